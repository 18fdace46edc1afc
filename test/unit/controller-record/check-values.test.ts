// The controller settings record against the check values of check-values.md. Each check names its
// source beside it: the precharge values are handbook RC formulas (searched); the cell voltages and the
// throttle thresholds are common practice, from memory; currents are arithmetic.
import { describe, expect, it } from "vitest";
import {
  checkRecord,
  derivePrecharge,
  deriveValues,
  parseRecord,
  type ControllerRecord,
  type Finding,
} from "../../../app/controller-record";
import { designController, exampleRecord, withValue, type Json } from "./fixtures";

function parsed(input: Json): ControllerRecord {
  const p = parseRecord(input);
  if (!p.ok) throw new Error(`record should be valid: ${JSON.stringify(p.problems)}`);
  return p.record;
}
const check = (input: Json, design?: Parameters<typeof checkRecord>[1]) => checkRecord(parsed(input), design);
const codes = (fs: Finding[]) => fs.map((f) => f.code);

describe("the spec's example record (controller-record.md sections 1-2)", () => {
  it("derives exactly the spec's derived values", () => {
    expect(check(exampleRecord()).derived).toEqual({
      pack: { minV: 40.0, nominalV: 51.2, maxV: 58.4 },
      batteryCurrentA: 200,
      motorCurrentA: 320,
      packContinuousA: 100,
      precharge: { tauMs: 47, t95Ms: 140.8, t99Ms: 216.4, inrushA: 1.2, energyJ: 1.71, reachedAtDelay: 0.995 },
      throttle: { rest: "released", full: "applied", openSignal: "fault", openGround: "fault" },
    });
  });

  it("has one finding: a 200 A battery limit above the pack's 100 A continuous rating is a warning", () => {
    // Currents (check-values.md, arithmetic): 50 % of a 400 A controller is 200 A; 100 Ah at 1 C is 100 A.
    expect(check(exampleRecord()).findings).toEqual([
      expect.objectContaining({ code: "battery-current-above-pack", severity: "warning", path: "settings.batteryCurrentPercent" }),
    ]);
  });
});

describe("pack windows (typical cell datasheet values; common practice, from memory)", () => {
  const pack = (chemistry: string, seriesCells: number) =>
    deriveValues(parsed(withValue(withValue(exampleRecord(), "pack.chemistry", chemistry), "pack.seriesCells", seriesCells))).pack;

  it("16 LiFePO4 cells: 40.0 V min, 51.2 V nominal, 58.4 V max", () => {
    // check-values.md "Traction packs": LiFePO4 2.5 / 3.2 / 3.65 V per cell (common practice, from memory)
    expect(pack("lifepo4", 16)).toEqual({ minV: 40.0, nominalV: 51.2, maxV: 58.4 });
  });
  it("20 NMC cells: 60.0 V min, 84.0 V max, 74.0 V nominal at the spec's 3.7 V a cell", () => {
    // check-values.md: NMC 3.0 / 3.6-3.7 / 4.2 V (common practice, from memory); the spec picks 3.7
    expect(pack("nmc", 20)).toEqual({ minV: 60.0, nominalV: 74.0, maxV: 84.0 });
  });
  it("a 36 V lead-acid pack (18 cells): 31.5 V at end of discharge, 43.2 V absorption charge", () => {
    // check-values.md: lead-acid 1.75 / 2.0 / 2.4 V (common practice, from memory)
    expect(pack("lead-acid", 18)).toEqual({ minV: 31.5, nominalV: 36.0, maxV: 43.2 });
  });
  it("24 LTO cells give 67.20 V exactly (2.8 * 24 is 67.19999999999999 in floating point)", () => {
    // check-values.md: LTO 1.5-1.8 / 2.3-2.4 / 2.7-2.8 V (common practice, from memory); spec: 1.8 / 2.4 / 2.8
    expect(pack("lto", 24)).toEqual({ minV: 43.2, nominalV: 57.6, maxV: 67.2 });
  });
});

