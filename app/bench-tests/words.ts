// Plain-word instructions for bench steps. Wording only: every outcome it speaks of is computed by
// replaying the moves with the engine elsewhere, and the words say the moves in the order replayed.
import type { Lockout } from "../engine";
import { LOCKOUT_TEXT, lockoutName } from "../lib/lockouts";
import type { RuleItem } from "./rules";
import type { BenchExpect } from "./types";

export type Naming = {
  conditionLabel: (cond: number) => string;
  stateName: (cond: number, state: number) => string;
  conditionCount: number;
  throttleCond: number;
  /** The throttle state counts as released. */
  releasedState: (state: number) => boolean;
  input: (id: string) => string;
  inputIds: string[];
  contact: (id: string) => string;
  states: (digit: (cond: number) => number) => string;
};

export type Move = { cond: number; from: number; to: number };

/**
 * A step's moves by phase, replayed in this order: `first` (the throttle to a released state),
 * `free` (any order: the throttle is released meanwhile), `hold` (the throttle applied and held),
 * `then` (one at a time, in order), `last` (the throttle set last).
 */
export type Phases = { first: Move[]; free: Move[]; hold: Move[]; then: Move[]; last: Move[] };

export const movesOf = (p: Phases): Move[] => [...p.first, ...p.free, ...p.hold, ...p.then, ...p.last];

export const list = (xs: string[], last = "and") =>
  xs.length <= 1 ? xs.join("") : `${xs.slice(0, -1).join(", ")} ${last} ${xs[xs.length - 1]}`;

export function describeMoves(n: Naming, p: Phases): string {
  const change = (m: Move) => `${n.conditionLabel(m.cond)} from ${n.stateName(m.cond, m.from)} to ${n.stateName(m.cond, m.to)}`;
  const parts: string[] = [];
  const more = p.free.length + p.hold.length + p.then.length + p.last.length > 0;
  for (const m of p.first) {
    const first = more ? " first" : "";
    parts.push(
      n.releasedState(m.from)
        ? `Set ${change(m)}${first} (both count as released).`
        : `Release ${n.conditionLabel(m.cond)}${first}: set it from ${n.stateName(m.cond, m.from)} to ${n.stateName(m.cond, m.to)}.`,
    );
  }
  if (p.free.length > 0)
    parts.push(
      `${parts.length > 0 ? "Then change" : "Change"} ${p.free.map(change).join("; ")}${p.free.length > 1 ? ", in any order" : ""}.`,
    );
  for (const m of p.hold) {
    parts.push(
      `${parts.length > 0 ? "Then apply" : "Apply"} ${n.conditionLabel(m.cond)}: set it from ${n.stateName(m.cond, m.from)} to ${n.stateName(m.cond, m.to)} and keep holding it.`,
    );
  }
  if (p.then.length > 0) {
    const held = p.hold.length > 0;
    const lead = held ? "Then, still holding it, change" : parts.length > 0 ? "Then change" : "Change";
    parts.push(`${lead} ${p.then.map(change).join(", then ")}${p.then.length > 1 ? ", in this order" : ""}.`);
  }
  for (const m of p.last) parts.push(`${parts.length > 0 ? "Then set" : "Set"} ${change(m)}${parts.length > 0 ? " last" : ""}.`);
  return parts.length > 0 ? parts.join(" ") : "Leave every condition as it is.";
}

export function describeExpect(n: Naming, e: BenchExpect): string {
  const live = n.inputIds.filter((id) => e.inputs[id]).map(n.input);
  const dead = n.inputIds.filter((id) => !e.inputs[id]).map(n.input);
  const parts = [e.drive ? "Drive must run." : "Drive must stay off."];
  if (live.length > 0) parts.push(`${list(live)} must read live.`);
  if (dead.length > 0) parts.push(`${list(dead)} must read dead.`);
  return parts.join(" ");
}

export const latchedBy = (armed: Lockout[]) =>
  armed.length === 0 ? "A lockout latches" : `The ${list(armed.map(lockoutName))} latch${armed.length > 1 ? "" : "es"}`;

/** The note of a row step whose throttle sets off a lockout; `steady`: the row drives when nothing is latched. */
export const latchNote = (armed: Lockout[], steady: boolean) =>
  steady
    ? `${latchedBy(armed)} as the throttle is applied here, so drive stays off although the wiring alone would let it run.`
    : `${latchedBy(armed)} as the throttle is applied here.`;

/** The caution of a row step that applies the throttle. */
export const WHEELS_ROW = "Lift the drive wheels clear of the ground (or otherwise stop the vehicle moving) before applying the throttle.";
/** The caution of every lockout check's step. */
export const WHEELS_CHECK =
  "Lift the drive wheels clear of the ground (or otherwise stop the vehicle moving): this step applies and holds the throttle.";

/** The note of the step showing a rule's test row: the rule at work there, or broken when `isBroken`. */
export function ruleNote(r: Pick<RuleItem, "type" | "label" | "forbid">, isBroken: boolean, n: Naming): string {
  if (r.type === "require-drive") {
    return isBroken
      ? `Rule "${r.label}" is BROKEN here: the design keeps drive off although the rule demands drive.`
      : `Checks rule "${r.label}": drive must run here, as the rule demands.`;
  }
  const forbidden = r.forbid === null ? "drive running" : `${n.input(r.forbid)} live`;
  const kept = r.forbid === null ? "drive off" : `${n.input(r.forbid)} dead`;
  return isBroken
    ? `Rule "${r.label}" is BROKEN here: the design gives ${forbidden} although the rule forbids it.`
    : `Checks rule "${r.label}": only its own conditions keep ${kept} here.`;
}

/**
 * What a lockout check's step says (decision 132). `checked`: the lockouts the step checks (more than
 * one when the same moves are the best check of each); `others`: further lockouts set off on the way.
 */
export function lockoutWords(checked: Lockout[], driveStep: number, others: Lockout[]): { head: string; note: string } {
  const names = checked.map(lockoutName);
  const events = list(
    checked.map((l) => LOCKOUT_TEXT[l].event),
    "and",
  );
  const extra = others.filter((o) => !checked.includes(o));
  const together = [...checked.slice(1), ...extra];
  const also =
    together.length === 0
      ? ""
      : checked.length > 1
        ? ` These moves set off ${extra.length > 0 ? `the ${list([...names, ...extra.map(lockoutName)])}` : "both"} at once, so this step can't tell them apart: it shows that at least one of them works.`
        : ` These moves also set off the ${list(extra.map(lockoutName))}, so this step alone can't tell ${extra.length > 1 ? "them" : "the two"} apart.`;
  return {
    head: `Check the ${list(names)}.`,
    note: `The ${list(names, "or")} must hold drive off: ${events} while the throttle is held, although step ${driveStep} showed drive running in these same conditions.${also}`,
  };
}
