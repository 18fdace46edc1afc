// Fitting the view around the overlays that sit on the canvas: the minimap (bottom right) and the
// zoom controls (bottom left). Either the drawing stays above them (more bottom padding) or beside
// the minimap (more right padding); whichever leaves the drawing larger wins.

export type Size = { width: number; height: number };
type Px = `${number}px`;
export type FitPadding = { top: Px; right: Px; bottom: Px; left: Px };

/** Space kept between the drawing and the pane's edges or an overlay, in screen pixels. */
export const FIT_MARGIN = 24;

/**
 * Per-side padding (pixels) for xyflow's fitView so no node ends up under an overlay.
 * `minimap` / `controls` are the overlays' footprints measured from their corners (size plus their
 * own offset from the edge); null when not shown.
 */
export function fitPadding(
  pane: Size,
  drawing: Size,
  overlays: { minimap: Size | null; controls: Size | null },
  maxZoom: number,
): FitPadding {
  const m = FIT_MARGIN;
  const px = (t: number, r: number, b: number, l: number): FitPadding => ({
    top: `${t}px`,
    right: `${r}px`,
    bottom: `${b}px`,
    left: `${l}px`,
  });
  const { minimap, controls } = overlays;
  if (!minimap && !controls) return px(m, m, m, m);
  const zoomWithin = (right: number, bottom: number, left: number) => {
    const w = pane.width - left - right;
    const h = pane.height - m - bottom;
    if (w <= 0 || h <= 0) return 0;
    return Math.min(maxZoom, w / Math.max(drawing.width, 1), h / Math.max(drawing.height, 1));
  };
  // Above both overlays: the bottom clears the taller one.
  const above = { right: m, bottom: Math.max(minimap?.height ?? 0, controls?.height ?? 0) + m, left: m };
  // Beside them: the right clears the minimap, the left clears the controls.
  const beside = { right: (minimap?.width ?? 0) + m, bottom: m, left: (controls?.width ?? 0) + m };
  const a = zoomWithin(above.right, above.bottom, above.left);
  const b = zoomWithin(beside.right, beside.bottom, beside.left);
  // A pane too small for either keeps plain margins: a fit that shows nothing helps nobody.
  if (a <= 0 && b <= 0) return px(m, m, m, m);
  const pick = a >= b ? above : beside;
  return px(m, pick.right, pick.bottom, pick.left);
}

/**
 * The viewport that shows `bounds` (flow coordinates) inside the pane less `padding`, at a zoom
 * between `minZoom` and `maxZoom`. When the drawing is too large to fit at `minZoom`, it is not
 * shrunk further: along each axis that does not fit, its start (left or top) is shown and the rest
 * is left to panning; along an axis that fits, it is centred.
 */
export function fitViewport(
  pane: Size,
  bounds: { x: number; y: number; width: number; height: number },
  padding: FitPadding,
  minZoom: number,
  maxZoom: number,
): { x: number; y: number; zoom: number } {
  const n = (p: Px) => Number.parseFloat(p);
  const [top, right, bottom, left] = [n(padding.top), n(padding.right), n(padding.bottom), n(padding.left)];
  const w = Math.max(1, pane.width - left - right);
  const h = Math.max(1, pane.height - top - bottom);
  const zoom = Math.min(maxZoom, Math.max(minZoom, Math.min(w / Math.max(bounds.width, 1), h / Math.max(bounds.height, 1))));
  const along = (start: number, room: number, size: number, at: number) =>
    size * zoom <= room ? start + (room - size * zoom) / 2 - at * zoom : start - at * zoom;
  return { x: along(left, w, bounds.width, bounds.x), y: along(top, h, bounds.height, bounds.y), zoom };
}
