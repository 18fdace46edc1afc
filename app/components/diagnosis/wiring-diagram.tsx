// A read-only drawing of a design's wiring for one row: live wires in copper, dead ones grey,
// contacts drawn open or closed, and the contacts to check (or suspected stuck) ringed in brick.
// Positions come from the design's canvas layout; components without one are placed in columns.
import type { CompiledDesign, RowView } from "~/engine";

const SIZE = {
  supply: { w: 150, h: 56 },
  contact: { w: 170, h: 70 },
  junction: { w: 16, h: 16 },
  input: { w: 150, h: 56 },
} as const;

type Box = { x: number; y: number; w: number; h: number };

function boxes(c: CompiledDesign): Map<string, Box> {
  const out = new Map<string, Box>();
  const layout = (c.design as { layout?: Record<string, { x: number; y: number }> }).layout ?? {};
  const column = { supply: 0, contact: 1, junction: 1, input: 3 } as const;
  const nextY = [0, 0, 0, 0];
  for (const comp of c.design.components) {
    const s = SIZE[comp.type];
    const at = layout[comp.id];
    if (at && Number.isFinite(at.x) && Number.isFinite(at.y)) out.set(comp.id, { x: at.x, y: at.y, ...s });
    else {
      const col = column[comp.type];
      out.set(comp.id, { x: col * 260, y: nextY[col], ...s });
      nextY[col] += s.h + 50;
    }
  }
  return out;
}

function terminalPoint(b: Box, type: keyof typeof SIZE, terminal: string): { x: number; y: number } {
  const mid = b.y + b.h / 2;
  if (type === "junction") return { x: b.x + b.w / 2, y: mid };
  if (type === "supply") return { x: b.x + b.w, y: mid };
  if (type === "input") return { x: b.x, y: mid };
  return terminal === "1" ? { x: b.x, y: mid } : { x: b.x + b.w, y: mid };
}

export function WiringDiagram({
  c,
  row,
  highlight = [],
  suspects = [],
  title,
}: {
  c: CompiledDesign;
  row: RowView;
  /** Contacts to check (ringed, dashed). */
  highlight?: string[];
  /** Contacts suspected stuck (ringed, solid). */
  suspects?: string[];
  title: string;
}) {
  const bx = boxes(c);
  const typeOf = new Map(c.design.components.map((x) => [x.id, x.type]));
  const live = new Set(row.nets.energizedTerminals);
  const point = (terminal: string) => {
    const [id, t] = terminal.split(".");
    return terminalPoint(bx.get(id)!, typeOf.get(id)!, t);
  };
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const b of bx.values()) {
    minX = Math.min(minX, b.x);
    minY = Math.min(minY, b.y);
    maxX = Math.max(maxX, b.x + b.w);
    maxY = Math.max(maxY, b.y + b.h);
  }
  const pad = 40;
  const viewBox = `${minX - pad} ${minY - pad} ${maxX - minX + 2 * pad} ${maxY - minY + 2 * pad}`;
  return (
    <figure className="overflow-x-auto rounded-lg border border-ink-200 bg-white p-2">
      <svg viewBox={viewBox} role="img" aria-label={title} className="h-auto w-full min-w-[48rem]" data-testid="wiring-diagram">
        <title>{title}</title>
        {c.design.wires.map((w, i) => {
          const a = point(w.from);
          const b = point(w.to);
          const midX = (a.x + b.x) / 2;
          const on = live.has(w.from);
          return (
            <path
              key={i}
              d={`M${a.x} ${a.y} H${midX} V${b.y} H${b.x}`}
              fill="none"
              stroke={on ? "var(--color-copper-500)" : "var(--color-ink-300)"}
              strokeWidth={on ? 5 : 3}
            />
          );
        })}
        {c.design.components.map((comp) => {
          const b = bx.get(comp.id)!;
          const label = comp.label ?? comp.id;
          const short = label.length > 26 ? `${label.slice(0, 25)}…` : label;
          if (comp.type === "junction") {
            const on = live.has(`${comp.id}.j`);
            return <circle key={comp.id} cx={b.x + b.w / 2} cy={b.y + b.h / 2} r={8} fill={on ? "var(--color-copper-500)" : "var(--color-ink-400)"} />;
          }
          if (comp.type === "contact") {
            const closed = row.contacts[comp.id];
            const ring = suspects.includes(comp.id) ? "suspect" : highlight.includes(comp.id) ? "check" : null;
            const y = b.y + b.h / 2;
            const x1 = b.x + 20;
            const x2 = b.x + b.w - 20;
            return (
              <g key={comp.id} data-contact={comp.id} data-state={closed ? "closed" : "open"} data-ring={ring ?? undefined}>
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
                <line x1={b.x} y1={y} x2={x1} y2={y} stroke="var(--color-ink-700)" strokeWidth={3} />
                <line x1={x2} y1={y} x2={b.x + b.w} y2={y} stroke="var(--color-ink-700)" strokeWidth={3} />
                <circle cx={x1} cy={y} r={6} fill="white" stroke="var(--color-ink-700)" strokeWidth={3} />
                <circle cx={x2} cy={y} r={6} fill="white" stroke="var(--color-ink-700)" strokeWidth={3} />
                <line
                  x1={x1}
                  y1={y}
                  x2={closed ? x2 : x2 - 10}
                  y2={closed ? y : y - 32}
                  stroke={closed ? "var(--color-moss-600)" : "var(--color-ink-700)"}
                  strokeWidth={5}
                  strokeLinecap="round"
                />
                <text x={b.x + b.w / 2} y={b.y - 8} textAnchor="middle" fontSize={20} fontWeight={600} fill="var(--color-ink-900)">
                  {comp.id}
                </text>
                <text x={b.x + b.w / 2} y={b.y + b.h + 2} textAnchor="middle" fontSize={15} fill="var(--color-ink-600)">
                  {short}
                </text>
              </g>
            );
          }
          const on = comp.type === "supply" ? true : row.inputs[comp.id];
          return (
            <g key={comp.id} data-input={comp.type === "input" ? comp.id : undefined}>
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
              <text x={b.x + b.w / 2} y={b.y + 24} textAnchor="middle" fontSize={18} fontWeight={600} fill="var(--color-ink-900)">
                {comp.id}
                {comp.type === "input" ? (on ? " · live" : " · dead") : ""}
              </text>
              <text x={b.x + b.w / 2} y={b.y + 44} textAnchor="middle" fontSize={13} fill="var(--color-ink-600)">
                {label.length > 20 ? `${label.slice(0, 19)}…` : label}
              </text>
            </g>
          );
        })}
      </svg>
      <figcaption className="mt-1 px-1 text-xs text-ink-600">
        Live wires in copper, dead in grey; contacts to check are ringed with a dashed line, suspected stuck contacts with a solid one.
      </figcaption>
    </figure>
  );
}
