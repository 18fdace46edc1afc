// Property-based checks on random designs (bridges, junction chains, unwired terminals, several
// supplies) against three independent references: graph connectivity (graphology), a SAT solver
// (logic-solver), and the row-at-a-time reference evaluator.
import fc from "fast-check";
import Graph from "graphology";
import { connectedComponents } from "graphology-components";
import Logic from "logic-solver";
import { describe, expect, it } from "vitest";

// Generous per-test limits: the machine is shared; these are not timing assertions.
const SLOW = 60_000;
import {
  compileDesign,
  countRows,
  csvChunks,
  decodeRow,
  encodeRow,
  evaluateRow,
  findRow,
  pageRows,
  prove,
  replayTrace,
  validateDesign,
  type Design,
  type InhibitVerdict,
  type NoRestartVerdict,
  type Predicate,
  type RowFilter,
} from "../../../app/engine";
import { randomDesign } from "./builders";
import { refVerdict } from "./reference";

const designs = fc.gen().map((g) => randomDesign(g));
/** Fewer nets for the same contacts: more parallel paths and bridges. */
const meshedDesigns = fc.gen().map((g) => randomDesign(g, { meshed: true, maxContacts: 9 }));
/** Meshed wiring whose rules are cut rules (hold when one contact cuts the paths), so faults matter. */
const faultProneDesigns = fc.gen().map((g) => randomDesign(g, { meshed: true, maxContacts: 9, cutRules: true }));

/** Energized inputs of one row by connected components of a terminal graph (wires + closed contacts). */
function inputsByComponents(d: Design, states: Record<string, string>): Record<string, boolean> {
  const graph = new Graph({ type: "undirected", multi: true, allowSelfLoops: true });
  const terminals: Record<string, string[]> = { supply: ["+"], contact: ["1", "2"], junction: ["j"], input: ["in"] };
  for (const comp of d.components) for (const t of terminals[comp.type]) graph.addNode(`${comp.id}.${t}`);
  for (const w of d.wires) graph.addEdge(w.from, w.to);
  for (const comp of d.components) {
    if (comp.type === "contact" && comp.closedIn.includes(states[comp.condition])) graph.addEdge(`${comp.id}.1`, `${comp.id}.2`);
  }
  const live = new Set<string>();
  for (const group of connectedComponents(graph)) {
    if (group.some((t) => d.components.some((c) => c.type === "supply" && t === `${c.id}.+`))) group.forEach((t) => live.add(t));
  }
  const out: Record<string, boolean> = {};
  for (const comp of d.components) if (comp.type === "input") out[comp.id] = live.has(`${comp.id}.in`);
  return out;
}

/**
 * A SAT model of a design over condition-state variables: hop-bounded reachability over nets
 * (wire-joined terminals), one variable per net and hop count, then the controller and drive.
 * Returns, per inhibit rule, a violating row found by the solver or null when it proves the rule.
 */
function satCheck(d: Design): Array<Record<string, string> | null> {
  const solver = new Logic.Solver();
  const v = (ci: number, k: number) => `x${ci}_${k}`;
  d.conditions.forEach((c, ci) => solver.require(Logic.exactlyOne(...c.states.map((_, k) => v(ci, k)))));
  const inState = (condId: string, states: string[]) => {
    const ci = d.conditions.findIndex((c) => c.id === condId);
    const cond = d.conditions[ci];
    return Logic.or(...states.map((s) => v(ci, cond.states.indexOf(s))));
  };
  // Nets: terminals joined by wires.
  const terms = d.components.flatMap((c) =>
    ({ supply: ["+"], contact: ["1", "2"], junction: ["j"], input: ["in"] })[c.type].map((t) => `${c.id}.${t}`),
  );
  const netOf = new Map(terms.map((t, i) => [t, i]));
  const root = (t: string): number => {
    let n = netOf.get(t)!;
    while (netOf.get(terms[n]) !== n) n = netOf.get(terms[n])!;
    return n;
  };
  for (const w of d.wires) netOf.set(terms[root(w.from)], root(w.to));
  const nets = [...new Set(terms.map(root))];
  const edges = d.components.flatMap((c) =>
    c.type === "contact" ? [[root(`${c.id}.1`), root(`${c.id}.2`), inState(c.condition, c.closedIn)] as const] : [],
  );
  const supplies = new Set(d.components.filter((c) => c.type === "supply").map((c) => root(`${c.id}.+`)));
  // r{k}_{n}: net n is connected to a supply through at most k contacts.
  const r = (k: number, n: number) => `r${k}_${n}`;
  for (const n of nets) solver.require(supplies.has(n) ? r(0, n) : Logic.not(r(0, n)));
  const K = nets.length;
  for (let k = 0; k < K; k++) {
    for (const n of nets) {
      const via = edges.flatMap(([a, b, on]) =>
        a === n ? [Logic.and(on, r(k, b))] : b === n ? [Logic.and(on, r(k, a))] : [],
      );
      solver.require(Logic.equiv(r(k + 1, n), Logic.or(r(k, n), ...via)));
    }
  }
  const energized = (id: string) => r(K, root(`${id}.in`));
  const input = (fn: string) => d.components.find((c) => c.type === "input" && c.function === fn);
  const live = (fn: string, absent: object | string) => {
    const x = input(fn);
    return x ? energized(x.id) : absent;
  };
  const fwd = live("forward", Logic.FALSE);
  const rev = live("reverse", Logic.FALSE);
  const moving =
    !input("forward") && !input("reverse")
      ? Logic.TRUE
      : !input("reverse")
        ? fwd
        : !input("forward")
          ? Logic.TRUE
          : Logic.or(Logic.and(fwd, Logic.not(rev)), Logic.and(rev, Logic.not(fwd)));
  const t = d.controller.throttle;
  const drive = Logic.and(
    live("power", Logic.TRUE),
    live("enable", Logic.TRUE),
    moving,
    (d.controller.brakeCutsDrive ?? true) ? Logic.not(live("brake", Logic.FALSE)) : Logic.TRUE,
    inState(t.condition, t.applied),
  );
  const pred = (p: Predicate): object | string => {
    if ("cond" in p) return inState(p.cond, p.in);
    if ("all" in p) return Logic.and(...p.all.map(pred));
    if ("any" in p) return Logic.or(...p.any.map(pred));
    if ("not" in p) return Logic.not(pred(p.not));
    return Logic.TRUE;
  };
  return d.rules.map((rule) => {
    if (rule.type !== "inhibit") return null;
    const forbidden = rule.forbid === "drive" ? drive : energized(rule.forbid.energized);
    const solution = solver.solveAssuming(Logic.and(pred(rule.when), forbidden));
    if (!solution) return null;
    const trueVars = new Set(solution.getTrueVars());
    const row: Record<string, string> = {};
    d.conditions.forEach((c, ci) => (row[c.id] = c.states.find((_, k) => trueVars.has(v(ci, k)))!));
    return row;
  });
}

