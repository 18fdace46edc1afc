// What a bench can observe, for the bench-test generator: row views in bulk (faults applied, each
// 32-row word evaluated once), the rows where a single stuck contact changes what the controller
// inputs read, and one step of spec 1.5 from what the controller remembers, so a procedure can be
// replayed move by move without replaying it from power-up each time.
import type { CompiledDesign } from "./compile";
import { THROTTLE_CLASSES } from "./compile";
import { viewOfLane, type ControllerState, type Direction, type RowView } from "./rows";
import { codeOfState, initialViewCode, step } from "./sequence";
import type { Lockout } from "./schema";
import { lowestBit, WORD, WordEvaluator, type ContactFault } from "./table";

/** What the controller keeps between steps (spec 1.5): its previous view, its drive and the latch. */
export type ControllerMemory = { view: number; drive: boolean; latched: boolean };

export type StepOutcome = {
  /** Lockouts whose event happened at this step. */
  armed: Lockout[];
  /** The latch L after this step. */
  latched: boolean;
  /** drive_t: steady drive and not latched. */
  drive: boolean;
  /** What the controller remembers for the next step. */
  memory: ControllerMemory;
};

/**
 * One step of spec 1.5 into the row `row` (its view, faults already applied). `memory` null: the
 * controller was off before this step (the first step from power-up).
 */
export function stepInto(c: CompiledDesign, memory: ControllerMemory | null, row: Pick<RowView, "controller">): StepOutcome {
  const v = codeOfState(row.controller);
  const p = memory ? memory.view : initialViewCode(v >> 5);
  const r = step(c, p, memory?.drive ?? false, memory?.latched ?? false, v);
  return { armed: r.armed, latched: r.latched, drive: r.drive, memory: { view: v, drive: r.drive, latched: r.latched } };
}

/** The views of many rows (in the order given), with faults applied; each word is evaluated once. */
export function evaluateRows(c: CompiledDesign, indexes: readonly number[], faults: readonly ContactFault[] = []): RowView[] {
  for (const i of indexes) {
    if (!Number.isInteger(i) || i < 0 || i >= c.rows) throw new RangeError(`row ${i} is outside 0..${c.rows - 1}`);
  }
  const order = indexes.map((_, k) => k).sort((a, b) => indexes[a] - indexes[b]);
  const out = new Array<RowView>(indexes.length);
  const ev = new WordEvaluator(c, faults);
  for (const k of order) {
    const w = Math.floor(indexes[k] / WORD);
    if (ev.wordIndex !== w) ev.evalWord(w);
    out[k] = viewOfLane(ev, indexes[k]);
  }
  return out;
}

/** What a bench sees of a row: the inputs, the controller's view and steady drive. */
export type RowGlimpse = Pick<RowView, "index" | "inputs" | "controller" | "drive">;

const DIRECTIONS: Direction[] = ["forward", "neutral", "reverse", "conflict"];

/** Like evaluateRows, but only what a bench sees (much lighter for many rows and faults). */
export function glimpseRows(c: CompiledDesign, indexes: readonly number[], faults: readonly ContactFault[] = []): RowGlimpse[] {
  const order = indexes.map((_, k) => k).sort((a, b) => indexes[a] - indexes[b]);
  const out = new Array<RowGlimpse>(indexes.length);
  const ev = new WordEvaluator(c, faults);
  for (const k of order) {
    const index = indexes[k];
    if (!Number.isInteger(index) || index < 0 || index >= c.rows) throw new RangeError(`row ${index} is outside 0..${c.rows - 1}`);
    const w = Math.floor(index / WORD);
    if (ev.wordIndex !== w) ev.evalWord(w);
    const j = index - w * WORD;
    const bit = (x: number) => ((x >>> j) & 1) === 1;
    const inputs: Record<string, boolean> = Object.create(null); // ids like "__proto__" are legal
    for (const x of c.inputs) inputs[x.id] = bit(ev.reach[x.net]);
    const controller: ControllerState = {
      powered: bit(ev.powered),
      enabled: bit(ev.enabled),
      direction: DIRECTIONS[[ev.dirForward, ev.dirNeutral, ev.dirReverse, ev.dirConflict].findIndex(bit)],
      braking: bit(ev.braking),
      throttle: THROTTLE_CLASSES[[ev.thrReleased, ev.thrApplied, ev.thrFault].findIndex(bit)],
    };
    out[k] = { index, inputs, controller, drive: bit(ev.drive) };
  }
  return out;
}

