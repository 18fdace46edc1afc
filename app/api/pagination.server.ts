// Cursor pagination of API lists (docs/decisions/085): a cursor is the base64url JSON of the last
// item's sort key and id, so a page continues after that item even when items were added since.
import { z } from "zod";
import { apiError } from "~/api/http.server";
import { PAGE_LIMIT_DEFAULT, type PageQuery } from "./schemas";

export type SortKey = [string | number, string];

export function encodeCursor(key: SortKey): string {
  return Buffer.from(JSON.stringify(key), "utf8").toString("base64url");
}

const cursorShape = z.tuple([z.union([z.string(), z.number()]), z.string()]);

/** The sort key of a cursor, checked against the list's key type; a 400 naming "cursor" otherwise. */
export function decodeCursor(cursor: string, primary: "string" | "number"): SortKey {
  let parsed: unknown;
  try {
    parsed = JSON.parse(Buffer.from(cursor, "base64url").toString("utf8"));
  } catch {
    parsed = null;
  }
  const key = cursorShape.safeParse(parsed);
  if (!key.success || typeof key.data[0] !== primary) {
    throw apiError(400, "invalid_query", "The cursor is not one this list gave out; start again without it.", [
      { path: "cursor", message: "the nextCursor of the previous page of the same list" },
    ]);
  }
  return key.data;
}

export type Page<T> = { items: T[]; nextCursor: string | null };

/**
 * One page of a fully loaded list: sorts by (key, id) with `compare`, then takes the items after
 * the cursor's key. Every item comes exactly once across pages while the list does not change.
 */
export function pageOfList<T>(
  items: T[],
  keyOf: (item: T) => SortKey,
  compare: (a: SortKey, b: SortKey) => number,
  page: PageQuery,
  primary: "string" | "number",
): Page<T> {
  const limit = page.limit ?? PAGE_LIMIT_DEFAULT;
  const sorted = [...items].sort((a, b) => compare(keyOf(a), keyOf(b)));
  let start = 0;
  if (page.cursor) {
    const after = decodeCursor(page.cursor, primary);
    start = sorted.findIndex((x) => compare(keyOf(x), after) > 0);
    if (start < 0) start = sorted.length;
  }
  const slice = sorted.slice(start, start + limit);
  const more = start + limit < sorted.length;
  return { items: slice, nextCursor: more && slice.length > 0 ? encodeCursor(keyOf(slice[slice.length - 1]!)) : null };
}

/** Code-unit order of text (the same on every server), then id: the order cursors rely on. */
export function ascending(a: SortKey, b: SortKey): number {
  const [ka, ia] = a;
  const [kb, ib] = b;
  if (ka !== kb) return ka < kb ? -1 : 1;
  return ia < ib ? -1 : ia > ib ? 1 : 0;
}

export function descending(a: SortKey, b: SortKey): number {
  return ascending(b, a);
}
