// Compiled designs of saved revisions, kept in a small in-memory LRU. Revisions never change, so a
// revision id is a safe key; the engine hangs its per-filter count index on the compiled design,
// so keeping it alive keeps later filtered pages fast. Never the table itself: rows are computed.
import { and, eq } from "drizzle-orm";
import { db, schema } from "~/db/client.server";
import { compileDesign, type CompiledDesign, type Design } from "~/engine";
import { readRevisionDesign } from "~/designs/revision-document";

const MAX_ENTRIES = 8;
const cache = new Map<string, CompiledDesign>();

/** The compiled design of a revision's design (read with readRevisionDesign). */
export function compiledFor(revisionId: string, design: Design): CompiledDesign {
  const hit = cache.get(revisionId);
  if (hit) {
    cache.delete(revisionId);
    cache.set(revisionId, hit);
    return hit;
  }
  const compiled = compileDesign(design);
  cache.set(revisionId, compiled);
  while (cache.size > MAX_ENTRIES) cache.delete(cache.keys().next().value!);
  return compiled;
}

export type RevisionRef = { id: string; number: number; contentHash: string; authorId: string; designId: string };

/** A revision by design and number, without its document (cheap), scoped by workspace. */
export async function revisionRef(workspaceId: string, designId: string, number: number): Promise<RevisionRef | null> {
  const t = schema.designRevision;
  const rows = await db
    .select({ id: t.id, number: t.number, contentHash: t.contentHash, authorId: t.authorId, designId: t.designId })
    .from(t)
    .where(and(eq(t.workspaceId, workspaceId), eq(t.designId, designId), eq(t.number, number)))
    .limit(1);
  return rows[0] ?? null;
}

/** The compiled design of a revision, reading its document only when it is not cached. */
export async function compiledRevision(workspaceId: string, ref: RevisionRef): Promise<CompiledDesign> {
  const hit = cache.get(ref.id);
  if (hit) return compiledFor(ref.id, hit.design);
  const t = schema.designRevision;
  const rows = await db
    .select({ document: t.document })
    .from(t)
    .where(and(eq(t.workspaceId, workspaceId), eq(t.id, ref.id)))
    .limit(1);
  if (!rows[0]) throw new Error(`revision ${ref.id} is gone`);
  return compiledFor(ref.id, readRevisionDesign(rows[0].document, ref.id));
}

/** Parses a revision number from a URL segment; null when it is not one. */
export function revisionNumber(text: string | undefined): number | null {
  return text && /^[1-9][0-9]{0,8}$/.test(text) ? Number(text) : null;
}
