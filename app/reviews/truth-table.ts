// The truth-table page's wire format: filters as URL query parameters, and rows as compact arrays
// in the column order of the page's columns. No server imports (the page uses it too).
import type { RowFilter, RowView } from "~/engine";
import type { TableRow } from "~/api/answers";
import type { FieldProblem } from "~/designs/types";

export const ONLY = ["unsafe", "violating", "drive", "demand", "failing"] as const;
export type Only = (typeof ONLY)[number];
export const PAGE_MAX = 500;

/** Query: only=unsafe|violating|drive|demand|failing, rule=ID, where=COND:STATE (repeatable; states of one condition are alternatives). */
export type FilterQuery = { only?: Only; rule?: string; where: Array<{ cond: string; state: string }> };

export function parseFilterQuery(params: URLSearchParams): { ok: true; query: FilterQuery } | { ok: false; fields: FieldProblem[] } {
  const fields: FieldProblem[] = [];
  const only = params.get("only") || undefined;
  if (only !== undefined && !(ONLY as readonly string[]).includes(only)) {
    fields.push({ path: "only", message: `use one of ${ONLY.join(", ")}` });
  }
  const rule = params.get("rule") || undefined;
  const where: FilterQuery["where"] = [];
  for (const w of params.getAll("where")) {
    const at = w.indexOf(":");
    if (at <= 0 || at === w.length - 1)
      fields.push({ path: "where", message: `write a condition filter as CONDITION:STATE, not ${JSON.stringify(w)}` });
    else where.push({ cond: w.slice(0, at), state: w.slice(at + 1) });
  }
  if (fields.length > 0) return { ok: false, fields };
  return { ok: true, query: { only: only as Only | undefined, rule, where } };
}

export function filterOf(q: FilterQuery): RowFilter {
  const filter: RowFilter = {};
  if (q.only) filter.only = q.only;
  if (q.rule) filter.rule = q.rule;
  if (q.where.length > 0) {
    filter.where = Object.create(null) as Record<string, string[]>; // condition ids like "constructor" are legal
    for (const { cond, state } of q.where) (filter.where[cond] ??= []).push(state);
  }
  return filter;
}

export function filterSearch(q: FilterQuery): URLSearchParams {
  const p = new URLSearchParams();
  if (q.only) p.set("only", q.only);
  if (q.rule) p.set("rule", q.rule);
  for (const w of q.where) p.append("where", `${w.cond}:${w.state}`);
  return p;
}

/** Column metadata of a revision's table (ids in the engine's order). */
export type TableColumns = {
  conditions: Array<{ id: string; label: string; states: string[] }>;
  contacts: Array<{ id: string; label: string; condition: string }>;
  inputs: Array<{ id: string; label: string; fn: string }>;
  /** Inhibit and require-drive rules, in design order. */
  rules: Array<{ id: string; label: string; type: "inhibit" | "require-drive" }>;
};

/** An inhibit rule's cell (unsafe, violating) or a require-drive rule's (demand, failing: demand without drive). */
export type RuleCell = "-" | "unsafe" | "violating" | "demand" | "failing";

// A row (values in column order) and a page of rows are API answers: typed by their schemas.
export type { RowsPage, TableRow } from "~/api/answers";

export function tableRow(cols: TableColumns, v: RowView): TableRow {
  return {
    index: v.index,
    states: cols.conditions.map((c) => v.states[c.id]!),
    contacts: cols.contacts.map((c) => v.contacts[c.id]!),
    inputs: cols.inputs.map((x) => v.inputs[x.id]!),
    powered: v.controller.powered,
    enabled: v.controller.enabled,
    direction: v.controller.direction,
    braking: v.controller.braking,
    throttle: v.controller.throttle,
    drive: v.drive,
    rules: cols.rules.map((r): RuleCell => {
      if (r.type === "require-drive") {
        const d = v.demands[r.id];
        return !d || !d.demand ? "-" : d.failing ? "failing" : "demand";
      }
      const x = v.rules[r.id];
      return !x || !x.unsafe ? "-" : x.violating ? "violating" : "unsafe";
    }),
  };
}
