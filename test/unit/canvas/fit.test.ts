// The fit padding keeps every node clear of the minimap and the zoom controls.
import { describe, expect, it } from "vitest";
import { FIT_MARGIN, fitPadding, fitViewport, type FitPadding, type Size } from "../../../app/canvas/fit";

const minimap = { width: 215, height: 165 };
const controls = { width: 47, height: 105 };
const n = (p: FitPadding) =>
  Object.fromEntries(Object.entries(p).map(([k, v]) => [k, Number.parseFloat(v)])) as Record<keyof FitPadding, number>;

/** The drawing's screen rectangle after xyflow's fit (centred, then pushed off any padding it breaks). */
function placed(pane: Size, drawing: Size, p: Record<keyof FitPadding, number>, maxZoom: number) {
  const zoom = Math.min(maxZoom, (pane.width - p.left - p.right) / drawing.width, (pane.height - p.top - p.bottom) / drawing.height);
  const w = drawing.width * zoom;
  const h = drawing.height * zoom;
  let x = (pane.width - w) / 2;
  let y = (pane.height - h) / 2;
  x += Math.max(p.left - x, 0) - Math.max(p.right - (pane.width - x - w), 0);
  y += Math.max(p.top - y, 0) - Math.max(p.bottom - (pane.height - y - h), 0);
  return { x, y, w, h, zoom };
}
const overlaps = (r: { x: number; y: number; w: number; h: number }, o: { x: number; y: number; w: number; h: number }) =>
  r.x < o.x + o.w && o.x < r.x + r.w && r.y < o.y + o.h && o.y < r.y + r.h;

describe("fitPadding", () => {
  const cases: Array<[string, Size, Size]> = [
    ["a wide drawing in a wide pane", { width: 900, height: 600 }, { width: 1200, height: 400 }],
    ["a tall drawing in a wide pane", { width: 900, height: 600 }, { width: 300, height: 900 }],
    ["a square drawing in a square pane", { width: 600, height: 600 }, { width: 500, height: 500 }],
    ["a small drawing that hits the zoom limit", { width: 900, height: 600 }, { width: 200, height: 120 }],
  ];
  for (const [name, pane, drawing] of cases) {
    it(`keeps ${name} off the minimap and the controls`, () => {
      const p = n(fitPadding(pane, drawing, { minimap, controls }, 1.2));
      const r = placed(pane, drawing, p, 1.2);
      expect(
        overlaps(r, { x: pane.width - minimap.width, y: pane.height - minimap.height, ...{ w: minimap.width, h: minimap.height } }),
      ).toBe(false);
      expect(overlaps(r, { x: 0, y: pane.height - controls.height, w: controls.width, h: controls.height })).toBe(false);
    });
  }

  it("clears the bottom for a wide drawing and the right side for a tall one (the larger fit)", () => {
    expect(n(fitPadding({ width: 900, height: 600 }, { width: 1200, height: 400 }, { minimap, controls }, 1.2)).bottom).toBe(
      minimap.height + FIT_MARGIN,
    );
    const tall = n(fitPadding({ width: 900, height: 600 }, { width: 300, height: 900 }, { minimap, controls }, 1.2));
    expect(tall.right).toBe(minimap.width + FIT_MARGIN);
    expect(tall.left).toBe(controls.width + FIT_MARGIN);
  });

  it("uses plain margins without overlays or in a pane too small for them", () => {
    const plain = { top: `${FIT_MARGIN}px`, right: `${FIT_MARGIN}px`, bottom: `${FIT_MARGIN}px`, left: `${FIT_MARGIN}px` };
    expect(fitPadding({ width: 900, height: 600 }, { width: 100, height: 100 }, { minimap: null, controls: null }, 1.2)).toEqual(plain);
    expect(fitPadding({ width: 150, height: 120 }, { width: 100, height: 100 }, { minimap, controls }, 1.2)).toEqual(plain);
  });
});

describe("fitViewport (Fit view with a readable floor)", () => {
  const pad: FitPadding = { top: "24px", right: "24px", bottom: "24px", left: "24px" };
  it("centres a drawing that fits, at no more than the largest zoom", () => {
    const small = fitViewport({ width: 1000, height: 600 }, { x: 0, y: 0, width: 476, height: 276 }, pad, 0.75, 1.2);
    expect(small.zoom).toBe(1.2);
    expect(small.x).toBeCloseTo(24 + (952 - 476 * 1.2) / 2, 6);
    const v = fitViewport({ width: 1000, height: 600 }, { x: 0, y: 0, width: 1058, height: 300 }, pad, 0.75, 1.2);
    expect(v.zoom).toBeCloseTo(952 / 1058, 9);
  });
  it("never goes below the floor: a large drawing shows from its top-left and the rest is panned to", () => {
    const v = fitViewport({ width: 1000, height: 600 }, { x: 100, y: 50, width: 5000, height: 3000 }, pad, 0.75, 1.2);
    expect(v.zoom).toBe(0.75);
    expect(v.x).toBe(24 - 100 * 0.75);
    expect(v.y).toBe(24 - 50 * 0.75);
  });
  it("a wide, flat drawing: top-left along x, centred along y", () => {
    const v = fitViewport({ width: 1000, height: 600 }, { x: 0, y: 0, width: 5000, height: 100 }, pad, 0.75, 1.2);
    expect(v.zoom).toBe(0.75);
    expect(v.x).toBe(24);
    expect(v.y).toBeCloseTo(24 + (552 - 75) / 2, 6);
  });
});
