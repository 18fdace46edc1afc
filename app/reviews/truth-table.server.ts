// Serving the truth table of a saved revision: pages of rows, one row with its diagnosis, and the
// CSV as a stream. All row work is the engine's (pageRows, countRows, diagnose, csvChunks).
import { csvChunks, diagnose, evaluateRow, filterRuleType, pageRows, type CompiledDesign, type RowFilter } from "~/engine";
import { apiError } from "~/api/http.server";
import { filterOf, PAGE_MAX, parseFilterQuery, tableRow, type RowsPage, type TableColumns, type TableRow } from "./truth-table";

export function tableColumns(c: CompiledDesign): TableColumns {
  return {
    conditions: c.conditions.map((x) => ({ id: x.id, label: x.label || x.id, states: x.states })),
    contacts: c.contacts.map((x) => ({ id: x.id, label: x.label || x.id, condition: c.conditions[x.cond]!.id })),
    inputs: c.inputs.map((x) => ({ id: x.id, label: x.label || x.id, fn: x.fn })),
    // Inhibit and require-drive rules in design order, as the CSV's rule:ID columns (decision 110).
    rules: c.rules.flatMap((r) =>
      r.type === "inhibit" || r.type === "require-drive" ? [{ id: r.id, label: r.label || r.id, type: r.type }] : [],
    ),
  };
}

/** The filter of a request's query, or throws a 400 naming the parameter. */
export function requestFilter(c: CompiledDesign, params: URLSearchParams): RowFilter {
  const parsed = parseFilterQuery(params);
  if (!parsed.ok) throw apiError(400, "invalid_filter", "The row filter is not valid.", parsed.fields);
  const filter = filterOf(parsed.query);
  // Ids and states are checked against the design here so the error names the parameter.
  const type = filterRuleType(filter.only);
  if (filter.rule !== undefined && !c.rules.some((r) => r.id === filter.rule && r.type === type)) {
    const what = type === "inhibit" ? "inhibit rule (only=unsafe or violating, or no only)" : "require-drive rule (only=demand or failing)";
    throw apiError(400, "invalid_filter", "The row filter is not valid.", [
      { path: "rule", message: `no ${what} with id ${JSON.stringify(filter.rule)}` },
    ]);
  }
  for (const [cond, states] of Object.entries(filter.where ?? {})) {
    const ci = c.conditionIndex[cond];
    if (ci === undefined)
      throw apiError(400, "invalid_filter", "The row filter is not valid.", [
        { path: "where", message: `no condition with id ${JSON.stringify(cond)}` },
      ]);
    const bad = states.find((s) => !c.conditions[ci]!.states.includes(s));
    if (bad !== undefined) {
      throw apiError(400, "invalid_filter", "The row filter is not valid.", [
        { path: "where", message: `${JSON.stringify(bad)} is not a state of condition ${JSON.stringify(cond)}` },
      ]);
    }
  }
  return filter;
}

function intParam(params: URLSearchParams, name: string, fallback: number, max: number): number {
  const raw = params.get(name);
  if (raw === null || raw === "") return fallback;
  if (!/^[0-9]{1,10}$/.test(raw) || Number(raw) > max) {
    throw apiError(400, "invalid_query", `The query parameter ${name} is not valid.`, [
      { path: name, message: `a whole number from 0 to ${max}` },
    ]);
  }
  return Number(raw);
}

export function rowsPage(c: CompiledDesign, params: URLSearchParams): RowsPage {
  const filter = requestFilter(c, params);
  const from = intParam(params, "from", 0, Number.MAX_SAFE_INTEGER);
  const count = intParam(params, "count", 100, PAGE_MAX);
  const cols = tableColumns(c);
  const page = pageRows(c, { filter, from, count });
  return { total: page.total, from, rows: page.rows.map((v) => tableRow(cols, v)) };
}

/** One row: its values, the energized terminals (for the canvas) and the engine's diagnosis. */
export function rowDetail(
  c: CompiledDesign,
  index: number,
): { row: TableRow; energizedTerminals: string[]; diagnosis: ReturnType<typeof diagnose> } {
  const view = evaluateRow(c, index);
  return { row: tableRow(tableColumns(c), view), energizedTerminals: view.nets.energizedTerminals, diagnosis: diagnose(c, view.states) };
}

/** The CSV of the filtered rows as a byte stream, pulled chunk by chunk (memory stays flat). */
export function csvStream(c: CompiledDesign, filter: RowFilter): ReadableStream<Uint8Array> {
  const chunks = csvChunks(c, filter);
  const encoder = new TextEncoder();
  return new ReadableStream<Uint8Array>(
    {
      pull(controller) {
        const next = chunks.next();
        if (next.done) controller.close();
        else controller.enqueue(encoder.encode(next.value));
      },
      cancel() {
        chunks.return(undefined);
      },
    },
    { highWaterMark: 1 },
  );
}
