// Standings (spec 1.1) of stored revisions by id, reading documents only for those not yet known.
import { and, eq, inArray } from "drizzle-orm";
import { db, schema } from "~/db/client.server";
import { knownStanding, standingOf, type Standing } from "./standing";

/** The standing of each revision (ids of this workspace; others are absent from the map). */
export async function standingsFor(workspaceId: string, revisionIds: readonly string[]): Promise<Map<string, Standing>> {
  const out = new Map<string, Standing>();
  const missing: string[] = [];
  for (const id of revisionIds) {
    const hit = knownStanding(id);
    if (hit) out.set(id, hit);
    else missing.push(id);
  }
  if (missing.length > 0) {
    const t = schema.designRevision;
    const rows = await db
      .select({ id: t.id, document: t.document, verdict: t.verdict })
      .from(t)
      .where(and(eq(t.workspaceId, workspaceId), inArray(t.id, missing)));
    for (const r of rows) out.set(r.id, standingOf(r.id, r.document, r.verdict));
  }
  return out;
}
