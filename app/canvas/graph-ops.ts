// Pure graph edits: which wires the spec can express, new components, series/parallel, duplicate.
import { TERMINALS, type InputFunction } from "../engine";
import type { Connection } from "@xyflow/react";
import { wireId, terminalRef } from "./convert";
import { freshId, ID_PREFIX, INPUT_ID } from "./ids";
import { NODE_KINDS } from "./nodes/registry";
import type { CanvasEdge, CanvasNode, ComponentKind, ContactNode, DesignRest, XY } from "./types";

export type ConnectionCheck = { ok: true; edge: CanvasEdge } | { ok: false; reason: string };

type Ends = Pick<Connection, "source" | "sourceHandle" | "target" | "targetHandle">;

/**
 * Whether a new wire may join two terminals. Refused: an end that is not a terminal of its
 * component; a terminal to itself; the two terminals of one component (a wire across a contact
 * would make it conduct always, which is a fault, not a design); and any wire between terminals
 * that wires already join into one net (a duplicate or a loop adds nothing to the nets).
 * Any number of wires may meet at one terminal.
 */
export function checkConnection(c: Ends, nodes: readonly CanvasNode[], edges: readonly CanvasEdge[]): ConnectionCheck {
  const a = nodes.find((n) => n.id === c.source);
  const b = nodes.find((n) => n.id === c.target);
  if (!a || !b) return { ok: false, reason: "both ends must be components on the canvas" };
  const ta = c.sourceHandle ?? "";
  const tb = c.targetHandle ?? "";
  if (!(TERMINALS[a.type] as readonly string[]).includes(ta) || !(TERMINALS[b.type] as readonly string[]).includes(tb)) {
    return { ok: false, reason: "a wire joins two terminals" };
  }
  if (a.id === b.id) {
    return { ok: false, reason: ta === tb ? "a wire cannot join a terminal to itself" : "a wire across one component's own terminals is not allowed" };
  }
  const from = terminalRef(a.id, ta);
  const to = terminalRef(b.id, tb);
  if (sameNet(from, to, edges)) return { ok: false, reason: "these terminals are already joined by wires" };
  return { ok: true, edge: { id: wireId(from, to), type: "wire", source: a.id, sourceHandle: ta, target: b.id, targetHandle: tb } };
}

function sameNet(x: string, y: string, edges: readonly CanvasEdge[]): boolean {
  const adj = new Map<string, string[]>();
  const link = (p: string, q: string) => adj.set(p, [...(adj.get(p) ?? []), q]);
  for (const e of edges) {
    const p = terminalRef(e.source, e.sourceHandle ?? "");
    const q = terminalRef(e.target, e.targetHandle ?? "");
    link(p, q);
    link(q, p);
  }
  const seen = new Set([x]);
  const stack = [x];
  while (stack.length) {
    const t = stack.pop()!;
    if (t === y) return true;
    for (const u of adj.get(t) ?? []) if (!seen.has(u)) (seen.add(u), stack.push(u));
  }
  return false;
}

function takenIds(nodes: readonly CanvasNode[], rest: DesignRest): Set<string> {
  return new Set([...nodes.map((n) => n.id), ...rest.conditions.map((c) => c.id)]);
}

export function newNode(kind: ComponentKind, position: XY, nodes: readonly CanvasNode[], rest: DesignRest, fn?: InputFunction): CanvasNode {
  const taken = takenIds(nodes, rest);
  const spec = NODE_KINDS[kind];
  const data = spec.defaultData({ rest, fn });
  const id =
    kind === "input"
      ? freshId(INPUT_ID[(data as { function: InputFunction }).function], taken, false)
      : freshId(ID_PREFIX[kind], taken);
  return { id, type: kind, position, data } as CanvasNode;
}

type Added = { nodes: CanvasNode[]; edges: CanvasEdge[]; added: string };

const edge = (from: [string, string], to: [string, string]): CanvasEdge => ({
  id: wireId(terminalRef(...from), terminalRef(...to)),
  type: "wire",
  source: from[0],
  sourceHandle: from[1],
  target: to[0],
  targetHandle: to[1],
});

function newContactNear(c: ContactNode, nodes: readonly CanvasNode[], rest: DesignRest, offset: XY): ContactNode {
  const n = newNode("contact", { x: c.position.x + offset.x, y: c.position.y + offset.y }, nodes, rest) as ContactNode;
  return n;
}

/** A new contact after `contactId`: whatever was wired to its terminal 2 moves to the new one's 2. */
export function addInSeries(contactId: string, nodes: readonly CanvasNode[], edges: readonly CanvasEdge[], rest: DesignRest): Added | null {
  const c = nodes.find((n) => n.id === contactId);
  if (!c || c.type !== "contact") return null;
  const n = newContactNear(c, nodes, rest, { x: 200, y: 0 });
  const moved = edges.map((e) => {
    if (e.source === c.id && e.sourceHandle === "2") return { ...e, source: n.id, id: wireId(terminalRef(n.id, "2"), terminalRef(e.target, e.targetHandle ?? "")) };
    if (e.target === c.id && e.targetHandle === "2") return { ...e, target: n.id, id: wireId(terminalRef(e.source, e.sourceHandle ?? ""), terminalRef(n.id, "2")) };
    return e;
  });
  return { nodes: [...nodes, n], edges: [...moved, edge([c.id, "2"], [n.id, "1"])], added: n.id };
}

/** A new contact across `contactId`: its terminals wired to the same two nets. */
export function addInParallel(contactId: string, nodes: readonly CanvasNode[], edges: readonly CanvasEdge[], rest: DesignRest): Added | null {
  const c = nodes.find((n) => n.id === contactId);
  if (!c || c.type !== "contact") return null;
  const n = newContactNear(c, nodes, rest, { x: 0, y: 120 });
  return { nodes: [...nodes, n], edges: [...edges, edge([c.id, "1"], [n.id, "1"]), edge([c.id, "2"], [n.id, "2"])], added: n.id };
}

/** Copies the selected components (and the wires among them) beside the originals, selecting the copies. */
export function duplicateNodes(nodes: readonly CanvasNode[], edges: readonly CanvasEdge[], rest: DesignRest): { nodes: CanvasNode[]; edges: CanvasEdge[] } | null {
  const picked = nodes.filter((n) => n.selected);
  if (picked.length === 0) return null;
  const taken = takenIds(nodes, rest);
  const rename = new Map<string, string>();
  const copies: CanvasNode[] = [];
  for (const n of picked) {
    // A second input of the same function would be invalid, so inputs are not copied.
    if (n.type === "input") continue;
    const id = freshId(ID_PREFIX[n.type], taken);
    taken.add(id);
    rename.set(n.id, id);
    copies.push({ ...n, id, selected: true, position: { x: n.position.x + 40, y: n.position.y + 40 }, data: structuredClone(n.data) } as CanvasNode);
  }
  if (copies.length === 0) return null;
  const copiedEdges = edges
    .filter((e) => rename.has(e.source) && rename.has(e.target))
    .map((e) => edge([rename.get(e.source)!, e.sourceHandle ?? ""], [rename.get(e.target)!, e.targetHandle ?? ""]));
  return {
    nodes: [...nodes.map((n) => (n.selected ? ({ ...n, selected: false } as CanvasNode) : n)), ...copies],
    edges: [...edges.map((e) => (e.selected ? { ...e, selected: false } : e)), ...copiedEdges],
  };
}