describe("precharge (handbook RC formulas; check-values.md 'Precharge', searched)", () => {
  it("800 V, 47 ohm, 1000 uF: tau 47 ms, t95 140.8 ms, t99 216.4 ms, inrush 17.0 A, 320 J in the resistor", () => {
    // Worked example of check-values.md: inrush 800 / 47 = 17.02 A, 17.0 to 0.1 A; energy C V^2 / 2 = 320 J
    const p = derivePrecharge(800, { resistorOhm: 47, capacitanceUF: 1000, delayMs: 235 });
    expect(p).toMatchObject({ tauMs: 47, t95Ms: 140.8, t99Ms: 216.4, inrushA: 17.0, energyJ: 320 });
    // 5 tau = 99.326 % (handbook), 0.993 to 0.001
    expect(p.reachedAtDelay).toBe(0.993);
  });

  it("95 % at 2.996 tau passes (0.94998 rounds to 0.950); 90 % at 2.303 tau is too short", () => {
    // handbook: 90 % at 2.303 tau, 95 % at 2.996 tau, 99 % at 4.605 tau
    const delay = (k: number) => withValue(exampleRecord(), "settings.precharge.delayMs", k * 47);
    expect(check(delay(2.996)).derived.precharge?.reachedAtDelay).toBe(0.95);
    expect(codes(check(delay(2.996)).findings)).not.toContain("precharge-too-short");
    expect(check(delay(2.303)).derived.precharge?.reachedAtDelay).toBe(0.9);
    expect(check(delay(2.303)).findings).toContainEqual(
      expect.objectContaining({ code: "precharge-too-short", severity: "error", path: "settings.precharge.delayMs" }),
    );
    expect(check(delay(4.605)).derived.precharge?.reachedAtDelay).toBe(0.99);
  });

  it("a fraction of 0.94971 reads 0.950 and passes; 0.9494 reads 0.949 and does not", () => {
    // spec section 2: findings compare the rounded fraction; delay = -tau ln(1 - q) (handbook RC formula)
    const at = (q: number) => withValue(exampleRecord(), "settings.precharge.delayMs", -47 * Math.log(1 - q));
    expect(check(at(0.94971)).derived.precharge?.reachedAtDelay).toBe(0.95);
    expect(codes(check(at(0.94971)).findings)).not.toContain("precharge-too-short");
    expect(codes(check(at(0.9494)).findings)).toContain("precharge-too-short");
  });

  it("no precharge, no precharge values and no precharge check", () => {
    const r = check(withValue(withValue(exampleRecord(), "settings.precharge", undefined), "pack.continuousC", undefined));
    expect(r.derived.precharge).toBeUndefined();
    expect(r.derived.packContinuousA).toBeUndefined();
    expect(r.findings).toEqual([]);
  });
});

describe("currents (check-values.md 'Currents', arithmetic)", () => {
  it("7 % of 300 A is 21.0 A: not above a 21 A fuse", () => {
    // spec section 2: 0.07 * 300 is 21.000000000000004 in floating point; the finding compares 21.0
    const r = check(
      withValue(
        withValue(withValue(exampleRecord(), "controller.ratedCurrentA", 300), "settings.batteryCurrentPercent", 7),
        "pack.fuseA",
        21,
      ),
    );
    expect(r.derived.batteryCurrentA).toBe(21);
    expect(codes(r.findings)).not.toContain("battery-current-above-fuse");
  });
  it("a limit above the main fuse is an error; at the pack's continuous rating it is no finding", () => {
    // 70 % of 400 A = 280 A > 250 A fuse; 100 Ah at 2.8 C = 280 A
    const r = check(withValue(withValue(exampleRecord(), "settings.batteryCurrentPercent", 70), "pack.continuousC", 2.8));
    expect(r.derived.batteryCurrentA).toBe(280);
    expect(r.derived.packContinuousA).toBe(280);
    expect(r.findings).toEqual([
      expect.objectContaining({ code: "battery-current-above-fuse", severity: "error", path: "settings.batteryCurrentPercent" }),
    ]);
  });
});