/**
 * One pass over the table, word by word: for each fault `want` asks for, the rows of the word where
 * some controller input reads differently with it applied (`shows[k]`, 0 for the others). The
 * fault-free word is evaluated once, and a fault's word only where its contact is in the state the
 * fault changes. `visit` returns false to stop.
 */
function scanFaultWords(
  c: CompiledDesign,
  faults: readonly ContactFault[],
  want: (k: number) => boolean,
  visit: (plain: WordEvaluator, shows: Int32Array) => boolean,
): void {
  const plain = new WordEvaluator(c);
  const evs = faults.map((f) => new WordEvaluator(c, [f]));
  const contact = faults.map((f) => {
    const i = c.contactIndex[f.component];
    if (i === undefined) throw new Error(`no contact with id ${JSON.stringify(f.component)}`);
    return i;
  });
  const nets = [...new Set(c.inputs.map((x) => x.net))];
  const shows = new Int32Array(faults.length);
  for (let w = 0; w < plain.wordCount; w++) {
    plain.evalWord(w);
    for (let k = 0; k < faults.length; k++) {
      shows[k] = 0;
      if (!want(k)) continue;
      const cw = plain.cw[contact[k]];
      const changed = (faults[k].mode === "stuck-open" ? cw : ~cw) & plain.valid;
      if (changed === 0) continue;
      evs[k].evalWord(w);
      let diff = 0;
      for (const n of nets) diff |= plain.reach[n] ^ evs[k].reach[n];
      shows[k] = diff & changed;
    }
    if (!visit(plain, shows)) return;
  }
}

/**
 * For each fault, the rows (in order, at most `limit` each) where some controller input reads
 * differently with that fault applied, in one pass over the table. A fault with no row has been
 * checked against every row of the table.
 */
export function faultRows(c: CompiledDesign, faults: readonly ContactFault[], limit = Infinity): number[][] {
  const out: number[][] = faults.map(() => []);
  let open = faults.length;
  scanFaultWords(
    c,
    faults,
    (k) => out[k].length < limit,
    (plain, shows) => {
      for (let k = 0; k < faults.length; k++) {
        let diff = shows[k];
        if (diff === 0) continue;
        while (diff !== 0 && out[k].length < limit) {
          const j = lowestBit(diff);
          diff &= diff - 1;
          out[k].push(plain.wordIndex * WORD + j);
        }
        if (out[k].length >= limit) open--;
      }
      return open > 0;
    },
  );
  return out;
}

/** Which faults show in a common row, over the whole table (for a bound on how few rows can reveal them all). */
export type FaultMeetings = {
  /** `together[i][j]`: some row shows fault i and fault j (both change an input there). */
  together: boolean[][];
  /** `withDrive[i]`: some row that drives (fault-free) shows fault i. */
  withDrive: boolean[];
};

/** For every pair of faults whether a row shows both, and for each whether a drive row shows it: one pass, nothing per row kept. */
export function faultMeetings(c: CompiledDesign, faults: readonly ContactFault[]): FaultMeetings {
  const together = faults.map(() => faults.map(() => false));
  const withDrive = faults.map(() => false);
  scanFaultWords(
    c,
    faults,
    () => true,
    (plain, shows) => {
      for (let i = 0; i < faults.length; i++) {
        if (shows[i] === 0) continue;
        if ((shows[i] & plain.drive) !== 0) withDrive[i] = true;
        for (let j = i + 1; j < faults.length; j++) if ((shows[i] & shows[j]) !== 0) together[i][j] = together[j][i] = true;
      }
      return true;
    },
  );
  return { together, withDrive };
}
