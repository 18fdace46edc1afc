// What the editor knows about each component kind, without React: palette names, terminals,
// default data, the size a node is drawn at, and the words used for inputs and contacts. The
// node views (nodes/*.tsx) and the pure graph edits (graph-ops.ts) both read it, so neither
// depends on the other.
import { TERMINALS, type InputFunction } from "../engine/vocabulary";
import type { CanvasNode, ComponentKind, DesignRest } from "./types";

export const FUNCTION_LABEL: Record<InputFunction, string> = {
  power: "Power",
  enable: "Enable",
  forward: "Forward",
  reverse: "Reverse",
  brake: "Brake",
};

export type ContactSense = "normally-open" | "normally-closed" | "unknown";

/** NO or NC, from whether the contact conducts in the first (rest) state of its condition. */
export function contactSense(closedIn: readonly string[], states: readonly string[] | undefined): ContactSense {
  if (!states || states.length === 0) return "unknown";
  return closedIn.includes(states[0]) ? "normally-closed" : "normally-open";
}

export type KindInfo<K extends ComponentKind> = {
  kind: K;
  /** Palette name. */
  title: string;
  description: string;
  terminals: readonly string[];
  /** The size a node of this kind is drawn at before it is measured (flow pixels). */
  size: { width: number; height: number };
  defaultData(ctx: { rest: DesignRest; fn?: InputFunction }): Extract<CanvasNode, { type: K }>["data"];
};

export const KIND_INFO: { [K in ComponentKind]: KindInfo<K> } = {
  supply: {
    kind: "supply",
    title: "Supply",
    description: "Always-live source (+)",
    terminals: TERMINALS.supply,
    size: { width: 176, height: 56 },
    defaultData: () => ({ label: "Supply +" }),
  },
  contact: {
    kind: "contact",
    title: "Contact",
    description: "Switch contact on a condition",
    terminals: TERMINALS.contact,
    size: { width: 176, height: 112 },
    defaultData: ({ rest }) => {
      // The first condition that is not the throttle, closing in its second state (normally open).
      const c = rest.conditions.find((x) => x.id !== rest.controller.throttle.condition) ?? rest.conditions[0];
      return { label: "Contact", condition: c?.id ?? "", closedIn: c ? [c.states[1] ?? c.states[0]].filter(Boolean) : [] };
    },
  },
  junction: {
    kind: "junction",
    title: "Junction",
    description: "Tie point for several wires",
    terminals: TERMINALS.junction,
    size: { width: 24, height: 24 },
    defaultData: () => ({}),
  },
  input: {
    kind: "input",
    title: "Controller input",
    description: "Power, enable, forward, reverse or brake",
    terminals: TERMINALS.input,
    size: { width: 208, height: 60 },
    defaultData: ({ fn }) => {
      const f = fn ?? "enable";
      return { label: `${FUNCTION_LABEL[f]} input`, function: f };
    },
  },
};

/** A node's footprint: as measured on screen when it has been drawn, else its kind's size. */
export function sizeOf(n: Pick<CanvasNode, "type" | "measured">): { width: number; height: number } {
  return n.measured?.width && n.measured?.height ? { width: n.measured.width, height: n.measured.height } : KIND_INFO[n.type].size;
}
