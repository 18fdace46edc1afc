// The replay of a bench plan and the claims made from it: every step's moves replayed, in the order
// the instruction gives them, with the engine's step of spec 1.5, once fault-free (what each step
// expects) and once with each single stuck contact (what each step reveals, decision 131). Each rule,
// fault and lockout claim is read from these replays, never assumed from how the step was planned.
import { glimpseRows, stepInto, type CompiledDesign, type ControllerMemory, type Lockout, type RowGlimpse } from "../engine";
import type { RowBook } from "./book";
import type { FaultItem } from "./faults";
import type { LockoutCheck } from "./lockouts";
import { broken, type RuleItem } from "./rules";
import type { BenchPlan } from "./types";
import { latchNote, lockoutWords, movesOf, ruleNote, type Naming, type Phases } from "./words";

/** A step before its replay: the row it ends in and its moves by phase. */
export type Draft = {
  kind: "row" | "sequence";
  row: number;
  phases: Phases;
  check?: LockoutCheck;
  /** Lockout checks: the index of the row step showing drive in the same row. */
  driveStep?: number;
};

/** What the bench shows after a step (or at the start), and the lockouts armed by its first latching move. */
export type Observation = { drive: boolean; latched: boolean; inputs: Record<string, boolean>; row: number; armed: Lockout[] };

export type Replay = { start: Observation; steps: Observation[] };

/** The fault-free replay, and for each step the faults whose replay differs from it there. */
export type PlanReplay = {
  plain: Replay;
  /** Per step: ids of the faults whose drive, inputs or latch differ from `plain` after it. */
  reveals: string[][];
  revealed: Set<string>;
};

/** The claims read from the replay: per step what it checks and its notes, and every item no step checks. */
export type Claims = { covers: string[][]; notes: string[][]; uncovered: BenchPlan["uncovered"] };

/** Replays the start row and every move of every step with the engine's step (spec 1.5). */
export function replay(c: CompiledDesign, book: RowBook, rest: number, drafts: Draft[], viewOf: (i: number) => RowGlimpse): Replay {
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

/** Replays the plan fault-free and with every fault; a step reveals a fault where the two differ. */
export function replayPlan(c: CompiledDesign, book: RowBook, rest: number, drafts: Draft[], faults: FaultItem[]): PlanReplay {
  const rowsVisited = visitedRows(book, rest, drafts);
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
  return { plain, reveals, revealed: new Set(reveals.flat()) };
}

/** Every row the moves pass through, from the start row on: the rows a fault's replay needs views of. */
function visitedRows(book: RowBook, rest: number, drafts: Draft[]): number[] {
  const visited = [rest];
  for (const d of drafts) {
    let r = visited[visited.length - 1];
    for (const m of movesOf(d.phases)) visited.push((r = book.withState(r, m.cond, m.to)));
  }
  return [...new Set(visited)];
}

/**
 * The claims, each from the replay: a rule at the first row step showing a test row with nothing
 * latched, a fault where a step reveals it, a lockout where its check held drive off after its row
 * step showed drive; everything else uncovered with the reason (rules, faults, then lockouts: those
 * without a check, `lockoutsUnchecked`, first).
 */
export function claimsFromReplay(
  book: RowBook,
  drafts: Draft[],
  { plain, revealed }: PlanReplay,
  items: { rules: RuleItem[]; faults: FaultItem[]; pool: { rows: number[] } },
  lockoutsUnchecked: BenchPlan["uncovered"],
  naming: Naming,
): Claims {
  const covers: string[][] = drafts.map(() => []);
  const notes: string[][] = drafts.map(() => []);
  const uncovered = ruleClaims(book, drafts, plain, items.rules, naming, covers, notes);
  for (const f of items.faults) {
    if (revealed.has(f.id)) continue;
    uncovered.push({
      item: f.id,
      reason: f.reason ?? `some row reveals it, but no step of this procedure does (rows searched: ${items.pool.rows.length})`,
    });
  }
  const lockoutUncovered = [...lockoutsUnchecked, ...stepClaims(book, drafts, plain, covers, notes)];
  return { covers, notes, uncovered: [...uncovered, ...lockoutUncovered] };
}

/** Each rule at the first row step that shows one of its test rows with nothing latched (its note there); returns the rules none shows. */
function ruleClaims(
  book: RowBook,
  drafts: Draft[],
  plain: Replay,
  rules: RuleItem[],
  naming: Naming,
  covers: string[][],
  notes: string[][],
): BenchPlan["uncovered"] {
  const uncovered: BenchPlan["uncovered"] = [];
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
    notes[at].push(ruleNote(r, broken(r, book.view(drafts[at].row)), naming));
  }
  return uncovered;
}

/**
 * What each step's replay says beyond rules: a row step where a lockout latched gets a note first; a
 * lockout check covers its lockouts when drive stayed off latched in a row that drives and that its row
 * step showed driving. Returns the lockouts whose check did not hold.
 */
function stepClaims(book: RowBook, drafts: Draft[], plain: Replay, covers: string[][], notes: string[][]): BenchPlan["uncovered"] {
  const uncovered: BenchPlan["uncovered"] = [];
  drafts.forEach((d, k) => {
    const o = plain.steps[k];
    if (d.kind === "row") {
      if (o.latched) notes[k].unshift(latchNote(o.armed, book.view(d.row).drive));
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
        uncovered.push({
          item: `lockout:${l}`,
          reason: "its check did not hold drive off when replayed, so this procedure does not check it",
        });
    }
  });
  return uncovered;
}
