// Auto-layout with elkjs: layered left to right, supplies in the first layer, controller inputs
// in the last. Wires have no direction in the spec, so each is oriented away from the supplies
// (by wire distance) to give the layering a flow.
import ELK from "elkjs/lib/elk.bundled.js";
import type { ElkExtendedEdge, ElkNode } from "elkjs/lib/elk-api";
import type { CanvasEdge, CanvasNode, XY } from "./types";

const SIZE: Record<CanvasNode["type"], { width: number; height: number }> = {
  supply: { width: 176, height: 56 },
  contact: { width: 176, height: 112 },
  junction: { width: 24, height: 24 },
  input: { width: 208, height: 60 },
};

let elk: InstanceType<typeof ELK> | null = null;

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

export async function autoLayout(nodes: readonly CanvasNode[], edges: readonly CanvasEdge[]): Promise<Record<string, XY>> {
  if (nodes.length === 0) return {};
  elk ??= new ELK();
  const dist = distances(nodes, edges);
  const far = (id: string) => dist.get(id) ?? Number.MAX_SAFE_INTEGER;
  const graph: ElkNode = {
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
      ...(n.measured?.width && n.measured?.height ? { width: n.measured.width, height: n.measured.height } : SIZE[n.type]),
      layoutOptions: (n.type === "supply"
          ? { "elk.layered.layering.layerConstraint": "FIRST" }
          : n.type === "input"
            ? { "elk.layered.layering.layerConstraint": "LAST" }
            : {}) as Record<string, string>,
    })),
    edges: edges.map((e): ElkExtendedEdge => {
      const forward = far(e.source) <= far(e.target) || nodes.find((n) => n.id === e.target)?.type === "supply";
      const [s, t] = forward ? [e.source, e.target] : [e.target, e.source];
      return { id: e.id, sources: [s], targets: [t] };
    }),
  };
  const out = await elk.layout(graph);
  const positions: Record<string, XY> = {};
  for (const c of out.children ?? []) positions[c.id] = { x: Math.round(c.x ?? 0), y: Math.round(c.y ?? 0) };
  return positions;
}
