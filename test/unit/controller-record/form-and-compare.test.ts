// The record's form (flat text fields <-> document) and the comparison of two versions.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  compareRecords,
  controllerFormSchema,
  formToRecord,
  recordToForm,
  validateRecord,
  type ControllerRecord,
} from "../../../app/controller-record";
import { fieldErrors } from "../../../app/lib/forms";
import { exampleRecord, withValue, type Json } from "./fixtures";

const valid = (doc: unknown): ControllerRecord => {
  const v = validateRecord(doc);
  if (!v.ok) throw new Error(JSON.stringify(v.problems));
  return v.record;
};

describe("the record's form", () => {
  it("shows a record and reads it back unchanged", () => {
    const r = valid(exampleRecord());
    expect(formToRecord(recordToForm(r))).toEqual(exampleRecord());
  });

  it("round-trips random changes of the example's numbers", () => {
    fc.assert(
      fc.property(fc.double({ min: 0.01, max: 4.19, noNaN: true }), fc.integer({ min: 1, max: 400 }), (rest, cells) => {
        const doc = withValue(withValue(exampleRecord(), "settings.throttle.restV", rest), "pack.seriesCells", cells);
        expect(formToRecord(recordToForm(valid(doc)))).toEqual(doc);
      }),
    );
  });

  it("names each bad field by its form name, as the page shows it", () => {
    const form = recordToForm(valid(exampleRecord()));
    form["settings.throttle.restV"] = "4.5"; // above full
    form["pack.capacityAh"] = "-3";
    form["settings.batteryCurrentPercent"] = "lots";
    form["pack.fuseA"] = "";
    const parsed = controllerFormSchema.safeParse(form);
    expect(parsed.success).toBe(false);
    if (parsed.success) return;
    const errors = fieldErrors(parsed.error);
    expect(Object.keys(errors).sort()).toEqual(["pack.capacityAh", "settings.batteryCurrentPercent", "settings.throttle.restV"]);
    expect(errors["settings.batteryCurrentPercent"]).toBe("must be a number");
  });

  it("takes a comma as the decimal point, drops an empty optional field and a wholly empty precharge", () => {
    const form = recordToForm(valid(exampleRecord()));
    form["settings.throttle.restV"] = "0,8";
    form["pack.fuseA"] = " ";
    for (const f of ["settings.precharge.resistorOhm", "settings.precharge.capacitanceUF", "settings.precharge.delayMs"]) form[f] = "";
    const doc = formToRecord(form);
    expect(doc).toMatchObject({ settings: { throttle: { restV: 0.8 } } });
    expect((doc.pack as Record<string, unknown>).fuseA).toBeUndefined();
    expect((doc.settings as Record<string, unknown>).precharge).toBeUndefined();
    expect(validateRecord(doc).ok).toBe(true);
  });

  it("a partly filled precharge names the empty fields", () => {
    const form = recordToForm(valid(exampleRecord()));
    form["settings.precharge.delayMs"] = "";
    const parsed = controllerFormSchema.safeParse(form);
    expect(parsed.success ? {} : fieldErrors(parsed.error)).toEqual({ "settings.precharge.delayMs": "is required" });
  });

  it("keeps keys the form does not show from the version it changes", () => {
    const base = withValue(exampleRecord(), "settings.throttle.note", "grip replaced");
    const form = recordToForm(valid(base));
    form["settings.lockouts.power-on"] = "";
    const doc = formToRecord(form, base);
    expect(doc).toMatchObject({ settings: { throttle: { note: "grip replaced" }, lockouts: ["enable-restore", "direction-engage"] } });
  });
});

describe("comparing two versions", () => {
  it("lists exactly the fields that differ, in words with their units", () => {
    let after = withValue(exampleRecord(), "settings.lockouts", ["power-on", "direction-engage"]);
    after = withValue(after, "settings.throttle.restV", 0.8);
    after = withValue(after, "pack.fuseA", undefined);
    after = withValue(after, "settings.extra", "kept");
    expect(compareRecords(exampleRecord(), after)).toEqual([
      { path: "pack.fuseA", label: "Main fuse rating", unit: "A", before: "250", after: "—" },
      { path: "settings.throttle.restV", label: "Reading at rest", unit: "V", before: "0.85", after: "0.8" },
      {
        path: "settings.lockouts",
        label: "Lockouts",
        unit: undefined,
        before: "power-on, enable-restore, direction-engage",
        after: "power-on, direction-engage",
      },
      { path: "settings.extra", label: "settings.extra", unit: undefined, before: "—", after: "kept" },
    ]);
  });

  it("a version compared with itself, or with its defaults written out, has no changes", () => {
    const implicit = withValue(withValue(exampleRecord(), "settings.brakeCutsDrive", undefined), "settings.lockouts", undefined);
    const explicit = withValue(withValue(exampleRecord(), "settings.brakeCutsDrive", true), "settings.lockouts", []);
    expect(compareRecords(exampleRecord(), exampleRecord())).toEqual([]);
    expect(compareRecords(implicit, explicit)).toEqual([]);
    // the same lockouts in another order are the same set
    const shuffled = withValue(exampleRecord(), "settings.lockouts", ["direction-engage", "power-on", "enable-restore", "power-on"]);
    expect(compareRecords(exampleRecord(), shuffled)).toEqual([]);
  });

  it("every changed leaf shows up once (random single changes)", () => {
    const paths = [
      "pack.capacityAh",
      "controller.ratedCurrentA",
      "settings.motorCurrentPercent",
      "settings.throttle.faultAboveV",
      "settings.precharge.delayMs",
    ];
    fc.assert(
      fc.property(fc.constantFrom(...paths), fc.integer({ min: 1, max: 99 }), (path, value) => {
        // a value equal to the example's own is no change at all (the example's throttle fault level is 4.5)
        fc.pre((path.split(".").reduce((at: Json, k) => at?.[k], exampleRecord()) as unknown) !== value + 0.5);
        const after = withValue(exampleRecord(), path, value + 0.5);
        const changes = compareRecords(exampleRecord(), after);
        expect(changes.map((c) => c.path)).toEqual([path]);
        expect(changes[0].after).toBe(String(value + 0.5));
      }),
    );
  });
});
