// Row access, filtered paging, CSV, diagnosis and reading explanations on small known designs.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import {
  compileDesign,
  countRows,
  csvChunks,
  decodeRow,
  diagnose,
  encodeRow,
  evaluateRow,
  explainReadings,
  findRow,
  pageRows,
  replayTrace,
  rowCount,
} from "../../../app/engine";
import { inhibit, is, makeDesign } from "./builders";

const example = (name: string) => compileDesign(JSON.parse(readFileSync(`/work/shared/spec/examples/${name}.design.json`, "utf8")));
const hauler = example("campus-hauler");
const mower = example("deck-mower");
const bike = example("trail-bike");
const HAULER_DRIVING = { key: "on", seat: "occupied", plug: "free", tether: "attached", fnr: "forward", brake: "released", pedal: "down" };

describe("row order", () => {
  // Spec 1.1: conditions A (2 states), B (3 states): row 1 = (A0,B1), row 3 = (A1,B0).
  const c = compileDesign(
    makeDesign({
      conditions: [
        ["A", ["a0", "a1"]],
        ["B", ["b0", "b1", "b2"]],
      ],
      inputs: [["P", "power"]],
      wires: [["BAT.+", "P.in"]],
      throttle: { condition: "B", released: ["b0"], applied: ["b1", "b2"] },
    }),
  );
  it("is mixed radix with the last condition varying fastest", () => {
    expect(rowCount(c)).toBe(6);
    expect(decodeRow(c, 1)).toEqual({ A: "a0", B: "b1" });
    expect(decodeRow(c, 3)).toEqual({ A: "a1", B: "b0" });
    expect(encodeRow(c, { A: "a1", B: "b2" })).toBe(5);
  });
  it("encodes unknown or missing states as -1", () => {
    expect(encodeRow(c, { A: "a1", B: "b9" })).toBe(-1);
    expect(encodeRow(c, { A: "a1" })).toBe(-1);
    expect(() => decodeRow(c, 6)).toThrow(RangeError);
  });
});

describe("evaluateRow", () => {
  it("shows contacts, inputs, energized terminals, controller and drive", () => {
    const row = evaluateRow(hauler, encodeRow(hauler, HAULER_DRIVING));
    expect(row.drive).toBe(true);
    expect(row.controller).toEqual({ powered: true, enabled: true, direction: "forward", braking: false, throttle: "applied" });
    expect(row.contacts).toMatchObject({ KS: true, SS: true, CP: true, DF: true, DR: false, BS: false });
    expect(row.inputs).toEqual({ PWR: true, EN: true, FWD: true, REV: false, BRK: false });
    expect(row.nets.energizedTerminals).toEqual(expect.arrayContaining(["BAT.+", "KS.1", "J1.j", "EN.in", "DR.1"]));
    expect(row.nets.energizedTerminals).not.toContain("DR.2");
    expect(row.rules.charging).toEqual({ unsafe: false, violating: false });
  });

  it("applies contact faults", () => {
    const states = { ...HAULER_DRIVING, plug: "inserted" };
    expect(evaluateRow(hauler, encodeRow(hauler, states)).inputs.EN).toBe(false);
    const faulted = evaluateRow(hauler, encodeRow(hauler, states), [{ component: "CP", mode: "stuck-closed" }]);
    expect(faulted.inputs.EN).toBe(true);
    expect(faulted.rules.charging).toEqual({ unsafe: true, violating: true });
  });
});

describe("filtered rows", () => {
  it("counts, pages and finds violating rows", () => {
    // deck-mower: charging and operator each have one violating row (reference verdict).
    expect(countRows(mower, { only: "violating" })).toBe(2);
    expect(countRows(mower, { only: "violating", rule: "charging" })).toBe(1);
    const page = pageRows(mower, { filter: { only: "violating" }, count: 10 });
    expect(page.total).toBe(2);
    expect(page.rows.every((r) => Object.values(r.rules).some((x) => x.violating))).toBe(true);
    expect(findRow(mower, { only: "violating" }, page.rows[0].index + 1)).toBe(page.rows[1].index);
    expect(findRow(mower, { only: "violating" }, page.rows[1].index + 1)).toBe(-1);
  });

  it("filters by condition states and counts drive rows", () => {
    expect(countRows(hauler, { only: "drive" })).toBe(2);
    expect(countRows(hauler, { where: { fnr: ["neutral"] } })).toBe(96);
    expect(countRows(hauler, { only: "drive", where: { fnr: ["reverse"] } })).toBe(1);
    expect(() => countRows(hauler, { where: { fnr: ["sideways"] } })).toThrow(/not a state/);
    expect(() => countRows(hauler, { only: "unsafe", rule: "no-surprise" })).toThrow(/not an inhibit rule/);
  });

  it("pages the unfiltered table in row order", () => {
    const page = pageRows(bike, { from: 20, count: 10 });
    expect(page.total).toBe(24);
    expect(page.rows.map((r) => r.index)).toEqual([20, 21, 22, 23]);
  });
});

