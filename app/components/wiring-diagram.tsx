// The one drawing of a design's wiring (the report, "why won't it drive"): boxes at the canvas
// positions (document.layout) or, without them, in columns by wire hops from the supplies. Given a
// row it shows that row: live wires in copper, dead ones grey, contacts open or closed, and the
// contacts to check (dashed ring) or suspected stuck (solid ring). On a phone (`phone`) a second
// drawing stacks the parts in one column at the screen's width, labels at reading size (decision 138).
// The report prints the plain drawing, wide or stacked, whichever fits its page at 6 pt (decision 166).
import type { Design, RowView } from "~/engine";
import { kindColours } from "~/lib/kind-colours";
import { cardVariants } from "~/components/ui/card";

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
function geometry(design: Design, stacked: boolean, plain: boolean) {
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

type Props = {
  design: Design;
  /** The row to show; without it the drawing is the plain wiring (the report). */
  row?: RowView;
  /** Contacts to check (ringed, dashed). */
  highlight?: string[];
  /** Contacts suspected stuck (ringed, solid). */
  suspects?: string[];
  title?: string;
  /** Also draw the one-column version, shown instead on narrow screens. */
  phone?: boolean;
  /** The plain drawing's layout (no row): wide, or stacked in one column (paper, when the wide one would print too small). */
  layout?: "wide" | "stacked";
};

export function WiringDiagram({ design, row, highlight = [], suspects = [], title, phone = false, layout = "wide" }: Props) {
  const label = title ?? `Wiring diagram of ${design.name}`;
  const wide = (
    <Drawing design={design} row={row} highlight={highlight} suspects={suspects} title={label} stacked={!row && layout === "stacked"} />
  );
  if (!row) return wide;
  return (
    <figure className={cardVariants({ padding: "xs" })}>
      {phone ? (
        <>
          <div className="hidden overflow-x-auto sm:block">{wide}</div>
          <div className="sm:hidden">
            <Drawing design={design} row={row} highlight={highlight} suspects={suspects} title={label} stacked />
          </div>
        </>
      ) : (
        <div className="overflow-x-auto">{wide}</div>
      )}
      <figcaption className="mt-1 px-1 text-base text-ink-600">
        Live wires in copper, dead in grey; contacts to check are ringed with a dashed line, suspected stuck contacts with a solid one.
      </figcaption>
    </figure>
  );
}

function Drawing({
  design,
  row,
  highlight,
  suspects,
  title,
  stacked,
}: Required<Omit<Props, "row" | "phone" | "title" | "layout">> & { row?: RowView; title: string; stacked: boolean }) {
  const plain = !row;
  const { list, paths, minX, minY, width, height } = geometry(design, stacked, plain);
  const live = new Set(row?.nets.energizedTerminals ?? []);
  return (
    <svg
      viewBox={`${minX} ${minY} ${width} ${height}`}
      className={stacked ? "h-auto w-full" : row ? "h-auto w-full min-w-[40rem]" : "h-auto w-full"}
      role="img"
      aria-label={title}
      data-testid="wiring-diagram"
      data-layout={stacked ? "stacked" : "wide"}
      fontFamily="Inter Variable, system-ui, sans-serif"
    >
      <title>{title}</title>
      {paths.map((p) => (
        <path
          key={p.key}
          d={p.d}
          fill="none"
          stroke={plain ? "#3b414d" : live.has(p.from) ? "var(--color-copper-500)" : "var(--color-ink-300)"}
          strokeWidth={plain ? 2 : live.has(p.from) ? 5 : 3}
        />
      ))}
      {list.map((b) => {
        if (b.type === "junction") {
          const on = live.has(`${b.id}.j`);
          return (
            <g key={b.id} data-kind={b.type}>
              <circle
                cx={b.x + b.w / 2}
                cy={b.y + b.h / 2}
                r={plain ? 5 : 8}
                fill={plain ? kindColours("junction").fill : on ? "var(--color-copper-500)" : "var(--color-ink-400)"}
              />
              {plain ? (
                // Stacked, wires run through the dot from above and below and out to the lanes on the right: the name goes on its left.
                <text
                  x={stacked ? b.x - 6 : b.x + b.w / 2}
                  y={stacked ? b.y + b.h / 2 + 4 : b.y - 4}
                  fontSize={11}
                  textAnchor={stacked ? "end" : "middle"}
                  fill="#5f6878"
                >
                  {b.id}
                </text>
              ) : null}
            </g>
          );
        }
        if (plain) {
          return (
            <g key={b.id} data-kind={b.type}>
              <rect
                x={b.x}
                y={b.y}
                width={b.w}
                height={b.h}
                rx={b.type === "input" ? 14 : 6}
                fill={kindColours(b.type).fill}
                stroke={kindColours(b.type).stroke}
                strokeWidth={1.5}
                strokeDasharray={b.type === "input" ? "5 3" : undefined}
              />
              <text x={b.x + 8} y={b.y + 20} fontSize={13} fontWeight={600} fill="#181b21">
                {b.label.length > 22 ? `${b.label.slice(0, 21)}…` : b.label}
              </text>
              <text x={b.x + 8} y={b.y + 36} fontSize={11} fill="#5f6878">
                {b.id} · {b.type}
              </text>
              {b.detail && b.type === "contact" ? (
                <text x={b.x + 8} y={b.y + 52} fontSize={10} fill="#3b414d">
                  {b.detail.length > 30 ? `${b.detail.slice(0, 29)}…` : b.detail}
                </text>
              ) : null}
            </g>
          );
        }
        const maxChars = stacked ? 24 : 20;
        const short = b.label.length > maxChars ? `${b.label.slice(0, maxChars - 1)}…` : b.label;
        if (b.type === "contact") {
          const closed = row!.contacts[b.id];
          const ring = suspects.includes(b.id) ? "suspect" : highlight.includes(b.id) ? "check" : null;
          // The switch is drawn across the box: from terminal 1 to terminal 2 (left to right, or top to bottom).
          const cx = b.x + b.w / 2;
          const cy = b.y + b.h / 2;
          const [s1, s2] = stacked
            ? [
                { x: cx, y: b.y + 18 },
                { x: cx, y: b.y + b.h - 18 },
              ]
            : [
                { x: b.x + 20, y: cy },
                { x: b.x + b.w - 20, y: cy },
              ];
          const [t1, t2] = stacked
            ? [
                { x: cx, y: b.y },
                { x: cx, y: b.y + b.h },
              ]
            : [
                { x: b.x, y: cy },
                { x: b.x + b.w, y: cy },
              ];
          const blade = closed ? s2 : stacked ? { x: s2.x + 30, y: s2.y - 8 } : { x: s2.x - 10, y: s2.y - 32 };
          return (
            <g key={b.id} data-kind={b.type} data-contact={b.id} data-state={closed ? "closed" : "open"} data-ring={ring ?? undefined}>
              {ring ? (
                <rect
                  x={b.x - 8}
                  y={b.y - 30}
                  width={b.w + 16}
                  height={b.h + 38}
                  rx={10}
                  fill="var(--color-brick-50)"
                  stroke="var(--color-brick-600)"
                  strokeWidth={4}
                  strokeDasharray={ring === "check" ? "10 6" : undefined}
                />
              ) : null}
              <line x1={t1.x} y1={t1.y} x2={s1.x} y2={s1.y} stroke="var(--color-ink-700)" strokeWidth={3} />
              <line x1={s2.x} y1={s2.y} x2={t2.x} y2={t2.y} stroke="var(--color-ink-700)" strokeWidth={3} />
              <circle cx={s1.x} cy={s1.y} r={6} fill="white" stroke="var(--color-ink-700)" strokeWidth={3} />
              <circle cx={s2.x} cy={s2.y} r={6} fill="white" stroke="var(--color-ink-700)" strokeWidth={3} />
              <line
                x1={s1.x}
                y1={s1.y}
                x2={blade.x}
                y2={blade.y}
                stroke={closed ? "var(--color-moss-600)" : "var(--color-ink-700)"}
                strokeWidth={5}
                strokeLinecap="round"
              />
              {stacked ? (
                <>
                  <text x={cx + 40} y={cy - 6} fontSize={20} fontWeight={600} fill="var(--color-ink-900)">
                    {b.id}
                  </text>
                  <text x={cx + 40} y={cy + 16} fontSize={18} fill="var(--color-ink-600)">
                    {short.length > 10 ? `${short.slice(0, 9)}…` : short}
                  </text>
                  <text x={b.x + 4} y={cy - 6} fontSize={18} fill="var(--color-ink-700)">
                    {closed ? "closed" : "open"}
                  </text>
                </>
              ) : (
                <>
                  <text x={cx} y={b.y - 8} textAnchor="middle" fontSize={20} fontWeight={600} fill="var(--color-ink-900)">
                    {b.id}
                  </text>
                  <text x={cx} y={b.y + b.h + 2} textAnchor="middle" fontSize={15} fill="var(--color-ink-600)">
                    {short}
                  </text>
                </>
              )}
            </g>
          );
        }
        const on = b.type === "supply" ? true : row!.inputs[b.id];
        return (
          <g key={b.id} data-kind={b.type} data-input={b.type === "input" ? b.id : undefined}>
            <rect
              x={b.x}
              y={b.y}
              width={b.w}
              height={b.h}
              rx={8}
              fill={on ? "var(--color-copper-50)" : "var(--color-ink-100)"}
              stroke={on ? "var(--color-copper-600)" : "var(--color-ink-400)"}
              strokeWidth={3}
            />
            <text x={b.x + b.w / 2} y={b.y + 26} textAnchor="middle" fontSize={18} fontWeight={600} fill="var(--color-ink-900)">
              {b.id}
              {b.type === "input" ? (on ? " · live" : " · dead") : ""}
            </text>
            <text x={b.x + b.w / 2} y={b.y + 48} textAnchor="middle" fontSize={stacked ? 18 : 16} fill="var(--color-ink-600)">
              {short}
            </text>
          </g>
        );
      })}
    </svg>
  );
}
