// Bench-test procedure generator: every item is covered or explained, every expectation matches an
// independent evaluation by the engine (evaluateRow for rows, replayTrace for sequences), and every
// coverage claim is re-checked from its definition (docs/decisions/050-053).
import { readdirSync, readFileSync } from "node:fs";
import fc from "fast-check";
import { afterAll, describe, expect, it } from "vitest";
import { generateBenchPlan, type BenchPlan, type BenchStep } from "../../../app/bench-tests/generate";
import {
  compileDesign,
  encodeRow,
  evaluateRow,
  replayTrace,
  type CompiledDesign,
  type Design,
  INPUT_FUNCTIONS,
  LOCKOUTS,
  type InhibitRule,
  type InputFunction,
  type Lockout,
  type Predicate,
} from "../../../app/engine";
import { inhibit, is, makeDesign, randomDesign } from "../engine/builders";

const EXAMPLES = "/work/shared/spec/examples";
const FIXTURES = new URL("./fixtures/", import.meta.url);
const readJson = (path: string | URL) => JSON.parse(readFileSync(path, "utf8")) as Design;

/** Twelve trip contacts in series on the enable line: 8192 rows, above the exhaustive search limit. */
function longChain(): Design {
  const n = 12;
  const ids = Array.from({ length: n }, (_, i) => `k${i}`);
  return makeDesign({
    conditions: [...ids.map((id): [string, string[]] => [id, ["ok", "trip"]]), ["grip", ["closed", "open"]]],
    contacts: ids.map((id, i): [string, string, string[]] => [`K${i}`, id, ["ok"]]),
    inputs: [
      ["EN", "enable"],
      ["PWR", "power"],
    ],
    wires: [
      ["BAT.+", "PWR.in"],
      ["BAT.+", "K0.1"],
      ...ids.slice(1).map((_, i): [string, string] => [`K${i}.2`, `K${i + 1}.1`]),
      [`K${n - 1}.2`, "EN.in"],
    ],
    throttle: { condition: "grip", released: ["closed"], applied: ["open"] },
    lockouts: ["enable-restore"],
    rules: ids.map((id) => inhibit(`trip-${id}`, is(id, "trip"))),
  });
}

/**
 * A random design that usually drives: every input fed from the supply through a series chain of
 * one or two contacts (sometimes a parallel bypass), random rules and lockouts.
 */
function drivableDesign(g: fc.GeneratorValue): Design {
  const int = (min: number, max: number) => g(fc.integer, { min, max });
  const conditions = Array.from({ length: int(2, 4) }, (_, i): [string, string[]] => [`c${i}`, Array.from({ length: int(2, 3) }, (_, k) => `s${k}`)]);
  const throttleCond = conditions[int(0, conditions.length - 1)];
  const [t0, t1, t2] = throttleCond[1];
  const fns: InputFunction[] = g(fc.subarray, [...INPUT_FUNCTIONS], { minLength: 1 });
  const contacts: Array<[string, string, string[]]> = [];
  const wires: Array<[string, string]> = [];
  const contact = (cond: [string, string[]]) => {
    const id = `K${contacts.length}`;
    contacts.push([id, cond[0], g(fc.subarray, cond[1], { minLength: 1, maxLength: cond[1].length - 1 })]);
    return id;
  };
  const pickCond = () => conditions[int(0, conditions.length - 1)];
  for (const fn of fns) {
    let from = "BAT.+";
    for (let k = int(1, 2); k > 0; k--) {
      const id = contact(pickCond());
      wires.push([from, `${id}.1`]);
      from = `${id}.2`;
    }
    wires.push([from, `I_${fn}.in`]);
    if (int(0, 3) === 0) {
      const id = contact(pickCond());
      wires.push(["BAT.+", `${id}.1`], [`${id}.2`, `I_${fn}.in`]);
    }
  }
  const rules = Array.from({ length: int(1, 3) }, (_, i) => {
    const c = pickCond();
    return inhibit(`R${i}`, is(c[0], ...g(fc.subarray, c[1], { minLength: 1 })), int(0, 2) === 0 ? { energized: `I_${fns[0]}` } : "drive");
  });
  return makeDesign({
    conditions,
    contacts,
    inputs: fns.map((fn): [string, InputFunction] => [`I_${fn}`, fn]),
    wires,
    throttle: { condition: throttleCond[0], released: [t0], applied: [t1], fault: t2 ? [t2] : [] },
    lockouts: g(fc.subarray, [...LOCKOUTS]) as Lockout[],
    brakeCutsDrive: g(fc.boolean),
    rules,
  });
}

