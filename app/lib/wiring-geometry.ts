// Where the parts and wires of a design's wiring drawing go (no React, no DOM): boxes at the canvas
// positions (document.layout) or, without them, in columns by wire hops from the supplies; or one
// column for a phone's width and for paper. The drawing (components/wiring-diagram.tsx) renders it;
// the report sizes its printed diagram with it (reviews/paper-diagram.ts, decision 166).
import type { Design } from "~/engine";

type Kind = "supply" | "contact" | "junction" | "input";
type Box = { id: string; type: Kind; label: string; x: number; y: number; w: number; h: number; detail: string };
type Point = { x: number; y: number; side: "left" | "right" | "top" | "bottom" | "centre" };

const SIZE: Record<Kind, { w: number; h: number }> = {
  supply: { w: 150, h: 60 },
  contact: { w: 176, h: 84 },
  junction: { w: 16, h: 16 },
  input: { w: 170, h: 60 },
};

/** Column of each component: wire hops from a supply (inputs in the last column). */
function columnsByDistance(d: Design): Map<string, number> {
  const adj = new Map<string, Set<string>>();
  const link = (a: string, b: string) => {
    if (a === b) return;
    (adj.get(a) ?? adj.set(a, new Set()).get(a)!).add(b);
    (adj.get(b) ?? adj.set(b, new Set()).get(b)!).add(a);
  };
  for (const w of d.wires) link(w.from.split(".")[0]!, w.to.split(".")[0]!);
  const depth = new Map<string, number>();
  const queue = d.components.filter((c) => c.type === "supply").map((c) => c.id);
  for (const id of queue) depth.set(id, 0);
  for (let i = 0; i < queue.length; i++) {
    const id = queue[i]!;
    for (const next of adj.get(id) ?? []) {
      if (!depth.has(next)) {
        depth.set(next, depth.get(id)! + 1);
        queue.push(next);
      }
    }
  }
  const max = Math.max(1, ...[...depth.values()]);
  const out = new Map<string, number>();
  for (const c of d.components) out.set(c.id, c.type === "input" ? max + 1 : c.type === "supply" ? 0 : (depth.get(c.id) ?? max));
  return out;
}

function describe(d: Design) {
  return d.components.map((c) => ({
    id: c.id,
    type: c.type as Kind,
    label: "label" in c && c.label ? c.label : c.id,
    detail:
      c.type === "contact"
        ? `${c.condition}: closed in ${c.closedIn.join(", ")}`
        : c.type === "input"
          ? `${c.function} input`
          : c.type === "supply"
            ? "supply +"
            : "",
  }));
}

/** The canvas's positions, or columns by distance from the supplies. */
function wideBoxes(d: Design): Box[] {
  const layout = (d as Design & { layout?: Record<string, { x?: unknown; y?: unknown }> }).layout ?? {};
  const placed = d.components.every(
    (c) => typeof layout[c.id]?.x === "number" && Number.isFinite(layout[c.id]?.x) && typeof layout[c.id]?.y === "number",
  );
  const cols = placed ? null : columnsByDistance(d);
  const rowInCol = new Map<number, number>();
  return describe(d).map((c) => {
    const size = SIZE[c.type] ?? SIZE.contact;
    let x: number, y: number;
    if (placed) {
      x = layout[c.id]!.x as number;
      y = layout[c.id]!.y as number;
    } else {
      const col = cols!.get(c.id)!;
      const r = rowInCol.get(col) ?? 0;
      rowInCol.set(col, r + 1);
      x = col * 240;
      y = r * 130;
    }
    return { ...c, x, y, ...size };
  });
}

/** The plain drawing's smallest type, in its own units (the contact's states line). */
export const SMALLEST_TYPE = 10;

const COLUMN_W = 230;
const LANE = 9;
/** Room between two parts of the plain stacked drawing: a wire's jog out of one (7), into the next (7), and space between. */
const PLAIN_GAP = 22;

