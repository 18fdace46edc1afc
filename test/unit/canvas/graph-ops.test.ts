import { describe, expect, it } from "vitest";
import { documentToFlow, flowToDocument } from "../../../app/canvas/convert";
import { addInParallel, addInSeries, checkConnection, duplicateNodes, newNode } from "../../../app/canvas/graph-ops";

function small() {
  const base = documentToFlow({
    format: "chainproof/design@1",
    name: "Haybarn campus hauler #3",
    conditions: [
      { id: "seat", states: ["empty", "occupied"] },
      { id: "throttle", states: ["released", "applied"] },
    ],
    components: [
      { id: "B1", type: "supply" },
      { id: "K1", type: "contact", condition: "seat", closedIn: ["occupied"] },
      { id: "EN", type: "input", function: "enable" },
    ],
    wires: [
      { from: "B1.+", to: "K1.1" },
      { from: "K1.2", to: "EN.in" },
    ],
    controller: { throttle: { condition: "throttle", released: ["released"], applied: ["applied"] } },
    rules: [],
  });
  return base;
}

const wires = (g: ReturnType<typeof small>, nodes = g.nodes, edges = g.edges) => flowToDocument(g.rest, nodes, edges).wires;

describe("series and parallel", () => {
  it("adds a contact in series after K1: K1.2 feeds the new contact, which takes over K1's outgoing wire", () => {
    const g = small();
    const out = addInSeries("K1", g.nodes, g.edges, g.rest)!;
    expect(out.added).toBe("K2");
    expect(wires(g, out.nodes, out.edges)).toEqual([
      { from: "B1.+", to: "K1.1" },
      { from: "K2.2", to: "EN.in" },
      { from: "K1.2", to: "K2.1" },
    ]);
    expect(out.nodes.find((n) => n.id === "K2")).toMatchObject({ type: "contact", data: { condition: "seat", closedIn: ["occupied"] } });
  });

  it("adds a contact in parallel across K1: both terminals joined to K1's", () => {
    const g = small();
    const out = addInParallel("K1", g.nodes, g.edges, g.rest)!;
    expect(wires(g, out.nodes, out.edges)).toEqual([
      { from: "B1.+", to: "K1.1" },
      { from: "K1.2", to: "EN.in" },
      { from: "K1.1", to: "K2.1" },
      { from: "K1.2", to: "K2.2" },
    ]);
  });

  it("refuses series/parallel on something that is not a contact", () => {
    const g = small();
    expect(addInSeries("B1", g.nodes, g.edges, g.rest)).toBeNull();
    expect(addInParallel("nope", g.nodes, g.edges, g.rest)).toBeNull();
  });
});

describe("isValidConnection rules", () => {
  const g = small();
  const check = (source: string, sourceHandle: string, target: string, targetHandle: string) =>
    checkConnection({ source, sourceHandle, target, targetHandle }, g.nodes, g.edges);

  it("accepts a wire between two free terminals of different components", () => {
    const r = check("B1", "+", "EN", "in");
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.edge).toMatchObject({ source: "B1", sourceHandle: "+", target: "EN", targetHandle: "in" });
  });
  it("refuses a terminal to itself", () =>
    expect(check("K1", "1", "K1", "1")).toMatchObject({ ok: false, reason: expect.stringContaining("itself") }));
  it("refuses a wire across one contact", () => expect(check("K1", "1", "K1", "2").ok).toBe(false));
  it("refuses a duplicate wire in either direction", () => {
    expect(check("B1", "+", "K1", "1").ok).toBe(false);
    expect(check("K1", "1", "B1", "+").ok).toBe(false);
  });
  it("refuses a handle that is not a terminal of its component", () => expect(check("B1", "-", "K1", "1").ok).toBe(false));
  it("refuses an unknown component", () => expect(check("B1", "+", "ZZ", "1").ok).toBe(false));
  it("refuses a wire between terminals already joined through a junction", () => {
    const t = documentToFlow({
      conditions: [],
      controller: {},
      components: [
        { id: "B1", type: "supply" },
        { id: "J1", type: "junction" },
        { id: "K1", type: "contact", condition: "c", closedIn: ["a"] },
      ],
      wires: [
        { from: "B1.+", to: "J1.j" },
        { from: "J1.j", to: "K1.1" },
      ],
    });
    expect(checkConnection({ source: "K1", sourceHandle: "1", target: "B1", targetHandle: "+" }, t.nodes, t.edges).ok).toBe(false);
    expect(checkConnection({ source: "K1", sourceHandle: "2", target: "B1", targetHandle: "+" }, t.nodes, t.edges).ok).toBe(true);
  });
});

describe("new components and duplicates", () => {
  it("names inputs by function and numbers other kinds without colliding", () => {
    const g = small();
    expect(newNode("contact", { x: 0, y: 0 }, g.nodes, g.rest).id).toBe("K2");
    expect(newNode("input", { x: 0, y: 0 }, g.nodes, g.rest, "forward").id).toBe("FWD");
    expect(newNode("input", { x: 0, y: 0 }, g.nodes, g.rest, "enable").id).toBe("EN1");
    expect(newNode("supply", { x: 0, y: 0 }, g.nodes, g.rest).id).toBe("B2");
  });

  it("duplicates selected components with the wires between them", () => {
    const g = small();
    const nodes = g.nodes.map((n) => (n.id !== "EN" ? { ...n, selected: true } : n));
    const out = duplicateNodes(nodes, g.edges, g.rest)!;
    expect(out.nodes.filter((n) => n.selected).map((n) => n.id)).toEqual(["B2", "K2"]);
    expect(wires(g, out.nodes, out.edges).slice(2)).toEqual([{ from: "B2.+", to: "K2.1" }]);
  });
});
