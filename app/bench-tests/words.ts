// Plain-word instructions for bench steps. Wording only: every outcome it speaks of is computed
// by the engine elsewhere.
import type { Lockout } from "../engine";
import type { BenchExpect } from "./generate";

export type Naming = {
  conditionLabel: (cond: number) => string;
  stateName: (cond: number, state: number) => string;
  conditionCount: number;
  throttleCond: number;
  /** A released throttle state, -1 when the throttle has none. */
  releasedState: number;
  condition: (cond: number) => string;
  input: (id: string) => string;
  inputIds: string[];
  contact: (id: string) => string;
  states: (digit: (cond: number) => number) => string;
};

type Digit = (row: number, cond: number) => number;

const list = (xs: string[]) => (xs.length <= 1 ? xs.join("") : `${xs.slice(0, -1).join(", ")} and ${xs[xs.length - 1]}`);

/**
 * What to change from the previous step. With `approach`, the throttle goes to its released state
 * first and to this step's state last, so no lockout latches on the way (decision 052).
 */
export function describeChanges(n: Naming, digit: Digit, prev: number, row: number, opts: { approach: boolean }): string {
  const changed: number[] = [];
  for (let ci = 0; ci < n.conditionCount; ci++) if (digit(prev, ci) !== digit(row, ci)) changed.push(ci);
  const change = (ci: number) => `${n.conditionLabel(ci)} from ${n.stateName(ci, digit(prev, ci))} to ${n.stateName(ci, digit(row, ci))}`;
  const t = n.throttleCond;
  const rel = n.releasedState;
  const target = digit(row, t);
  if (!opts.approach || rel < 0 || target === rel) {
    return changed.length > 0 ? `Change ${changed.map(change).join("; ")}.` : "Change nothing.";
  }
  const parts: string[] = [];
  const others = changed.filter((ci) => ci !== t);
  const tLabel = n.conditionLabel(t);
  if (digit(prev, t) !== rel && others.length > 0) parts.push(`Release ${tLabel} (${n.stateName(t, rel)}) first.`);
  if (others.length > 0) parts.push(`Change ${others.map(change).join("; ")}.`);
  if (others.length > 0 || digit(prev, t) !== target) {
    parts.push(`${others.length > 0 ? "Then set" : "Set"} ${tLabel} to ${n.stateName(t, target)}${others.length > 0 ? " last" : ""}.`);
  } else parts.push("Change nothing.");
  return parts.join(" ");
}

export function describeExpect(n: Naming, e: BenchExpect): string {
  const live = n.inputIds.filter((id) => e.inputs[id]).map(n.input);
  const dead = n.inputIds.filter((id) => !e.inputs[id]).map(n.input);
  const parts = [e.drive ? "Drive must run." : "Drive must stay off."];
  if (live.length > 0) parts.push(`${list(live)} must read live.`);
  if (dead.length > 0) parts.push(`${list(dead)} must read dead.`);
  return parts.join(" ");
}

const EVENT: Record<Lockout, string> = {
  "power-on": "the controller powers up",
  "enable-restore": "enable comes back",
  "direction-engage": "a direction is engaged",
  "brake-release": "the brake is released",
  "throttle-fault": "the throttle reports a fault",
};

/** The role of one step of a lockout sequence [B released, B, D, D released, D]. */
export function lockoutWords(lockout: Lockout, pos: number, length: number, others: Lockout[]): string {
  const head = `Lockout "${lockout}", part ${pos + 1} of ${length}:`;
  switch (pos) {
    case 0:
      return `${head} start with the throttle released.`;
    case 1:
      return `${head} hold the throttle and keep holding it.`;
    case 2: {
      const also =
        others.length > 0
          ? ` This change also sets off the ${list(others.map((o) => `"${o}"`))} lockout${others.length > 1 ? "s" : ""}, so this step alone can't tell them apart.`
          : "";
      return `${head} ${EVENT[lockout]} while the throttle is held, so the lockout must keep drive off.${also}`;
    }
    case 3:
      return `${head} release the throttle; this clears the lockout.`;
    default:
      return `${head} apply the throttle again; drive must come back.`;
  }
}
