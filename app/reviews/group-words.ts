// Row groups in words for people: each condition a group names with its label and states ("Key
// switch: on"), the conditions it leaves free as "any", and the truth-table link that shows exactly
// the group's rows. Shared by the review page and the printed report (no server imports).
import type { BlockingReason, RowGroup } from "~/engine";

export type ConditionWords = { id: string; label: string; states: string[] };

export type GroupWords = { rows: number; named: Array<{ label: string; id: string; states: string[] }>; free: string[] };

export function groupWords(conditions: readonly ConditionWords[], g: RowGroup): GroupWords {
  const named: GroupWords["named"] = [];
  const free: string[] = [];
  for (const c of conditions) {
    const states = g.states[c.id];
    if (states) named.push({ label: c.label || c.id, id: c.id, states });
    else free.push(c.label || c.id);
  }
  return { rows: g.rows, named, free };
}

/** One line: "Key switch on · Direction lever forward or reverse · any Brake pedal, Accelerator". */
export function groupLine(conditions: readonly ConditionWords[], g: RowGroup): string {
  const w = groupWords(conditions, g);
  const parts = w.named.map((n) => `${n.label} ${n.states.join(" or ")}`);
  if (w.named.length === 0) return "every row";
  if (w.free.length > 0) parts.push(`any ${w.free.join(", ")}`);
  return parts.join(" · ");
}

/** Query string of the truth-table page that shows exactly the group's rows. */
export function groupSearch(g: RowGroup): URLSearchParams {
  const p = new URLSearchParams();
  for (const [cond, states] of Object.entries(g.states)) for (const s of states) p.append("where", `${cond}:${s}`);
  return p;
}

/** What keeps drive off, in words (spec section 4's blocking reasons). */
export const REASON_WORDS: Record<BlockingReason, string> = {
  unpowered: "the controller has no power",
  disabled: "the enable input is dead",
  neutral: "no direction is selected",
  conflict: "forward and reverse are both energized",
  braking: "the brake cuts drive",
  throttle: "the throttle is not applied",
};
