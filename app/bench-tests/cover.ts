// The fewest rows that meet every need of a procedure (decision 133): each need (a fault to reveal,
// a rule to show, a lockout's drive row) lists the rows that meet it, and a set of rows must meet
// all of them: a minimum hitting set. Rows that meet the same needs are one choice; a row whose needs
// another row also meets is dropped; then branch and bound, exact within a node budget, with the
// greedy answer as the first incumbent. Pure TypeScript.

export type Need = { id: string; rows: readonly number[] };

export type Cover = {
  /** The rows chosen, in the order of `prefer`. */
  rows: number[];
  /** No set of fewer rows meets every need (the search finished within its budget). */
  exact: boolean;
  /** No set of fewer rows can meet every need: the optimum when exact, else a proven bound. */
  lowerBound: number;
  /** Needs no row meets (they are left out of the cover). */
  unmet: string[];
};

/** Search nodes before the search settles for the best cover found so far. */
export const COVER_NODE_BUDGET = 200_000;

type Bits = Uint32Array;

const has = (b: Bits, i: number) => (b[i >>> 5] & (1 << (i & 31))) !== 0;
const set = (b: Bits, i: number) => {
  b[i >>> 5] |= 1 << (i & 31);
};
function popcount32(x: number): number {
  x = x - ((x >>> 1) & 0x55555555);
  x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
  return (((x + (x >>> 4)) & 0x0f0f0f0f) * 0x01010101) >>> 24;
}
/** |a AND NOT done| */
function gain(a: Bits, done: Bits): number {
  let n = 0;
  for (let k = 0; k < a.length; k++) n += popcount32(a[k] & ~done[k]);
  return n;
}
const subset = (a: Bits, b: Bits) => a.every((x, k) => (x & ~b[k]) === 0);

/**
 * A minimum set of rows meeting every need that some row meets. `prefer` orders rows when several
 * choices are equally good (lower first); `fixed` rows are in the cover from the start (their needs
 * are met) and are not counted in `lowerBound`.
 */
export function minimumCover(
  needs: readonly Need[],
  opts: { prefer?: (row: number) => number; fixed?: readonly number[]; budget?: number } = {},
): Cover {
  const prefer = opts.prefer ?? ((r: number) => r);
  const fixed = new Set(opts.fixed ?? []);
  const unmet = needs.filter((n) => n.rows.length === 0).map((n) => n.id);
  const open = needs.filter((n) => n.rows.length > 0 && !n.rows.some((r) => fixed.has(r)));
  const E = open.length;
  const words = Math.max(1, Math.ceil(E / 32));
  // Row -> the open needs it meets.
  const meets = new Map<number, Bits>();
  open.forEach((n, e) => {
    for (const r of n.rows) {
      let b = meets.get(r);
      if (!b) meets.set(r, (b = new Uint32Array(words)));
      set(b, e);
    }
  });
  // One candidate per distinct need set (the preferred row), then drop those another one contains.
  const bySignature = new Map<string, { row: number; bits: Bits; size: number }>();
  for (const [row, bits] of meets) {
    const key = bits.join(",");
    const was = bySignature.get(key);
    if (!was || prefer(row) < prefer(was.row) || (prefer(row) === prefer(was.row) && row < was.row)) {
      bySignature.set(key, { row, bits, size: gain(bits, new Uint32Array(words)) });
    }
  }
  const distinct = [...bySignature.values()].sort((a, b) => b.size - a.size || prefer(a.row) - prefer(b.row) || a.row - b.row);
  const cands = distinct.filter((x, i) => !distinct.some((y, j) => j !== i && y.size > x.size && subset(x.bits, y.bits)));
  const R = cands.length;
  // Need -> candidate indexes meeting it.
  const rowsOf: number[][] = Array.from({ length: E }, () => []);
  cands.forEach((cand, k) => {
    for (let e = 0; e < E; e++) if (has(cand.bits, e)) rowsOf[e].push(k);
  });

  // A bound for what is left: needs that pairwise share no candidate each need their own row.
  const packing = (done: Bits): number => {
    const used = new Uint8Array(R);
    const left: number[] = [];
    for (let e = 0; e < E; e++) if (!has(done, e)) left.push(e);
    left.sort((a, b) => rowsOf[a].length - rowsOf[b].length || a - b);
    let n = 0;
    for (const e of left) {
      if (rowsOf[e].some((k) => used[k])) continue;
      for (const k of rowsOf[e]) used[k] = 1;
      n++;
    }
    return n;
  };
  const countBound = (done: Bits, remaining: number): number => {
    if (remaining === 0) return 0;
    let best = 0;
    for (const cand of cands) best = Math.max(best, gain(cand.bits, done));
    return best === 0 ? Infinity : Math.ceil(remaining / best);
  };

  // Greedy incumbent: most new needs, then the preferred row.
  const greedy: number[] = [];
  {
    const done = new Uint32Array(words);
    let remaining = E;
    while (remaining > 0) {
      let bi = -1;
      let bg = 0;
      for (let k = 0; k < R; k++) {
        const g = gain(cands[k].bits, done);
        if (g > bg) [bi, bg] = [k, g];
      }
      greedy.push(bi);
      for (let w = 0; w < words; w++) done[w] |= cands[bi].bits[w];
      remaining -= bg;
    }
  }
  let best = greedy.slice();
  const root = new Uint32Array(words);
  const rootBound = Math.max(packing(root), E === 0 ? 0 : countBound(root, E));
  let nodes = 0;
  let complete = true;
  const budget = opts.budget ?? COVER_NODE_BUDGET;
  const pick: number[] = [];
  const search = (done: Bits, remaining: number): void => {
    if (remaining === 0) {
      if (pick.length < best.length) best = pick.slice();
      return;
    }
    if (++nodes > budget) {
      complete = false;
      return;
    }
    if (pick.length + Math.max(packing(done), countBound(done, remaining)) >= best.length) return;
    // Branch on the open need with the fewest candidates; try those meeting the most first.
    let e0 = -1;
    for (let e = 0; e < E; e++) if (!has(done, e) && (e0 < 0 || rowsOf[e].length < rowsOf[e0].length)) e0 = e;
    const options = rowsOf[e0].slice().sort((a, b) => gain(cands[b].bits, done) - gain(cands[a].bits, done) || a - b);
    for (const k of options) {
      const next = done.slice();
      for (let w = 0; w < words; w++) next[w] |= cands[k].bits[w];
      pick.push(k);
      search(next, remaining - gain(cands[k].bits, done));
      pick.pop();
      if (!complete) return;
    }
  };
  if (E > 0 && rootBound < best.length) search(root, E);
  const rows = best.map((k) => cands[k].row).sort((a, b) => prefer(a) - prefer(b) || a - b);
  return { rows, exact: complete, lowerBound: complete ? best.length : Math.min(best.length, rootBound), unmet };
}
