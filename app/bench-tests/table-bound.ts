// A lower bound, over the whole table, on the rows any plan must observe, for tables too large to
// search whole (decision 133). Faults that no row shows together each need a row of their own, so
// the size of any set of revealable faults that pairwise share no row is a bound: a packing. Any
// such set is a valid bound; the search below only makes it larger. With lockout checks the need "a
// row that drives" joins a set whose faults no drive row shows. Rules are left out of the packing,
// which keeps the bound valid (it can only be looser).
import { faultMeetings, type CompiledDesign } from "../engine";
import type { FaultItem } from "./faults";

export type TableBound = {
  /** At least this many rows, whatever rows a plan picks. */
  rows: number;
  /** The faults (ids) no row shows two of. */
  witness: string[];
  /** The same with the need for a row that drives. */
  rowsWithDrive?: number;
  witnessWithDrive?: string[];
};

/** Search nodes before the packing search keeps the largest set found so far (still a valid bound). */
const PACKING_BUDGET = 100_000;

export const DRIVE_NEED = "drive-row";

export function tableBound(c: CompiledDesign, faults: readonly FaultItem[], needsDriveRow: boolean): TableBound {
  const shown = faults.filter((f) => f.revealable);
  const meet = faultMeetings(
    c,
    shown.map((f) => ({ component: f.contact, mode: f.mode })),
  );
  const ids = shown.map((f) => f.id);
  const apart = largestApart(ids.length, (i, j) => meet.together[i][j]);
  const out: TableBound = { rows: apart.length, witness: apart.map((i) => ids[i]) };
  if (needsDriveRow) {
    // Node n is the drive-row need: it meets fault i when some drive row shows i.
    const n = ids.length;
    const withDrive = largestApart(n + 1, (i, j) => (i === n ? meet.withDrive[j] : j === n ? meet.withDrive[i] : meet.together[i][j]));
    out.rowsWithDrive = withDrive.length;
    out.witnessWithDrive = withDrive.map((i) => (i === n ? DRIVE_NEED : ids[i]));
  }
  return out;
}

/** A large set of nodes no two of which `meet` (a maximum independent set, exact within the budget). */
export function largestApart(n: number, meet: (i: number, j: number) => boolean): number[] {
  const adjacent = Array.from(
    { length: n },
    (_, i) => new Set(Array.from({ length: n }, (_, j) => j).filter((j) => j !== i && meet(i, j))),
  );
  // Fewest neighbours first: the greedy answer is the first incumbent, and the search tries the same order.
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => adjacent[a].size - adjacent[b].size || a - b);
  let best: number[] = [];
  {
    const taken: number[] = [];
    for (const v of order) if (taken.every((u) => !adjacent[v].has(u))) taken.push(v);
    best = taken;
  }
  let nodes = 0;
  const extend = (chosen: number[], candidates: number[]) => {
    if (++nodes > PACKING_BUDGET) return;
    if (candidates.length === 0) {
      if (chosen.length > best.length) best = chosen.slice();
      return;
    }
    if (chosen.length + candidates.length <= best.length) return;
    const [v, ...rest] = candidates;
    // With v: drop its neighbours. Without v: the rest.
    extend(
      [...chosen, v],
      rest.filter((u) => !adjacent[v].has(u)),
    );
    extend(chosen, rest);
  };
  extend([], order);
  return best.sort((a, b) => a - b);
}
