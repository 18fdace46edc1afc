// New parts land in free space: whatever is added (palette, series, parallel, duplicate, paste)
// never overlaps a part already on the canvas (checked on random drawings with fast-check).
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { documentToFlow } from "../../../app/canvas/convert";
import { addInParallel, addInSeries, copyOf, duplicateNodes, newNode, pasteClip } from "../../../app/canvas/graph-ops";
import { sizeOf } from "../../../app/canvas/node-kinds";
import type { CanvasNode } from "../../../app/canvas/types";

const overlap = (a: CanvasNode, b: CanvasNode) => {
  const [sa, sb] = [sizeOf(a), sizeOf(b)];
  return (
    a.position.x < b.position.x + sb.width &&
    b.position.x < a.position.x + sa.width &&
    a.position.y < b.position.y + sb.height &&
    b.position.y < a.position.y + sa.height
  );
};

const drawing = fc.array(
  fc.record({
    kind: fc.constantFrom("contact", "junction", "supply"),
    x: fc.integer({ min: 0, max: 900 }),
    y: fc.integer({ min: 0, max: 600 }),
  }),
  { minLength: 1, maxLength: 25 },
);

function graphOf(parts: Array<{ kind: string; x: number; y: number }>) {
  const g = documentToFlow({
    format: "chainproof/design@1",
    name: "Scree trail bike prototype P2",
    conditions: [
      { id: "stand", states: ["down", "up"] },
      { id: "throttle", states: ["released", "applied"] },
    ],
    components: parts.map((p, i) =>
      p.kind === "contact" ? { id: `P${i}`, type: "contact", condition: "stand", closedIn: ["up"] } : { id: `P${i}`, type: p.kind },
    ),
    wires: [],
    controller: { throttle: { condition: "throttle", released: ["released"], applied: ["applied"] } },
    rules: [],
    layout: Object.fromEntries(parts.map((p, i) => [`P${i}`, { x: p.x, y: p.y }])),
  });
  return g;
}

const noNewOverlap = (before: readonly CanvasNode[], after: readonly CanvasNode[]) => {
  const old = new Set(before.map((n) => n.id));
  const added = after.filter((n) => !old.has(n.id));
  expect(added.length).toBeGreaterThan(0);
  // Against every part already there (a pasted group keeps its own arrangement among itself).
  for (const n of added) for (const m of before) expect(overlap(n, m), `${n.id} lands on ${m.id}`).toBe(false);
};

describe("placement of new parts", () => {
  it("a palette part, series and parallel contacts, duplicates and pastes never land on another part", () => {
    fc.assert(
      fc.property(drawing, fc.nat(), fc.integer({ min: 0, max: 900 }), fc.integer({ min: 0, max: 600 }), (parts, pick, x, y) => {
        const g = graphOf(parts);
        const n = newNode("contact", { x, y }, g.nodes, g.rest);
        noNewOverlap(g.nodes, [...g.nodes, n]);
        const contacts = g.nodes.filter((c) => c.type === "contact");
        if (contacts.length > 0) {
          const c = contacts[pick % contacts.length];
          noNewOverlap(g.nodes, addInSeries(c.id, g.nodes, g.edges, g.rest)!.nodes);
          noNewOverlap(g.nodes, addInParallel(c.id, g.nodes, g.edges, g.rest)!.nodes);
        }
        const selected = g.nodes.map((m, i) => (i % 3 === pick % 3 ? { ...m, selected: true } : m));
        const dup = duplicateNodes(selected, g.edges, g.rest);
        if (dup) noNewOverlap(g.nodes, dup.nodes);
        const clip = copyOf(selected, g.edges);
        if (clip) noNewOverlap(g.nodes, pasteClip(clip, selected, g.edges, g.rest)!.nodes);
      }),
      { numRuns: 150 },
    );
  });

  it("a series contact goes to the right of its contact when there is room", () => {
    const g = graphOf([{ kind: "contact", x: 100, y: 100 }]);
    const out = addInSeries("P0", g.nodes, g.edges, g.rest)!;
    const added = out.nodes.find((n) => n.id === out.added)!;
    expect(added.position.y).toBe(100);
    expect(added.position.x).toBeGreaterThan(100 + sizeOf(g.nodes[0]).width);
  });
});
