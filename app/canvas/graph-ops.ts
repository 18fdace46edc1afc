// Pure graph edits: which wires the spec can express, new components, series/parallel,
// duplicate, copy and paste. New parts land in free space (placement.ts).
import { TERMINALS, type InputFunction } from "../engine/vocabulary";
import type { Connection } from "@xyflow/react";
import { wireId, terminalRef } from "./convert";
import { freshId, ID_PREFIX, INPUT_ID } from "./ids";
import { KIND_INFO, sizeOf } from "./node-kinds";
import { freeSpot, PLACE_MARGIN } from "./placement";
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
    return {
      ok: false,
      reason: ta === tb ? "a wire cannot join a terminal to itself" : "a wire across one component's own terminals is not allowed",
    };
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
    for (const u of adj.get(t) ?? []) {
      if (!seen.has(u)) {
        seen.add(u);
        stack.push(u);
      }
    }
  }
  return false;
}

function takenIds(nodes: readonly CanvasNode[], rest: DesignRest): Set<string> {
  return new Set([...nodes.map((n) => n.id), ...rest.conditions.map((c) => c.id)]);
}

/**
 * A new component of `kind` at the free spot nearest `position` (its top-left corner), with a
 * fresh id. `prefer` is the direction searched first when `position` is taken.
 */
