// Bench-test procedure generator: from a design, an ordered list of bench steps that reveals every
// single stuck contact some observation can reveal, shows each rule at work and checks each listed
// lockout; what it can't check is listed with the reason. Pure TypeScript (no React, no Node APIs).
// The parts follow the decisions: rows and approaches (130, book.ts), faults (131, faults.ts),
// lockout checks (132, lockouts.ts), the fewest rows (133, cover.ts), rules (050 and 134, rules.ts).
// Every expectation is the replay of the step's moves, in the order the instruction gives them,
// with the engine's step of spec 1.5; every "reveals" is the same replay with the fault applied
// (replay.ts, which also reads every claim from the replay).
import { compileDesign, type CompiledDesign, type Design } from "../engine";
import { RowBook, restRow, searchPool, EXHAUSTIVE_ROWS, type SearchPool } from "./book";
import { minimumCover, type Cover, type Need } from "./cover";
import { tableBound } from "./table-bound";
import { faultItems, type FaultItem } from "./faults";
import { checkPhases, planLockoutChecks, type LockoutCheck, type LockoutPlan } from "./lockouts";
import { claimsFromReplay, replayPlan, type Claims, type Draft, type Observation, type PlanReplay } from "./replay";
import { ruleItems, type RuleItem } from "./rules";
import type { BenchExpect, BenchPlan, BenchStep } from "./types";
import {
  describeExpect,
  describeMoves,
  lockoutWords,
  movesOf,
  WHEELS_CHECK,
  WHEELS_ROW,
  type Move,
  type Naming,
  type Phases,
} from "./words";

export type { BenchExpect, BenchMove, BenchPlan, BenchStep } from "./types";
export { EXHAUSTIVE_ROWS };

export const BENCH_PLAN_FORMAT = "chainproof/bench-plan@1";

/** What a plan must cover: the start row, the rows searched, the faults and rules, and the fewest rows meeting them. */
type Scope = {
  rest: number;
  pool: SearchPool;
  /** Appended to a reason when the search looked at only part of a large table. */
  poolNote: string;
  faults: FaultItem[];
  rules: RuleItem[];
  /** Each revealable fault and each rule with a test row, with the rows that meet it. */
  needs: Need[];
  /** Among equal choices, the lower row is taken. */
  prefer: (row: number) => number;
  /** The fewest rows meeting `needs` (decision 133), the plan's lower bound. */
  bound: Cover;
};

/** The bench plan of a design: what to cover, the lockout checks, the fewest rows in order, each step replayed, every claim read from the replay. */
export function generateBenchPlan(design: Design): BenchPlan {
  const c = compileDesign(design);
  const book = new RowBook(c);
  const naming = namingOf(c, book);
  const scope = whatToCover(c, book, naming);
  const lockouts = planLockoutChecks(c, book, scope, naming.input);
  const withDrive = boundWithDrive(scope, lockouts);
  const rows = nearestFirst(book, scope.rest, planRows(scope, lockouts), scope.prefer);
  const drafts = draftSteps(c, book, scope.rest, rows, lockouts.checks);
  const replayed = replayPlan(c, book, scope.rest, drafts, scope.faults);
  const claims = claimsFromReplay(book, drafts, replayed, scope, lockouts.uncovered, naming);
  const steps = benchSteps(c, book, drafts, replayed, claims, naming);
  return {
    format: BENCH_PLAN_FORMAT,
    design: c.design.name,
    start: startOf(book, scope.rest, replayed.plain.start, naming),
    steps,
    uncovered: claims.uncovered,
    stats: planStats(c, scope, drafts, steps, replayed, claims, withDrive),
  };
}

// ---------------------------------------------------------------- what to cover

