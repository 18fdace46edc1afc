// Bench plans for the shared examples, held-back fixtures and a generated long chain: every claim
// checked by the independent replay of bench-reference.ts, plus the outcomes a reader of these
// designs expects (docs/decisions/050, 130-134).
import { readdirSync, readFileSync } from "node:fs";
import { afterAll, describe, expect, it } from "vitest";
import { generateBenchPlan } from "../../../app/bench-tests/generate";
import { validateDesign, type Design } from "../../../app/engine";
import { inhibit, is, makeDesign } from "../engine/builders";
import { checkPlan, fewestRows, Reference } from "./bench-reference";

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
 * A throttle with two released states and a contact on it that closes in only one of them (an idle
 * switch in the enable line): a step that ends at "creep" must compute the next from "creep".
 */
function idleSwitch(): Design {
  return makeDesign({
    conditions: [
      ["key", ["off", "on"]],
      ["pedal", ["idle", "creep", "down"]],
    ],
    contacts: [
      ["KS", "key", ["on"]],
      ["IS", "pedal", ["idle", "down"]],
    ],
    inputs: [
      ["PWR", "power"],
      ["EN", "enable"],
    ],
    wires: [
      ["BAT.+", "KS.1"],
      ["KS.2", "PWR.in"],
      ["KS.2", "IS.1"],
      ["IS.2", "EN.in"],
    ],
    throttle: { condition: "pedal", released: ["idle", "creep"], applied: ["down"] },
    lockouts: ["enable-restore", "power-on"],
    rules: [inhibit("key-off", is("key", "off"))],
  });
}

/** A dual-channel seat: two contacts of one seat switch in series on the enable line. */
function dualSeat(): Design {
  return makeDesign({
    conditions: [
      ["seat", ["empty", "occupied"]],
      ["pedal", ["up", "down"]],
    ],
    contacts: [
      ["S1", "seat", ["occupied"]],
      ["S2", "seat", ["occupied"]],
    ],
    inputs: [["EN", "enable"]],
    wires: [
      ["BAT.+", "S1.1"],
      ["S1.2", "S2.1"],
      ["S2.2", "EN.in"],
    ],
    throttle: { condition: "pedal", released: ["up"], applied: ["down"] },
    rules: [inhibit("seat", is("seat", "empty"))],
  });
}

const designs: Array<[string, Design]> = (
  [
    ...readdirSync(EXAMPLES)
      .filter((f) => f.endsWith(".design.json"))
      .sort()
      .map((f): [string, Design] => [f.replace(".design.json", ""), readJson(`${EXAMPLES}/${f}`)]),
    ...readdirSync(FIXTURES)
      .filter((f) => f.endsWith(".design.json"))
      .sort()
      .map((f): [string, Design] => [f.replace(".design.json", ""), readJson(new URL(f, FIXTURES))]),
    ["idle-switch (built)", idleSwitch()],
    ["dual-seat (built)", dualSeat()],
    ["scree-long-chain (generated)", longChain()],
  ] as Array<[string, Design]>
).filter(([, d]) => validateDesign(d).ok);

const table: Array<Record<string, string | number | boolean>> = [];
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
    lockoutSteps: s.lockoutSteps ?? 0,
    planRows: s.lowerBound!.planRows,
    lowerBound: s.lowerBound!.rows,
    exact: s.lowerBound!.exact,
  });

  it(`holds every claim when replayed independently (${s.steps} steps, ${s.covered} of ${s.items} items)`, () => {
    expect(s.covered + plan.uncovered.length).toBe(s.items);
    expect(checkPlan(design, plan)).toEqual([]);
  });

  it("is the same plan every time", () => {
    expect(generateBenchPlan(design)).toEqual(plan);
  });

  it("states a lower bound no smaller plan beats", () => {
    const brute = fewestRows(design, 300);
    if (brute !== null) {
      if (s.lowerBound!.exact) expect(s.lowerBound!.rows).toBe(brute);
      else expect(s.lowerBound!.rows).toBeLessThanOrEqual(brute);
    }
    expect(s.lowerBound!.planRows).toBeGreaterThanOrEqual(s.lowerBound!.rows);
  });

  it("states, for a table searched only in part, a bound that holds over the whole table", { timeout: 120_000 }, () => {
    const lb = s.lowerBound!;
    if (s.rowsSearched === s.rows) {
      expect(lb.apart).toBeUndefined();
      return;
    }
    // The fewest rows among those searched is no bound on the whole table: not called exact.
    expect(lb.exact).toBe(false);
    expect(lb.rows).toBe(lb.apart!.faults.length);
    // Independent check, every row of the table by the reference: each named fault shows in some row
    // and no row shows two of them, so any plan needs a row of its own for each (a packing bound).
    const ref = new Reference(design);
    const rowsOf = (id: string) => {
      if (id === "drive-row") return new Set(Array.from({ length: ref.rows }, (_, i) => i).filter((i) => ref.see(ref.states(i)).drive));
      const [, contact, mode] = id.split(":") as [string, string, "stuck-open" | "stuck-closed"];
      return new Set(ref.revealingRows({ contact, mode }));
    };
    for (const named of [lb.apart!.faults, lb.apart!.withDrive ?? []]) {
      const sets = named.map(rowsOf);
      sets.forEach((rows) => expect(rows.size).toBeGreaterThan(0));
      for (let i = 0; i < sets.length; i++)
        for (let j = i + 1; j < sets.length; j++)
          expect(
            [...sets[i]].some((r) => sets[j].has(r)),
            `${named[i]} and ${named[j]}`,
          ).toBe(false);
    }
    if (lb.rowsWithDrive !== undefined) expect(lb.rowsWithDrive).toBe(lb.apart!.withDrive!.length);
    expect(lb.searched!.fewest).toBeGreaterThanOrEqual(lb.rows);
  });
});

