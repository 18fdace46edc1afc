// What changed between two revisions: the structure (components, wires, conditions, rules,
// controller) from the documents, and the truth-table rows whose drive or violated rules changed,
// evaluated by the engine on both designs when their conditions are identical (same row numbering).
import { pageRows, type CompiledDesign, type Design } from "~/engine";

export type ItemChange = { id: string; fields: string[] };
export type ListDiff = { added: string[]; removed: string[]; changed: ItemChange[] };

export type StructuralDiff = {
  components: ListDiff;
  wires: { added: string[]; removed: string[] };
  conditions: ListDiff;
  rules: ListDiff;
  /** Controller keys whose value changed (throttle, brakeCutsDrive, lockouts). */
  controller: string[];
  name: { before: string; after: string } | null;
  empty: boolean;
};

/** JSON with sorted keys, so key order never counts as a change. */
function canonical(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(canonical).join(",")}]`;
  if (v && typeof v === "object") {
    return `{${Object.keys(v)
      .sort()
      .map((k) => `${JSON.stringify(k)}:${canonical((v as Record<string, unknown>)[k])}`)
      .join(",")}}`;
  }
  return JSON.stringify(v) ?? "null";
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
    if (fields.length > 0) changed.push({ id, fields });
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

export type RowOutcome = { drive: boolean; violated: string[] };
export type RowChange = { index: number; states: Record<string, string>; before: RowOutcome; after: RowOutcome };
export type RowDiff =
  | { comparable: false; reason: string }
  | { comparable: true; rows: number; changedRows: number; listed: RowChange[]; truncated: boolean };

/** Largest table compared row by row while a page loads. */
export const ROW_DIFF_LIMIT = 2 ** 20;
const CHUNK = 4096;

function outcome(v: { drive: boolean; rules: Record<string, { violating: boolean }> }): RowOutcome {
  return {
    drive: v.drive,
    violated: Object.keys(v.rules)
      .filter((id) => v.rules[id]!.violating)
      .sort(),
  };
}

/** Rows whose steady drive or set of violated inhibit rules differs; the first `limit` are listed. */
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
  const listed: RowChange[] = [];
  let changedRows = 0;
  for (let from = 0; from < after.rows; from += CHUNK) {
    const a = pageRows(before, { from, count: CHUNK }).rows;
    const b = pageRows(after, { from, count: CHUNK }).rows;
    for (let i = 0; i < b.length; i++) {
      const x = outcome(a[i]!);
      const y = outcome(b[i]!);
      if (x.drive === y.drive && x.violated.join("\u0000") === y.violated.join("\u0000")) continue;
      changedRows++;
      if (listed.length < limit) listed.push({ index: b[i]!.index, states: b[i]!.states, before: x, after: y });
    }
  }
  return { comparable: true, rows: after.rows, changedRows, listed, truncated: changedRows > listed.length };
}