/** The faults and rules to cover (decisions 131, 050, 134) and the fewest rows meeting them (133), from the rows searched. */
function whatToCover(c: CompiledDesign, book: RowBook, naming: Naming): Scope {
  const rest = restRow(c, book);
  const pool = searchPool(c, book, rest);
  const poolNote = pool.exhaustive
    ? ""
    : ` (searched ${pool.rows.length} of ${c.rows} rows, those near ${pool.anchors.length} sampled drive rows)`;
  const faults = faultItems(c, book, faultSearchRows(c, book, pool, rest), pool.exhaustive, naming.contact);
  const rules = ruleItems(c, book, pool.rows, pool.exhaustive, poolNote, naming.input);
  const needs: Need[] = [
    ...faults.filter((f) => f.revealable).map((f) => ({ id: f.id, rows: f.rows })),
    ...rules.filter((r) => r.rows.length > 0).map((r) => ({ id: r.id, rows: r.rows })),
  ];
  // Among equal choices: rows near the start, then rows whose approach latches nothing.
  const prefer = (r: number) => 2 * book.hamming(r, rest) + (book.approach(r).steady ? 0 : 1);
  return { rest, pool, poolNote, faults, rules, needs, prefer, bound: minimumCover(needs, { prefer }) };
}

/** Rows a large table's faults are looked for in: the sampled drive rows, the rest row and their neighbours. */
function faultSearchRows(c: CompiledDesign, book: RowBook, pool: SearchPool, rest: number): number[] {
  if (pool.exhaustive) return pool.rows;
  const out = new Set<number>();
  for (const a of [rest, ...pool.anchors]) {
    c.conditions.forEach((cond, ci) => {
      for (let s = 0; s < cond.radix; s++) out.add(book.withState(a, ci, s));
    });
  }
  return [...out].sort((x, y) => x - y);
}

// ---------------------------------------------------------------- the rows and their order

/**
 * The rows the plan shows (decision 133): the drive rows the lockout checks end in, then the fewest
 * rows meeting every need, those rows fixed when the checks do not share one drive row of the cover.
 */
function planRows({ needs, prefer }: Scope, { checks, sharedRow, cover }: LockoutPlan): number[] {
  const fixed = [...new Set(checks.map((k) => k.d))];
  const rest = sharedRow === undefined && fixed.length > 0 ? minimumCover(needs, { prefer, fixed }).rows : cover.rows;
  return [...new Set([...fixed, ...rest])];
}

/** The lower bound again with one more need, a row that shows drive, when there are lockout checks (they need one). */
function boundWithDrive({ needs, prefer }: Scope, { checks, drives }: LockoutPlan): Cover | null {
  return checks.length > 0 ? minimumCover([...needs, { id: "drive-row", rows: drives }], { prefer }) : null;
}

/** The rows in nearest-neighbour order from the start row (fewest condition changes; ties by `prefer`, then row). */
function nearestFirst(book: RowBook, rest: number, chosen: number[], prefer: (row: number) => number): number[] {
  const ordered: number[] = [];
  const left = chosen.slice();
  let at = rest;
  while (left.length > 0) {
    let bi = 0;
    for (let k = 1; k < left.length; k++) {
      const dk = book.hamming(at, left[k]);
      const db = book.hamming(at, left[bi]);
      if (dk < db || (dk === db && (prefer(left[k]) < prefer(left[bi]) || (prefer(left[k]) === prefer(left[bi]) && left[k] < left[bi]))))
        bi = k;
    }
    [at] = left.splice(bi, 1);
    ordered.push(at);
  }
  return ordered;
}

// ---------------------------------------------------------------- moves of a step

/** A row step per row, each followed by the lockout checks ending in its row (they need it shown driving first). */
function draftSteps(c: CompiledDesign, book: RowBook, rest: number, rows: number[], checks: LockoutCheck[]): Draft[] {
  const drafts: Draft[] = [];
  let cur = rest;
  for (const row of rows) {
    drafts.push({ kind: "row", row, phases: rowPhases(c, book, cur, row) });
    cur = row;
    const driveStep = drafts.length - 1;
    for (const check of checks.filter((k) => k.d === row)) {
      drafts.push({ kind: "sequence", row, phases: checkPhases(book, cur, check), check, driveStep });
    }
  }
  return drafts;
}

