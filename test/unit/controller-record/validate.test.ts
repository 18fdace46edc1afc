// Validation of the record (spec section 1): every impossible value refused whole, each named by its path.
import { describe, expect, it } from "vitest";
import { parseRecord, validateRecord } from "../../../app/controller-record";
import { exampleRecord, withValue } from "./fixtures";

const problemsOf = (input: unknown) => {
  const v = parseRecord(input);
  if (v.ok) throw new Error("record should be invalid");
  return v.problems;
};
const paths = (input: unknown) => problemsOf(input).map((p) => p.path);

describe("validateRecord", () => {
  it("accepts the spec's example and keeps unknown keys at every level", () => {
    const rec = withValue(withValue(exampleRecord(), "settings.throttle.note", "new grip fitted"), "vendorNote", { a: 1 });
    const v = validateRecord(rec);
    expect(v.ok).toBe(true);
    if (v.ok) {
      expect(v.record).toEqual(rec);
      expect(v.record.settings.throttle.note).toBe("new grip fitted");
    }
  });

  it.each([
    ["a rest voltage above full", "settings.throttle.restV", 4.3, "settings.throttle.restV"],
    ["a rest voltage equal to full", "settings.throttle.restV", 4.2, "settings.throttle.restV"],
    ["the low fault threshold at the released one", "settings.throttle.faultBelowV", 1.0, "settings.throttle.faultBelowV"],
    ["the released threshold above the applied one", "settings.throttle.releasedBelowV", 1.2, "settings.throttle.releasedBelowV"],
    ["the applied threshold at the high fault one", "settings.throttle.appliedFromV", 4.5, "settings.throttle.appliedFromV"],
    ["a throttle voltage above 5 V", "settings.throttle.faultAboveV", 5.5, "settings.throttle.faultAboveV"],
    ["a negative throttle voltage", "settings.throttle.faultBelowV", -0.1, "settings.throttle.faultBelowV"],
    ["a negative capacity", "pack.capacityAh", -100, "pack.capacityAh"],
    ["a zero capacity", "pack.capacityAh", 0, "pack.capacityAh"],
    ["an unknown chemistry", "pack.chemistry", "nickel-zinc", "pack.chemistry"],
    ["a fraction of a cell", "pack.seriesCells", 15.5, "pack.seriesCells"],
    ["no cells", "pack.seriesCells", 0, "pack.seriesCells"],
    ["a percentage over 100", "settings.batteryCurrentPercent", 100.5, "settings.batteryCurrentPercent"],
    ["a negative percentage", "settings.motorCurrentPercent", -1, "settings.motorCurrentPercent"],
    ["a number as text", "settings.lowVoltageCutbackV", "42", "settings.lowVoltageCutbackV"],
    ["an unknown sensor", "settings.throttle.sensor", "optical", "settings.throttle.sensor"],
    ["an unknown lockout", "settings.lockouts", ["power-on", "seat-return"], "settings.lockouts[1]"],
    ["brake behaviour as text", "settings.brakeCutsDrive", "yes", "settings.brakeCutsDrive"],
    ["a zero precharge resistor", "settings.precharge.resistorOhm", 0, "settings.precharge.resistorOhm"],
    ["a negative fuse", "pack.fuseA", -250, "pack.fuseA"],
    ["a zero C rate", "pack.continuousC", 0, "pack.continuousC"],
    ["a controller range upside down (decision 121)", "controller.minVoltageV", 95, "controller.minVoltageV"],
    ["a cut-back above the cut-off (decision 121)", "settings.lowVoltageCutbackV", 70, "settings.lowVoltageCutbackV"],
    ["a missing description", "controller.description", undefined, "controller.description"],
    ["a description of 201 characters", "controller.description", "x".repeat(201), "controller.description"],
    ["a NUL character in a kept key's text", "settings.note", "a\u0000b", "settings.note"],
    ["the wrong format", "format", "chainproof/controller-record@2", "format"],
  ])("refuses %s, naming %s", (_what, path, value, expected) => {
    const problems = problemsOf(withValue(exampleRecord(), path, value));
    expect(problems.map((p) => p.path)).toContain(expected);
    expect(problems.every((p) => p.message.length > 0 && !/^\s+at /m.test(p.message))).toBe(true);
  });

  it("lists every problem at once", () => {
    let rec = withValue(exampleRecord(), "pack.chemistry", "zinc");
    rec = withValue(rec, "settings.throttle.restV", 4.4);
    rec = withValue(rec, "settings.batteryCurrentPercent", 120);
    expect(paths(rec)).toEqual(["pack.chemistry", "settings.batteryCurrentPercent", "settings.throttle.restV"]);
  });

  it("a value too large to compute with is refused at the field that drives it", () => {
    expect(paths(withValue(exampleRecord(), "settings.precharge.resistorOhm", 1e-310))).toEqual(["settings.precharge.resistorOhm"]);
    expect(paths(withValue(exampleRecord(), "pack.seriesCells", 1e308))).toContain("pack.seriesCells");
  });

  it("refuses what is not a record at all with a root problem", () => {
    for (const input of [null, 42, "record", []]) expect(paths(input)).toContain("");
  });
});
