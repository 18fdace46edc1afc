// A static drawing of a design's wiring for the printed report: boxes at the canvas positions
// (document.layout) or, without them, columns by distance from the supplies; wires as elbow lines.
import type { Design } from "~/engine";
import { kindColours } from "~/lib/kind-colours";

type Box = { id: string; type: string; label: string; x: number; y: number; w: number; h: number; detail: string };

const SIZE: Record<string, { w: number; h: number }> = {
  supply: { w: 140, h: 56 },
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

function boxes(d: Design): Box[] {
  const layout = (d as Design & { layout?: Record<string, { x?: unknown; y?: unknown }> }).layout ?? {};
  const placed = d.components.every((c) => typeof layout[c.id]?.x === "number" && typeof layout[c.id]?.y === "number");
  const cols = placed ? null : columnsByDistance(d);
  const rowInCol = new Map<number, number>();
  return d.components.map((c) => {
    const size = SIZE[c.type]!;
    const label = "label" in c && c.label ? c.label : c.id;
    const detail =
      c.type === "contact" ? `${c.condition}: closed in ${c.closedIn.join(", ")}` : c.type === "input" ? `${c.function} input` : c.type === "supply" ? "supply +" : "";
    let x: number, y: number;
    if (placed) {
      x = layout[c.id]!.x as number;
      y = layout[c.id]!.y as number;
    } else {
      const col = cols!.get(c.id)!;
      const r = rowInCol.get(col) ?? 0;
      rowInCol.set(col, r + 1);
      x = col * 240;
      y = r * 120;
    }
    return { id: c.id, type: c.type, label, x, y, w: size.w, h: size.h, detail };
  });
}

function terminalPoint(b: Box, terminal: string): { x: number; y: number } {
  if (b.type === "junction") return { x: b.x + b.w / 2, y: b.y + b.h / 2 };
  const left = terminal === "1" || terminal === "in";
  return { x: left ? b.x : b.x + b.w, y: b.y + b.h / 2 };
}

export function WiringDiagram({ design }: { design: Design }) {
  const list = boxes(design);
  const byId = new Map(list.map((b) => [b.id, b]));
  const minX = Math.min(...list.map((b) => b.x)) - 20;
  const minY = Math.min(...list.map((b) => b.y)) - 20;
  const maxX = Math.max(...list.map((b) => b.x + b.w)) + 20;
  const maxY = Math.max(...list.map((b) => b.y + b.h)) + 20;
  return (
    <svg
      viewBox={`${minX} ${minY} ${maxX - minX} ${maxY - minY}`}
      className="h-auto w-full"
      role="img"
      aria-label={`Wiring diagram of ${design.name}`}
      data-testid="wiring-diagram"
      fontFamily="Inter Variable, system-ui, sans-serif"
    >
      {design.wires.map((w, i) => {
        const [fa, ft] = w.from.split(".") as [string, string];
        const [ta, tt] = w.to.split(".") as [string, string];
        const a = byId.get(fa);
        const b = byId.get(ta);
        if (!a || !b) return null;
        const p = terminalPoint(a, ft);
        const q = terminalPoint(b, tt);
        const mid = (p.x + q.x) / 2;
        return <path key={i} d={`M${p.x} ${p.y} H${mid} V${q.y} H${q.x}`} fill="none" stroke="#3b414d" strokeWidth={2} />;
      })}
      {list.map((b) =>
        b.type === "junction" ? (
          <g key={b.id} data-kind={b.type}>
            <circle cx={b.x + b.w / 2} cy={b.y + b.h / 2} r={5} fill={kindColours("junction").fill} />
            <text x={b.x + b.w / 2} y={b.y - 4} fontSize={11} textAnchor="middle" fill="#5f6878">
              {b.id}
            </text>
          </g>
        ) : (
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
        ),
      )}
    </svg>
  );
}
