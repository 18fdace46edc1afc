// Which drawing of the wiring the printed report can carry (decisions 165, 166): the wide one, else the
// phone's one-column (stacked) one, each scaled to fit one page's printable box, and printed only if its
// smallest type stays at or above 6 pt. Otherwise the wiring list alone (it always prints).
import type { Design } from "~/engine";
import { SMALLEST_TYPE, plainDrawingSize } from "~/lib/wiring-geometry";

const PX_PER_MM = 96 / 25.4;
/** Paper sizes the report offers, in mm: A4 (ISO 216) and US Letter (8.5 × 11 in). */
const PAPER_MM = { a4: { w: 210, h: 297 }, letter: { w: 215.9, h: 279.4 } } as const;
/** The report's @page margins, in mm. */
const MARGIN_MM = { x: 12, y: 14 };
/** Room the drawing's frame takes on each side: 8 px padding and a 1 px border, twice. */
const FRAME_PX = 18;
/** What shares the page with the drawing: the section's heading (66 px), the frame's margin, padding and border (30 px), the note under it (20 px), and 30 px to spare. */
const BESIDE_PX = 66 + 30 + 20 + 30;
/** 6 pt = 8 CSS px (1 pt = 1/72 in, 1 px = 1/96 in): the least legible print size (common practice, from memory). */
export const MIN_TYPE_PX = 8;
/** No larger than the report's own small print (12 px): a few parts do not need poster-sized boxes. */
const MAX_SCALE = 12 / SMALLEST_TYPE;

export type Paper = keyof typeof PAPER_MM;

export type PaperDiagram = {
  layout: "wide" | "stacked";
  /** The drawing's size on paper, in CSS px. */
  widthPx: number;
  heightPx: number;
  /** Its smallest type on paper, in points, rounded down to 0.1. */
  smallestPt: number;
};

/** The box the drawing may fill on one page, in CSS px. */
export function diagramBox(paper: Paper): { width: number; height: number } {
  const { w, h } = PAPER_MM[paper];
  return {
    width: Math.floor((w - 2 * MARGIN_MM.x) * PX_PER_MM) - FRAME_PX,
    height: Math.floor((h - 2 * MARGIN_MM.y) * PX_PER_MM) - BESIDE_PX,
  };
}

function fitted(d: Design, layout: "wide" | "stacked", paper: Paper): PaperDiagram | null {
  const { width, height } = plainDrawingSize(d, layout);
  if (width <= 0 || height <= 0) return null;
  const box = diagramBox(paper);
  const scale = Math.min(box.width / width, box.height / height, MAX_SCALE);
  if (SMALLEST_TYPE * scale < MIN_TYPE_PX) return null;
  return {
    layout,
    widthPx: Math.floor(width * scale),
    heightPx: Math.floor(height * scale),
    smallestPt: Math.floor(SMALLEST_TYPE * scale * 0.75 * 10) / 10,
  };
}

/** The drawing the report prints on this paper, or null for the wiring list alone. */
export function paperDiagram(d: Design, paper: Paper): PaperDiagram | null {
  return fitted(d, "wide", paper) ?? fitted(d, "stacked", paper);
}
