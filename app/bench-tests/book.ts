// Row views and row arithmetic for the bench-test generator: views cached from the engine, the
// mixed-radix digits of spec 1.1, how a row step approaches its row (decision 130), and the rows the
// generator searches (every row of a small table; rows near sampled drive rows of a large one).
import { evaluateRows, pageRows, stepInto, type CompiledDesign, type ControllerMemory, type Predicate, type RowView } from "../engine";

/** Up to this many rows, every row is a candidate; above it, rows near sampled drive rows (decision 133). */
export const EXHAUSTIVE_ROWS = 4096;
const ANCHOR_DRIVE_ROWS = 48;
const MAX_RELAX_COMBOS = 64;

/** How a row step reaches its row from a released throttle, and what it then shows. */
export type Approach = {
  /** The released throttle state passed through (-1: the throttle has none, or the row's own is released). */
  via: number;
  latched: boolean;
  drive: boolean;
  /** Lockouts armed as the throttle is set last. */
  armed: string[];
  /** The step shows the row's steady outcome (nothing latched on the way in). */
  steady: boolean;
};

/** Condition ids a predicate reads. */
export function predicateConditions(p: Predicate, out: Set<string> = new Set()): Set<string> {
  if ("cond" in p) out.add(p.cond);
  else if ("all" in p) p.all.forEach((q) => predicateConditions(q, out));
  else if ("any" in p) p.any.forEach((q) => predicateConditions(q, out));
  else if ("not" in p) predicateConditions(p.not, out);
  return out;
}

export class RowBook {
  private readonly views = new Map<number, RowView>();
  private readonly approaches = new Map<number, Approach>();
  /** Released throttle states, in the condition's order. */
  readonly releasedStates: number[];
  readonly throttle: number;
  constructor(readonly c: CompiledDesign) {
    this.throttle = c.throttle.cond;
    this.releasedStates = c.throttle.classOf.flatMap((k, s) => (k === 0 ? [s] : []));
  }
  view(i: number): RowView {
    let v = this.views.get(i);
    if (!v) {
      v = evaluateRows(this.c, [i])[0];
      this.views.set(i, v);
    }
    return v;
  }
  /** Evaluates many rows at once (a word at a time) into the cache. */
  load(rows: readonly number[]): void {
    const missing = rows.filter((i) => !this.views.has(i));
    evaluateRows(this.c, missing).forEach((v) => this.views.set(v.index, v));
  }
  remember(v: RowView): void {
    this.views.set(v.index, v);
  }
  digit(i: number, cond: number): number {
    const k = this.c.conditions[cond];
    return Math.floor(i / k.stride) % k.radix;
  }
  withState(i: number, cond: number, state: number): number {
    return i + (state - this.digit(i, cond)) * this.c.conditions[cond].stride;
  }
  hamming(i: number, j: number): number {
    let d = 0;
    for (let k = 0; k < this.c.conditions.length; k++) if (this.digit(i, k) !== this.digit(j, k)) d++;
    return d;
  }
  isReleased(i: number): boolean {
    return this.c.throttle.classOf[this.digit(i, this.throttle)] === 0;
  }
  /** The memory after settling in row `i` with the throttle released (latch clear, drive off). */
  settled(i: number): ControllerMemory {
    return stepInto(this.c, null, this.view(i)).memory;
  }
  /**
   * A row step releases the throttle, sets the other conditions, then sets the throttle last
   * (decision 130). With the throttle released the latch is clear, so what the step shows depends
   * only on the row and the released state passed through: the first released state whose
   * approach shows the row's steady outcome, else the first.
   */
  approach(i: number): Approach {
    let a = this.approaches.get(i);
    if (a) return a;
    const row = this.view(i);
    if (this.releasedStates.length === 0 || this.isReleased(i)) {
      a = { via: -1, latched: false, drive: row.drive, armed: [], steady: true };
    } else {
      for (const s of this.releasedStates) {
        const from = this.settled(this.withState(i, this.throttle, s));
        const r = stepInto(this.c, from, row);
        const here: Approach = { via: s, latched: r.latched, drive: r.drive, armed: r.armed, steady: !r.latched };
        if (!a) a = here;
        if (here.steady) {
          a = here;
          break;
        }
      }
    }
    this.approaches.set(i, a!);
    return a!;
  }
}

/** No drive, throttle released, fewest live inputs, then the lowest row (first states). */
export function restRow(c: CompiledDesign, book: RowBook): number {
  const tc = c.conditions[c.throttle.cond];
  const released = tc.states.filter((_, s) => c.throttle.classOf[s] === 0);
  const filter = released.length > 0 ? { where: { [tc.id]: released } } : undefined;
  const { rows } = pageRows(c, { filter, count: EXHAUSTIVE_ROWS });
  let best: RowView | null = null;
  const live = (v: RowView) => Object.values(v.inputs).filter(Boolean).length;
  for (const v of rows) {
    book.remember(v);
    if (v.drive) continue;
    if (!best || live(v) < live(best)) best = v;
  }
  return (best ?? rows[0]).index;
}

export type SearchPool = {
  rows: number[];
  exhaustive: boolean;
  /** Sampled drive rows the pool was built around (large tables only). */
  anchors: number[];
};

/**
 * Every row of a small table. Of a large one: sampled drive rows, their single-condition neighbours,
 * and their variations over each rule's own conditions (so rule test rows near drive are found).
 */
export function searchPool(c: CompiledDesign, book: RowBook, rest: number): SearchPool {
  if (c.rows <= EXHAUSTIVE_ROWS) {
    const { rows } = pageRows(c, { count: c.rows });
    rows.forEach((v) => book.remember(v));
    return { rows: rows.map((v) => v.index), exhaustive: true, anchors: [] };
  }
  const anchors = new Set<number>([rest]);
  const total = pageRows(c, { filter: { only: "drive" }, count: 0 }).total;
  for (let k = 0; k < Math.min(ANCHOR_DRIVE_ROWS, total); k++) {
    const from = Math.floor((k * total) / Math.min(ANCHOR_DRIVE_ROWS, total));
    const v = pageRows(c, { filter: { only: "drive" }, from, count: 1 }).rows[0];
    book.remember(v);
    anchors.add(v.index);
  }
  const pool = new Set<number>(anchors);
  const ruleConds = c.design.rules.flatMap((r) =>
    r.type === "no-restart" ? [] : [[...predicateConditions(r.when)].map((id) => c.conditionIndex[id])],
  );
  for (const a of anchors) {
    c.conditions.forEach((cond, ci) => {
      for (let s = 0; s < cond.radix; s++) pool.add(book.withState(a, ci, s));
    });
    for (const conds of ruleConds) {
      const combos = conds.reduce((n, ci) => n * c.conditions[ci].radix, 1);
      if (combos > MAX_RELAX_COMBOS) continue;
      let rows = [a];
      for (const ci of conds) rows = rows.flatMap((i) => c.conditions[ci].states.map((_, s) => book.withState(i, ci, s)));
      rows.forEach((i) => pool.add(i));
    }
  }
  const rows = [...pool].sort((x, y) => x - y);
  book.load(rows);
  return { rows, exhaustive: false, anchors: [...anchors].filter((a) => a !== rest) };
}