const designs: Array<[string, Design]> = [
  ...["campus-hauler", "deck-mower", "trail-bike"].map((n): [string, Design] => [n, readJson(`${EXAMPLES}/${n}.design.json`)]),
  ...readdirSync(FIXTURES)
    .filter((f) => f.endsWith(".design.json"))
    .sort()
    .map((f): [string, Design] => [f.replace(".design.json", ""), readJson(new URL(f, FIXTURES))]),
  ["scree-long-chain (generated)", longChain()],
];

// ---------------------------------------------------------------- independent checks

function itemsOf(d: Design): string[] {
  return [
    ...d.rules.filter((r) => r.type === "inhibit").map((r) => `rule:${r.id}`),
    ...d.components.filter((k) => k.type === "contact").map((k) => `contact:${k.id}`),
    ...[...new Set(d.controller.lockouts ?? [])].map((l) => `lockout:${l}`),
  ];
}

function conditionsOf(p: Predicate, out = new Set<string>()): Set<string> {
  if ("cond" in p) out.add(p.cond);
  if ("all" in p) p.all.forEach((q) => conditionsOf(q, out));
  if ("any" in p) p.any.forEach((q) => conditionsOf(q, out));
  if ("not" in p) conditionsOf(p.not, out);
  return out;
}

/** Every assignment of `conds` applied to `base`. */
function variations(d: Design, base: Record<string, string>, conds: string[]): Array<Record<string, string>> {
  let out = [base];
  for (const id of conds) {
    const states = d.conditions.find((k) => k.id === id)!.states;
    out = out.flatMap((row) => states.map((s) => ({ ...row, [id]: s })));
  }
  return out;
}

const differingConditions = (a: Record<string, string>, b: Record<string, string>) => Object.keys(a).filter((k) => a[k] !== b[k]);
const sameRecord = (a: Record<string, boolean>, b: Record<string, boolean>) =>
  Object.keys(a).length === Object.keys(b).length && Object.keys(a).every((k) => a[k] === b[k]);

/** The lockout blocks: runs of consecutive sequence steps carrying the same lockout tag. */
function blocksOf(plan: BenchPlan): Array<{ lockout: string; steps: BenchStep[] }> {
  const out: Array<{ lockout: string; steps: BenchStep[] }> = [];
  for (const s of plan.steps) {
    if (s.kind !== "sequence") continue;
    const tag = s.covers.find((x) => x.startsWith("lockout:"))!;
    const last = out[out.length - 1];
    if (last && last.lockout === tag && last.steps[last.steps.length - 1].n === s.n - 1) last.steps.push(s);
    else out.push({ lockout: tag, steps: [s] });
  }
  return out;
}