export function newNode(
  kind: ComponentKind,
  position: XY,
  nodes: readonly CanvasNode[],
  rest: DesignRest,
  fn?: InputFunction,
  prefer?: XY,
): CanvasNode {
  const taken = takenIds(nodes, rest);
  const info = KIND_INFO[kind];
  const data = info.defaultData({ rest, fn });
  const id =
    kind === "input" ? freshId(INPUT_ID[(data as { function: InputFunction }).function], taken, false) : freshId(ID_PREFIX[kind], taken);
  const spot = freeSpot(position, [{ dx: 0, dy: 0, ...info.size }], nodes, prefer);
  return { id, type: kind, position: spot, data } as CanvasNode;
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

/** A new contact in the free spot nearest `side` of `c`. */
function newContactNear(c: ContactNode, nodes: readonly CanvasNode[], rest: DesignRest, side: "right" | "below"): ContactNode {
  const size = sizeOf(c);
  const gap = PLACE_MARGIN * 2;
  const wanted =
    side === "right" ? { x: c.position.x + size.width + gap, y: c.position.y } : { x: c.position.x, y: c.position.y + size.height + gap };
  return newNode("contact", wanted, nodes, rest, undefined, side === "right" ? { x: 1, y: 0 } : { x: 0, y: 1 }) as ContactNode;
}

/** A new contact after `contactId`: whatever was wired to its terminal 2 moves to the new one's 2. */
export function addInSeries(contactId: string, nodes: readonly CanvasNode[], edges: readonly CanvasEdge[], rest: DesignRest): Added | null {
  const c = nodes.find((n) => n.id === contactId);
  if (!c || c.type !== "contact") return null;
  const n = newContactNear(c, nodes, rest, "right");
  const moved = edges.map((e) => {
    if (e.source === c.id && e.sourceHandle === "2")
      return { ...e, source: n.id, id: wireId(terminalRef(n.id, "2"), terminalRef(e.target, e.targetHandle ?? "")) };
    if (e.target === c.id && e.targetHandle === "2")
      return { ...e, target: n.id, id: wireId(terminalRef(e.source, e.sourceHandle ?? ""), terminalRef(n.id, "2")) };
    return e;
  });
  return { nodes: [...nodes, n], edges: [...moved, edge([c.id, "2"], [n.id, "1"])], added: n.id };
}

/** A new contact across `contactId`: its terminals wired to the same two nets. */
export function addInParallel(
  contactId: string,
  nodes: readonly CanvasNode[],
  edges: readonly CanvasEdge[],
  rest: DesignRest,
): Added | null {
  const c = nodes.find((n) => n.id === contactId);
  if (!c || c.type !== "contact") return null;
  const n = newContactNear(c, nodes, rest, "below");
  return { nodes: [...nodes, n], edges: [...edges, edge([c.id, "1"], [n.id, "1"]), edge([c.id, "2"], [n.id, "2"])], added: n.id };
}

/** What Copy keeps: components (inputs included) and the wires among them. */
export type Clip = { nodes: CanvasNode[]; edges: CanvasEdge[] };

export function copyOf(nodes: readonly CanvasNode[], edges: readonly CanvasEdge[]): Clip | null {
  const picked = nodes.filter((n) => n.selected);
  if (picked.length === 0) return null;
  const ids = new Set(picked.map((n) => n.id));
  return {
    nodes: picked.map((n) => structuredClone({ ...n, selected: false }) as CanvasNode),
    edges: edges.filter((e) => ids.has(e.source) && ids.has(e.target)).map((e) => ({ ...e, selected: false })),
  };
}

/**
 * Places copies of `clip` beside `anchor` (default: right of the copied parts) in free space, with
 * fresh ids, and selects them. An input whose function the design already has is left out (a
 * second one would be invalid); the count of those is returned so the editor can say so.
 */
export function pasteClip(
  clip: Clip,
  nodes: readonly CanvasNode[],
  edges: readonly CanvasEdge[],
  rest: DesignRest,
  anchor?: XY,
): { nodes: CanvasNode[]; edges: CanvasEdge[]; added: string[]; skippedInputs: number } | null {
  const taken = takenIds(nodes, rest);
  const usedFunctions = new Set(nodes.flatMap((n) => (n.type === "input" ? [n.data.function] : [])));
  const rename = new Map<string, string>();
  const copies: CanvasNode[] = [];
  let skippedInputs = 0;
  for (const n of clip.nodes) {
    if (n.type === "input") {
      if (usedFunctions.has(n.data.function)) {
        skippedInputs++;
        continue;
      }
      usedFunctions.add(n.data.function);
    }
    const id = n.type === "input" ? freshId(INPUT_ID[n.data.function], taken, false) : freshId(ID_PREFIX[n.type], taken);
    taken.add(id);
    rename.set(n.id, id);
    copies.push({
      id,
      type: n.type,
      position: n.position,
      data: structuredClone(n.data),
      selected: true,
      ...(n.measured ? { measured: n.measured } : {}),
    } as CanvasNode);
  }
  if (copies.length === 0) return skippedInputs > 0 ? { nodes: [...nodes], edges: [...edges], added: [], skippedInputs } : null;
  // The group keeps its shape; it moves as a whole to the nearest spot where none of it overlaps.
  const left = Math.min(...copies.map((n) => n.position.x));
  const top = Math.min(...copies.map((n) => n.position.y));
  const right = Math.max(...copies.map((n) => n.position.x + sizeOf(n).width));
  const group = copies.map((n) => ({ dx: n.position.x - left, dy: n.position.y - top, ...sizeOf(n) }));
  const at = freeSpot(anchor ?? { x: right + PLACE_MARGIN * 2, y: top }, group, nodes);
  const placed = copies.map((n, i) => ({ ...n, position: { x: at.x + group[i].dx, y: at.y + group[i].dy } }) as CanvasNode);
  const copiedEdges = clip.edges
    .filter((e) => rename.has(e.source) && rename.has(e.target))
    .map((e) => ({
      ...edge([rename.get(e.source)!, e.sourceHandle ?? ""], [rename.get(e.target)!, e.targetHandle ?? ""]),
      selected: false,
    }));
  return {
    nodes: [...nodes.map((n) => (n.selected ? ({ ...n, selected: false } as CanvasNode) : n)), ...placed],
    edges: [...edges.map((e) => (e.selected ? { ...e, selected: false } : e)), ...copiedEdges],
    added: placed.map((n) => n.id),
    skippedInputs,
  };
}

/** Copies the selected components (and the wires among them) beside the originals, selecting the copies. Inputs are not copied. */
export function duplicateNodes(
  nodes: readonly CanvasNode[],
  edges: readonly CanvasEdge[],
  rest: DesignRest,
): { nodes: CanvasNode[]; edges: CanvasEdge[] } | null {
  const clip = copyOf(nodes, edges);
  if (!clip) return null;
  // A second input of the same function would be invalid, so Duplicate leaves inputs out.
  const kept = { nodes: clip.nodes.filter((n) => n.type !== "input"), edges: clip.edges };
  if (kept.nodes.length === 0) return null;
  const out = pasteClip(kept, nodes, edges, rest);
  return out && out.added.length > 0 ? { nodes: out.nodes, edges: out.edges } : null;
}
