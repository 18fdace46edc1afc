// Scenarios from outside requirements (see the source named beside each check; the values and their
// status are those of ../shared/spec/check-values.md). ISO 13849-1 clause numbers here are those of
// its 2006 edition, which the 2015 and 2023 editions supersede (the clauses on restart, fault
// consideration and categories kept their substance: from memory).
import { describe, expect, it } from "vitest";
import { compileDesign, prove, replayTrace, type Design, type NoRestartVerdict } from "../../../app/engine";
import { inhibit, is, makeDesign, noRestart, type Spec } from "./builders";

const THROTTLE = { condition: "throttle", released: ["released"], applied: ["applied"], fault: ["fault"] };
const CONDITIONS: Spec["conditions"] = [
  ["key", ["off", "on"]],
  ["seat", ["empty", "occupied"]],
  ["plug", ["free", "inserted"]],
  ["throttle", ["released", "applied", "fault"]],
];

/** Key switch feeds power; the enable line runs through the seat switch and the charge-inlet switch. */
function chargeInlet(arrangement: "series" | "parallel"): Design {
  const wires: Spec["wires"] =
    arrangement === "series"
      ? [
          ["BAT.+", "KS.1"],
          ["KS.2", "PWR.in"],
          ["KS.2", "SS.1"],
          ["SS.2", "CI.1"],
          ["CI.2", "EN.in"],
        ]
      : [
          ["BAT.+", "KS.1"],
          ["KS.2", "PWR.in"],
          ["KS.2", "SS.1"],
          ["KS.2", "CI.1"],
          ["SS.2", "EN.in"],
          ["CI.2", "EN.in"],
        ];
  return makeDesign({
    conditions: CONDITIONS,
    contacts: [
      ["KS", "key", ["on"]],
      ["SS", "seat", ["occupied"]],
      ["CI", "plug", ["free"]],
    ],
    inputs: [
      ["PWR", "power"],
      ["EN", "enable"],
    ],
    wires,
    throttle: THROTTLE,
    lockouts: ["power-on", "enable-restore"],
    rules: [inhibit("charging", is("plug", "inserted"))],
  });
}

describe("charge-inlet interlock", () => {
  // UN ECE Regulation No. 100, 02 series (a vehicle connected to the external supply must not move
  // by its own propulsion) - from memory. R100 applies to road vehicles of categories M and N; for
  // carts, tugs and mowers it is a benchmark borrowed from road vehicles, not their requirement.
  it("holds with the inlet switch in series in the enable line", () => {
    const v = prove(chargeInlet("series"));
    expect(v.rules[0]).toMatchObject({ id: "charging", holds: true, violatingRows: 0 });
  });

  // UN ECE Regulation No. 100, 02 series - from memory; road vehicles of categories M and N only.
  it("fails with the inlet switch in parallel with the seat switch", () => {
    const v = prove(chargeInlet("parallel"));
    expect(v.rules[0]).toMatchObject({
      id: "charging",
      holds: false,
      example: { key: "on", seat: "occupied", plug: "inserted", throttle: "applied" },
    });
  });
});

/**
 * Key feeds power, the seat switch feeds enable; no direction or brake inputs. The throttle has no
 * fault state here (a fault -> applied step would need the throttle-fault lockout, a separate matter).
 */
function seatInterlock(lockouts: Spec["lockouts"]): Design {
  return makeDesign({
    conditions: [
      ["key", ["off", "on"]],
      ["seat", ["empty", "occupied"]],
      ["throttle", ["released", "applied"]],
    ],
    contacts: [
      ["KS", "key", ["on"]],
      ["SS", "seat", ["occupied"]],
    ],
    inputs: [
      ["PWR", "power"],
      ["EN", "enable"],
    ],
    wires: [
      ["BAT.+", "KS.1"],
      ["KS.2", "PWR.in"],
      ["KS.2", "SS.1"],
      ["SS.2", "EN.in"],
    ],
    throttle: { condition: "throttle", released: ["released"], applied: ["applied"] },
    lockouts,
    rules: [noRestart("no-surprise")],
  });
}

