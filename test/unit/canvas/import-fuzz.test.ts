// Fuzzing the editor's import: mutated shipped designs and arbitrary JSON opened by documentToFlow and
// by the editor store. Never a throw; what is dropped names a real place; the canvas always turns
// back into a document; a valid document opens without loss.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { validateDesign } from "../../../app/engine";
import { documentToFlow, flowToDocument } from "../../../app/canvas/convert";
import { createEditorStore } from "../../../app/canvas/store";
import { mutatedDesign, pathNamesPlaceIn } from "../../support/fuzz-designs";

// Generous per-test limits: the machine is shared; these are not timing assertions.
const SLOW = 120_000;
// Fixed seeds so a failure replays the same way (fast-check prints the seed and path on failure).
const SEED = 0x1a9b07;

const withoutLayout = (d: unknown) => {
  const { layout: _layout, ...rest } = d as Record<string, unknown>;
  return rest;
};
/** The document as the canvas keeps it: no positions, and wires as their two ends (edges carry no other fields). */
const asCanvasKeeps = (d: unknown) => {
  const rest = withoutLayout(d);
  const wires = Array.isArray(rest.wires) ? rest.wires.map((w: { from: string; to: string }) => ({ from: w.from, to: w.to })) : rest.wires;
  return { ...rest, wires };
};

/** Opens `doc` as the import does and checks the canvas it makes. */
function checkImport(doc: unknown): void {
  const g = documentToFlow(doc, "Imported design");
  // Dropped items name the list entry they came from.
  for (const note of g.dropped) {
    const m = /^((components|wires)\[\d+\]): /.exec(note);
    if (!m || !pathNamesPlaceIn(doc, m[1]!)) throw new Error(`dropped note names no place in the document: ${note}`);
  }
  const ids = g.nodes.map((n) => n.id);
  expect(new Set(ids).size).toBe(ids.length);
  for (const e of g.edges) {
    expect(ids).toContain(e.source);
    expect(ids).toContain(e.target);
  }
  expect(new Set(g.edges.map((e) => e.id)).size).toBe(g.edges.length);
  for (const id of g.unplaced) expect(ids).toContain(id);

  const back = flowToDocument(g.rest, g.nodes, g.edges);
  // Whatever came in, the canvas's document is one the engine can judge and JSON can carry.
  const checked = validateDesign(back);
  if (!checked.ok) for (const p of checked.problems) expect(pathNamesPlaceIn(back, p.path)).toBe(true);
  expect(JSON.parse(JSON.stringify(back))).toBeTypeOf("object");

  if (validateDesign(doc).ok) {
    // A valid document opens without loss (positions aside).
    expect(g.dropped).toEqual([]);
    expect(asCanvasKeeps(back)).toEqual(asCanvasKeeps(doc));
  }
}

describe("importing a design into the editor under bad input", () => {
  it("documentToFlow never throws on 2,000 mutated designs and keeps valid ones intact", { timeout: SLOW }, () => {
    fc.assert(fc.property(mutatedDesign(4), checkImport), { seed: SEED, numRuns: 2000 });
  });

  it("documentToFlow never throws on 1,500 arbitrary JSON values", { timeout: SLOW }, () => {
    fc.assert(
      fc.property(
        fc.oneof(
          fc.jsonValue({ maxDepth: 5 }),
          fc.dictionary(
            fc.constantFrom("format", "name", "conditions", "components", "wires", "controller", "rules", "layout"),
            fc.jsonValue({ maxDepth: 4 }),
          ),
        ),
        checkImport,
      ),
      { seed: SEED + 1, numRuns: 1500 },
    );
  });

  it("the editor store opens and replaces with 500 mutated designs; undo returns the previous document", { timeout: SLOW }, () => {
    fc.assert(
      fc.property(mutatedDesign(3), mutatedDesign(3), (first, second) => {
        const store = createEditorStore({ initial: first, readOnly: false, designName: "Scree trail bike prototype P2", baseRevision: 0 });
        const opened = store.getState().document();
        for (const note of store.getState().loadNotes) expect(note).toMatch(/^(components|wires)\[\d+\]: /);
        // A document without a name of its own keeps the open design's name.
        const expected = flowToDocument(...flowArgs(second, store.getState().rest.name));
        store.getState().replace(second, { keepHistory: true });
        expect(withoutLayout(store.getState().document())).toEqual(withoutLayout(expected));
        store.getState().undo();
        expect(withoutLayout(store.getState().document())).toEqual(withoutLayout(opened));
      }),
      { seed: SEED + 2, numRuns: 500 },
    );
  });
});

function flowArgs(doc: unknown, fallbackName: string): Parameters<typeof flowToDocument> {
  const g = documentToFlow(doc, fallbackName);
  return [g.rest, g.nodes, g.edges];
}
