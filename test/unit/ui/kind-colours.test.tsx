// @vitest-environment jsdom
// Supply and input keep their colours in every drawing: the editor's minimap and the review/report
// diagram read one table (app/lib/kind-colours.ts), and the table's tokens resolve, through app.css,
// to two different palette colours: copper for a supply, moss for an input (decision 145).
import { readFileSync } from "node:fs";
import { afterEach, describe, expect, it } from "vitest";
import { cleanup, render } from "@testing-library/react";
import { KIND_COLOURS, kindColours } from "../../../app/lib/kind-colours";
import { minimapNodeColor } from "../../../app/canvas/canvas-view";
import { WiringDiagram } from "../../../app/components/wiring-diagram";
import type { Design } from "../../../app/engine";

afterEach(cleanup);

/** Follows var(--x) through the custom properties declared in app.css to a hex colour. */
function resolve(value: string): string {
  const css = readFileSync("app/app.css", "utf8");
  const decl = new Map([...css.matchAll(/(--[a-z0-9-]+):\s*([^;]+);/g)].map((m) => [m[1]!, m[2]!.trim()]));
  let v = value;
  for (let hops = 0; hops < 10; hops++) {
    const m = /^var\((--[a-z0-9-]+)\)$/.exec(v);
    if (!m) return v;
    const next = decl.get(m[1]!);
    if (next === undefined) throw new Error(`${m[1]} is not declared in app.css`);
    v = next;
  }
  throw new Error(`${value} does not resolve`);
}

const design = {
  format: "chainproof/design@1",
  name: "Two-part chain",
  conditions: [{ id: "seat", label: "Seat", states: ["empty", "occupied"] }],
  components: [
    { id: "B", type: "supply", label: "Battery +" },
    { id: "S1", type: "contact", label: "Seat switch", condition: "seat", closedIn: ["occupied"] },
    { id: "J", type: "junction" },
    { id: "EN", type: "input", label: "Enable", function: "enable" },
  ],
  wires: [
    { from: "B.+", to: "S1.1" },
    { from: "S1.2", to: "J.j" },
    { from: "J.j", to: "EN.in" },
  ],
} as unknown as Design;

describe("one colour table for component kinds", () => {
  it("a supply is copper and an input moss, different from each other and from the parts", () => {
    // The palette's values are Chainproof's own (app.css): copper-600 #ad5520, moss-600 #3f7a35.
    expect(resolve(KIND_COLOURS.supply.mark)).toBe("#ad5520");
    expect(resolve(KIND_COLOURS.input.mark)).toBe("#3f7a35");
    const marks = new Set((["supply", "input", "contact"] as const).map((k) => resolve(KIND_COLOURS[k].mark)));
    expect(marks.size).toBe(3);
    for (const k of Object.keys(KIND_COLOURS) as Array<keyof typeof KIND_COLOURS>)
      for (const c of Object.values(KIND_COLOURS[k])) expect(resolve(c)).toMatch(/^#[0-9a-f]{6}$/);
  });

  it("the minimap colours each node by its kind from the table", () => {
    expect(minimapNodeColor({ type: "supply" })).toBe(KIND_COLOURS.supply.mark);
    expect(minimapNodeColor({ type: "input" })).toBe(KIND_COLOURS.input.mark);
    expect(minimapNodeColor({ type: "contact" })).toBe(KIND_COLOURS.contact.mark);
    expect(minimapNodeColor({})).toBe(kindColours(undefined).mark);
  });

  it("the report diagram outlines a supply and an input in the same colours as the minimap", () => {
    const { container } = render(<WiringDiagram design={design} />);
    const box = (kind: string) => container.querySelector(`g[data-kind="${kind}"] rect`)!;
    expect(resolve(box("supply").getAttribute("stroke")!)).toBe(resolve(minimapNodeColor({ type: "supply" })));
    expect(resolve(box("input").getAttribute("stroke")!)).toBe(resolve(minimapNodeColor({ type: "input" })));
    expect(resolve(box("supply").getAttribute("stroke")!)).not.toBe(resolve(box("input").getAttribute("stroke")!));
    expect(box("supply").getAttribute("fill")).toBe(KIND_COLOURS.supply.fill);
    expect(box("input").getAttribute("fill")).toBe(KIND_COLOURS.input.fill);
  });
});
