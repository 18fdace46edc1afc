// @vitest-environment jsdom
// The rule picker's "Must drive when …" (a require-drive rule, spec 1.1 section 1.6) with the live
// proof beside it: a new rule that matches no row is shown at the rule at once; once it names a
// situation, a design that does not drive there shows the rule failing with its counterexample row
// (checked against the independent row-by-row reference, not the engine); fixing the wiring makes
// it hold. A design that never drives says so in the status line even when every rule holds.
import { afterEach, describe, expect, it } from "vitest";
import { act, cleanup, fireEvent, render, screen, waitFor, within } from "@testing-library/react";
import type { Design, Predicate } from "../../../app/engine";
import { createEditorStore, EditorContext, type EditorStore } from "../../../app/canvas/store";
import { useLiveProof } from "../../../app/canvas/hooks";
import { RulesPanel } from "../../../app/canvas/panels/rules-panel";
import { ProblemsPanel } from "../../../app/canvas/panels/problems-panel";
import { StatusBar } from "../../../app/canvas/status-bar";
import { refHolds, refRow } from "../engine/reference";

afterEach(cleanup);

/** Seat switch feeding the enable input; `closedIn` decides whether it drives with the seat occupied. */
function cart(closedIn: string[], wired = true): Design {
  return {
    format: "chainproof/design@1",
    name: "Rules panel cart",
    conditions: [
      { id: "seat", label: "Operator seat", states: ["empty", "occupied"] },
      { id: "throttle", label: "Throttle", states: ["released", "applied"] },
    ],
    components: [
      { id: "BAT", type: "supply", label: "Battery +" },
      { id: "S1", type: "contact", label: "Seat switch", condition: "seat", closedIn },
      { id: "EN", type: "input", label: "Enable", function: "enable" },
    ],
    wires: wired
      ? [
          { from: "BAT.+", to: "S1.1" },
          { from: "S1.2", to: "EN.in" },
        ]
      : [],
    controller: {
      throttle: { condition: "throttle", released: ["released"], applied: ["applied"], fault: [] },
      brakeCutsDrive: true,
      lockouts: [],
    },
    rules: [],
    layout: { BAT: { x: 0, y: 0 }, S1: { x: 200, y: 0 }, EN: { x: 400, y: 0 } },
  };
}

function Editor() {
  useLiveProof();
  return (
    <>
      <RulesPanel />
      <ProblemsPanel />
      <StatusBar draft={{ kind: "saved" }} readOnly={false} />
    </>
  );
}

function open(design: Design): EditorStore {
  const store = createEditorStore({ initial: design, readOnly: false, designName: design.name, baseRevision: 0 });
  render(
    <EditorContext.Provider value={store}>
      <Editor />
    </EditorContext.Provider>,
  );
  return store;
}

const proofText = () => screen.getByTestId("proof-status").textContent ?? "";

