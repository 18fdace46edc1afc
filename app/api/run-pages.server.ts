// Pages of bench runs for the API: keyset pagination in the database (runs are many and only grow),
// newest first; the cursor carries the exact start time and the id (docs/decisions/085).
import { apiError } from "~/api/http.server";
import { listRuns, type RunFilter } from "~/bench-runs/bench-runs.server";
import { decodeCursor, encodeCursor } from "./pagination.server";
import { PAGE_LIMIT_DEFAULT, type PageQuery } from "./schemas";
import { runSummaryJson } from "./views.server";

const START_KEY = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{6}Z$/;

export async function runsPage(workspaceId: string, filter: RunFilter, query: PageQuery) {
  const limit = query.limit ?? PAGE_LIMIT_DEFAULT;
  let after: { startKey: string; id: string } | undefined;
  if (query.cursor) {
    const [startKey, id] = decodeCursor(query.cursor, "string");
    if (!START_KEY.test(String(startKey))) {
      throw apiError(400, "invalid_query", "The cursor is not one this list gave out; start again without it.", [
        { path: "cursor", message: "the nextCursor of the previous page of the same list" },
      ]);
    }
    after = { startKey: String(startKey), id };
  }
  const rows = await listRuns(workspaceId, filter, { limit: limit + 1, after });
  const items = rows.slice(0, limit);
  const last = items[items.length - 1];
  return {
    runs: items.map(runSummaryJson),
    nextCursor: rows.length > limit && last ? encodeCursor([last.startKey, last.id]) : null,
  };
}