/** Problems with a plan, found from the definitions; [] when every claim holds. */
function checkPlan(d: Design, plan: BenchPlan): string[] {
  const c: CompiledDesign = compileDesign(d);
  const problems: string[] = [];
  const tags = new Set(plan.steps.flatMap((s) => s.covers));
  const stepOf = (tag: string) => plan.steps.find((s) => s.covers.includes(tag));
  const rowOf = (set: Record<string, string>) => evaluateRow(c, encodeRow(c, set));

  // Every item covered or listed as uncovered with a reason, never both.
  for (const item of itemsOf(d)) {
    const covered = item.startsWith("contact:") ? tags.has(`${item}:closed`) && tags.has(`${item}:open`) : tags.has(item);
    const listed = plan.uncovered.filter((u) => u.item === item);
    if (covered === (listed.length > 0)) problems.push(`${item}: covered=${covered}, listed uncovered ${listed.length} times`);
    if (listed.some((u) => u.reason.trim().length < 10)) problems.push(`${item}: no reason given`);
  }

  // Row steps: inputs and drive as evaluateRow says; a latched row step as the released-then-applied approach replays.
  const throttle = d.controller.throttle;
  plan.steps.forEach((s, i) => {
    if (s.n !== i + 1) problems.push(`step ${i + 1} is numbered ${s.n}`);
    const v = rowOf(s.set);
    if (!sameRecord(s.expect.inputs, v.inputs)) problems.push(`step ${s.n}: inputs differ from evaluateRow`);
    if (s.kind === "row") {
      if (s.expect.latched) {
        const approach = replayTrace(c, [{ ...s.set, [throttle.condition]: throttle.released[0] }, s.set]);
        if (s.expect.drive !== approach[1].drive || !approach[1].latched) problems.push(`step ${s.n}: latched drive differs from replay`);
      } else if (s.expect.drive !== v.drive) problems.push(`step ${s.n}: drive differs from evaluateRow`);
    }
    const claims = s.covers.filter((x) => !x.startsWith("lockout:"));
    if (claims.length > 0 && s.kind === "sequence" && (s.expect.latched || s.expect.drive !== v.drive)) {
      problems.push(`step ${s.n}: a sequence step standing in for a row must show its steady drive`);
    }
    if (v.controller.throttle !== "released" && !/drive wheels/.test(s.caution ?? "")) problems.push(`step ${s.n}: no caution with the throttle off released`);
    if (s.instruction.trim().length === 0) problems.push(`step ${s.n}: empty instruction`);
  });

  // Sequences: every step as replayTrace of the block says; the lockout holds drive off with the throttle held, then drive returns.
  for (const block of blocksOf(plan)) {
    const lockout = block.lockout.slice("lockout:".length);
    const trace = replayTrace(c, block.steps.map((s) => s.set));
    block.steps.forEach((s, t) => {
      if (s.expect.drive !== trace[t].drive || s.expect.latched !== trace[t].latched) problems.push(`step ${s.n}: differs from replayTrace`);
      if (!/drive wheels/.test(s.caution ?? "")) problems.push(`step ${s.n}: sequence step without the lift-the-wheels caution`);
    });
    const held = trace.findIndex((t, k) => t.row.drive && !t.drive && t.latched && trace.slice(0, k + 1).some((x) => x.armed.includes(lockout as never)));
    if (held < 0) problems.push(`${block.lockout}: no step where it holds drive off`);
    if (!trace[trace.length - 1].drive) problems.push(`${block.lockout}: drive does not come back at the end`);
    if (trace[0].row.controller.throttle !== "released") problems.push(`${block.lockout}: does not start with the throttle released`);
  }
  for (const l of new Set(d.controller.lockouts ?? [])) {
    if (tags.has(`lockout:${l}`) && blocksOf(plan).filter((b) => b.lockout === `lockout:${l}`).length !== 1) problems.push(`lockout:${l}: not one block`);
  }

  // Rules: unsafe row, steady outcome shown, and relaxing only the rule's own conditions gives the forbidden outcome.
  for (const r of d.rules.filter((x): x is InhibitRule => x.type === "inhibit")) {
    const s = stepOf(`rule:${r.id}`);
    if (!s) continue;
    const outcome = (set: Record<string, string>) => {
      const v = rowOf(set);
      return r.forbid === "drive" ? v.drive : v.inputs[r.forbid.energized];
    };
    if (!rowOf(s.set).rules[r.id].unsafe) problems.push(`rule:${r.id}: step ${s.n} is not an unsafe row`);
    if (s.expect.latched) problems.push(`rule:${r.id}: step ${s.n} is latched`);
    const relaxed = variations(d, s.set, [...conditionsOf(r.when)]).some((x) => !rowOf(x).rules[r.id].unsafe && outcome(x));
    if (!relaxed) problems.push(`rule:${r.id}: relaxing its conditions at step ${s.n} never gives the forbidden outcome`);
  }

  // Contacts: two steps differing only in the contact's condition, closed vs open, different expectations,
  // and the contact's own faults show in them.
  for (const k of d.components) {
    if (k.type !== "contact") continue;
    const a = stepOf(`contact:${k.id}:closed`);
    const b = stepOf(`contact:${k.id}:open`);
    if (!a || !b) continue;
    const diff = differingConditions(a.set, b.set);
    if (diff.length !== 1 || diff[0] !== k.condition) problems.push(`contact:${k.id}: steps ${a.n}/${b.n} differ in ${diff.join(",")}`);
    if (!k.closedIn.includes(a.set[k.condition]) || k.closedIn.includes(b.set[k.condition])) problems.push(`contact:${k.id}: not closed/open`);
    if (a.expect.drive === b.expect.drive && sameRecord(a.expect.inputs, b.expect.inputs)) problems.push(`contact:${k.id}: same expectations`);
    const ia = encodeRow(c, a.set);
    const ib = encodeRow(c, b.set);
    if (sameRecord(evaluateRow(c, ia, [{ component: k.id, mode: "stuck-open" }]).inputs, a.expect.inputs)) {
      problems.push(`contact:${k.id}: stuck open would not show at step ${a.n}`);
    }
    if (sameRecord(evaluateRow(c, ib, [{ component: k.id, mode: "stuck-closed" }]).inputs, b.expect.inputs)) {
      problems.push(`contact:${k.id}: stuck closed would not show at step ${b.n}`);
    }
  }

  // Stats and size: condition changes recounted; never more steps than one-item-at-a-time.
  let changes = 0;
  let prev = plan.start.set;
  for (const s of plan.steps) {
    changes += differingConditions(prev, s.set).length;
    prev = s.set;
  }
  if (changes !== plan.stats.conditionChanges) problems.push(`conditionChanges ${plan.stats.conditionChanges}, recounted ${changes}`);
  if (plan.stats.steps !== plan.steps.length) problems.push("stats.steps is not the step count");
  const naive =
    [...tags].filter((t) => t.startsWith("rule:")).length +
    [...tags].filter((t) => t.endsWith(":closed")).length * 2 +
    blocksOf(plan).reduce((n, b) => n + b.steps.length, 0);
  if (plan.steps.length > naive) problems.push(`${plan.steps.length} steps, more than the naive ${naive}`);
  if (rowOf(plan.start.set).drive) problems.push("the start row drives");
  return problems;
}

