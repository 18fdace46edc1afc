// The scan over the whole table: steady-drive count, per inhibit rule the unsafe and violating
// counts with a first violating row, per require-drive rule the demand and failing counts with a
// first failing row, the distinct controller views (for no-restart), and
// optionally the single-fault checks riding along (faults.ts). One word of rows at a time.
import type { CompiledDesign } from "./compile";
import { FaultTracker } from "./faults";
import type { SingleFault } from "./schema";
import { lowestBit, popcount, WORD, WordEvaluator } from "./table";

export type InhibitCount = { unsafe: number; violating: number; example: number };
/** `example` is the first failing row, -1 when none. */
export type RequireDriveCount = { demand: number; failing: number; example: number };

export type TableSummary = {
  rows: number;
  driveRows: number;
  /** Indexed by rule index; null for rules that are not inhibit rules. */
  inhibit: (InhibitCount | null)[];
  /** Indexed by rule index; null for rules that are not require-drive rules. */
  requireDrive: (RequireDriveCount | null)[];
  /** Controller view code (see sequence.ts) -> first row showing that view. */
  views: Map<number, number>;
  /** Present when requested: faults defeating rules that hold fault-free. */
  singleFaults?: SingleFault[];
};

/** Number of distinct controller views: powered x enabled x 4 directions x braking x 3 throttle classes. */
export const VIEW_CODES = 96;

export function viewCode(powered: number, enabled: number, direction: number, braking: number, throttle: number): number {
  return powered | (enabled << 1) | (direction << 2) | (braking << 4) | (throttle * 32);
}

export function summarizeTable(c: CompiledDesign, opts: { views?: boolean; faults?: boolean } = {}): TableSummary {
  const ev = new WordEvaluator(c);
  const ruleIdx = Int32Array.from(c.rules.filter((r) => r.type === "inhibit").map((r) => r.index));
  const demandIdx = Int32Array.from(c.rules.filter((r) => r.type === "require-drive").map((r) => r.index));
  const nRules = c.rules.length;
  const unsafeCount = new Float64Array(nRules);
  const violating = new Float64Array(nRules);
  const example = new Float64Array(nRules).fill(-1);
  const unsafe = new Int32Array(nRules);
  const wantViews = opts.views ?? c.rules.some((r) => r.type === "no-restart");
  const firstRow = new Float64Array(VIEW_CODES).fill(-1);
  const faults = opts.faults ? new FaultTracker(c, ev) : null;
  let driveRows = 0;
  for (let w = 0; w < ev.wordCount; w++) {
    ev.evalWord(w);
    driveRows += popcount(ev.drive & ev.valid);
    // Require-drive rules share the arrays: unsafe/violating/example count demand/failing rows.
    for (let n = 0; n < demandIdx.length; n++) {
      const r = demandIdx[n];
      const d = ev.demandWord(r);
      if (d === 0) continue;
      unsafeCount[r] += popcount(d);
      const failing = d & ~ev.drive;
      if (failing !== 0) {
        violating[r] += popcount(failing);
        if (example[r] < 0) example[r] = w * WORD + lowestBit(failing);
      }
    }
    let anyUnsafe = 0;
    for (let n = 0; n < ruleIdx.length; n++) {
      const r = ruleIdx[n];
      const u = ev.unsafeWord(r);
      unsafe[r] = u;
      if (u === 0) continue;
      anyUnsafe |= u;
      unsafeCount[r] += popcount(u);
      const bad = u & ev.forbiddenWord(r);
      if (bad !== 0) {
        violating[r] += popcount(bad);
        if (example[r] < 0) {
          example[r] = w * WORD + lowestBit(bad);
          faults?.ruleFails(r);
        }
      }
    }
    if (wantViews) collectViews(ev, w, firstRow);
    if (faults && anyUnsafe !== 0 && !faults.done) faults.word(unsafe);
  }
  const views = new Map<number, number>();
  firstRow.forEach((row, code) => {
    if (row >= 0) views.set(code, row);
  });
  const inhibit = c.rules.map((r) =>
    r.type === "inhibit" ? { unsafe: unsafeCount[r.index], violating: violating[r.index], example: example[r.index] } : null,
  );
  const requireDrive = c.rules.map((r) =>
    r.type === "require-drive" ? { demand: unsafeCount[r.index], failing: violating[r.index], example: example[r.index] } : null,
  );
  return {
    rows: c.rows,
    driveRows,
    inhibit,
    requireDrive,
    views,
    ...(faults ? { singleFaults: faults.result((r) => violating[r] === 0) } : {}),
  };
}

/** Records the first row of each controller view present in the current word (pruned enumeration). */
function collectViews(ev: WordEvaluator, w: number, firstRow: Float64Array): void {
  const valid = ev.valid;
  for (let p = 0; p < 2; p++) {
    const mp = (p ? ev.powered : ~ev.powered) & valid;
    if (mp === 0) continue;
    for (let e = 0; e < 2; e++) {
      const me = mp & (e ? ev.enabled : ~ev.enabled);
      if (me === 0) continue;
      for (let d = 0; d < 4; d++) {
        const md = me & (d === 0 ? ev.dirForward : d === 1 ? ev.dirNeutral : d === 2 ? ev.dirReverse : ev.dirConflict);
        if (md === 0) continue;
        for (let b = 0; b < 2; b++) {
          const mb = md & (b ? ev.braking : ~ev.braking);
          if (mb === 0) continue;
          for (let t = 0; t < 3; t++) {
            const mt = mb & (t === 0 ? ev.thrReleased : t === 1 ? ev.thrApplied : ev.thrFault);
            if (mt === 0) continue;
            const code = viewCode(p, e, d, b, t);
            if (firstRow[code] < 0) firstRow[code] = w * WORD + lowestBit(mt);
          }
        }
      }
    }
  }
}
