// Bench-test procedure generator: from a design, an ordered list of bench steps that reveals every
// single stuck contact some observation can reveal, shows each rule at work and checks each listed
// lockout; what it can't check is listed with the reason. Pure TypeScript (no React, no Node APIs).
// The parts follow the decisions: rows and approaches (130, book.ts), faults (131, faults.ts),
// lockout checks (132, lockouts.ts), the fewest rows (133, cover.ts), rules (050 and 134, rules.ts).
// Every expectation is the replay of the step's moves, in the order the instruction gives them,
// with the engine's step of spec 1.5; every "reveals" is the same replay with the fault applied.
import {
  compileDesign,
  glimpseRows,
  stepInto,
  type CompiledDesign,
  type ControllerMemory,
  type Design,
  type Lockout,
  type RowGlimpse,
  type RowView,
} from "../engine";
import { RowBook, restRow, searchPool, EXHAUSTIVE_ROWS } from "./book";
import { minimumCover, type Need } from "./cover";
import { faultItems } from "./faults";
import { findCheck, lockoutReason, sameCheck, type LockoutCheck } from "./lockouts";
import { broken, ruleItems, type RuleItem } from "./rules";
import type { BenchExpect, BenchPlan, BenchStep } from "./types";
import { describeExpect, describeMoves, latchedBy, lockoutWords, movesOf, type Move, type Naming, type Phases } from "./words";

export type { BenchExpect, BenchMove, BenchPlan, BenchStep } from "./types";
export { EXHAUSTIVE_ROWS };

export const BENCH_PLAN_FORMAT = "chainproof/bench-plan@1";
/** Drive rows beyond those already in the plan that a lockout check may end in. */
const EXTRA_LOCKOUT_ROWS = 8;
/** Drive rows tried as the one row every lockout check ends in. */
const SHARED_LOCKOUT_ROWS = 32;

const WHEELS_ROW = "Lift the drive wheels clear of the ground (or otherwise stop the vehicle moving) before applying the throttle.";
const WHEELS_CHECK =
  "Lift the drive wheels clear of the ground (or otherwise stop the vehicle moving): this step applies and holds the throttle.";

type Draft = {
  kind: "row" | "sequence";
  row: number;
  phases: Phases;
  check?: LockoutCheck;
  /** Lockout checks: the index of the row step showing drive in the same row. */
  driveStep?: number;
};

type Observation = { drive: boolean; latched: boolean; inputs: Record<string, boolean>; row: number; armed: Lockout[] };

