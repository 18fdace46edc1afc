// The revision diff: the row diff (built from the engine's filters) agrees with comparing every row
// one by one through pageRows; the structural diff names what changed.
import { describe, expect, it } from "vitest";
import { compileDesign, pageRows, type RowView } from "../engine";
import { generatedDesign } from "../../test/bench/designs";
import { rowDiff, structuralDiff } from "./diff";

const outcome = (v: RowView) =>
  JSON.stringify([
    v.drive,
    Object.keys(v.rules)
      .filter((k) => v.rules[k]!.violating)
      .sort(),
  ]);

describe("rowDiff", () => {
  it("lists exactly the rows whose drive or violated rules differ, in row order", () => {
    const a = generatedDesign(10);
    const b = structuredClone(a);
    (b.components.find((c) => c.id === "S0") as { closedIn: string[] }).closedIn = ["off"];
    b.rules = b.rules.filter((r) => r.id !== "brake");
    const ca = compileDesign(a);
    const cb = compileDesign(b);
    const A = pageRows(ca, { from: 0, count: ca.rows }).rows;
    const B = pageRows(cb, { from: 0, count: cb.rows }).rows;
    const want = A.map((_, i) => i).filter((i) => outcome(A[i]!) !== outcome(B[i]!));
    const d = rowDiff(ca, cb, want.length);
    expect(d.comparable).toBe(true);
    if (!d.comparable) return;
    expect(want.length).toBeGreaterThan(0);
    expect(d.changedRows).toBe(want.length);
    expect(d.listed.map((r) => r.index)).toEqual(want);
    expect(d.listed[0]!.before).not.toEqual(d.listed[0]!.after);
  });

  it("counts a require-drive rule's failing rows as broken: its rows differ when the wiring changes what drives", () => {
    // Must drive with the key on (c00) and the throttle applied: a demand row without drive is failing (spec 1.6, 1.1).
    const drives = (d: ReturnType<typeof generatedDesign>) => {
      const throttle = d.controller.throttle;
      d.rules.push({
        id: "D1",
        label: "Drives keyed, throttle applied",
        type: "require-drive",
        when: {
          all: [
            { cond: "c00", in: ["on"] },
            { cond: throttle.condition, in: throttle.applied },
          ],
        },
      });
      return d;
    };
    const a = drives(generatedDesign(10));
    const b = structuredClone(a);
    (b.components.find((c) => c.id === "KEY2") as { closedIn: string[] }).closedIn = ["off"];
    const ca = compileDesign(a);
    const cb = compileDesign(b);
    const broken = (v: RowView) =>
      JSON.stringify([
        v.drive,
        [
          ...Object.keys(v.rules).filter((k) => v.rules[k]!.violating),
          ...Object.keys(v.demands).filter((k) => v.demands[k]!.failing),
        ].sort(),
      ]);
    const A = pageRows(ca, { from: 0, count: ca.rows }).rows;
    const B = pageRows(cb, { from: 0, count: cb.rows }).rows;
    const want = A.map((_, i) => i).filter((i) => broken(A[i]!) !== broken(B[i]!));
    const d = rowDiff(ca, cb, want.length);
    if (!d.comparable) throw new Error("comparable tables");
    expect(d.changedRows).toBe(want.length);
    expect(d.listed.map((r) => r.index)).toEqual(want);
    expect(d.listed.some((r) => r.after.violated.includes("D1") && !r.before.violated.includes("D1"))).toBe(true);
    // The structure names the rule when it is added or changed.
    expect(structuralDiff(generatedDesign(10), a).rules.added).toEqual(["D1"]);
  });

  it("refuses to compare tables whose conditions differ", () => {
    const a = generatedDesign(8);
    const b = structuredClone(a);
    b.conditions[0]!.states = ["off", "on", "stuck"];
    expect(rowDiff(compileDesign(a), compileDesign(b)).comparable).toBe(false);
  });
});

describe("structuralDiff", () => {
  it("names added, removed and changed components, wires, rules and controller settings", () => {
    const a = generatedDesign(8);
    const b = structuredClone(a);
    (b.components.find((c) => c.id === "KEY") as { label: string }).label = "Key, two pole";
    b.components = b.components.filter((c) => c.id !== "BKB");
    b.wires = b.wires.filter((w) => !w.from.startsWith("BKB") && !w.to.startsWith("BKB"));
    b.wires.push({ from: "JP.j", to: "BKA.2" });
    b.rules = b.rules.filter((r) => r.id !== "brake");
    b.controller.lockouts = ["power-on"];
    const d = structuralDiff(a, b);
    expect(d.components).toEqual({
      added: [],
      removed: ["BKB"],
      changed: [{ id: "KEY", fields: ["label"], values: [{ field: "label", before: '"KEY"', after: '"Key, two pole"' }] }],
    });
    expect(d.wires.added).toEqual(["BKA.2 — JP.j"]);
    expect(d.wires.removed).toContain("BKB.1 — JP.j");
    expect(d.rules.removed).toEqual(["brake"]);
    expect(d.controller).toEqual(["lockouts"]);
    expect(d.controllerValues).toEqual([{ field: "lockouts", before: JSON.stringify(a.controller.lockouts), after: '["power-on"]' }]);
    expect(d.empty).toBe(false);
    expect(structuralDiff(a, structuredClone(a)).empty).toBe(true);
  });

  it("gives every changed field's value before and after, not just its name", () => {
    const a = generatedDesign(8);
    const b = structuredClone(a);
    const key = b.components.find((c) => c.id === "KEY") as { closedIn: string[] };
    key.closedIn = ["off", "on"];
    expect(structuralDiff(a, b).components.changed).toEqual([
      { id: "KEY", fields: ["closedIn"], values: [{ field: "closedIn", before: '["on"]', after: '["off","on"]' }] },
    ]);
  });

  it("does not count key order as a change, and counts a field that appears as one", () => {
    const a = generatedDesign(8);
    const b = structuredClone(a);
    // The same component with its keys written in reverse order: canonical JSON (RFC 8785) sorts them.
    b.components = b.components.map((c) => Object.fromEntries(Object.entries(c).reverse()) as typeof c);
    expect(structuralDiff(a, b).empty).toBe(true);
    const key = b.components.find((c) => c.id === "KEY") as { note?: string };
    key.note = "added";
    expect(structuralDiff(a, b).components.changed).toEqual([
      { id: "KEY", fields: ["note"], values: [{ field: "note", before: "(none)", after: '"added"' }] },
    ]);
  });
});