describe("Must drive when … in the rule picker", () => {
  it("adds a require-drive rule, shows it matching no row at the rule, then failing with a real counterexample, then holding", async () => {
    // The seat switch is wired the wrong way round: closed with the seat empty.
    const store = open(cart(["empty"]));
    await waitFor(() => expect(proofText()).toMatch(/Proven/));

    fireEvent.click(screen.getByRole("button", { name: "+ Must drive when …" }));
    const card = screen.getByTestId("rule-D1");
    expect(store.getState().rest.rules).toEqual([{ id: "D1", label: "", type: "require-drive", when: { cond: "seat", in: [] } }]);
    // No state picked yet: the rule demands drive in no row, said at the rule itself (spec 1.6, 1.1).
    await waitFor(() => expect(within(card).getByRole("alert").textContent).toMatch(/rules\[0\]\.when.*holds in no row/));
    expect(proofText()).toMatch(/1 problem to fix/);

    // Must drive when all of: seat occupied, throttle applied.
    fireEvent.change(within(card).getByLabelText("Must drive when"), { target: { value: "all" } });
    const first = card.querySelector('[data-path="rules[0].when.all[0]"]') as HTMLElement;
    fireEvent.click(within(first).getByRole("button", { name: "occupied" }));
    fireEvent.click(within(card).getByRole("button", { name: "+ Condition test" }));
    const second = card.querySelector('[data-path="rules[0].when.all[1]"]') as HTMLElement;
    fireEvent.change(within(second).getByLabelText("Condition"), { target: { value: "throttle" } });
    fireEvent.click(within(second).getByRole("button", { name: "applied" }));
    const when: Predicate = {
      all: [
        { cond: "seat", in: ["occupied"] },
        { cond: "throttle", in: ["applied"] },
      ],
    };
    expect((store.getState().rest.rules[0] as { when: Predicate }).when).toEqual(when);

    const failing = await screen.findByTestId("failing-D1");
    expect(within(screen.getByTestId("rule-D1")).queryByRole("alert")).toBeNull();
    expect(failing.textContent).toMatch(/1 of 1 rows where it must drive have the drive off/);
    expect(proofText()).toMatch(/1 of 1 rule fails/);
    // The row it shows is a demand row without drive, by the independent reference (spec 1.4, 1.6).
    const shown = /For example: (.*)$/.exec(failing.querySelector("p")!.textContent!)![1];
    const example = Object.fromEntries(shown.split(", ").map((kv) => kv.split(" = ")));
    expect(example).toEqual({ seat: "occupied", throttle: "applied" });
    const doc = store.getState().document();
    expect(refHolds(when, example)).toBe(true);
    expect(refRow(doc, example).drive).toBe(false);

    // It opens on the canvas as a row where the vehicle must drive and does not.
    fireEvent.click(within(failing).getByRole("button", { name: "Show this row on the canvas" }));
    expect(store.getState().simulation?.states).toEqual(example);
    act(() => store.getState().simulate(null));

    // Wire the seat switch the right way: the rule holds, by the reference in every demand row too.
    act(() => store.getState().updateComponent("S1", { closedIn: ["occupied"] }));
    await screen.findByText("Every rule holds.");
    expect(screen.queryByTestId("failing-D1")).toBeNull();
    expect(proofText()).toMatch(/Proven: every rule holds/);
    const fixed = store.getState().document();
    for (const seat of ["empty", "occupied"]) {
      for (const throttle of ["released", "applied"]) {
        if (refHolds(when, { seat, throttle })) expect(refRow(fixed, { seat, throttle }).drive).toBe(true);
      }
    }
  });

  it("says a design that never drives proves nothing, even with every rule holding", async () => {
    // Nothing wired to the enable input: no row drives (spec 2: ok needs driveRows > 0).
    const design = {
      ...cart(["occupied"], false),
      rules: [
        {
          id: "R1",
          label: "No drive with the seat empty",
          type: "inhibit" as const,
          when: { cond: "seat", in: ["empty"] },
          forbid: "drive" as const,
        },
      ],
    };
    for (const seat of ["empty", "occupied"])
      for (const throttle of ["released", "applied"]) expect(refRow(design, { seat, throttle }).drive).toBe(false);
    open(design);
    await waitFor(() => expect(proofText()).toMatch(/Never drives: proves nothing/));
    expect(screen.getByTestId("never-drives").textContent).toMatch(/never drives/);
    expect(proofText()).not.toMatch(/Proven/);
  });

  it("removes a require-drive rule with its button, and renames it as one step", async () => {
    const store = open({
      ...cart(["occupied"]),
      rules: [{ id: "D1", label: "Drives seated", type: "require-drive", when: { cond: "seat", in: ["occupied"] } }],
    });
    expect(screen.getByTestId("rule-D1")).toBeTruthy();
    fireEvent.click(screen.getByRole("button", { name: "Remove rule D1" }));
    expect(store.getState().rest.rules).toEqual([]);
    act(() => store.getState().undo());
    expect(store.getState().rest.rules.map((r) => r.type)).toEqual(["require-drive"]);
  });
});
