// Lockout checks (decision 132): from a drive row D that an earlier step shows driving, release the
// throttle, set the conditions of a row B, apply the throttle and keep holding it, then change
// conditions one at a time back to D. The lockout's event happens with the throttle held, so the
// latch must keep drive off in D although D's inputs let it run. Every outcome is replayed with the
// engine's step of spec 1.5 (stepInto); nothing here decides what the controller does. Also here:
// which check each listed lockout gets in a plan, and the moves of a check's step.
import { stepInto, type CompiledDesign, type InputFunction, type Lockout } from "../engine";
import type { RowBook, SearchPool } from "./book";
import { minimumCover, type Cover, type Need } from "./cover";
import type { BenchPlan } from "./types";
import type { Phases } from "./words";

export type LockoutCheck = {
  lockout: Lockout;
  /** The drive row the check ends in (an earlier row step shows it driving). */
  d: number;
  /** The row in which the throttle is applied and held: D with up to two other conditions changed. */
  b: number;
  /** The released throttle state B is set up in. */
  via: number;
  /** Conditions changed from B back to D, one at a time, in this order (the throttle may be one). */
  order: number[];
  /** Other lockouts whose events also happen on the way. */
  others: Lockout[];
  /** Other listed lockouts whose best check is this same one (the step can't tell them apart). */
  also: Lockout[];
};

export const sameCheck = (x: LockoutCheck, y: LockoutCheck) =>
  x.d === y.d && x.b === y.b && x.via === y.via && x.order.join() === y.order.join();

const MAX_REPLAYS = 6000;

function permutations<T>(xs: T[]): T[][] {
  if (xs.length <= 1) return [xs];
  return xs.flatMap((x, i) => permutations([...xs.slice(0, i), ...xs.slice(i + 1)]).map((p) => [x, ...p]));
}

/** Replays a check; the lockouts armed from the first move that latched, or null when it does not hold drive off in D. */
export function replayCheck(
  c: CompiledDesign,
  book: RowBook,
  b: number,
  via: number,
  order: number[],
  d: number,
): { cause: Lockout[]; others: Lockout[] } | null {
  let memory = book.settled(book.withState(b, book.throttle, via));
  let row = b;
  const path = [b];
  for (const ci of order) path.push((row = book.withState(row, ci, book.digit(d, ci))));
  if (row !== d) return null;
  let cause: Lockout[] | null = null;
  const seen = new Set<Lockout>();
  let last = null as ReturnType<typeof stepInto> | null;
  for (const i of path) {
    last = stepInto(c, memory, book.view(i));
    memory = last.memory;
    if (last.latched && cause === null) cause = last.armed;
    if (cause !== null) last.armed.forEach((l) => seen.add(l));
  }
  if (!cause || !last || !last.latched || last.drive || !book.view(d).drive) return null;
  return { cause, others: [...seen].filter((l) => !cause!.includes(l)) };
}

/**
 * A check of `lockout` ending in one of the drive rows `drives` (in order of preference): B differs
 * from D in the throttle and at most two other conditions; a check whose first latching move arms
 * only this lockout, with no other lockout's event on the way, is preferred.
 */
