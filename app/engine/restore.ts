// The smallest change of conditions that brings back drive (or power, enable, a direction, ...):
// the rows nearest to the present one, counted in conditions changed, where the goal holds. It is
// what a technician can do with the vehicle's switches; a set of contacts to close may need
// settings no condition can give at once (a reverse line wired behind the forward contact).
// Exact: every row is scanned, a machine word of rows at a time (decision 135).
import type { CompiledDesign } from "./compile";
import { rowProblems, encodeRow } from "./rows";
import { lowestBit, WORD, WordEvaluator } from "./table";

/** What must hold in the rows looked for. */
export type RestoreGoal = "drive" | "powered" | "enabled" | "direction" | "not-braking" | "throttle-applied";

export type ConditionChange = { condition: string; from: string; to: string };

export type SmallestChange =
  /** No row of the design meets the goal: no setting of the conditions can, only a wiring fault explains it. */
  | { reachable: false }
  | {
      reachable: true;
      /** How many conditions must change (0: the goal holds in the present row). */
      size: number;
      /** Smallest changes, up to MAX_CHANGES of them, in row order. */
      changes: ConditionChange[][];
      /** How many smallest changes there are in all. */
      count: number;
    };

export const MAX_CHANGES = 12;

function goalWord(ev: WordEvaluator, goal: RestoreGoal): number {
  switch (goal) {
    case "drive":
      return ev.drive;
    case "powered":
      return ev.powered;
    case "enabled":
      return ev.enabled;
    case "direction":
      return ev.dirForward | ev.dirReverse;
    case "not-braking":
      return ~ev.braking;
    case "throttle-applied":
      return ev.thrApplied;
  }
}

/** Every smallest change of conditions from `states` to a row where `goal` holds (spec 1.4 for each goal). */
export function smallestChange(c: CompiledDesign, states: Record<string, string>, goal: RestoreGoal): SmallestChange {
  const index = encodeRow(c, states);
  if (index < 0 || Object.keys(states).some((k) => !(k in c.conditionIndex))) throw new Error(rowProblems(c, states).join("; "));
  const n = c.conditions.length;
  const here = c.conditions.map((k) => Math.floor(index / k.stride) % k.radix);
  const ev = new WordEvaluator(c);
  let best = Infinity;
  let count = 0;
  const nearest: number[] = [];
  for (let w = 0; w < ev.wordCount; w++) {
    ev.evalWord(w);
    let m = goalWord(ev, goal) & ev.valid;
    while (m !== 0) {
      const row = w * WORD + lowestBit(m);
      m &= m - 1;
      let d = 0;
      for (let i = 0; i < n && d <= best; i++) {
        const k = c.conditions[i];
        if (Math.floor(row / k.stride) % k.radix !== here[i]) d++;
      }
      if (d > best) continue;
      if (d < best) {
        best = d;
        count = 0;
        nearest.length = 0;
      }
      count++;
      if (nearest.length < MAX_CHANGES) nearest.push(row);
    }
  }
  if (best === Infinity) return { reachable: false };
  const changes = nearest.map((row) => {
    const out: ConditionChange[] = [];
    c.conditions.forEach((k, i) => {
      const s = Math.floor(row / k.stride) % k.radix;
      if (s !== here[i]) out.push({ condition: k.id, from: k.states[here[i]], to: k.states[s] });
    });
    return out;
  });
  return { reachable: true, size: best, changes, count };
}