export function generateBenchPlan(design: Design): BenchPlan {
  const c = compileDesign(design);
  const book = new RowBook(c);
  const naming = namingOf(c, book);

  // ------------------------------------------------------------ what to cover
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
  const bound = minimumCover(needs, { prefer });

  // ------------------------------------------------------------ lockout checks (decision 132)
  const drives = pool.rows.filter((i) => book.view(i).drive && book.approach(i).steady);
  const isDrive = new Set(drives);
  const near = (i: number) => Math.min(book.hamming(i, rest), ...bound.rows.map((r) => book.hamming(i, r)));
  const byNearness = drives.slice().sort((x, y) => near(x) - near(y) || prefer(x) - prefer(y) || x - y);
  const uncovered: BenchPlan["uncovered"] = [];
  const lockoutUncovered: BenchPlan["uncovered"] = [];
  // First the best check of each lockout over drive rows in or near the plan.
  const best = new Map<Lockout, LockoutCheck>();
  for (const l of c.lockouts) {
    const planned = bound.rows.filter((r) => isDrive.has(r));
    const extra = byNearness.filter((r) => !planned.includes(r)).slice(0, EXTRA_LOCKOUT_ROWS);
    const check = findCheck(c, book, l, [...planned, ...extra]);
    if (check) best.set(l, check);
    else lockoutUncovered.push({ item: `lockout:${l}`, reason: lockoutReason(c, book, l, pool.rows, drives, naming.input) + poolNote });
  }
  // Then one drive row where every lockout has a check as good as its best, if one exists, as one
  // more need of the cover: the checks then share the row step that shows drive (decision 132).
  const shared: number[] = [];
  if (best.size > 0) {
    const candidates = [...new Set([...bound.rows.filter((r) => isDrive.has(r)), ...byNearness.slice(0, SHARED_LOCKOUT_ROWS)])];
    for (const d of candidates) {
      if ([...best].every(([l, k]) => findCheck(c, book, l, [d])?.others.length === k.others.length)) shared.push(d);
    }
  }
  const withShared = shared.length > 0 ? [...needs, { id: "lockout-drive-row", rows: shared }] : needs;
  const cover = shared.length > 0 ? minimumCover(withShared, { prefer }) : bound;
  const sharedRow = cover.rows.find((r) => shared.includes(r));
  const checks: LockoutCheck[] = [];
  for (const [l, k] of best) {
    const check = sharedRow === undefined ? k : findCheck(c, book, l, [sharedRow])!;
    const twin = checks.find((x) => sameCheck(x, check));
    if (twin) twin.also.push(l);
    else checks.push(check);
  }

  // The bound again when a lockout check needs a row step that shows drive.
  const withDrive = checks.length > 0 ? minimumCover([...needs, { id: "drive-row", rows: drives }], { prefer }) : null;

  // ------------------------------------------------------------ the fewest rows (decision 133)
  const fixed = [...new Set(checks.map((k) => k.d))];
  const chosen = [
    ...new Set([...fixed, ...(sharedRow === undefined && fixed.length > 0 ? minimumCover(needs, { prefer, fixed }).rows : cover.rows)]),
  ];

  // ------------------------------------------------------------ order: nearest neighbour from the start
  const ordered: number[] = [];
  {
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
  }
  const drafts: Draft[] = [];
  let cur = rest;
  for (const row of ordered) {
    drafts.push({ kind: "row", row, phases: rowPhases(c, book, cur, row) });
    cur = row;
    const driveStep = drafts.length - 1;
    for (const check of checks.filter((k) => k.d === row)) {
      drafts.push({ kind: "sequence", row, phases: checkPhases(book, cur, check), check, driveStep });
    }
  }

  // ------------------------------------------------------------ replay, fault-free and with every fault
  const visited = [rest];
  for (const d of drafts) {
    let r = visited[visited.length - 1];
    for (const m of movesOf(d.phases)) visited.push((r = book.withState(r, m.cond, m.to)));
  }
  const rowsVisited = [...new Set(visited)];
  book.load(rowsVisited);
  const plain = replay(c, book, rest, drafts, (i) => book.view(i));
  const reveals: string[][] = drafts.map(() => []);
  for (const f of faults) {
    const views = new Map<number, RowGlimpse>();
    glimpseRows(c, rowsVisited, [{ component: f.contact, mode: f.mode }]).forEach((v) => views.set(v.index, v));
    const faulty = replay(c, book, rest, drafts, (i) => views.get(i)!);
    faulty.steps.forEach((o, k) => {
      const e = plain.steps[k];
      if (o.drive !== e.drive || o.latched !== e.latched || Object.keys(e.inputs).some((id) => e.inputs[id] !== o.inputs[id]))
        reveals[k].push(f.id);
    });
  }
  const revealed = new Set(reveals.flat());

  // ------------------------------------------------------------ claims, each from the replay
  const covers: string[][] = drafts.map(() => []);
  const notes: string[][] = drafts.map(() => []);
  for (const r of rules) {
    if (r.rows.length === 0) {
      uncovered.push({ item: r.id, reason: r.reason! });
      continue;
    }
    const test = new Set(r.rows);
    const at = drafts.findIndex((d, k) => d.kind === "row" && test.has(d.row) && !plain.steps[k].latched);
    if (at < 0) {
      uncovered.push({
        item: r.id,
        reason:
          book.releasedStates.length === 0
            ? "the throttle has no released state, so a lockout latched earlier in this procedure can't be cleared to show the rule's row"
            : "no step of this procedure shows one of its test rows with its steady outcome",
      });
      continue;
    }
    covers[at].push(r.id);
    notes[at].push(ruleNote(r, book.view(drafts[at].row), naming));
  }
  for (const f of faults) {
    if (revealed.has(f.id)) continue;
    uncovered.push({
      item: f.id,
      reason: f.reason ?? `some row reveals it, but no step of this procedure does (rows searched: ${pool.rows.length})`,
    });
  }
  drafts.forEach((d, k) => {
    const o = plain.steps[k];
    if (d.kind === "row") {
      if (o.latched) {
        const steady = book.view(d.row).drive;
        notes[k].unshift(
          steady
            ? `${latchedBy(o.armed)} as the throttle is applied here, so drive stays off although the wiring alone would let it run.`
            : `${latchedBy(o.armed)} as the throttle is applied here.`,
        );
      }
      return;
    }
    const check = d.check!;
    const shown = plain.steps[d.driveStep!];
    const checked = [check.lockout, ...check.also];
    if (o.latched && !o.drive && book.view(d.row).drive && shown.drive && !shown.latched) {
      covers[k].push(...checked.map((l) => `lockout:${l}`));
      notes[k].unshift(lockoutWords(checked, d.driveStep! + 1, check.others).note);
    } else {
      for (const l of checked)
        lockoutUncovered.push({
          item: `lockout:${l}`,
          reason: "its check did not hold drive off when replayed, so this procedure does not check it",
        });
    }
  });
  uncovered.push(...lockoutUncovered);

  // ------------------------------------------------------------ steps
  let conditionChanges = 0;
  const steps: BenchStep[] = drafts.map((d, k) => {
    const o = plain.steps[k];
    const moves = movesOf(d.phases);
    conditionChanges += moves.length;
    const expect: BenchExpect = { drive: o.drive, inputs: { ...o.inputs }, latched: o.latched };
    const anyFrom = d.phases.first.length;
    const head = d.kind === "sequence" ? [lockoutWords([d.check!.lockout, ...d.check!.also], d.driveStep! + 1, d.check!.others).head] : [];
    const instruction = [...head, describeMoves(naming, d.phases), describeExpect(naming, expect), ...notes[k]].join(" ");
    const appliesThrottle =
      moves.some((m) => m.cond === book.throttle && c.throttle.classOf[m.to] !== 0) ||
      c.throttle.classOf[book.digit(d.row, book.throttle)] !== 0;
    const caution = d.kind === "sequence" ? WHEELS_CHECK : appliesThrottle ? WHEELS_ROW : undefined;
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
      covers: covers[k],
      reveals: reveals[k],
      instruction,
      ...(caution ? { caution } : {}),
    };
  });

  const startExpect: BenchExpect = { drive: plain.start.drive, inputs: { ...plain.start.inputs }, latched: plain.start.latched };
  const revealable = faults.filter((f) => f.revealable).length;
  const coveredRules = rules.length - uncovered.filter((u) => u.item.startsWith("rule:")).length;
  const coveredLockouts = c.lockouts.length - lockoutUncovered.length;
  return {
    format: BENCH_PLAN_FORMAT,
    design: c.design.name,
    start: {
      set: book.view(rest).states,
      expect: startExpect,
      instruction: `Start with ${naming.states((ci) => book.digit(rest, ci))}. ${describeExpect(naming, startExpect)}`,
    },
    steps,
    uncovered,
    stats: {
      steps: steps.length,
      lockoutSteps: steps.filter((s) => s.kind === "sequence").length,
      conditionChanges,
      items: rules.length + faults.length + c.lockouts.length,
      covered: coveredRules + revealed.size + coveredLockouts,
      faults: { total: faults.length, revealable, revealed: revealed.size },
      lowerBound: {
        rows: bound.lowerBound,
        exact: bound.exact,
        ...(withDrive ? { rowsWithDrive: withDrive.lowerBound, exactWithDrive: withDrive.exact } : {}),
        planRows: new Set(drafts.map((d) => d.row)).size,
      },
      rows: c.rows,
      rowsSearched: pool.rows.length,
    },
  };
}

