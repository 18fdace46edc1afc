// The component palette: drag a part onto the canvas, or press it to add one in the free space
// nearest the middle of the view.
import { useReactFlow } from "@xyflow/react";
import { INPUT_FUNCTIONS, type InputFunction } from "../engine/vocabulary";
import { FUNCTION_LABEL, KIND_INFO } from "./node-kinds";
import { useEditor, useEditorStore } from "./store";
import type { ComponentKind } from "./types";
import { Button } from "../components/ui/button";

export const DRAG_TYPE = "application/x-chainproof-component";

const PALETTE: Array<{ kind: ComponentKind; fn?: InputFunction; title: string; hint: string }> = [
  { kind: "supply", title: KIND_INFO.supply.title, hint: KIND_INFO.supply.description },
  { kind: "contact", title: KIND_INFO.contact.title, hint: KIND_INFO.contact.description },
  { kind: "junction", title: KIND_INFO.junction.title, hint: KIND_INFO.junction.description },
  ...INPUT_FUNCTIONS.map((fn) => ({ kind: "input" as const, fn, title: `${FUNCTION_LABEL[fn]} input`, hint: "Controller input" })),
];

export function Palette() {
  const store = useEditorStore();
  const editable = useEditor((s) => s.simulation === null);
  const usedFunctions = useEditor((s) =>
    s.nodes
      .filter((n) => n.type === "input")
      .map((n) => (n.data as { function: string }).function)
      .join(","),
  );
  const { screenToFlowPosition } = useReactFlow();
  const addAtCentre = (kind: ComponentKind, fn?: InputFunction) => {
    const pane = document.querySelector(".cp-editor .react-flow")?.getBoundingClientRect();
    const p = pane ? screenToFlowPosition({ x: pane.left + pane.width / 2, y: pane.top + pane.height / 2 }) : { x: 0, y: 0 };
    const size = KIND_INFO[kind].size;
    store.getState().addComponent(kind, { x: Math.round(p.x - size.width / 2), y: Math.round(p.y - size.height / 2) }, fn);
  };
  return (
    <nav
      aria-label="Component palette"
      className="flex-none border-b border-ink-200 bg-ink-50 p-2 md:w-36 md:overflow-y-auto md:border-r md:border-b-0"
    >
      <h2 className="mb-1 text-xs font-bold uppercase tracking-wide text-ink-500">Components</h2>
      <p className="mb-2 text-[11px] text-ink-500">Drag onto the canvas, or press to add.</p>
      <ul className="flex flex-wrap gap-1 md:block md:space-y-1">
        {PALETTE.map((item) => {
          const taken = item.kind === "input" && usedFunctions.split(",").includes(item.fn!);
          return (
            <li key={`${item.kind}:${item.fn ?? ""}`}>
              <Button
                type="button"
                variant="secondary"
                size="sm"
                draggable={editable && !taken}
                disabled={!editable || taken}
                data-testid={`palette-${item.kind}${item.fn ? `-${item.fn}` : ""}`}
                title={taken ? "A design has at most one input per function" : item.hint}
                onDragStart={(e) => {
                  e.dataTransfer.setData(DRAG_TYPE, item.fn ? `${item.kind}:${item.fn}` : item.kind);
                  e.dataTransfer.effectAllowed = "copy";
                }}
                onClick={() => addAtCentre(item.kind, item.fn)}
                className="cursor-grab justify-start text-left disabled:opacity-50 md:w-full"
              >
                {item.title}
              </Button>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
