import { describe, expect, it } from "vitest";
import { createEditorStore } from "../../../app/canvas/store";

const make = () => createEditorStore({ initial: {}, readOnly: false, designName: "Meadowline deck mower M-11", baseRevision: 0 });

describe("editor store", () => {
  it("undoes and redoes additions, wires and property edits as design snapshots", () => {
    const store = make();
    const s = store.getState;
    const b = s().addComponent("supply", { x: 0, y: 0 });
    const k = s().addComponent("contact", { x: 200, y: 0 });
    expect(s().connect({ source: b, sourceHandle: "+", target: k, targetHandle: "1" })).toBe(true);
    s().updateComponent(k, { label: "Seat switch" });
    expect(s().document().components.map((c) => c.id)).toEqual(["B1", "K1"]);
    expect(s().document().wires).toEqual([{ from: "B1.+", to: "K1.1" }]);

    s().undo();
    expect(s().document().components[1]).toMatchObject({ label: "Contact" });
    s().undo();
    expect(s().document().wires).toEqual([]);
    s().undo();
    expect(s().document().components.map((c) => c.id)).toEqual(["B1"]);
    s().redo();
    s().redo();
    s().redo();
    expect(s().document().components[1]).toMatchObject({ label: "Seat switch" });
    expect(s().document().wires).toEqual([{ from: "B1.+", to: "K1.1" }]);
    s().redo();
    expect(s().future).toHaveLength(0);
  });

  it("a new edit after undo clears the redo history", () => {
    const store = make();
    const s = store.getState;
    s().addComponent("supply", { x: 0, y: 0 });
    s().undo();
    expect(s().future).toHaveLength(1);
    s().addComponent("junction", { x: 0, y: 0 });
    expect(s().future).toHaveLength(0);
    expect(s().document().components).toEqual([{ id: "J1", type: "junction" }]);
  });

  it("deletes the selection with its wires, undoably", () => {
    const store = make();
    const s = store.getState;
    const b = s().addComponent("supply", { x: 0, y: 0 });
    const k = s().addComponent("contact", { x: 200, y: 0 });
    s().connect({ source: b, sourceHandle: "+", target: k, targetHandle: "1" });
    s().select(k);
    s().deleteSelected();
    expect(s().document().components.map((c) => c.id)).toEqual(["B1"]);
    expect(s().document().wires).toEqual([]);
    s().undo();
    expect(s().document().wires).toHaveLength(1);
  });

  it("refuses every edit when read-only", () => {
    const store = createEditorStore({ initial: {}, readOnly: true, designName: "x", baseRevision: 0 });
    const s = store.getState;
    expect(s().addComponent("supply", { x: 0, y: 0 })).toBe("");
    s().updateRest((r) => ({ ...r, name: "changed" }));
    expect(s().document().components).toEqual([]);
    expect(s().document().name).toBe("x");
  });

  it("renames a component everywhere it is referenced", () => {
    const store = make();
    const s = store.getState;
    const b = s().addComponent("supply", { x: 0, y: 0 });
    const en = s().addComponent("input", { x: 300, y: 0 }, "enable");
    s().connect({ source: b, sourceHandle: "+", target: en, targetHandle: "in" });
    s().updateRest((r) => ({ ...r, rules: [{ id: "R1", type: "inhibit", when: { always: true }, forbid: { energized: "EN" } }] }));
    expect(s().renameComponent("EN", "throttle")).toMatch(/condition/);
    expect(s().renameComponent("EN", "ENABLE")).toBeNull();
    const d = s().document();
    expect(d.wires).toEqual([{ from: "B1.+", to: "ENABLE.in" }]);
    expect(d.rules[0]).toMatchObject({ forbid: { energized: "ENABLE" } });
  });
});
