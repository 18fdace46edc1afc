// Auto-layout off the main thread. elkjs (about 1.6 MB) is loaded only here, and this worker is
// started only when a layout is asked for, so opening the editor never downloads it.
import ELK from "elkjs/lib/elk.bundled.js";
import type { ElkNode } from "elkjs/lib/elk-api";
import { positionsOf, type LayoutReply, type LayoutRequest } from "./layout-graph";

const elk = new ELK();
// elkjs installs its own message handler when it finds itself in a worker; this one replaces it.
self.onmessage = async (event: MessageEvent<LayoutRequest>) => {
  const { id, graph } = event.data;
  let reply: LayoutReply;
  try {
    reply = { id, positions: positionsOf(await elk.layout(graph as ElkNode)) };
  } catch (e) {
    reply = { id, error: e instanceof Error ? e.message : String(e) };
  }
  (self as unknown as Worker).postMessage(reply);
};
