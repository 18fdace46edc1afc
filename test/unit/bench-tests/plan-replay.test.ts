// Property test: bench plans for random designs (several released throttle states, dual-channel
// contacts, contacts closed in every state, pedal switches, shared feeds, every lockout) replayed
// from the spec's step semantics by the independent reference in bench-reference.ts (graph
// connectivity and a step function written from spec 1.5, not the engine): every expectation, every
// "reveals", every revealable fault revealed, every other fault explained, every rule and lockout
// claim, and the lower bound against a brute-force minimum.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { generateBenchPlan } from "../../../app/bench-tests/generate";
import { LOCKOUTS, validateDesign, type Component, type Design, type InputFunction, type Lockout, type Rule } from "../../../app/engine";
import { checkPlan, fewestRows, Reference } from "./bench-reference";

const SLOW = 240_000;

/**
 * A design built the way vehicles are wired: each input fed from the supply (or from a shared
 * feed such as a key switch) through a chain of contacts, where a chain may be a dual channel (two
 * contacts worked by one condition), may hold a contact closed in every state, may get a parallel
 * bypass, and may run through a switch on the throttle itself.
 */
export function benchDesign(g: fc.GeneratorValue): Design {
  const int = (min: number, max: number) => g(fc.integer, { min, max });
  const pick = <T>(xs: T[]): T => xs[int(0, xs.length - 1)];
  const released = ["idle", "creep"].slice(0, int(1, 2));
  const applied = ["on", "full"].slice(0, int(1, 2));
  const fault = int(0, 1) === 1 ? ["bad"] : [];
  const throttleStates = [...released, ...applied, ...fault].slice(0, 4);
  const conditions: Array<{ id: string; states: string[] }> = [{ id: "t", states: throttleStates }];
  const extra = int(1, throttleStates.length > 3 ? 2 : 3);
  for (let i = 0; i < extra; i++) conditions.push({ id: `c${i}`, states: ["a", "b", "c"].slice(0, int(2, 3)) });
  const order = g(fc.shuffledSubarray, conditions, { minLength: conditions.length, maxLength: conditions.length });
  const components: Component[] = [{ id: "BAT", type: "supply", label: "BAT" }];
  const wires: Array<{ from: string; to: string }> = [];
  let n = 0;
  const contact = (cond: { id: string; states: string[] }, closedIn?: string[]) => {
    const id = `K${n++}`;
    components.push({
      id,
      type: "contact",
      label: id,
      condition: cond.id,
      closedIn: closedIn ?? g(fc.subarray, cond.states, { minLength: 1, maxLength: cond.states.length - 1 }),
    });
    return id;
  };
  const fns: InputFunction[] = g(fc.shuffledSubarray, ["power", "enable", "forward", "reverse", "brake"] as InputFunction[], {
    minLength: 1,
    maxLength: 4,
  });
  // A shared feed (a key switch feeding several lines) half of the time.
  let feed = "BAT.+";
  if (int(0, 1) === 1) {
    const k = contact(pick(order.filter((c) => c.id !== "t")));
    wires.push({ from: "BAT.+", to: `${k}.1` });
    components.push({ id: "JF", type: "junction" });
    wires.push({ from: `${k}.2`, to: "JF.j" });
    feed = "JF.j";
  }
  for (const fn of fns) {
    const input = `I_${fn}`;
    components.push({ id: input, type: "input", label: input, function: fn });
    let from = feed;
    const kind = int(0, 4);
    const links: string[] = [];
    if (kind === 0) {
      // Dual channel: two contacts on one condition in series.
      const cond = pick(order);
      const closedIn = g(fc.subarray, cond.states, { minLength: 1, maxLength: cond.states.length - 1 });
      links.push(contact(cond, closedIn), contact(cond, closedIn));
    } else if (kind === 1) {
      // A contact closed in every state in series with an ordinary one.
      const cond = pick(order);
      links.push(contact(cond, cond.states.slice()), contact(pick(order)));
    } else if (kind === 2) {
      // A switch on the throttle (a pedal switch) in series.
      links.push(contact(order.find((c) => c.id === "t")!), contact(pick(order)));
    } else {
      for (let k = int(1, 2); k > 0; k--) links.push(contact(pick(order)));
    }
    for (const k of links) {
      wires.push({ from, to: `${k}.1` });
      from = `${k}.2`;
    }
    wires.push({ from, to: `${input}.in` });
    if (int(0, 3) === 0) {
      // A parallel bypass around the chain.
      const k = contact(pick(order));
      wires.push({ from: feed, to: `${k}.1` }, { from: `${k}.2`, to: `${input}.in` });
    }
  }
  const rules: Rule[] = [];
  for (let i = int(0, 2); i > 0; i--) {
    const cond = pick(order);
    const forbid = int(0, 2) === 0 ? { energized: `I_${pick(fns)}` } : ("drive" as const);
    rules.push({
      id: `R${rules.length}`,
      label: `R${rules.length}`,
      type: "inhibit",
      when: { cond: cond.id, in: g(fc.subarray, cond.states, { minLength: 1 }) },
      forbid,
    });
  }
  if (int(0, 1) === 1) {
    const cond = pick(order);
    rules.push({
      id: `D${rules.length}`,
      label: "drives",
      type: "require-drive",
      when: {
        all: [
          { cond: "t", in: applied },
          { cond: cond.id, in: g(fc.subarray, cond.states, { minLength: 1 }) },
        ],
      },
    });
  }
  if (int(0, 1) === 1) rules.push({ id: "NR", label: "NR", type: "no-restart" });
  return {
    format: "chainproof/design@1",
    name: "bench property design",
    conditions: order.map((c) => ({ id: c.id, label: c.id, states: c.states })),
    components,
    wires,
    controller: {
      throttle: { condition: "t", released, applied, fault },
      brakeCutsDrive: g(fc.boolean),
      lockouts: g(fc.subarray, [...LOCKOUTS]) as Lockout[],
    },
    rules,
    layout: {},
  };
}

