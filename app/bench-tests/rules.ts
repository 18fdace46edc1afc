// Rules as bench items: the rows in which a step shows a rule at work (decisions 050 and 134).
// Inhibit rule: an unsafe row one relaxation of the rule's own conditions away from the forbidden
// outcome. Require-drive rule: a demand row. Either way the row step's approach must show the row's
// steady outcome (no lockout latched on the way in). Every fact is read from the engine's row views.
import type { CompiledDesign, RowView } from "../engine";
import { predicateConditions, type RowBook } from "./book";

export type RuleItem = {
  /** "rule:ID" */
  id: string;
  rule: string;
  label: string;
  type: "inhibit" | "require-drive";
  /** Inhibit: the input whose energizing is forbidden; null forbids drive. */
  forbid: string | null;
  /** Candidate test rows. */
  rows: number[];
  reason?: string;
};

/** Is the row where the rule applies (unsafe row, demand row)? */
export function applies(item: Pick<RuleItem, "rule" | "type">, v: RowView): boolean {
  return item.type === "inhibit" ? v.rules[item.rule].unsafe : v.demands[item.rule].demand;
}

/** The rule's outcome in a row: the forbidden outcome (inhibit) or steady drive (require-drive). */
export function outcomeOf(item: Pick<RuleItem, "type" | "forbid">, v: RowView): boolean {
  return item.type === "require-drive" || item.forbid === null ? v.drive : v.inputs[item.forbid];
}

/** Does the row break the rule (a violating row, a failing row)? */
export function broken(item: Pick<RuleItem, "rule" | "type" | "forbid">, v: RowView): boolean {
  return applies(item, v) && (item.type === "inhibit" ? outcomeOf(item, v) : !v.drive);
}

export function ruleItems(
  c: CompiledDesign,
  book: RowBook,
  pool: number[],
  exhaustive: boolean,
  poolNote: string,
  input: (id: string) => string,
): RuleItem[] {
  const out: RuleItem[] = [];
  for (const r of c.design.rules) {
    if (r.type === "no-restart") continue;
    const conds = [...predicateConditions(r.when)].map((id) => c.conditionIndex[id]);
    const forbid = r.type === "inhibit" && r.forbid !== "drive" ? r.forbid.energized : null;
    const item: RuleItem = { id: `rule:${r.id}`, rule: r.id, label: r.label ?? r.id, type: r.type, forbid, rows: [] };
    let applying = 0;
    if (r.type === "require-drive") {
      for (const i of pool) {
        if (!applies(item, book.view(i))) continue;
        applying++;
        if (book.approach(i).steady) item.rows.push(i);
      }
      if (item.rows.length === 0) {
        item.reason =
          applying === 0
            ? `its condition never holds, so there is no row to test it in${poolNote}`
            : `every row where it applies latches a lockout as the throttle is applied, so drive can't be shown there${poolNote}`;
      }
      out.push(item);
      continue;
    }
    /** Row index with the rule's own condition digits zeroed: rows sharing it differ only in those. */
    const restOf = (i: number) => {
      let k = i;
      for (const ci of conds) k -= book.digit(i, ci) * c.conditions[ci].stride;
      return k;
    };
    const fires = new Set<number>();
    let outsideOutcome = false;
    for (const i of pool) {
      const v = book.view(i);
      if (applies(item, v)) applying++;
      else if (outcomeOf(item, v)) {
        outsideOutcome = true;
        fires.add(restOf(i));
      }
    }
    item.rows = pool.filter((i) => applies(item, book.view(i)) && fires.has(restOf(i)) && book.approach(i).steady);
    if (item.rows.length === 0) {
      const what = forbid === null ? "lets drive run" : `energizes ${input(forbid)}`;
      let reason: string;
      if (applying === 0) reason = "its condition never holds, so there is no row to test it in";
      else if (applying === pool.length && exhaustive) reason = "its condition holds in every row, so there is no row to compare against";
      else if (!outsideOutcome) reason = `no row outside its condition ${what}, so the rule's own conditions are never what stops it`;
      else reason = "every row where it applies latches a lockout on the way in, so its steady outcome can't be shown";
      item.reason = reason + poolNote;
    }
    out.push(item);
  }
  return out;
}
