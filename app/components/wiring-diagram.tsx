// The one drawing of a design's wiring (the report, "why won't it drive"): boxes at the canvas
// positions (document.layout) or, without them, in columns by wire hops from the supplies (placed by
// lib/wiring-geometry.ts). Given a row it shows that row: live wires in copper, dead ones grey,
// contacts open or closed, and the contacts to check (dashed ring) or suspected stuck (solid ring). On a phone (`phone`) a second
// drawing stacks the parts in one column at the screen's width, labels at reading size (decision 138).
// The report prints the plain drawing, wide or stacked, whichever fits its page at 6 pt (decision 166).
import type { Design, RowView } from "~/engine";
import { kindColours } from "~/lib/kind-colours";
import { cardVariants } from "~/components/ui/card";
import { geometry } from "~/lib/wiring-geometry";

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
