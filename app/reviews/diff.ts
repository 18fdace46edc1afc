// What changed between two revisions: the structure (components, wires, conditions, rules,
// controller) from the documents, and the truth-table rows whose drive or violated rules changed,
// evaluated by the engine on both designs when their conditions are identical (same row numbering).
import { canonicalJson } from "~/lib/canonical-json";
import { csvChunks, decodeRow, evaluateRow, type CompiledDesign, type Design, type RowFilter } from "../engine";

/** A changed field with its value before and after, as compact JSON (`["released"]`, `"Seat switch"`). */
export type FieldChange = { field: string; before: string; after: string };
export type ItemChange = { id: string; fields: string[]; values: FieldChange[] };
export type ListDiff = { added: string[]; removed: string[]; changed: ItemChange[] };

export type StructuralDiff = {
  components: ListDiff;
  wires: { added: string[]; removed: string[] };
  conditions: ListDiff;
  rules: ListDiff;
  /** Controller keys whose value changed (throttle, brakeCutsDrive, lockouts). */
  controller: string[];
  controllerValues: FieldChange[];
  name: { before: string; after: string } | null;
  empty: boolean;
};

/** JSON with sorted keys, so key order never counts as a change; an absent field differs from null. */
function canonical(v: unknown): string {
  return v === undefined ? "(absent)" : canonicalJson(v);
}

/** A value as people read it in a diff: compact JSON, "(none)" when absent. */
function shown(v: unknown): string {
  return v === undefined ? "(none)" : JSON.stringify(v);
}

function listDiff<T extends { id: string }>(before: readonly T[], after: readonly T[]): ListDiff {
  const a = new Map(before.map((x) => [x.id, x]));
  const b = new Map(after.map((x) => [x.id, x]));
  const changed: ItemChange[] = [];
  for (const [id, x] of b) {
    const y = a.get(id);
    if (!y) continue;
    const keys = [...new Set([...Object.keys(x), ...Object.keys(y)])].sort();
    const fields = keys.filter((k) => canonical((x as Record<string, unknown>)[k]) !== canonical((y as Record<string, unknown>)[k]));
    const values = fields.map((k) => ({
      field: k,
      before: shown((y as Record<string, unknown>)[k]),
      after: shown((x as Record<string, unknown>)[k]),
    }));
    if (fields.length > 0) changed.push({ id, fields, values });
  }
  return {
    added: [...b.keys()].filter((id) => !a.has(id)),
    removed: [...a.keys()].filter((id) => !b.has(id)),
    changed,
  };
}

/** A wire as text with its ends in a fixed order, so a reversed wire is the same wire. */
export function wireKey(w: { from: string; to: string }): string {
  return [w.from, w.to].sort().join(" — ");
}

export function structuralDiff(before: Design, after: Design): StructuralDiff {
  const wa = new Set(before.wires.map(wireKey));
  const wb = new Set(after.wires.map(wireKey));
  const ca = before.controller as unknown as Record<string, unknown>;
  const cb = after.controller as unknown as Record<string, unknown>;
  const controller = [...new Set([...Object.keys(ca), ...Object.keys(cb)])].sort().filter((k) => canonical(ca[k]) !== canonical(cb[k]));
  const d: Omit<StructuralDiff, "empty"> = {
    components: listDiff(before.components, after.components),
    wires: { added: [...wb].filter((w) => !wa.has(w)).sort(), removed: [...wa].filter((w) => !wb.has(w)).sort() },
    conditions: listDiff(before.conditions, after.conditions),
    rules: listDiff(before.rules, after.rules),
    controller,
    controllerValues: controller.map((k) => ({ field: k, before: shown(ca[k]), after: shown(cb[k]) })),
    name: before.name === after.name ? null : { before: before.name, after: after.name },
  };
  const lists = [d.components, d.conditions, d.rules];
  const empty =
    lists.every((l) => l.added.length + l.removed.length + l.changed.length === 0) &&
    d.wires.added.length + d.wires.removed.length === 0 &&
    controller.length === 0 &&
    d.name === null;
  return { ...d, empty };
}

/** Same condition ids, states and order: row N means the same situation in both tables. */
export function sameConditions(before: Design, after: Design): boolean {
  return canonical(before.conditions.map((c) => [c.id, c.states])) === canonical(after.conditions.map((c) => [c.id, c.states]));
}