export function findCheck(c: CompiledDesign, book: RowBook, lockout: Lockout, drives: number[]): LockoutCheck | null {
  if (book.releasedStates.length === 0) return null;
  const T = book.throttle;
  const held = c.conditions[T].states.map((_, s) => s).filter((s) => c.throttle.classOf[s] !== 0);
  // Applied states first: applying a faulty throttle sets off its own lockout.
  held.sort((x, y) => c.throttle.classOf[x] - c.throttle.classOf[y] || x - y);
  const others = c.conditions.map((_, i) => i).filter((i) => i !== T);
  let best = null as (LockoutCheck & { score: number }) | null;
  let replays = 0;
  for (let level = 0; level <= 2; level++) {
    const changeSets: number[][] =
      level === 0 ? [[]] : level === 1 ? others.map((i) => [i]) : others.flatMap((i, k) => others.slice(k + 1).map((j) => [i, j]));
    for (const d of drives) {
      const first = book.approach(d).via;
      if (first < 0) continue;
      // The released state the row step passes through first, then any other (an idle switch that
      // opens in only one of them may be the only way to set the event off).
      const vias = [first, ...book.releasedStates.filter((s) => s !== first)];
      for (const set of changeSets) {
        let variants = [d];
        for (const ci of set) {
          const here = book.digit(d, ci);
          variants = variants.flatMap((i) =>
            c.conditions[ci].states
              .map((_, s) => s)
              .filter((s) => s !== here)
              .map((s) => book.withState(i, ci, s)),
          );
        }
        for (const v of variants) {
          for (const t of held) {
            const b = book.withState(v, T, t);
            const moves = book.digit(d, T) === t ? set : [...set, T];
            for (const via of vias) {
              for (const order of permutations(moves)) {
                if (++replays > MAX_REPLAYS) return best;
                const r = replayCheck(c, book, b, via, order, d);
                if (!r || !r.cause.includes(lockout)) continue;
                // Fewer other lockouts involved is better; then fewer moves.
                const score = (r.cause.length - 1) * 4 + r.others.length * 2 + order.length / 10;
                if (!best || score < best.score)
                  best = { lockout, d, b, via, order, others: [...r.cause.filter((l) => l !== lockout), ...r.others], also: [], score };
                if (best.others.length === 0 && order.length <= 1) return best;
              }
            }
          }
        }
      }
    }
    if (best && best.others.length === 0) return best;
  }
  return best;
}

/** Why a listed lockout gets no check. */
export function lockoutReason(
  c: CompiledDesign,
  book: RowBook,
  l: Lockout,
  pool: number[],
  drives: number[],
  input: (id: string) => string,
): string {
  const live = (fn: InputFunction) => c.inputOf[fn] >= 0 && pool.every((i) => book.view(i).inputs[c.inputs[c.inputOf[fn]].id]);
  const always = l === "power-on" && live("power") ? "power" : l === "enable-restore" && live("enable") ? "enable" : null;
  if (always) return `the ${always} input ${input(c.inputs[c.inputOf[always]].id)} is live in every row, so it never comes on`;
  if (book.releasedStates.length === 0)
    return "the throttle has no released state, so a latched lockout can't be cleared to show drive in the same conditions";
  if (!pool.some((i) => book.view(i).drive)) return "drive never runs in any row, so holding it off can't be seen";
  if (drives.length === 0)
    return "every row where drive could run latches a lockout as the throttle is applied, so drive can never be shown there first";
  const missing: Partial<Record<Lockout, string>> = {
    "power-on": c.inputOf.power < 0 ? "the design has no power input, so the controller is powered whenever the supply is" : "",
    "enable-restore": c.inputOf.enable < 0 ? "the design has no enable input, so enable never comes back" : "",
    "direction-engage": c.inputOf.forward < 0 ? "the design has no forward input, so a direction is always selected" : "",
    "brake-release": c.inputOf.brake < 0 ? "the design has no brake input, so the brake is never released" : "",
    "throttle-fault": !c.throttle.classOf.includes(2) ? "the throttle has no fault state" : "",
  };
  return (
    missing[l] || "no change of at most two conditions from a drive row sets it off with the throttle held and drive otherwise able to run"
  );
}

/** Drive rows beyond those already in the plan that a lockout check may end in. */
const EXTRA_LOCKOUT_ROWS = 8;
/** Drive rows tried as the one row every lockout check ends in. */
const SHARED_LOCKOUT_ROWS = 32;

/** What the lockout checks of a plan are planned from: the rows to cover and their bound (decision 133). */
export type LockoutPlanInput = {
  rest: number;
  pool: SearchPool;
  /** Appended to a reason when the search looked at only part of a large table. */
  poolNote: string;
  needs: Need[];
  /** Among equal choices, the lower row is taken. */
  prefer: (row: number) => number;
  /** The fewest rows meeting `needs`, without lockout checks. */
  bound: Cover;
};