// ---------------------------------------------------------------- tests

const table: Array<Record<string, string | number>> = [];
afterAll(() => console.table(table));

describe.each(designs)("bench plan for %s", (name, design) => {
  const plan = generateBenchPlan(design);
  const s = plan.stats;
  table.push({
    design: name,
    rows: s.rows,
    items: s.items,
    covered: s.covered,
    uncovered: plan.uncovered.length,
    steps: s.steps,
    naive: s.naiveSteps,
    conditionChanges: s.conditionChanges,
  });

  it(`covers or explains all ${s.items} items in ${s.steps} steps and ${s.conditionChanges} condition changes (naive ${s.naiveSteps})`, () => {
    expect(s.items).toBe(itemsOf(design).length);
    expect(s.covered + plan.uncovered.length).toBe(s.items);
    expect(checkPlan(design, plan)).toEqual([]);
    expect(s.steps).toBeLessThanOrEqual(s.naiveSteps);
  });

  it("is the same plan every time", () => {
    expect(generateBenchPlan(design)).toEqual(plan);
  });
});

describe("specific outcomes", () => {
  const plan = (n: string) => generateBenchPlan(designs.find(([x]) => x === n)![1]);

  it("covers every item of the campus hauler and the trail bike", () => {
    expect(plan("campus-hauler").uncovered).toEqual([]);
    expect(plan("trail-bike").uncovered).toEqual([]);
  });

  it("explains the deck mower's power-on lockout: no power input", () => {
    expect(plan("deck-mower").uncovered).toEqual([{ item: "lockout:power-on", reason: expect.stringMatching(/no power input/) }]);
  });

  it("reports the unobservable, never-open and untestable items of the pedal-switch mower", () => {
    const p = plan("meadowline-pedal-switch");
    const reason = (item: string) => p.uncovered.find((u) => u.item === item)?.reason;
    expect(reason("contact:BK")).toMatch(/not observable from the controller inputs/);
    expect(reason("contact:LP")).toMatch(/closes in every state/);
    // A rule whose condition never holds is no longer in the fixture: spec 1.1 makes such a design invalid.
    expect(reason("rule:reverse-line")).toMatch(/every row/);
    expect(reason("lockout:brake-release")).toMatch(/no brake input/);
    // The rocker's two sides always switch together: covered by a shared pair, said so in words.
    const df = p.steps.find((s) => s.covers.includes("contact:DF:closed"))!;
    expect(df.instruction).toMatch(/other contacts on the same condition switch with it/);
    // A rule the design breaks is still tested, and the step says so.
    const lamp = p.steps.find((s) => s.covers.includes("rule:lamp"))!;
    expect(lamp.expect.drive).toBe(true);
    expect(lamp.instruction).toMatch(/BROKEN/);
  });

  it("shows a latching approach on the bench and explains the lockout it hides", () => {
    const p = plan("haybarn-latching-enable");
    const latched = p.steps.filter((s) => s.expect.latched);
    expect(latched.length).toBeGreaterThan(0);
    for (const s of latched) {
      expect(s.expect.drive).toBe(false);
      expect(s.instruction).toMatch(/"enable-restore" lockout latches/);
    }
    expect(p.uncovered).toEqual([{ item: "lockout:enable-restore", reason: expect.stringMatching(/latches a lockout/) }]);
  });

  it("searches near drive rows above the exhaustive limit and still covers the long chain", () => {
    const p = plan("scree-long-chain (generated)");
    expect(p.stats.rows).toBe(8192);
    expect(p.stats.rowsSearched).toBeLessThan(p.stats.rows);
    expect(p.uncovered).toEqual([]);
  });

  it("words a row step as plain instructions with the throttle set last", () => {
    const step = plan("trail-bike").steps.find((s) => s.covers.includes("rule:stand"))!;
    expect(step.instruction).toMatch(/^Release Twist grip \(closed\) first\. Change .*Side stand from up to down.* Then set Twist grip to open last\./);
    expect(step.instruction).toMatch(/Drive must stay off\./);
    expect(step.instruction).toMatch(/Drive enable \(EN\) must read dead\./);
    expect(step.caution).toMatch(/drive wheels/);
  });
});

