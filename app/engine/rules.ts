// The fault-free pass over the whole table: steady-drive count, per inhibit rule the unsafe and
// violating counts with a first violating row, and the distinct controller views (for no-restart).
import type { CompiledDesign } from "./compile";
import { lowestBit, popcount, WORD, WordEvaluator } from "./table";

export type InhibitCount = { unsafe: number; violating: number; example: number };

export type TableSummary = {
  rows: number;
  driveRows: number;
  /** Indexed by rule index; null for rules that are not inhibit rules. */
  inhibit: (InhibitCount | null)[];
  /** Controller view code (see sequence.ts) -> first row showing that view. */
  views: Map<number, number>;
};

/** Number of distinct controller views: powered x enabled x 4 directions x braking x 3 throttle classes. */
export const VIEW_CODES = 96;

export function viewCode(powered: number, enabled: number, direction: number, braking: number, throttle: number): number {
  return powered | (enabled << 1) | (direction << 2) | (braking << 4) | (throttle * 32);
}

export function summarizeTable(c: CompiledDesign, opts: { views?: boolean } = {}): TableSummary {
  const ev = new WordEvaluator(c);
  const inhibit: (InhibitCount | null)[] = c.rules.map((r) =>
    r.type === "inhibit" ? { unsafe: 0, violating: 0, example: -1 } : null,
  );
  const ruleIdx = c.rules.filter((r) => r.type === "inhibit").map((r) => r.index);
  const wantViews = opts.views ?? c.rules.some((r) => r.type === "no-restart");
  const firstRow = new Float64Array(VIEW_CODES).fill(-1);
  let driveRows = 0;
  for (let w = 0; w < ev.wordCount; w++) {
    ev.evalWord(w);
    const valid = ev.valid;
    driveRows += popcount(ev.drive & valid);
    for (const r of ruleIdx) {
      const unsafe = ev.unsafeWord(r);
      if (unsafe === 0) continue;
      const count = inhibit[r]!;
      count.unsafe += popcount(unsafe);
      const bad = unsafe & ev.forbiddenWord(r);
      if (bad !== 0) {
        count.violating += popcount(bad);
        if (count.example < 0) count.example = w * WORD + lowestBit(bad);
      }
    }
    if (wantViews) collectViews(ev, w, firstRow);
  }
  const views = new Map<number, number>();
  firstRow.forEach((row, code) => {
    if (row >= 0) views.set(code, row);
  });
  return { rows: c.rows, driveRows, inhibit, views };
}

/** Records the first row of each controller view present in the current word (pruned enumeration). */
function collectViews(ev: WordEvaluator, w: number, firstRow: Float64Array): void {
  const dirs = [ev.dirForward, ev.dirNeutral, ev.dirReverse, ev.dirConflict];
  const thr = [ev.thrReleased, ev.thrApplied, ev.thrFault];
  for (let p = 0; p < 2; p++) {
    const mp = (p ? ev.powered : ~ev.powered) & ev.valid;
    if (mp === 0) continue;
    for (let e = 0; e < 2; e++) {
      const me = mp & (e ? ev.enabled : ~ev.enabled);
      if (me === 0) continue;
      for (let d = 0; d < 4; d++) {
        const md = me & dirs[d];
        if (md === 0) continue;
        for (let b = 0; b < 2; b++) {
          const mb = md & (b ? ev.braking : ~ev.braking);
          if (mb === 0) continue;
          for (let t = 0; t < 3; t++) {
            const mt = mb & thr[t];
            if (mt === 0) continue;
            const code = viewCode(p, e, d, b, t);
            if (firstRow[code] < 0) firstRow[code] = w * WORD + lowestBit(mt);
          }
        }
      }
    }
  }
}