const designs = fc.gen().map((g) => benchDesign(g));

describe("bench plans replayed from the spec's step semantics", () => {
  it(
    "hold every expectation, reveal every revealable fault and explain every other item (random designs)",
    () => {
      const seen = {
        designs: 0,
        twoReleased: 0,
        dual: 0,
        alwaysClosed: 0,
        lockoutChecks: 0,
        unrevealable: 0,
        ruleSteps: 0,
        requireDrive: 0,
        anyOrder: 0,
      };
      fc.assert(
        fc.property(designs, (d) => {
          const checked = validateDesign(d);
          fc.pre(checked.ok);
          const plan = generateBenchPlan(d);
          expect(checkPlan(d, plan)).toEqual([]);
          seen.designs++;
          if (d.controller.throttle.released.length > 1) seen.twoReleased++;
          const contacts = d.components.filter((k) => k.type === "contact");
          if (
            contacts.some((k, i) =>
              contacts.some((o, j) => j !== i && o.condition === k.condition && o.closedIn.join() === k.closedIn.join()),
            )
          )
            seen.dual++;
          if (contacts.some((k) => k.closedIn.length === d.conditions.find((c) => c.id === k.condition)!.states.length))
            seen.alwaysClosed++;
          seen.lockoutChecks += plan.steps.filter((s) => s.kind === "sequence").length;
          seen.unrevealable += plan.uncovered.filter((u) => u.item.startsWith("fault:")).length;
          seen.ruleSteps += plan.steps.filter((s) => s.covers.some((x) => x.startsWith("rule:"))).length;
          seen.anyOrder += plan.steps.filter((s) => s.anyOrder).length;
          seen.requireDrive += plan.steps.filter((s) => s.covers.some((x) => /^rule:D/.test(x))).length;
        }),
        { numRuns: 120, seed: 16 },
      );
      // The random designs exercise what the property is about.
      expect(seen.designs).toBeGreaterThan(100);
      for (const k of [
        "twoReleased",
        "dual",
        "alwaysClosed",
        "lockoutChecks",
        "unrevealable",
        "ruleSteps",
        "requireDrive",
        "anyOrder",
      ] as const)
        expect(seen[k]).toBeGreaterThan(0);
    },
    SLOW,
  );

  it(
    "state a lower bound that a brute-force search confirms, and never plan fewer rows than it",
    () => {
      let exact = 0;
      fc.assert(
        fc.property(designs, (d) => {
          fc.pre(validateDesign(d).ok);
          const plan = generateBenchPlan(d);
          const lb = plan.stats.lowerBound!;
          const brute = fewestRows(d);
          if (brute === null) return;
          if (lb.exact) {
            expect(lb.rows).toBe(brute);
            exact++;
          } else expect(lb.rows).toBeLessThanOrEqual(brute);
          expect(lb.planRows).toBeGreaterThanOrEqual(brute);
          if (lb.rowsWithDrive !== undefined) {
            const withDrive = fewestRows(d, 200, { withDrive: true })!;
            if (lb.exactWithDrive) expect(lb.rowsWithDrive).toBe(withDrive);
            else expect(lb.rowsWithDrive).toBeLessThanOrEqual(withDrive);
            expect(lb.planRows).toBeGreaterThanOrEqual(withDrive);
          }
        }),
        { numRuns: 60, seed: 1616 },
      );
      expect(exact).toBeGreaterThan(40);
    },
    SLOW,
  );
});

describe("the independent checker itself", () => {
  const d = (() => {
    let found: Design | null = null;
    fc.assert(
      fc.property(designs, (x) => {
        if (!validateDesign(x).ok) return;
        const p = generateBenchPlan(x);
        if (!found && p.steps.some((s) => s.kind === "sequence") && p.steps.some((s) => (s.reveals ?? []).length > 0)) found = x;
      }),
      { numRuns: 60, seed: 3 },
    );
    return found!;
  })();

  it("finds a wrong drive, a wrong latch, a missing reveal, an unexplained fault and a move that does not chain", () => {
    const good = generateBenchPlan(d);
    expect(checkPlan(d, good)).toEqual([]);
    const flip = structuredClone(good);
    flip.steps[0].expect.drive = !flip.steps[0].expect.drive;
    expect(checkPlan(d, flip).join("\n")).toMatch(/expects drive/);
    const latch = structuredClone(good);
    const seq = latch.steps.find((s) => s.kind === "sequence")!;
    seq.expect.latched = false;
    expect(checkPlan(d, latch).join("\n")).toMatch(/expects latched/);
    const drop = structuredClone(good);
    for (const s of drop.steps) s.reveals = [];
    expect(checkPlan(d, drop).join("\n")).toMatch(/shows here but is not listed/);
    const hide = structuredClone(good);
    const f = new Reference(d).faults[0]!;
    hide.uncovered.push({ item: `fault:${f.contact}:${f.mode}`, reason: "made up" });
    expect(checkPlan(d, hide).join("\n")).toMatch(/listed as uncovered|not explained/);
    const moved = structuredClone(good);
    const withMoves = moved.steps.find((s) => (s.moves ?? []).length > 0)!;
    withMoves.moves![0] = { ...withMoves.moves![0], from: "nowhere" };
    expect(checkPlan(d, moved).join("\n")).toMatch(/move of/);
  });
});
