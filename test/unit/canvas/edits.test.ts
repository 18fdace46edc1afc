// Reference-keeping edits of conditions, states, rules and the design name (app/canvas/edits.ts).
import { describe, expect, it } from "vitest";
import { documentToFlow, flowToDocument } from "../../../app/canvas/convert";
import {
  addState,
  removeCondition,
  removeState,
  renameCondition,
  renameDesign,
  renameRule,
  renameState,
  type Graph,
  type Outcome,
} from "../../../app/canvas/edits";

function graph(extra: { states?: string[] } = {}) {
  const g = documentToFlow({
    format: "chainproof/design@1",
    name: "Meadowline deck mower M-11",
    conditions: [
      { id: "park", label: "Park brake", states: ["set", "off"] },
      { id: "park2", label: "Second park switch", states: ["set", "off"] },
      { id: "key", states: extra.states ?? ["off", "on", "start"] },
      { id: "throttle", states: ["released", "applied"] },
    ],
    components: [
      { id: "B1", type: "supply" },
      { id: "K1", type: "contact", condition: "key", closedIn: ["on"] },
      { id: "K2", type: "contact", condition: "park", closedIn: ["off"] },
      { id: "EN", type: "input", function: "enable" },
    ],
    wires: [],
    controller: { throttle: { condition: "throttle", released: ["released"], applied: ["applied"] } },
    rules: [
      {
        id: "R1",
        type: "inhibit",
        when: {
          all: [
            { cond: "park", in: ["set"] },
            { cond: "key", in: ["on", "start"] },
          ],
        },
        forbid: "drive",
      },
      { id: "R2", type: "inhibit", when: { cond: "key", in: ["off"] }, forbid: { energized: "EN" } },
    ],
  });
  return { rest: g.rest, nodes: g.nodes, edges: g.edges };
}
const ok = (o: Outcome) => {
  if (!o.ok) throw new Error(`refused: ${o.message}`);
  return o;
};
const docOf = (g: Graph & { edges?: ReturnType<typeof graph>["edges"] }) => flowToDocument(g.rest, g.nodes, []);

describe("renaming a condition", () => {
  it("refuses an id another condition has ('park2' back to 'park'), with a sentence, and changes nothing", () => {
    const g = graph();
    const o = renameCondition(g, 1, "park");
    expect(o).toEqual({ ok: false, message: "another condition is already called “park”" });
  });

  it("moves every reference at once: contacts, rule tests; a component id is refused", () => {
    const g = graph();
    const d = docOf(ok(renameCondition(g, 0, "parkbrake")));
    expect(d.components.find((c) => c.id === "K2")).toMatchObject({ condition: "parkbrake" });
    expect(JSON.stringify(d.rules[0])).toContain('"cond":"parkbrake"');
    expect(d.conditions[1].id).toBe("park2");
    expect(renameCondition(g, 0, "K1")).toMatchObject({ ok: false, message: expect.stringContaining("component") });
    expect(renameCondition(g, 0, "has space")).toMatchObject({ ok: false, message: expect.stringContaining("1-64 characters") });
  });

  it("renaming one of two conditions that share an id leaves the references with the other", () => {
    const g = graph();
    g.rest.conditions[1] = { ...g.rest.conditions[1], id: "park" };
    const d = docOf(ok(renameCondition(g, 1, "park3")));
    expect(d.conditions.map((c) => c.id)).toEqual(["park", "park3", "key", "throttle"]);
    expect(d.components.find((c) => c.id === "K2")).toMatchObject({ condition: "park" });
  });

  it("refuses to remove a condition in use, naming who uses it", () => {
    expect(removeCondition(graph(), 2)).toEqual({ ok: false, message: "“key” is used by K1, rule R1 and rule R2: change them first" });
    expect(removeCondition(graph(), 3)).toMatchObject({ ok: false, message: expect.stringContaining("the throttle") });
    expect(docOf(ok(removeCondition(graph(), 1))).conditions.map((c) => c.id)).toEqual(["park", "key", "throttle"]);
  });
});

describe("renaming and removing states", () => {
  it("refuses a name the condition already has ('on' on the way to 'on2' never merges)", () => {
    expect(renameState(graph(), 2, 2, "on")).toEqual({ ok: false, message: "key already has a state “on”" });
    const d = docOf(ok(renameState(graph(), 2, 1, "on2")));
    expect(d.conditions[2].states).toEqual(["off", "on2", "start"]);
    expect(d.components.find((c) => c.id === "K1")).toMatchObject({ closedIn: ["on2"] });
    expect(JSON.stringify(d.rules[0])).toContain('"in":["on2","start"]');
  });

  it("renaming one of two equal states renames only that one and keeps the references", () => {
    const g = graph({ states: ["off", "on", "on"] });
    const d = docOf(ok(renameState(g, 2, 2, "start")));
    expect(d.conditions[2].states).toEqual(["off", "on", "start"]);
    expect(d.components.find((c) => c.id === "K1")).toMatchObject({ closedIn: ["on"] });
  });

  it("removing one of two equal states removes one, and the contact closed in it keeps its state", () => {
    const g = graph({ states: ["off", "on", "on"] });
    const d = docOf(ok(removeState(g, 2, 2)));
    expect(d.conditions[2].states).toEqual(["off", "on"]);
    expect(d.components.find((c) => c.id === "K1")).toMatchObject({ closedIn: ["on"] });
    expect(JSON.stringify(d.rules[0])).toContain('"in":["on","start"]');
  });

  it("refuses to remove the only state a contact closes in, or to go below two states", () => {
    expect(removeState(graph(), 2, 1)).toEqual({ ok: false, message: "K1 conducts only in “on”: change it first" });
    expect(removeState(graph(), 0, 0)).toMatchObject({ ok: false, message: "a condition needs at least 2 states" });
    const d = docOf(ok(removeState(graph(), 2, 2)));
    expect(JSON.stringify(d.rules[0])).toContain('"in":["on"]');
  });

  it("refuses an empty, duplicate or ninth state", () => {
    expect(addState(graph(), 2, "  ")).toMatchObject({ ok: false, message: "a state needs a name" });
    expect(addState(graph(), 2, "on")).toMatchObject({ ok: false });
    expect(addState(graph({ states: ["a", "b", "c", "d", "e", "f", "g", "h"] }), 2, "i")).toMatchObject({
      ok: false,
      message: "a condition has at most 8 states",
    });
  });
});

describe("rules and the design name", () => {
  it("refuses a rule id another rule has, and an empty design name", () => {
    expect(renameRule(graph(), 1, "R1")).toEqual({ ok: false, message: "another rule is already called “R1”" });
    expect(docOf(ok(renameRule(graph(), 1, "R3"))).rules.map((r) => r.id)).toEqual(["R1", "R3"]);
    expect(renameDesign(graph(), "   ")).toEqual({ ok: false, message: "a design needs a name" });
    expect(docOf(ok(renameDesign(graph(), " Mower "))).name).toBe("Mower");
  });
});
