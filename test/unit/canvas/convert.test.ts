import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { validateDesign } from "../../../app/engine";
import { contentKey, documentToFlow, flowToDocument, starterDocument } from "../../../app/canvas/convert";

// The spec's examples live in shared/ beside the repository (also in CI).
const EXAMPLES = [path.resolve(process.cwd(), "../shared/spec/examples"), "/work/shared/spec/examples"].find((d) => existsSync(d))!;
const load = (name: string) => JSON.parse(readFileSync(`${EXAMPLES}/${name}.design.json`, "utf8"));

describe("design document <-> canvas", () => {
  for (const name of ["campus-hauler", "deck-mower", "trail-bike"]) {
    it(`round-trips the spec example ${name} (equal up to layout)`, () => {
      const doc = load(name);
      const g = documentToFlow(doc);
      expect(g.dropped).toEqual([]);
      expect(g.nodes).toHaveLength(doc.components.length);
      expect(g.edges).toHaveLength(doc.wires.length);
      const back = flowToDocument(g.rest, g.nodes, g.edges);
      const { layout: _a, ...original } = doc;
      const { layout, ...roundTripped } = back;
      expect(roundTripped).toEqual(original);
      expect(contentKey(back)).toBe(contentKey(doc));
      expect(Object.keys(layout ?? {})).toEqual(doc.components.map((c: { id: string }) => c.id));
      expect(validateDesign(back).ok).toBe(true);
    });
  }

  it("keeps saved positions and reports components without one", () => {
    const doc = load("trail-bike");
    doc.layout = { [doc.components[0].id]: { x: 12, y: 34 } };
    const g = documentToFlow(doc);
    expect(g.nodes[0].position).toEqual({ x: 12, y: 34 });
    expect(g.unplaced).toEqual(doc.components.slice(1).map((c: { id: string }) => c.id));
  });

  it("opens an empty or non-object document as the starter design", () => {
    for (const input of [null, {}, "nonsense", { name: "Meadowline deck mower M-11" }]) {
      const g = documentToFlow(input, "Fallback");
      expect(g.nodes).toEqual([]);
      expect(g.rest.conditions.map((c) => c.id)).toEqual(["throttle"]);
      expect(g.rest.controller.throttle.condition).toBe("throttle");
    }
    expect(documentToFlow({ name: "Scree trail bike prototype P2" }).rest.name).toBe("Scree trail bike prototype P2");
    expect(flowToDocument(documentToFlow(null, "X").rest, [], []).conditions).toEqual(starterDocument("X").conditions);
  });

  it("opens an invalid document without throwing, dropping only what cannot be drawn", () => {
    const g = documentToFlow({
      conditions: [{ id: "seat", states: ["empty", "occupied"] }],
      components: [
        { id: "B1", type: "supply" },
        { id: "Q", type: "lamp" },
        { id: "K1", type: "contact", condition: "nope", closedIn: "x" },
      ],
      wires: [{ from: "B1.+", to: "K1.1" }, { from: "B1.+", to: "ZZ.1" }, 7],
      controller: 3,
      rules: [{ id: "r", type: "inhibit" }],
    });
    expect(g.nodes.map((n) => n.id)).toEqual(["B1", "K1"]);
    expect(g.edges).toHaveLength(1);
    expect(g.dropped).toHaveLength(3);
    expect(g.nodes[1].data).toMatchObject({ condition: "nope", closedIn: [] });
    const back = flowToDocument(g.rest, g.nodes, g.edges);
    const v = validateDesign(back);
    expect(v.ok).toBe(false);
  });
});
