// The graph elkjs lays out, built without elkjs itself: layered left to right, supplies in the
// first layer, controller inputs in the last. Wires have no direction in the spec, so each is
// oriented away from the supplies (by wire distance) to give the layering a flow.
import { sizeOf } from "./node-kinds";
import type { CanvasEdge, CanvasNode, XY } from "./types";

export type LayoutGraph = {
  id: string;
  layoutOptions: Record<string, string>;
  children: Array<{ id: string; width: number; height: number; layoutOptions: Record<string, string> }>;
  edges: Array<{ id: string; sources: string[]; targets: string[] }>;
};
export type LayoutRequest = { id: number; graph: LayoutGraph };
export type LayoutReply = { id: number; positions: Record<string, XY> } | { id: number; error: string };

function distances(nodes: readonly CanvasNode[], edges: readonly CanvasEdge[]): Map<string, number> {
  const adj = new Map<string, string[]>();
  for (const e of edges) {
    adj.set(e.source, [...(adj.get(e.source) ?? []), e.target]);
    adj.set(e.target, [...(adj.get(e.target) ?? []), e.source]);
  }
  const dist = new Map<string, number>();
  const queue = nodes.filter((n) => n.type === "supply").map((n) => n.id);
  for (const id of queue) dist.set(id, 0);
  for (let i = 0; i < queue.length; i++) {
    for (const next of adj.get(queue[i]) ?? []) {
      if (!dist.has(next)) {
        dist.set(next, dist.get(queue[i])! + 1);
        queue.push(next);
      }
    }
  }
  return dist;
}

export function layoutGraph(nodes: readonly CanvasNode[], edges: readonly CanvasEdge[]): LayoutGraph {
  const dist = distances(nodes, edges);
  const far = (id: string) => dist.get(id) ?? Number.MAX_SAFE_INTEGER;
  const kind = new Map(nodes.map((n) => [n.id, n.type]));
  return {
    id: "root",
    layoutOptions: {
      "elk.algorithm": "layered",
      "elk.direction": "RIGHT",
      "elk.layered.spacing.nodeNodeBetweenLayers": "70",
      "elk.spacing.nodeNode": "40",
      "elk.layered.crossingMinimization.semiInteractive": "true",
    },
    children: nodes.map((n) => ({
      id: n.id,
      ...sizeOf(n),
      layoutOptions: (n.type === "supply"
        ? { "elk.layered.layering.layerConstraint": "FIRST" }
        : n.type === "input"
          ? { "elk.layered.layering.layerConstraint": "LAST" }
          : {}) as Record<string, string>,
    })),
    edges: edges.map((e) => {
      const forward = far(e.source) <= far(e.target) || kind.get(e.target) === "supply";
      const [s, t] = forward ? [e.source, e.target] : [e.target, e.source];
      return { id: e.id, sources: [s], targets: [t] };
    }),
  };
}

/** Top-left corners from elk's answer, in whole pixels. */
export function positionsOf(out: { children?: Array<{ id: string; x?: number; y?: number }> }): Record<string, XY> {
  const positions: Record<string, XY> = {};
  for (const c of out.children ?? []) positions[c.id] = { x: Math.round(c.x ?? 0), y: Math.round(c.y ?? 0) };
  return positions;
}