describe("random designs", () => {
  const runs = (make: (g: fc.GeneratorValue) => Design, seed: number) => {
    const seen = { rule: 0, contact: 0, lockout: 0 };
    fc.assert(
      fc.property(fc.gen(), (g) => {
        const design = make(g);
        const plan = generateBenchPlan(design);
        for (const t of new Set(plan.steps.flatMap((s) => s.covers))) {
          if (t.startsWith("rule:")) seen.rule++;
          if (t.endsWith(":closed")) seen.contact++;
          if (t.startsWith("lockout:")) seen.lockout++;
        }
        expect(checkPlan(design, plan)).toEqual([]);
      }),
      { numRuns: 40, seed },
    );
    return seen;
  };

  it("any wiring: every covered item is exercised as claimed and every other item is explained", () => {
    const seen = runs((g) => randomDesign(g), 20240611);
    expect(seen.rule + seen.contact).toBeGreaterThan(0);
  });

  it("wiring that drives: rules, contacts and lockouts are exercised as claimed", () => {
    const seen = runs(drivableDesign, 7);
    expect(seen.rule).toBeGreaterThan(0);
    expect(seen.contact).toBeGreaterThan(0);
    expect(seen.lockout).toBeGreaterThan(0);
  });
});

describe("the checker itself", () => {
  it("finds a wrong drive expectation, a missing contact step and a broken sequence", () => {
    const design = designs.find(([n]) => n === "trail-bike")![1];
    const good = generateBenchPlan(design);
    const flip: BenchPlan = structuredClone(good);
    const row = flip.steps.find((s) => s.kind === "row")!;
    row.expect.drive = !row.expect.drive;
    expect(checkPlan(design, flip).join("\n")).toMatch(/drive differs from evaluateRow/);
    const drop: BenchPlan = structuredClone(good);
    for (const s of drop.steps) s.covers = s.covers.filter((t) => t !== "contact:ST:open");
    expect(checkPlan(design, drop).join("\n")).toMatch(/contact:ST: covered=false, listed uncovered 0 times/);
    const seq: BenchPlan = structuredClone(good);
    const last = seq.steps.filter((s) => s.kind === "sequence").at(-1)!;
    last.set = { ...last.set, grip: "closed" };
    expect(checkPlan(design, seq).join("\n")).toMatch(/drive does not come back/);
  });
});
