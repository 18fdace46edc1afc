// Every kind of invalid design named by the spec (section 3), each reported at its exact field path.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { compileDesign, ENGINE_ROW_LIMIT, validateDesign, type Design, type Problem } from "../../../app/engine";

const base: Design = JSON.parse(readFileSync("/work/shared/spec/examples/trail-bike.design.json", "utf8"));
// trail-bike: conditions key, kill, stand, grip; components BAT(0) IG(1) KL(2) ST(3) PWR(4) EN(5).

function problems(mutate: (d: any) => void): Problem[] {
  const d = structuredClone(base) as any;
  mutate(d);
  const r = validateDesign(d);
  return r.ok ? [] : r.problems;
}
const paths = (ps: Problem[]) => ps.map((p) => p.path);

describe("validateDesign", () => {
  it("accepts the example design and returns it", () => {
    const r = validateDesign(base);
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.design.name).toBe(base.name);
  });

  it.each<[string, (d: any) => void, string, string]>([
    ["a wrong format string", (d) => (d.format = "chainproof/design@2"), "format", "chainproof/design@1"],
    ["a wrong type", (d) => (d.components[1].label = 7), "components[1].label", "expected string"],
    ["a list that is not a list", (d) => (d.wires = {}), "wires", "expected array"],
    ["bad id characters", (d) => (d.conditions[0].id = "key switch"), "conditions[0].id", "1-64 characters"],
    ["an id over 64 characters", (d) => (d.components[0].id = "B".repeat(65)), "components[0].id", "1-64 characters"],
    ["a duplicate condition id", (d) => (d.conditions[2].id = "key"), "conditions[2].id", 'duplicate condition id "key"'],
    ["a duplicate component id", (d) => (d.components[3].id = "KL"), "components[3].id", 'duplicate component id "KL"'],
    ["a condition/component id collision", (d) => (d.components[0].id = "stand"), "components[0].id", "also the id of a condition"],
    ["a duplicate rule id", (d) => (d.rules[1].id = "stand"), "rules[1].id", 'duplicate rule id "stand"'],
    ["a condition with one state", (d) => (d.conditions[1].states = ["run"]), "conditions[1].states", "2 to 8"],
    ["a condition with nine states", (d) => (d.conditions[1].states = "abcdefghi".split("")), "conditions[1].states", "2 to 8"],
    ["a repeated state", (d) => d.conditions[0].states.push("off"), "conditions[0].states[2]", 'state "off" is listed twice'],
    [
      "an unknown contact condition",
      (d) => (d.components[1].condition = "ignition"),
      "components[1].condition",
      'no condition with id "ignition"',
    ],
    [
      "a closedIn state not in its condition",
      (d) => (d.components[2].closedIn = ["running"]),
      "components[2].closedIn[0]",
      'state "running" is not a state of condition "kill"',
    ],
    ["an empty closedIn", (d) => (d.components[2].closedIn = []), "components[2].closedIn", "at least one state"],
    ["an unknown component type", (d) => (d.components[1].type = "relay"), "components[1].type", "discriminator"],
    ["an unknown input function", (d) => (d.components[5].function = "horn"), "components[5].function", "Invalid option"],
    [
      "a second input with the same function",
      (d) => (d.components[5].function = "power"),
      "components[5].function",
      'second input with function "power"',
    ],
    ["no supply", (d) => (d.components[0].type = "junction"), "components", "no supply"],
    ["a wire to a missing component", (d) => (d.wires[0].from = "BATT.+"), "wires[0].from", 'no component with id "BATT"'],
    ["a wire to a missing terminal", (d) => (d.wires[1].to = "PWR.out"), "wires[1].to", 'has no terminal "out"'],
    ["a wire end without a terminal", (d) => (d.wires[2].to = "KL"), "wires[2].to", "COMPONENT.TERMINAL"],
    [
      "an unknown throttle condition",
      (d) => (d.controller.throttle.condition = "twist"),
      "controller.throttle.condition",
      'no condition with id "twist"',
    ],
    [
      "a throttle state in no class",
      (d) => (d.controller.throttle.fault = []),
      "controller.throttle",
      'state "fault" of condition "grip" is in no throttle class',
    ],
    [
      "a throttle state in two classes",
      (d) => d.controller.throttle.applied.push("closed"),
      "controller.throttle.applied[1]",
      'already in throttle class "released"',
    ],
    [
      "a throttle class state not in its condition",
      (d) => d.controller.throttle.fault.push("stuck"),
      "controller.throttle.fault[1]",
      'state "stuck" is not a state of condition "grip"',
    ],
    [
      "an empty applied class",
      (d) => {
        d.controller.throttle.applied = [];
        d.controller.throttle.released.push("open");
      },
      "controller.throttle.applied",
      "at least one applied state",
    ],
    ["a missing throttle", (d) => delete d.controller.throttle, "controller.throttle", "expected object"],
    ["an unknown lockout", (d) => d.controller.lockouts.push("seat-return"), "controller.lockouts[2]", "Invalid option"],
    ["an unknown rule type", (d) => (d.rules[0].type = "require"), "rules[0].type", "discriminator"],
    [
      "a rule on an unknown condition",
      (d) => (d.rules[0].when = { cond: "door", in: ["open"] }),
      "rules[0].when.cond",
      'no condition with id "door"',
    ],
    [
      "a nested rule on an unknown condition",
      (d) => (d.rules[0].when = { all: [{ always: true }, { not: { cond: "door", in: ["x"] } }] }),
      "rules[0].when.all[1].not.cond",
      'no condition with id "door"',
    ],
    [
      "a rule on an unknown state",
      (d) => (d.rules[1].when = { any: [{ cond: "kill", in: ["run", "halt"] }] }),
      "rules[1].when.any[0].in[1]",
      'state "halt" is not a state of condition "kill"',
    ],
    [
      "a predicate mixing forms",
      (d) => (d.rules[0].when = { cond: "stand", in: ["down"], not: { always: true } }),
      "rules[0].when",
      "exactly one form",
    ],
    ["a predicate with no form", (d) => (d.rules[0].when = {}), "rules[0].when", "a predicate is one of"],
    ["a condition test without states", (d) => (d.rules[0].when = { cond: "stand" }), "rules[0].when.in", '"in"'],
    [
      "forbid energized an unknown id",
      (d) => (d.rules[0].forbid = { energized: "ENABLE" }),
      "rules[0].forbid.energized",
      'no component with id "ENABLE"',
    ],
    [
      "forbid energized a non-input",
      (d) => (d.rules[0].forbid = { energized: "KL" }),
      "rules[0].forbid.energized",
      'component "KL" is a contact, not an input',
    ],
    ["a bad forbid", (d) => (d.rules[0].forbid = "motion"), "rules[0].forbid", 'forbid is "drive"'],
  ])("reports %s", (_, mutate, path, message) => {
    // Consequences may be listed too (a renamed condition leaves its references dangling).
    const ps = problems(mutate);
    expect(ps).toContainEqual({ path, message: expect.stringContaining(message) });
  });

  it("reports a document that is not an object at the root path", () => {
    const r = validateDesign(42);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.problems).toEqual([{ path: "", message: expect.stringContaining("expected object") }]);
  });

  it("reports too many rows, naming the limit", () => {
    expect(ENGINE_ROW_LIMIT).toBeGreaterThanOrEqual(2 ** 24);
    const ps = problems((d) => {
      for (let i = 0; i < 24; i++) d.conditions.push({ id: `extra${i}`, label: "x", states: ["a", "b"] });
    });
    expect(paths(ps)).toEqual(["conditions"]);
    expect(ps[0].message).toContain(String(ENGINE_ROW_LIMIT));
  });

  it("accepts exactly the row limit", () => {
    const ps = problems((d) => {
      d.conditions = [
        { id: "grip", states: ["closed", "open", "fault", "x"] },
        ...Array.from({ length: 22 }, (_, i) => ({ id: `c${i}`, states: ["a", "b"] })),
      ];
      d.controller.throttle.fault = ["fault", "x"];
      d.components = d.components.filter((c: any) => c.type !== "contact");
      d.wires = [{ from: "BAT.+", to: "PWR.in" }];
      d.rules = [];
    });
    expect(ps).toEqual([]);
  });

  it("lists every problem of a design with several", () => {
    const ps = problems((d) => {
      d.format = "nope";
      d.components[2].closedIn = ["running"];
      d.wires[1].to = "PWR.out";
      d.rules[0].forbid = { energized: "KL" };
    });
    expect(paths(ps).sort()).toEqual(["components[2].closedIn[0]", "format", "rules[0].forbid.energized", "wires[1].to"]);
  });

  it("treats self-wires, duplicate wires and repeated closedIn states as harmless", () => {
    const ps = problems((d) => {
      d.wires.push({ from: "KL.2", to: "KL.2" }, { ...d.wires[0] });
      d.components[2].closedIn = ["run", "run"];
      d.controller.lockouts.push("power-on");
    });
    expect(ps).toEqual([]);
  });

  it("keeps unknown keys and the layout", () => {
    const r = validateDesign({ ...base, layout: { IG: { x: 1, y: 2 } }, notes: "kept" });
    expect(r.ok && r.design.layout).toEqual({ IG: { x: 1, y: 2 } });
    expect(r.ok && r.design.notes).toBe("kept");
  });

  it("makes compileDesign throw on an invalid design", () => {
    expect(() => compileDesign({ ...base, components: [] })).toThrow(/no supply/);
  });
});
