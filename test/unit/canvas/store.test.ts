import { describe, expect, it } from "vitest";
import { createEditorStore } from "../../../app/canvas/store";

const make = () => createEditorStore({ initial: {}, readOnly: false, designName: "Meadowline deck mower M-11", baseRevision: 0 });

describe("editor store", () => {
  it("undoes and redoes additions, wires and property edits as design snapshots", () => {
    const store = make();
    const s = store.getState;
    const b = s().addComponent("supply", { x: 0, y: 0 });
    const k = s().addComponent("contact", { x: 200, y: 0 });
    expect(s().connect({ source: b, sourceHandle: "+", target: k, targetHandle: "1" })).toBeNull();
    s().updateComponent(k, { label: "Seat switch" });
    expect(
      s()
        .document()
        .components.map((c) => c.id),
    ).toEqual(["B1", "K1"]);
    expect(s().document().wires).toEqual([{ from: "B1.+", to: "K1.1" }]);

    s().undo();
    expect(s().document().components[1]).toMatchObject({ label: "Contact" });
    s().undo();
    expect(s().document().wires).toEqual([]);
    s().undo();
    expect(
      s()
        .document()
        .components.map((c) => c.id),
    ).toEqual(["B1"]);
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
    expect(
      s()
        .document()
        .components.map((c) => c.id),
    ).toEqual(["B1"]);
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

describe("editor store messages and shortcuts", () => {
  const hauler = () =>
    createEditorStore({
      initial: {
        format: "chainproof/design@1",
        name: "Haybarn campus hauler #3",
        conditions: [
          { id: "seat", states: ["empty", "occupied"] },
          { id: "throttle", states: ["released", "applied"] },
        ],
        components: [
          { id: "B1", type: "supply" },
          { id: "K1", type: "contact", condition: "seat", closedIn: ["occupied"] },
          { id: "EN", type: "input", function: "enable" },
          { id: "X1", type: "mystery" },
        ],
        wires: [
          { from: "B1.+", to: "K1.1" },
          { from: "K1.2", to: "EN.in" },
        ],
        controller: { throttle: { condition: "throttle", released: ["released"], applied: ["applied"] } },
        rules: [{ id: "R1", type: "inhibit", when: { cond: "seat", in: ["empty"] }, forbid: { energized: "EN" } }],
        layout: { B1: { x: 0, y: 0 }, K1: { x: 240, y: 0 }, EN: { x: 480, y: 0 } },
      },
      readOnly: false,
      designName: "Haybarn campus hauler #3",
      baseRevision: 0,
    });

  it("a refusal, a 'saved' banner and 'left out when opening' go with the next change of the design, undo included", () => {
    const store = hauler();
    const s = store.getState;
    expect(s().loadNotes).toHaveLength(1);
    s().setRefusal({ kind: "problems", problems: [{ path: "rules[0]", message: "R1 fails" }] });
    s().setBanner({ tone: "success", text: "Revision 2 saved" });
    s().setPositions({ K1: { x: 260, y: 0 } });
    expect(s().refusal).not.toBeNull(); // moving a part changes no meaning
    s().updateComponent("K1", { label: "Seat switch" });
    expect(s().refusal).toBeNull();
    expect(s().banner).toBeNull();
    expect(s().loadNotes).toEqual([]);
    s().setRefusal({ kind: "problems", problems: [{ path: "rules[0]", message: "R1 fails" }] });
    s().setBanner({ tone: "warning", text: "saved elsewhere", sticky: true });
    s().undo();
    expect(s().refusal).toBeNull();
    expect(s().banner?.text).toBe("saved elsewhere");
  });

  it("refuses an empty design name", () => {
    const store = hauler();
    expect(store.getState().setDesignName("   ")).toBe("a design needs a name");
    expect(store.getState().document().name).toBe("Haybarn campus hauler #3");
    expect(store.getState().past).toHaveLength(0);
  });

  it("selects all, copies and pastes beside the originals with fresh ids and the wires among them, as one undo step", () => {
    const store = hauler();
    const s = store.getState;
    s().select("K1");
    expect(s().copySelected()).toBe(1);
    expect(s().paste()).toEqual(["K2"]);
    expect(
      s()
        .nodes.filter((n) => n.selected)
        .map((n) => n.id),
    ).toEqual(["K2"]);
    s().undo();
    expect(
      s()
        .document()
        .components.map((c) => c.id),
    ).toEqual(["B1", "K1", "EN"]);
    s().selectAll();
    expect(s().nodes.every((n) => n.selected) && s().edges.every((e) => e.selected)).toBe(true);
    s().copySelected();
    const added = s().paste();
    // The enable input is not pasted: a second one would be invalid.
    expect(added).toEqual(["B2", "K2"]);
    expect(s().canvasNote?.text).toMatch(/input was not pasted/);
    expect(s().document().wires).toContainEqual({ from: "B2.+", to: "K2.1" });
  });

  it("refuses to delete an input a rule names, saying which rule", () => {
    const store = hauler();
    store.getState().select("EN");
    expect(store.getState().deleteSelected()).toBe("rule R1 names EN: change the rule first");
    expect(
      store
        .getState()
        .document()
        .components.map((c) => c.id),
    ).toContain("EN");
    expect(store.getState().canvasNote?.text).toBe("Not deleted: rule R1 names EN: change the rule first.");
  });

  it("wires by clicking one terminal and then another; a refused wire says why", () => {
    const store = hauler();
    const s = store.getState;
    s().clickTerminal({ component: "K1", terminal: "1" });
    expect(s().pendingWire).toEqual({ component: "K1", terminal: "1" });
    s().clickTerminal({ component: "K1", terminal: "2" });
    expect(s().pendingWire).toBeNull();
    expect(s().canvasNote).toEqual({
      tone: "error",
      text: "No wire from K1.1 to K1.2: a wire across one component's own terminals is not allowed.",
    });
    s().clickTerminal({ component: "K1", terminal: "1" });
    s().clickTerminal({ component: "B1", terminal: "+" });
    expect(s().canvasNote?.text).toBe("No wire from K1.1 to B1.+: these terminals are already joined by wires.");
    const before = s().document().wires.length;
    s().addComponent("junction", { x: 0, y: 200 });
    s().clickTerminal({ component: "J1", terminal: "j" });
    s().clickTerminal({ component: "B1", terminal: "+" });
    expect(s().document().wires).toHaveLength(before + 1);
    expect(s().canvasNote?.text).toBe("Wired J1.j to B1.+.");
  });
});