export type LockoutPlan = {
  /** Drive rows of the pool whose approach latches nothing: rows a check may end in. */
  drives: number[];
  /** One check per distinct set of moves; lockouts sharing a check are in its `also`. */
  checks: LockoutCheck[];
  /** The drive row every check ends in, when the cover could take one. */
  sharedRow: number | undefined;
  /** The cover with that shared drive row as one more need (`bound` itself when there is none). */
  cover: Cover;
  /** Listed lockouts no check was found for, with the reason. */
  uncovered: BenchPlan["uncovered"];
};

/**
 * The check of each listed lockout (decision 132): its best check over drive rows in or near the
 * plan, then, when one drive row gives every lockout a check as good as its best, that row as one
 * more need of the cover, so that the checks share the row step that shows drive.
 */
export function planLockoutChecks(c: CompiledDesign, book: RowBook, at: LockoutPlanInput, input: (id: string) => string): LockoutPlan {
  const { rest, pool, needs, prefer, bound } = at;
  const drives = pool.rows.filter((i) => book.view(i).drive && book.approach(i).steady);
  const isDrive = new Set(drives);
  const near = (i: number) => Math.min(book.hamming(i, rest), ...bound.rows.map((r) => book.hamming(i, r)));
  const byNearness = drives.slice().sort((x, y) => near(x) - near(y) || prefer(x) - prefer(y) || x - y);
  const planned = bound.rows.filter((r) => isDrive.has(r));
  const extra = byNearness.filter((r) => !planned.includes(r)).slice(0, EXTRA_LOCKOUT_ROWS);
  const why = (l: Lockout) => lockoutReason(c, book, l, pool.rows, drives, input) + at.poolNote;
  const { best, uncovered } = bestChecks(c, book, [...planned, ...extra], why);
  const shared = sharedDriveRows(c, book, best, [...planned, ...byNearness.slice(0, SHARED_LOCKOUT_ROWS)]);
  const cover = shared.length > 0 ? minimumCover([...needs, { id: "lockout-drive-row", rows: shared }], { prefer }) : bound;
  const sharedRow = cover.rows.find((r) => shared.includes(r));
  const checks: LockoutCheck[] = [];
  for (const [l, k] of best) {
    const check = sharedRow === undefined ? k : findCheck(c, book, l, [sharedRow])!;
    const twin = checks.find((x) => sameCheck(x, check));
    if (twin) twin.also.push(l);
    else checks.push(check);
  }
  return { drives, checks, sharedRow, cover, uncovered };
}

/** Each listed lockout's best check ending in one of `drives` (in order of preference); those without one, with the reason `why`. */
function bestChecks(
  c: CompiledDesign,
  book: RowBook,
  drives: number[],
  why: (l: Lockout) => string,
): { best: Map<Lockout, LockoutCheck>; uncovered: BenchPlan["uncovered"] } {
  const best = new Map<Lockout, LockoutCheck>();
  const uncovered: BenchPlan["uncovered"] = [];
  for (const l of c.lockouts) {
    const check = findCheck(c, book, l, drives);
    if (check) best.set(l, check);
    else uncovered.push({ item: `lockout:${l}`, reason: why(l) });
  }
  return { best, uncovered };
}

/** The candidate drive rows in which every lockout has a check as good as its best (shared checks cost one drive row). */
function sharedDriveRows(c: CompiledDesign, book: RowBook, best: Map<Lockout, LockoutCheck>, candidates: number[]): number[] {
  if (best.size === 0) return [];
  return [...new Set(candidates)].filter((d) => [...best].every(([l, k]) => findCheck(c, book, l, [d])?.others.length === k.others.length));
}

/** A lockout check's moves (decision 132): release, set B, apply and hold, then back to D one condition at a time. */
export function checkPhases(book: RowBook, cur: number, check: LockoutCheck): Phases {
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