describe("pack voltage settings against the pack (check-values.md 'Traction packs'; common practice, from memory)", () => {
  it("a cut-back at the pack minimum is fine, 0.01 V below it is an error", () => {
    expect(check(withValue(exampleRecord(), "settings.lowVoltageCutbackV", 40)).findings.filter((f) => f.severity === "error")).toEqual([]);
    expect(check(withValue(exampleRecord(), "settings.lowVoltageCutbackV", 39.99)).findings).toContainEqual(
      expect.objectContaining({ code: "cutback-below-pack-min", severity: "error", path: "settings.lowVoltageCutbackV" }),
    );
  });
  it("24 LTO cells: a cut-off of exactly 67.2 V is not above the pack's 67.20 V; 67.21 V is", () => {
    let r = withValue(withValue(exampleRecord(), "pack.chemistry", "lto"), "pack.seriesCells", 24);
    r = withValue(withValue(r, "settings.lowVoltageCutbackV", 43.2), "controller.minVoltageV", 43.2);
    r = withValue(r, "controller.maxVoltageV", 67.2);
    const at = (v: number) => check(withValue(r, "settings.overVoltageCutoffV", v));
    expect(at(67.2).findings).toContainEqual(
      expect.objectContaining({ code: "cutoff-below-pack-max", severity: "error", path: "settings.overVoltageCutoffV" }),
    );
    // A controller range of exactly 43.2 to 67.2 V holds the pack's window (1.8 * 24 is 43.199999999999996 unrounded).
    expect(codes(at(67.21).findings)).not.toContain("outside-controller-range");
    expect(codes(at(67.21).findings)).not.toContain("cutoff-below-pack-max");
    expect(codes(at(67.21).findings)).not.toContain("cutback-below-pack-min");
  });
  it("a pack window outside the controller's range is one error at controller, naming the end", () => {
    const r = check(withValue(exampleRecord(), "controller.maxVoltageV", 58));
    expect(r.findings).toContainEqual(expect.objectContaining({ code: "outside-controller-range", severity: "error", path: "controller" }));
    expect(r.findings.find((f) => f.code === "outside-controller-range")?.message).toMatch(
      /maximum is above the controller's highest \(58 V\)/,
    );
  });
});

describe("throttle (check-values.md 'Throttle signals': common practice, from memory)", () => {
  const throttle = (t: Json) => withValue(exampleRecord(), "settings.throttle", { ...exampleRecord().settings.throttle, ...t });

  it("a Hall throttle at 0.8 V rest and 4.2 V full, with faults below 0.5 V and above 4.5 V, classes as the design assumes", () => {
    // common practice, from memory: ~0.8 V at rest, ~4.2 V full; fault below ~0.5 V or above ~4.5 V
    expect(check(throttle({ restV: 0.8 })).derived.throttle).toEqual({
      rest: "released",
      full: "applied",
      openSignal: "fault",
      openGround: "fault",
    });
  });
  it("a 0-5 V signal from another device has no open-ground reading", () => {
    // check-values.md: an open signal wire reads near 0 V; an open ground reads near the supply on a three-wire sensor only
    const r = check(throttle({ sensor: "voltage", faultAboveV: 5 }));
    expect(r.derived.throttle).toEqual({ rest: "released", full: "applied", openSignal: "fault" });
    expect(r.findings.filter((f) => f.severity === "error")).toEqual([]);
  });
  it("a Hall sensor with no high fault threshold (5 V) does not see an open ground: an error at settings.throttle", () => {
    const r = check(throttle({ faultAboveV: 5 }));
    expect(r.derived.throttle.openGround).toBe("applied");
    expect(r.findings).toContainEqual(
      expect.objectContaining({ code: "throttle-open-wire-not-fault", severity: "error", path: "settings.throttle" }),
    );
  });
  it("an open signal at exactly the low fault threshold (0 V) is not below it: released, not fault", () => {
    const r = check(throttle({ faultBelowV: 0 }));
    expect(r.derived.throttle.openSignal).toBe("released");
    expect(codes(r.findings)).toContain("throttle-open-wire-not-fault");
  });
  it("a rest reading in the dead band and a full reading in the fault band are errors at their fields", () => {
    const r = check(throttle({ restV: 1.05, fullV: 4.6 }));
    expect(r.derived.throttle).toMatchObject({ rest: "dead-band", full: "fault" });
    expect(r.findings).toEqual([
      expect.objectContaining({ code: "throttle-full-not-applied", path: "settings.throttle.fullV" }),
      expect.objectContaining({ code: "throttle-rest-not-released", path: "settings.throttle.restV" }),
      expect.objectContaining({ code: "battery-current-above-pack" }),
    ]);
  });
  it("a reading at the released threshold is applied when the thresholds meet, in the dead band otherwise", () => {
    expect(check(throttle({ restV: 1.0 })).derived.throttle.rest).toBe("dead-band");
    expect(check(throttle({ restV: 1.1, appliedFromV: 1.0, fullV: 1.2 })).derived.throttle.rest).toBe("applied");
    // a reading at a fault threshold is not beyond it
    expect(check(throttle({ restV: 0.5 })).derived.throttle.rest).toBe("released");
    expect(check(throttle({ fullV: 4.5 })).derived.throttle.full).toBe("applied");
  });
});

