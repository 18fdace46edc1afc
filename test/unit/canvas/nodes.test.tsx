// @vitest-environment jsdom
// How parts are drawn: a supply with Chainproof's own supply mark (not the earth symbol of three
// shrinking bars), and, in the fault view, the contact held stuck marked with how it is stuck.
import { afterEach, describe, expect, it } from "vitest";
import { cleanup, render, screen } from "@testing-library/react";
import { ReactFlowProvider, type NodeProps } from "@xyflow/react";
import { ContactNodeView } from "../../../app/canvas/nodes/contact";
import { SupplyMark } from "../../../app/canvas/nodes/supply";
import { createEditorStore, EditorContext } from "../../../app/canvas/store";
import type { ContactNode } from "../../../app/canvas/types";

afterEach(cleanup);

/** Horizontal strokes of a path's "M x y h w" segments, as [y, width]. */
const bars = (svg: Element) =>
  [...svg.querySelectorAll("path")].flatMap((p) =>
    [...(p.getAttribute("d") ?? "").matchAll(/M\s*[\d.]+\s+([\d.]+)\s*h\s*([\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])]),
  );

describe("node drawings", () => {
  it("draws a supply with its own mark, named for what it is, and not as an earth symbol", () => {
    render(<SupplyMark live={false} />);
    const svg = screen.getByRole("img", { name: "Supply, always live" });
    expect(svg.getAttribute("data-symbol")).toBe("supply");
    // Earth (IEC 60417-5017, from memory): three or more stacked bars, each shorter than the one above.
    const stacked = bars(svg).sort((a, b) => a[0] - b[0]);
    const shrinking = stacked.length >= 3 && stacked.every((b, i) => i === 0 || (b[0] > stacked[i - 1][0] && b[1] < stacked[i - 1][1]));
    expect(shrinking).toBe(false);
  });

  it("marks the contact held stuck in the fault view, and no other", () => {
    const store = createEditorStore({
      initial: {
        format: "chainproof/design@1",
        name: "Meadowline deck mower M-11",
        conditions: [
          { id: "seat", states: ["empty", "occupied"] },
          { id: "throttle", states: ["released", "applied"] },
        ],
        components: [
          { id: "K1", type: "contact", condition: "seat", closedIn: ["occupied"] },
          { id: "K2", type: "contact", condition: "seat", closedIn: ["occupied"] },
        ],
        wires: [],
        controller: { throttle: { condition: "throttle", released: ["released"], applied: ["applied"] } },
        rules: [],
      },
      readOnly: true,
      designName: "Meadowline deck mower M-11",
      baseRevision: 0,
    });
    store.getState().setSimView({
      contacts: { K1: true, K2: false },
      inputs: {},
      energized: new Set(),
      drive: false,
      fault: { component: "K1", mode: "stuck-closed" },
    });
    const props = (id: string) =>
      ({ id, type: "contact", data: { condition: "seat", closedIn: ["occupied"] }, selected: false }) as unknown as NodeProps<ContactNode>;
    render(
      <EditorContext.Provider value={store}>
        <ReactFlowProvider>
          <ContactNodeView {...props("K1")} />
          <ContactNodeView {...props("K2")} />
        </ReactFlowProvider>
      </EditorContext.Provider>,
    );
    expect(screen.getByTestId("stuck-K1").textContent).toBe("Stuck closed");
    expect(screen.getByTestId("node-K1").getAttribute("data-stuck")).toBe("stuck-closed");
    expect(screen.queryByTestId("stuck-K2")).toBeNull();
  });
});