/** One column, in order of wire hops from the supplies: for a phone's width. */
function stackedBoxes(d: Design, plain: boolean): Box[] {
  const cols = columnsByDistance(d);
  const order = describe(d)
    .map((c, i) => ({ c, i }))
    .sort((a, b) => cols.get(a.c.id)! - cols.get(b.c.id)! || a.i - b.i);
  // The plain drawing (paper) has no ring above a contact and three lines of type in every box: it packs tighter.
  const ring = plain ? 0 : 26;
  const gap = plain ? PLAIN_GAP : 44;
  let y = 0;
  return order.map(({ c }) => {
    const h = c.type === "junction" ? 16 : plain ? (c.type === "contact" ? 58 : 42) : c.type === "contact" ? 92 : 64;
    const w = c.type === "junction" ? 16 : COLUMN_W;
    const box = { ...c, x: c.type === "junction" ? COLUMN_W / 2 - 8 : 0, y: y + (c.type === "contact" ? ring : 0), w, h };
    y += h + (c.type === "contact" ? ring : 0) + gap;
    return box;
  });
}

function wideTerminal(b: Box, terminal: string): Point {
  if (b.type === "junction") return { x: b.x + b.w / 2, y: b.y + b.h / 2, side: "centre" };
  const left = b.type === "input" || (b.type === "contact" && terminal === "1");
  return { x: left ? b.x : b.x + b.w, y: b.y + b.h / 2, side: left ? "left" : "right" };
}

function stackedTerminal(b: Box, terminal: string): Point {
  if (b.type === "junction") return { x: b.x + b.w / 2, y: b.y + b.h / 2, side: "centre" };
  const top = b.type === "input" || (b.type === "contact" && terminal === "1");
  return { x: b.x + b.w / 2, y: top ? b.y : b.y + b.h, side: top ? "top" : "bottom" };
}

/** Where every part and wire goes, and the drawing's box, in the drawing's own units. */
export function geometry(design: Design, stacked: boolean, plain: boolean) {
  const list = stacked ? stackedBoxes(design, plain) : wideBoxes(design);
  const byId = new Map(list.map((b) => [b.id, b]));
  const terminal = stacked ? stackedTerminal : wideTerminal;
  // Wires that cannot run straight down the column go round on the right, each in its own lane.
  let lanes = 0;
  const paths = design.wires.flatMap((w, i) => {
    const [fa, ft] = w.from.split(".") as [string, string];
    const [ta, tt] = w.to.split(".") as [string, string];
    const a = byId.get(fa);
    const b = byId.get(ta);
    if (!a || !b) return [];
    let p = terminal(a, ft);
    let q = terminal(b, tt);
    let d: string;
    if (!stacked) {
      const mid = (p.x + q.x) / 2;
      d = `M${p.x} ${p.y} H${mid} V${q.y} H${q.x}`;
    } else {
      if (p.y > q.y) [p, q] = [q, p];
      // Straight down only to the next part in the column: a line through another part would read as a series chain.
      const between = list.some((o) => o !== a && o !== b && o.y + o.h > p.y + 1 && o.y < q.y - 1);
      const straight = p.x === q.x && p.side !== "top" && q.side !== "bottom" && !between;
      if (straight) d = `M${p.x} ${p.y} V${q.y}`;
      else {
        const lane = COLUMN_W + 18 + LANE * lanes++;
        const jog = plain ? 7 : 10;
        const out = (t: Point) => (t.side === "top" ? t.y - jog : t.side === "bottom" ? t.y + jog : t.y);
        d = `M${p.x} ${p.y} V${out(p)} H${lane} V${out(q)} H${q.x} V${q.y}`;
      }
    }
    return [{ key: i, d, from: w.from }];
  });
  const pad = 34;
  const minX = Math.min(...list.map((b) => b.x)) - pad;
  const minY = Math.min(...list.map((b) => b.y)) - pad - 10;
  const maxX = Math.max(...list.map((b) => b.x + b.w), stacked ? COLUMN_W + 18 + LANE * lanes : -Infinity) + pad;
  const maxY = Math.max(...list.map((b) => b.y + b.h)) + pad;
  return { list, paths, minX, minY, width: maxX - minX, height: maxY - minY };
}

/** The plain drawing's size in its own units, wide (canvas positions or columns) or stacked (one column): the report's diagram. */
export function plainDrawingSize(d: Design, layout: "wide" | "stacked"): { width: number; height: number } {
  if (d.components.length === 0) return { width: 0, height: 0 };
  const { width, height } = geometry(d, layout === "stacked", true);
  return { width, height };
}