/** A row's drive and its broken rules: inhibit rules violated and require-drive rules failing there. */
export type RowOutcome = { drive: boolean; violated: string[] };
export type RowChange = { index: number; states: Record<string, string>; before: RowOutcome; after: RowOutcome };
export type RowDiff =
  { comparable: false; reason: string } | { comparable: true; rows: number; changedRows: number; listed: RowChange[]; truncated: boolean };

/** Largest table compared row by row while a page loads. */
export const ROW_DIFF_LIMIT = 2 ** 22;

/**
 * Indexes of the rows matching a filter, read from the first column of the engine's streamed CSV:
 * the engine's filter scan goes word by word and only matching rows are formatted, so this costs
 * in proportion to the matches, not to the table.
 */
function matchingIndexes(c: CompiledDesign, filter: RowFilter): Set<number> {
  const out = new Set<number>();
  let header = true;
  let carry = "";
  for (const chunk of csvChunks(c, filter)) {
    const text = carry + chunk;
    let at = 0;
    for (;;) {
      const nl = text.indexOf("\n", at);
      if (nl < 0) break;
      if (header) header = false;
      else out.add(Number(text.slice(at, text.indexOf(",", at))));
      at = nl + 1;
    }
    carry = text.slice(at);
  }
  return out;
}

function outcomeOf(c: CompiledDesign, index: number): RowOutcome {
  const v = evaluateRow(c, index);
  return {
    drive: v.drive,
    violated: [
      ...Object.keys(v.rules).filter((id) => v.rules[id]!.violating),
      ...Object.keys(v.demands).filter((id) => v.demands[id]!.failing),
    ].sort(),
  };
}

/** Rules checked row by row, with the filter of their broken rows: inhibit (violating), require-drive (failing). */
function rowRules(c: CompiledDesign): Map<string, RowFilter["only"]> {
  const out = new Map<string, RowFilter["only"]>();
  for (const r of c.rules) if (r.type !== "no-restart") out.set(r.id, r.type === "inhibit" ? "violating" : "failing");
  return out;
}

/**
 * Rows whose steady drive or set of broken rules differs (inhibit rules violated, require-drive rules
 * failing): the symmetric differences of the drive rows and of each rule's violating or failing rows
 * (the engine's filters on both designs; a rule whose type changed compares its broken rows). The
 * first `limit` changed rows are listed with both outcomes.
 */
export function rowDiff(before: CompiledDesign, after: CompiledDesign, limit = 200): RowDiff {
  if (!sameConditions(before.design, after.design)) {
    return {
      comparable: false,
      reason: "The two revisions have different conditions or states, so their truth tables are not comparable row by row.",
    };
  }
  if (after.rows > ROW_DIFF_LIMIT) {
    return {
      comparable: false,
      reason: `The truth table has ${after.rows.toLocaleString("en-US")} rows, more than the ${ROW_DIFF_LIMIT.toLocaleString("en-US")} compared on this page; compare the CSV downloads instead.`,
    };
  }
  const changed = new Set<number>();
  const addDifference = (a: Set<number>, b: Set<number>) => {
    for (const i of a) if (!b.has(i)) changed.add(i);
    for (const i of b) if (!a.has(i)) changed.add(i);
  };
  addDifference(matchingIndexes(before, { only: "drive" }), matchingIndexes(after, { only: "drive" }));
  const rulesBefore = rowRules(before);
  const rulesAfter = rowRules(after);
  for (const id of new Set([...rulesBefore.keys(), ...rulesAfter.keys()])) {
    const a = rulesBefore.has(id) ? matchingIndexes(before, { only: rulesBefore.get(id), rule: id }) : new Set<number>();
    const b = rulesAfter.has(id) ? matchingIndexes(after, { only: rulesAfter.get(id), rule: id }) : new Set<number>();
    addDifference(a, b);
  }
  const sorted = [...changed].sort((x, y) => x - y);
  const listed: RowChange[] = sorted.slice(0, limit).map((index) => ({
    index,
    states: decodeRow(after, index),
    before: outcomeOf(before, index),
    after: outcomeOf(after, index),
  }));
  return { comparable: true, rows: after.rows, changedRows: sorted.length, listed, truncated: sorted.length > listed.length };
}