// ---------------------------------------------------------------- moves of a step

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

/** A lockout check (decision 132): release, set B, apply and hold, then back to D one condition at a time. */
function checkPhases(book: RowBook, cur: number, check: LockoutCheck): Phases {
  const T = book.throttle;
  const c = book.c;
  const ct = book.digit(cur, T);
  const p: Phases = { first: [], free: [], hold: [], then: [], last: [] };
  if (ct !== check.via) p.first = [{ cond: T, from: ct, to: check.via }];
  c.conditions.forEach((_, ci) => {
    if (ci !== T && book.digit(cur, ci) !== book.digit(check.b, ci))
      p.free.push({ cond: ci, from: book.digit(cur, ci), to: book.digit(check.b, ci) });
  });
  p.hold = [{ cond: T, from: check.via, to: book.digit(check.b, T) }];
  let row = check.b;
  for (const ci of check.order) {
    p.then.push({ cond: ci, from: book.digit(row, ci), to: book.digit(check.d, ci) });
    row = book.withState(row, ci, book.digit(check.d, ci));
  }
  return p;
}

// ---------------------------------------------------------------- replay

/** Replays the start row and every move of every step with the engine's step (spec 1.5). */
function replay(c: CompiledDesign, book: RowBook, rest: number, drafts: Draft[], viewOf: (i: number) => RowGlimpse) {
  const first = viewOf(rest);
  const s0 = stepInto(c, null, first);
  let memory: ControllerMemory = s0.memory;
  let row = rest;
  const start: Observation = { drive: s0.drive, latched: s0.latched, inputs: first.inputs, row, armed: s0.armed };
  const steps: Observation[] = [];
  for (const d of drafts) {
    let armed: Lockout[] = [];
    for (const m of movesOf(d.phases)) {
      row = book.withState(row, m.cond, m.to);
      const wasLatched = memory.latched;
      const r = stepInto(c, memory, viewOf(row));
      if (r.latched && !wasLatched) armed = r.armed;
      memory = r.memory;
    }
    steps.push({ drive: memory.drive, latched: memory.latched, inputs: viewOf(row).inputs, row, armed });
  }
  return { start, steps };
}