/**
 * A row step (decision 130): the throttle to the released state of the row's approach first, the
 * other conditions in any order, the throttle to its state last. A row with a released throttle
 * state is set with the throttle released first. Without a released state the conditions change
 * one at a time in condition order, the throttle last.
 */
function rowPhases(c: CompiledDesign, book: RowBook, cur: number, target: number): Phases {
  const T = book.throttle;
  const ct = book.digit(cur, T);
  const tt = book.digit(target, T);
  const others: Move[] = [];
  c.conditions.forEach((_, ci) => {
    if (ci !== T && book.digit(cur, ci) !== book.digit(target, ci))
      others.push({ cond: ci, from: book.digit(cur, ci), to: book.digit(target, ci) });
  });
  const p: Phases = { first: [], free: [], hold: [], then: [], last: [] };
  if (book.releasedStates.length === 0) {
    p.then = others;
    if (ct !== tt) p.last = [{ cond: T, from: ct, to: tt }];
    return p;
  }
  const via = c.throttle.classOf[tt] === 0 ? tt : book.approach(target).via;
  if (ct !== via) p.first = [{ cond: T, from: ct, to: via }];
  p.free = others;
  if (via !== tt) p.last = [{ cond: T, from: via, to: tt }];
  return p;
}

// ---------------------------------------------------------------- steps

/** The start row's set-up and what the bench shows there before any move (the replay's start). */
function startOf(book: RowBook, rest: number, o: Observation, naming: Naming): BenchPlan["start"] {
  const expect: BenchExpect = { drive: o.drive, inputs: { ...o.inputs }, latched: o.latched };
  return {
    set: book.view(rest).states,
    expect,
    instruction: `Start with ${naming.states((ci) => book.digit(rest, ci))}. ${describeExpect(naming, expect)}`,
  };
}

/** The plan's steps: each draft's moves, the conditions it ends in, what its replay expects, its claims and its words. */
function benchSteps(
  c: CompiledDesign,
  book: RowBook,
  drafts: Draft[],
  { plain, reveals }: PlanReplay,
  claims: Claims,
  naming: Naming,
): BenchStep[] {
  return drafts.map((d, k) => {
    const o = plain.steps[k];
    const moves = movesOf(d.phases);
    const expect: BenchExpect = { drive: o.drive, inputs: { ...o.inputs }, latched: o.latched };
    const anyFrom = d.phases.first.length;
    const head = d.kind === "sequence" ? [lockoutWords([d.check!.lockout, ...d.check!.also], d.driveStep! + 1, d.check!.others).head] : [];
    const instruction = [...head, describeMoves(naming, d.phases), describeExpect(naming, expect), ...claims.notes[k]].join(" ");
    const caution = d.kind === "sequence" ? WHEELS_CHECK : appliesThrottle(c, book, d.row, moves) ? WHEELS_ROW : undefined;
    return {
      n: k + 1,
      kind: d.kind,
      moves: moves.map((m) => ({
        condition: c.conditions[m.cond].id,
        from: c.conditions[m.cond].states[m.from],
        to: c.conditions[m.cond].states[m.to],
      })),
      ...(d.phases.free.length > 1 ? { anyOrder: [anyFrom, anyFrom + d.phases.free.length] as [number, number] } : {}),
      set: book.view(d.row).states,
      expect,
      covers: claims.covers[k],
      reveals: reveals[k],
      instruction,
      ...(caution ? { caution } : {}),
    };
  });
}