describe("against a design (spec section 4)", () => {
  const all = ["power-on", "enable-restore", "direction-engage", "brake-release", "throttle-fault"] as const;

  it("a lockout the design assumes and the record lacks: one error each, in the design's order, each naming it", () => {
    const design = designController({ lockouts: ["throttle-fault", "brake-release", "power-on", "brake-release"] });
    const r = check(withValue(exampleRecord(), "settings.lockouts", ["enable-restore"]), design);
    const missing = r.findings.filter((f) => f.code === "lockout-missing");
    expect(missing.map((f) => f.message.match(/the (\S+) lockout/)?.[1])).toEqual(["throttle-fault", "brake-release", "power-on"]);
    expect(missing.every((f) => f.severity === "error" && f.path === "settings.lockouts")).toBe(true);
  });
  it("a lockout the record has and the design does not assume is no finding", () => {
    const r = check(withValue(exampleRecord(), "settings.lockouts", [...all]), designController({ lockouts: ["power-on"] }));
    expect(codes(r.findings)).toEqual(["battery-current-above-pack"]);
  });
  it("no lockouts in the record (the default) against a design assuming two: two findings", () => {
    const r = check(
      withValue(exampleRecord(), "settings.lockouts", undefined),
      designController({ lockouts: ["power-on", "enable-restore"] }),
    );
    expect(codes(r.findings)).toEqual(["lockout-missing", "lockout-missing", "battery-current-above-pack"]);
  });
  it("brake behaviour: both default to cutting drive; a difference either way is an error", () => {
    const noBrakeKey = withValue(exampleRecord(), "settings.brakeCutsDrive", undefined);
    expect(codes(check(noBrakeKey, designController({})).findings)).not.toContain("brake-behaviour-differs");
    expect(check(noBrakeKey, designController({ brakeCutsDrive: false })).findings).toContainEqual(
      expect.objectContaining({ code: "brake-behaviour-differs", severity: "error", path: "settings.brakeCutsDrive" }),
    );
    const noCut = withValue(exampleRecord(), "settings.brakeCutsDrive", false);
    expect(codes(check(noCut, designController({})).findings)).toContain("brake-behaviour-differs");
    expect(codes(check(noCut, designController({ brakeCutsDrive: false })).findings)).not.toContain("brake-behaviour-differs");
  });
  it("throttle-fault-unused: an open wire read as a fault, the design's throttle-fault lockout, no fault state", () => {
    const rec = withValue(exampleRecord(), "settings.lockouts", [...all]);
    const noFault = designController({ lockouts: ["throttle-fault"], fault: [] });
    expect(check(rec, noFault).findings).toContainEqual(
      expect.objectContaining({ code: "throttle-fault-unused", severity: "warning", path: "settings.throttle" }),
    );
    expect(codes(check(rec, designController({ lockouts: ["throttle-fault"] })).findings)).not.toContain("throttle-fault-unused");
    expect(codes(check(rec, designController({ lockouts: [], fault: [] })).findings)).not.toContain("throttle-fault-unused");
    // an open wire the controller does not read as a fault: the lockout would not act, so no such warning
    const blind = withValue(withValue(rec, "settings.throttle.faultBelowV", 0), "settings.throttle.faultAboveV", 5);
    expect(codes(check(blind, noFault).findings)).not.toContain("throttle-fault-unused");
  });
});

describe("order of findings (spec section 3)", () => {
  it("errors first, then by code, then by path", () => {
    let rec = withValue(exampleRecord(), "settings.lockouts", []);
    rec = withValue(rec, "settings.throttle.faultAboveV", 5); // open ground not a fault
    rec = withValue(rec, "settings.precharge.delayMs", 50); // too short
    rec = withValue(rec, "settings.batteryCurrentPercent", 70); // 280 A: above pack and fuse
    rec = withValue(rec, "settings.lowVoltageCutbackV", 30);
    const r = check(rec, designController({ lockouts: ["power-on", "throttle-fault"], fault: [], brakeCutsDrive: false }));
    expect(r.findings.map((f) => `${f.severity} ${f.code} ${f.path}`)).toEqual([
      "error battery-current-above-fuse settings.batteryCurrentPercent",
      "error brake-behaviour-differs settings.brakeCutsDrive",
      "error cutback-below-pack-min settings.lowVoltageCutbackV",
      "error lockout-missing settings.lockouts",
      "error lockout-missing settings.lockouts",
      "error precharge-too-short settings.precharge.delayMs",
      "error throttle-open-wire-not-fault settings.throttle",
      "warning battery-current-above-pack settings.batteryCurrentPercent",
      "warning throttle-fault-unused settings.throttle",
    ]);
    // throttle-fault-unused needs one open wire read as a fault: here the open signal still is
    expect(r.derived.throttle.openSignal).toBe("fault");
  });
});