// ---------------------------------------------------------------- wording helpers

function ruleNote(r: RuleItem, v: RowView, n: Naming): string {
  if (r.type === "require-drive") {
    return broken(r, v)
      ? `Rule "${r.label}" is BROKEN here: the design keeps drive off although the rule demands drive.`
      : `Checks rule "${r.label}": drive must run here, as the rule demands.`;
  }
  const forbidden = r.forbid === null ? "drive running" : `${n.input(r.forbid)} live`;
  const kept = r.forbid === null ? "drive off" : `${n.input(r.forbid)} dead`;
  return broken(r, v)
    ? `Rule "${r.label}" is BROKEN here: the design gives ${forbidden} although the rule forbids it.`
    : `Checks rule "${r.label}": only its own conditions keep ${kept} here.`;
}

/** Rows a large table's faults are looked for in: the sampled drive rows, the rest row and their neighbours. */
function faultSearchRows(c: CompiledDesign, book: RowBook, pool: ReturnType<typeof searchPool>, rest: number): number[] {
  if (pool.exhaustive) return pool.rows;
  const out = new Set<number>();
  for (const a of [rest, ...pool.anchors]) {
    c.conditions.forEach((cond, ci) => {
      for (let s = 0; s < cond.radix; s++) out.add(book.withState(a, ci, s));
    });
  }
  return [...out].sort((x, y) => x - y);
}

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
