// The editor's `?row=` parameter: parsed strictly, checked against the design's truth table, and
// opened as a simulation of that row with the engine's own evaluation.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { compileDesign, evaluateRow, validateDesign } from "../../../app/engine";
import { parseRowParam, rowStart, viewFor } from "../../../app/canvas/simulation";
import { createEditorStore } from "../../../app/canvas/store";

const hauler = JSON.parse(readFileSync(new URL("../../../drizzle/demo-designs/haybarn-campus-hauler.json", import.meta.url), "utf8"));
const v = validateDesign(hauler);
if (!v.ok) throw new Error("the demo hauler design should be valid");
const compiled = compileDesign(v.design);
const rows = compiled.rows;

describe("parseRowParam", () => {
  it("reads absent, zero and plain decimal indexes", () => {
    expect(parseRowParam(null)).toEqual({ kind: "none" });
    expect(parseRowParam(undefined)).toEqual({ kind: "none" });
    expect(parseRowParam("0")).toEqual({ kind: "index", index: 0 });
    expect(parseRowParam("17")).toEqual({ kind: "index", index: 17 });
    expect(parseRowParam(" 5 ")).toEqual({ kind: "index", index: 5 });
  });

  it("refuses anything that is not a plain non-negative integer", () => {
    for (const raw of ["", "-1", "1.5", "1e3", "0x10", "07", "abc", "12abc", "Infinity", "99999999999999999"]) {
      expect(parseRowParam(raw), raw).toMatchObject({ kind: "bad" });
    }
  });

  it("shortens a long bad value for the notice", () => {
    const r = parseRowParam("x".repeat(200));
    expect(r.kind === "bad" && r.text.length).toBe(25);
  });
});

describe("rowStart", () => {
  it("simulates an in-range row with the states the engine decodes for it", () => {
    const index = rows - 1;
    const start = rowStart(String(index), v.design);
    expect(start.notice).toBeNull();
    expect(start.simulation?.source).toEqual({ kind: "row", index });
    const row = evaluateRow(compiled, index);
    expect(start.simulation?.states).toEqual(row.states);
    // The canvas draws what the engine evaluates for that row.
    const view = viewFor(compiled, start.simulation!);
    expect(view.drive).toBe(row.drive);
    expect(view.contacts).toEqual(row.contacts);
  });

  it("ignores an out-of-range row with a notice naming the range", () => {
    const start = rowStart(String(rows), v.design);
    expect(start.simulation).toBeNull();
    expect(start.notice).toContain(`no row ${rows}`);
    expect(start.notice).toContain(`rows 0 to ${rows - 1}`);
  });

  it("ignores a bad value with a notice, and says nothing when no row is asked", () => {
    expect(rowStart("soon", v.design)).toEqual({ simulation: null, notice: expect.stringContaining("“soon” is not a row number") });
    expect(rowStart(null, v.design)).toEqual({ simulation: null, notice: null });
  });

  it("ignores a row of a design that cannot be compiled", () => {
    const broken = { ...v.design, wires: [{ from: "nowhere.1", to: "K9.2" }] };
    const start = rowStart("0", broken);
    expect(start.simulation).toBeNull();
    expect(start.notice).toContain("problems");
  });
});

describe("editor store opened with a row", () => {
  it("starts in simulation on the Simulate panel; a reviewer's read-only store too", () => {
    for (const readOnly of [false, true]) {
      const store = createEditorStore({ initial: hauler, readOnly, designName: "Haybarn", baseRevision: 1, row: "3" });
      expect(store.getState().openRow).toBe("3");
      store.getState().startAt(rowStart(store.getState().openRow, store.getState().document()));
      const s = store.getState();
      expect(s.panel).toBe("simulate");
      expect(s.simulation).toEqual({ states: evaluateRow(compiled, 3).states, source: { kind: "row", index: 3 } });
      expect(s.banner).toBeNull();
      expect(s.openRow).toBeNull();
    }
  });

  it("opens for editing with the notice when the row is bad", () => {
    const store = createEditorStore({ initial: hauler, readOnly: false, designName: "Haybarn", baseRevision: 1, row: "-2" });
    store.getState().startAt(rowStart(store.getState().openRow, store.getState().document()));
    const s = store.getState();
    expect(s.simulation).toBeNull();
    expect(s.panel).toBe("properties");
    expect(s.banner?.text).toContain("not a row number");
  });
});

describe("editor store and the revision it opened", () => {
  it("calls a draft that differs from its base revision a draft, and one that equals it the revision", () => {
    const changed = createEditorStore({
      initial: hauler,
      readOnly: false,
      designName: "Haybarn",
      baseRevision: 1,
      initialIsRevision: false,
    }).getState();
    expect(changed.revision).toEqual({ number: 1, key: null });
    const same = createEditorStore({ initial: hauler, readOnly: false, designName: "Haybarn", baseRevision: 1 }).getState();
    expect(same.revision.key).not.toBeNull();
  });
});