/** A row step applies the throttle when a move sets it to an applied state or its row holds it applied (the wheels caution). */
function appliesThrottle(c: CompiledDesign, book: RowBook, row: number, moves: Move[]): boolean {
  return (
    moves.some((m) => m.cond === book.throttle && c.throttle.classOf[m.to] !== 0) ||
    c.throttle.classOf[book.digit(row, book.throttle)] !== 0
  );
}

/**
 * The rows a plan must observe at least. A whole table: the fewest rows meeting every need (exact when
 * the search finished). A sampled one: the cover of the rows searched is no bound on the whole table,
 * so the bound is a packing of faults no row shows together, over the whole table (table-bound.ts),
 * and the fewest rows among those searched is given beside it.
 */
function lowerBoundOf(
  c: CompiledDesign,
  pool: SearchPool,
  faults: FaultItem[],
  bound: Cover,
  withDrive: Cover | null,
  planRows: number,
): NonNullable<BenchPlan["stats"]["lowerBound"]> {
  if (pool.exhaustive) {
    return {
      rows: bound.lowerBound,
      exact: bound.exact,
      ...(withDrive ? { rowsWithDrive: withDrive.lowerBound, exactWithDrive: withDrive.exact } : {}),
      planRows,
    };
  }
  const whole = tableBound(c, faults, withDrive !== null);
  return {
    rows: whole.rows,
    exact: false,
    ...(withDrive ? { rowsWithDrive: whole.rowsWithDrive, exactWithDrive: false } : {}),
    planRows,
    apart: { faults: whole.witness, ...(withDrive ? { withDrive: whole.witnessWithDrive } : {}) },
    searched: { rows: pool.rows.length, fewest: bound.rows.length, ...(withDrive ? { fewestWithDrive: withDrive.rows.length } : {}) },
  };
}

/** The plan's figures: items and those covered, faults revealed, and the rows observed against the lower bound (decision 133). */
function planStats(
  c: CompiledDesign,
  { pool, faults, rules, bound }: Scope,
  drafts: Draft[],
  steps: BenchStep[],
  { revealed }: PlanReplay,
  { uncovered }: Claims,
  withDrive: Cover | null,
): BenchPlan["stats"] {
  const coveredRules = rules.length - uncovered.filter((u) => u.item.startsWith("rule:")).length;
  const coveredLockouts = c.lockouts.length - uncovered.filter((u) => u.item.startsWith("lockout:")).length;
  return {
    steps: steps.length,
    lockoutSteps: steps.filter((s) => s.kind === "sequence").length,
    conditionChanges: steps.reduce((n, s) => n + s.moves!.length, 0),
    items: rules.length + faults.length + c.lockouts.length,
    covered: coveredRules + revealed.size + coveredLockouts,
    faults: { total: faults.length, revealable: faults.filter((f) => f.revealable).length, revealed: revealed.size },
    lowerBound: lowerBoundOf(c, pool, faults, bound, withDrive, new Set(drafts.map((d) => d.row)).size),
    rows: c.rows,
    rowsSearched: pool.rows.length,
  };
}

// ---------------------------------------------------------------- wording helpers

/** How the words name conditions, states, inputs and contacts of this design (labels with ids where they differ). */
function namingOf(c: CompiledDesign, book: RowBook): Naming {
  return {
    conditionLabel: (ci) => c.conditions[ci].label,
    stateName: (ci, s) => c.conditions[ci].states[s],
    conditionCount: c.conditions.length,
    throttleCond: book.throttle,
    releasedState: (s) => c.throttle.classOf[s] === 0,
    input: (id) => {
      const x = c.inputs[c.inputIndex[id]];
      return x && x.label !== id ? `${x.label} (${id})` : id;
    },
    inputIds: c.inputs.map((x) => x.id),
    contact: (id) => {
      const k = c.contacts[c.contactIndex[id]];
      return k && k.label !== id ? `${id} (${k.label})` : id;
    },
    states: (digit) => c.conditions.map((k, ci) => `${k.label} ${k.states[digit(ci)]}`).join(", "),
  };
}