describe("random designs", () => {
  it("are valid designs, and rows decode and encode back", () => {
    fc.assert(
      fc.property(designs, (d) => {
        const checked = validateDesign(d);
        expect(checked.ok).toBe(true);
        const c = compileDesign(d);
        for (let i = 0; i < c.rows; i++) expect(encodeRow(c, decodeRow(c, i))).toBe(i);
      }),
      { numRuns: 50 },
    );
  }, SLOW);

  it("energize exactly the inputs that graph connectivity (graphology) energizes, in every row", () => {
    fc.assert(
      fc.property(fc.oneof(designs, meshedDesigns), (d) => {
        const c = compileDesign(d);
        const { rows } = pageRows(c, { count: c.rows });
        expect(rows.length).toBe(c.rows);
        for (const row of rows) {
          expect(row.inputs).toEqual(inputsByComponents(d, row.states));
        }
      }),
      { numRuns: 120 },
    );
  }, SLOW);

  it("have inhibit verdicts that agree with a SAT solver (logic-solver)", () => {
    fc.assert(
      fc.property(designs, (d) => {
        const c = compileDesign(d);
        const verdict = prove(c);
        const witnesses = satCheck(d);
        d.rules.forEach((rule, i) => {
          if (rule.type !== "inhibit") return;
          const witness = witnesses[i];
          expect(verdict.rules[i].holds).toBe(witness === null);
          if (witness) expect(evaluateRow(c, encodeRow(c, witness)).rules[rule.id].violating).toBe(true);
        });
      }),
      { numRuns: 40 },
    );
  }, SLOW);

  it.each([
    ["random", designs],
    ["meshed", meshedDesigns],
    ["fault-prone", faultProneDesigns],
  ] as const)("get the same verdict as the row-at-a-time reference evaluator (%s wiring)", (_, arb) => {
    fc.assert(
      fc.property(arb, (d) => {
        const c = compileDesign(d);
        const got = prove(c);
        const want = refVerdict(d);
        expect(got.rows).toBe(want.rows);
        expect(got.driveRows).toBe(want.driveRows);
        expect(got.ok).toBe(want.ok);
        expect(got.singleFaults).toEqual(want.singleFaults);
        got.rules.forEach((r, i) => {
          const w = want.rules[i];
          expect(r.holds).toBe(w.holds);
          if ("unsafeRows" in w) {
            const g = r as InhibitVerdict;
            expect([g.unsafeRows, g.violatingRows]).toEqual([w.unsafeRows, w.violatingRows]);
            if (!g.holds) expect(evaluateRow(c, encodeRow(c, g.example!)).rules[g.id].violating).toBe(true);
          } else if (!r.holds) {
            const trace = (r as NoRestartVerdict).trace!;
            expect(trace.length).toBe((w as NoRestartVerdict).trace!.length);
            const steps = replayTrace(c, trace);
            expect(steps.map((s) => s.restart)).toEqual(trace.map((_, k) => k === trace.length - 1));
          }
        });
      }),
      { numRuns: 150 },
    );
  }, SLOW);

  it("count, page, find and export filtered rows consistently", () => {
    fc.assert(
      fc.property(designs, fc.constantFrom<RowFilter["only"]>(undefined, "unsafe", "violating", "drive"), (d, only) => {
        const c = compileDesign(d);
        const filter: RowFilter = { only, where: { [c.conditions[0].id]: [c.conditions[0].states[1]] } };
        const all = pageRows(c, { count: c.rows }).rows;
        const match = (r: (typeof all)[number]) =>
          r.states[c.conditions[0].id] === c.conditions[0].states[1] &&
          (only === undefined ||
            (only === "drive" ? r.drive : Object.values(r.rules).some((x) => (only === "unsafe" ? x.unsafe : x.violating))));
        const expected = all.filter(match).map((r) => r.index);
        expect(countRows(c, filter)).toBe(expected.length);
        const page = pageRows(c, { filter, from: 1, count: 3 });
        expect(page.total).toBe(expected.length);
        expect(page.rows.map((r) => r.index)).toEqual(expected.slice(1, 4));
        expect(findRow(c, filter, 0)).toBe(expected.length > 0 ? expected[0] : -1);
        if (expected.length > 1) expect(findRow(c, filter, expected[0] + 1)).toBe(expected[1]);
        const csv = [...csvChunks(c, filter)].join("");
        expect(csv.trimEnd().split("\n").length).toBe(1 + expected.length);
      }),
      { numRuns: 60 },
    );
  }, SLOW);
});