describe("restoring an interlock on a held throttle", () => {
  // ISO 13849-1:2006 (superseded), 5.2.3 (restart: after an interlock is restored, no automatic
  // restart where it could be hazardous). ANSI/ITSDF B56.1, 7.2.10-7.2.11 (travel must not resume
  // automatically when the operator returns): clause numbers as quoted in a trade article, not read
  // in the standard; B56.1 covers lift trucks, and ANSI/ITSDF B56.8 is the closer standard for
  // carts and burden carriers (from memory).
  it("fails no-restart without the enable-restore lockout, with a replayable counterexample", () => {
    const d = seatInterlock(["power-on"]);
    const rule = prove(d).rules[0] as NoRestartVerdict;
    expect(rule.holds).toBe(false);
    // Power up released, sit away with the throttle held, sit back down: drive would restart.
    expect(rule.trace).toHaveLength(3);
    const steps = replayTrace(compileDesign(d), rule.trace!);
    expect(steps[2]).toMatchObject({ drive: true, restart: true });
    expect(steps[2].row.states).toMatchObject({ seat: "occupied", throttle: "applied" });
  });

  // ISO 13849-1:2006 (superseded), 5.2.3; ANSI/ITSDF B56.1, 7.2.10-7.2.11 as quoted in a trade
  // article (B56.8 is the closer standard for carts and burden carriers, from memory).
  it("holds with the enable-restore lockout", () => {
    expect(prove(seatInterlock(["power-on", "enable-restore"])).rules[0].holds).toBe(true);
  });

  // ISO 13849-1:2006 (superseded), 5.2.3: with a throttle fault state, returning from fault to
  // applied is also a start without a deliberate release, so the throttle-fault lockout is needed.
  it("needs the throttle-fault lockout when the throttle can report a fault", () => {
    const base = seatInterlock(["power-on", "enable-restore"]);
    base.conditions[2].states.push("fault");
    base.controller.throttle.fault = ["fault"];
    const without = prove(base).rules[0] as NoRestartVerdict;
    expect(without.holds).toBe(false);
    expect(without.trace!.map((r) => r.throttle)).toEqual(["released", "fault", "applied"]);
    base.controller.lockouts = ["power-on", "enable-restore", "throttle-fault"];
    expect(prove(base).rules[0].holds).toBe(true);
  });
});

describe("power-on with the throttle held", () => {
  // IEC 60204-1, 7.5 (switching the supply on must not cause an unexpected restart; read in a
  // translation).
  it("fails no-restart without the power-on lockout", () => {
    const d = seatInterlock([]);
    const rule = prove(d).rules[0] as NoRestartVerdict;
    expect(rule.holds).toBe(false);
    // Shortest: the very first step powers up with the throttle already applied.
    expect(rule.trace).toEqual([{ key: "on", seat: "occupied", throttle: "applied" }]);
  });

  // IEC 60204-1, 7.5.
  it("holds against power-on when the power-on lockout is listed (seat handled by enable-restore)", () => {
    expect(prove(seatInterlock(["power-on", "enable-restore"])).rules[0].holds).toBe(true);
    // With power-on alone the seat path still restarts, so the counterexample is not a power-up.
    const trace = (prove(seatInterlock(["power-on"])).rules[0] as NoRestartVerdict).trace!;
    expect(trace[trace.length - 1].key).toBe("on");
    expect(trace[trace.length - 2]).toMatchObject({ key: "on", throttle: "applied" });
  });
});

describe("single faults", () => {
  const chain = (contacts: Array<[string, string, string[]]>, wires: Spec["wires"]) =>
    makeDesign({
      conditions: [
        ["plug", ["free", "inserted"]],
        ["throttle", ["released", "applied"]],
      ],
      contacts,
      inputs: [["EN", "enable"]],
      wires,
      throttle: { condition: "throttle", released: ["released"], applied: ["applied"] },
      rules: [inhibit("charging", is("plug", "inserted"))],
    });

  // ISO 13849-1:2006 (superseded), 7.2 (single-fault criterion: one fault at a time; faults of a
  // common cause count as one, which a contact-by-contact check does not cover).
  it("a stuck-closed contact in a single chain defeats its rule", () => {
    const v = prove(
      chain(
        [["CI", "plug", ["free"]]],
        [
          ["BAT.+", "CI.1"],
          ["CI.2", "EN.in"],
        ],
      ),
    );
    expect(v.ok).toBe(true);
    expect(v.singleFaults).toEqual([{ component: "CI", mode: "stuck-closed", defeats: ["charging"] }]);
  });

  // ISO 13849-1:2006 (superseded), 7.2.
  it("a redundant pair in series is not defeated by any single fault", () => {
    const v = prove(
      chain(
        [
          ["CI1", "plug", ["free"]],
          ["CI2", "plug", ["free"]],
        ],
        [
          ["BAT.+", "CI1.1"],
          ["CI1.2", "CI2.1"],
          ["CI2.2", "EN.in"],
        ],
      ),
    );
    expect(v.ok).toBe(true);
    expect(v.singleFaults).toEqual([]);
  });

  // Machinery Directive 2006/42/EC, Annex I, 1.2.4.1 (stop has priority over start): a brake
  // contact that fails open loses the brake's priority.
  it("a stuck-open brake contact defeats the brake rule", () => {
    const d = makeDesign({
      conditions: [
        ["brake", ["released", "pressed"]],
        ["throttle", ["released", "applied"]],
      ],
      contacts: [["BS", "brake", ["pressed"]]],
      inputs: [["BRK", "brake"]],
      wires: [
        ["BAT.+", "BS.1"],
        ["BS.2", "BRK.in"],
      ],
      throttle: { condition: "throttle", released: ["released"], applied: ["applied"] },
      rules: [inhibit("brake", is("brake", "pressed"))],
    });
    expect(prove(d).singleFaults).toEqual([{ component: "BS", mode: "stuck-open", defeats: ["brake"] }]);
  });
});
