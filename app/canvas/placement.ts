// Where new parts go: the nearest free spot to where they belong, so a new part never lands on
// top of another. Footprints are the nodes' measured sizes (or their kind's size) plus a margin.
import { sizeOf } from "./node-kinds";
import type { CanvasNode, XY } from "./types";

export const PLACE_MARGIN = 24;
const STEP = 24;
const MAX_RINGS = 80;

type Box = { x: number; y: number; width: number; height: number };

export const boxOf = (n: Pick<CanvasNode, "type" | "measured" | "position">): Box => ({ ...n.position, ...sizeOf(n) });

const overlaps = (a: Box, b: Box, margin: number) =>
  a.x < b.x + b.width + margin && b.x < a.x + a.width + margin && a.y < b.y + b.height + margin && b.y < a.y + a.height + margin;

/** True when a box at `at` of `size` keeps `margin` clear of every box in `others`. */
export function isFree(at: XY, size: { width: number; height: number }, others: readonly Box[], margin = PLACE_MARGIN): boolean {
  const box = { ...at, ...size };
  return others.every((o) => !overlaps(box, o, margin));
}

/**
 * The free spot nearest to `wanted` for a group of boxes laid out relative to `wanted` (one box at
 * offset 0,0 for a single part). Rings of candidates are searched outwards; within a ring the spots
 * in `prefer`'s direction (right of a contact for series, below for parallel) come first.
 */
export function freeSpot(
  wanted: XY,
  group: ReadonlyArray<{ dx: number; dy: number; width: number; height: number }>,
  nodes: ReadonlyArray<Pick<CanvasNode, "type" | "measured" | "position">>,
  prefer: XY = { x: 1, y: 0 },
): XY {
  const others = nodes.map(boxOf);
  const fits = (p: XY) => group.every((g) => isFree({ x: p.x + g.dx, y: p.y + g.dy }, g, others));
  if (fits(wanted)) return wanted;
  for (let ring = 1; ring <= MAX_RINGS; ring++) {
    const spots: XY[] = [];
    for (let i = -ring; i <= ring; i++) {
      spots.push({ x: i, y: -ring }, { x: i, y: ring });
      if (i > -ring && i < ring) spots.push({ x: -ring, y: i }, { x: ring, y: i });
    }
    // Nearest first; ties broken towards the preferred direction.
    spots.sort(
      (a, b) => Math.hypot(a.x, a.y) - Math.hypot(b.x, b.y) || b.x * prefer.x + b.y * prefer.y - (a.x * prefer.x + a.y * prefer.y),
    );
    for (const s of spots) {
      const p = { x: wanted.x + s.x * STEP, y: wanted.y + s.y * STEP };
      if (fits(p)) return p;
    }
  }
  // Everything near is taken: below the whole drawing.
  const bottom = Math.max(...others.map((o) => o.y + o.height));
  return { x: wanted.x, y: bottom + PLACE_MARGIN * 2 };
}
