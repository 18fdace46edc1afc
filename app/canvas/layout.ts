// Auto-layout with elkjs, in a worker started on the first request (layout.worker.ts). Where
// there are no workers (unit tests), elkjs is imported on demand and runs here.
import { layoutGraph, positionsOf, type LayoutGraph, type LayoutReply } from "./layout-graph";
import type { CanvasEdge, CanvasNode, XY } from "./types";

let worker: Worker | null = null;
let next = 0;
const waiting = new Map<number, (r: LayoutReply) => void>();

function layoutWorker(): Worker | null {
  if (typeof Worker === "undefined") return null;
  if (!worker) {
    try {
      worker = new Worker(new URL("./layout.worker.ts", import.meta.url), { type: "module" });
    } catch {
      return null;
    }
    worker.onmessage = (e: MessageEvent<LayoutReply>) => {
      waiting.get(e.data.id)?.(e.data);
      waiting.delete(e.data.id);
    };
    // A worker that fails to load answers every waiting request with the reason.
    worker.onerror = (e) => {
      for (const [id, answer] of waiting) answer({ id, error: e.message || "the layout worker did not start" });
      waiting.clear();
      worker = null;
    };
  }
  return worker;
}

async function layoutHere(graph: LayoutGraph): Promise<Record<string, XY>> {
  const { default: ELK } = await import("elkjs/lib/elk.bundled.js");
  return positionsOf(await new ELK().layout(graph));
}

export async function autoLayout(nodes: readonly CanvasNode[], edges: readonly CanvasEdge[]): Promise<Record<string, XY>> {
  if (nodes.length === 0) return {};
  const graph = layoutGraph(nodes, edges);
  const w = layoutWorker();
  if (!w) return layoutHere(graph);
  const id = ++next;
  const reply = await new Promise<LayoutReply>((resolve) => {
    waiting.set(id, resolve);
    w.postMessage({ id, graph });
  });
  if ("error" in reply) throw new Error(`auto-layout failed: ${reply.error}`);
  return reply.positions;
}