describe("specific outcomes", () => {
  const plan = (n: string) => generateBenchPlan(designs.find(([x]) => x === n)![1]);

  it("covers every item of the campus hauler and the trail bike, with one step per lockout", () => {
    for (const n of ["campus-hauler", "trail-bike"]) {
      const p = plan(n);
      expect(p.uncovered).toEqual([]);
      expect(p.stats.lockoutSteps).toBe(new Set(designs.find(([x]) => x === n)![1].controller.lockouts).size);
    }
    // Lockout checks no longer dominate the campus hauler's plan.
    const hauler = plan("campus-hauler");
    expect(hauler.stats.steps).toBeLessThanOrEqual(hauler.stats.lowerBound!.rows + 2 + hauler.stats.lockoutSteps!);
  });

  it("explains the deck mower's power-on lockout: no power input", () => {
    expect(plan("deck-mower").uncovered).toEqual([{ item: "lockout:power-on", reason: expect.stringMatching(/no power input/) }]);
  });

  it("explains the pedal-switch mower's hidden faults by the wiring, and the rules it can't test", () => {
    const p = plan("meadowline-pedal-switch");
    const reason = (item: string) => p.uncovered.find((u) => u.item === item)?.reason;
    // The spare blade contact leads to no input; the lamp relay is closed in every state.
    expect(reason("fault:BK:stuck-open")).toMatch(/No combination of conditions .* BK .* stuck open: .*leads to no controller input/);
    expect(reason("fault:LP:stuck-closed")).toMatch(/closed in every state of "Work lamp"/);
    // A stuck-open lamp relay is visible in no input either: its far end is unwired.
    expect(reason("fault:LP:stuck-open")).toMatch(/leads to no controller input/);
    expect(reason("rule:reverse-line")).toMatch(/every row/);
    expect(reason("lockout:brake-release")).toMatch(/no brake input/);
    // Both sides of the rocker are checked in both modes now (they used to be "changeover" only).
    for (const k of ["DF", "DR"])
      for (const m of ["stuck-open", "stuck-closed"]) expect(p.steps.some((s) => s.reveals!.includes(`fault:${k}:${m}`))).toBe(true);
    // A rule the design breaks is still tested, and the step says so.
    const lamp = p.steps.find((s) => s.covers.includes("rule:lamp"))!;
    expect(lamp.expect.drive).toBe(true);
    expect(lamp.instruction).toMatch(/BROKEN/);
    // The key switch powers the direction lines too: power-on and direction-engage share one step that says so.
    const both = p.steps.find((s) => s.covers.includes("lockout:power-on"))!;
    expect(both.covers).toContain("lockout:direction-engage");
    expect(both.instruction).toMatch(/can't tell them apart/);
  });

  it("names the series twin that hides a dual-channel contact stuck closed, and still finds it stuck open", () => {
    const p = plan("dual-seat (built)");
    expect(p.uncovered.find((u) => u.item === "fault:S1:stuck-closed")?.reason).toMatch(/S2 in series beyond it open/);
    expect(p.uncovered.find((u) => u.item === "fault:S2:stuck-closed")?.reason).toMatch(/no supply reaches either of its ends \(S1 open\)/);
    for (const k of ["S1", "S2"]) expect(p.steps.some((s) => s.reveals!.includes(`fault:${k}:stuck-open`))).toBe(true);
  });

  it("computes each step from the released state the previous one leaves (two released states)", () => {
    const p = plan("idle-switch (built)");
    expect(p.uncovered).toEqual([]);
    // Every step's moves start where the previous step ended, and say which released state they pass through.
    let at = p.start.set;
    for (const s of p.steps) {
      for (const m of s.moves!) {
        expect(at[m.condition]).toBe(m.from);
        at = { ...at, [m.condition]: m.to };
      }
      expect(at).toEqual(s.set);
    }
    // The enable-restore lockout is checked through "creep", where the idle switch opens.
    const check = p.steps.find((s) => s.covers.includes("lockout:enable-restore"))!;
    expect(check.moves!.map((m) => m.to)).toContain("creep");
  });

  it("shows a latching approach on the bench and explains the lockout it hides", () => {
    const p = plan("haybarn-latching-enable");
    const latched = p.steps.filter((s) => s.expect.latched);
    expect(latched.length).toBeGreaterThan(0);
    for (const s of latched) {
      expect(s.expect.drive).toBe(false);
      expect(s.instruction).toMatch(/enable-restore lockout latches/);
    }
    expect(p.uncovered).toEqual([{ item: "lockout:enable-restore", reason: expect.stringMatching(/latches a lockout/) }]);
  });

  it("searches near drive rows above the exhaustive limit and still covers the long chain", () => {
    const p = plan("scree-long-chain (generated)");
    expect(p.stats.rows).toBe(8192);
    expect(p.stats.rowsSearched).toBeLessThan(p.stats.rows);
    expect(p.uncovered).toEqual([]);
  });

  it("words a row step as moves in the order replayed, the throttle set last", () => {
    const step = plan("trail-bike").steps.find((s) => s.covers.includes("rule:stand"))!;
    expect(step.instruction).toMatch(/Side stand from up to down/);
    expect(step.instruction).toMatch(/Then set Twist grip from closed to open last\./);
    expect(step.instruction).toMatch(/Drive must stay off\./);
    expect(step.caution).toMatch(/drive wheels/);
    const check = plan("trail-bike").steps.find((s) => s.kind === "sequence")!;
    expect(check.instruction).toMatch(/^Check the [a-z-]+ lockout\. Release Twist grip first/);
    expect(check.instruction).toMatch(/and keep holding it\. Then, still holding it, change /);
  });
});