describe("csvChunks", () => {
  it("streams a header and one line per row", () => {
    const lines = [...csvChunks(bike)].join("").trimEnd().split("\n");
    expect(lines[0]).toBe(
      "row,key,kill,stand,grip,input:PWR,input:EN,powered,enabled,direction,braking,throttle,drive,rule:stand,rule:kill",
    );
    expect(lines).toHaveLength(25);
    expect(lines[14]).toBe("13,on,run,up,open,1,1,1,1,forward,0,applied,1,-,-");
  });
  it("honours from and count within the filtered rows", () => {
    const lines = [...csvChunks(hauler, { only: "unsafe" }, { from: 5, count: 3 })].join("").trimEnd().split("\n");
    expect(lines).toHaveLength(4);
    const all = pageRows(hauler, { filter: { only: "unsafe" }, from: 5, count: 3 }).rows.map((r) => String(r.index));
    expect(lines.slice(1).map((l) => l.split(",")[0])).toEqual(all);
  });
});

describe("diagnose", () => {
  it("names the smallest sets of contacts to close and the controller's reasons", () => {
    const d = diagnose(hauler, { ...HAULER_DRIVING, seat: "empty", fnr: "neutral" });
    expect(d.drive).toBe(false);
    expect(d.reasons.map((r) => r.code)).toEqual(["not-enabled", "neutral"]);
    const en = d.inputs.find((x) => x.input === "EN")!;
    expect(en.fixes).toEqual([[{ contact: "SS", label: "Seat switch (NO)", condition: "seat", closeIn: ["occupied"] }]]);
    expect(d.inputs.find((x) => x.input === "PWR")!.energized).toBe(true);
  });

  it("lists every smallest set, across parallel branches", () => {
    const c = compileDesign(
      makeDesign({
        conditions: [
          ["a", ["off", "on"]],
          ["b", ["off", "on"]],
          ["c", ["off", "on"]],
          ["t", ["rel", "app"]],
        ],
        contacts: [
          ["A", "a", ["on"]],
          ["B", "b", ["on"]],
          ["C", "c", ["on"]],
        ],
        inputs: [["EN", "enable"]],
        // A in series with (B parallel C)
        wires: [
          ["BAT.+", "A.1"],
          ["A.2", "B.1"],
          ["A.2", "C.1"],
          ["B.2", "EN.in"],
          ["C.2", "EN.in"],
        ],
        throttle: { condition: "t", released: ["rel"], applied: ["app"] },
      }),
    );
    const d = diagnose(c, { a: "off", b: "off", c: "off", t: "app" });
    expect(d.inputs[0].fixes.map((s) => s.map((k) => k.contact))).toEqual([
      ["A", "B"],
      ["A", "C"],
    ]);
    expect(d.reasons.map((r) => r.code)).toEqual(["not-enabled"]);
  });

  it("reports a latched lockout after a history", () => {
    // trail-bike has the power-on lockout: powering up on an open grip latches it.
    const row = { key: "on", kill: "run", stand: "up", grip: "open" };
    const d = diagnose(bike, row, { history: [{ ...row, key: "off" }] });
    expect(d.steadyDrive).toBe(true);
    expect(d.drive).toBe(false);
    expect(d.reasons).toEqual([expect.objectContaining({ code: "lockout-latched", lockouts: ["power-on"] })]);
    expect(diagnose(bike, row).reasons).toEqual([]);
  });

  it("rejects an incomplete row, naming the missing condition", () => {
    expect(() => diagnose(bike, { key: "on" })).toThrow(/"kill"/);
  });
});

describe("explainReadings", () => {
  const inserted = { ...HAULER_DRIVING, plug: "inserted" };
  it("says consistent when the fault-free design explains the readings", () => {
    expect(explainReadings(hauler, inserted, { EN: false, PWR: true })).toEqual({ consistent: true, explanations: [] });
  });
  it("names the single faults that explain impossible readings, simplest first", () => {
    const r = explainReadings(hauler, inserted, { EN: true });
    expect(r.consistent).toBe(false);
    expect(r.explanations[0]).toEqual({ component: "CP", mode: "stuck-closed", otherInputsChanged: [] });
    for (const e of r.explanations) {
      const view = evaluateRow(hauler, encodeRow(hauler, inserted), [{ component: e.component, mode: e.mode }]);
      expect(view.inputs.EN).toBe(true);
    }
  });
});

describe("replayTrace", () => {
  it("reports the latch, armed lockouts and drive per step", () => {
    const c = compileDesign(
      makeDesign({
        conditions: [
          ["key", ["off", "on"]],
          ["t", ["rel", "app"]],
        ],
        contacts: [["KS", "key", ["on"]]],
        inputs: [["PWR", "power"]],
        wires: [
          ["BAT.+", "KS.1"],
          ["KS.2", "PWR.in"],
        ],
        throttle: { condition: "t", released: ["rel"], applied: ["app"] },
        lockouts: ["power-on"],
        rules: [inhibit("never", is("key", "off"))],
      }),
    );
    const steps = replayTrace(c, [
      { key: "on", t: "app" },
      { key: "on", t: "rel" },
      { key: "on", t: "app" },
    ]);
    expect(steps.map((s) => [s.armed, s.latched, s.drive, s.restart])).toEqual([
      [["power-on"], true, false, false],
      [[], false, false, false],
      [[], false, true, false],
    ]);
  });
});
