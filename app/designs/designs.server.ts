// Designs, their revisions and drafts. Every query is scoped by workspace id; the engine does all
// checking and proving (validateDesign, prove), this module only stores what it says.
import { and, asc, count, desc, eq, isNotNull, isNull, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { db, schema } from "~/db/client.server";
import type { DesignRecord } from "~/db/schema.server";
import type { Membership } from "~/auth/guard.server";
import { requireApiCaller, requireApiCan, type RequestContext } from "~/auth/context.server";
import { recordAudit } from "~/audit/audit.server";
import { getVehicle } from "~/vehicles/vehicles.server";
import type { Design, Problem, Verdict } from "~/engine";
import { storableJsonProblem } from "~/lib/storable-json";
import { proveOffThread } from "~/proofs/pool.server";
import type { Action } from "~/lib/roles";
import { apiError } from "~/api/http.server";
import { contentHash } from "./content-hash.server";
import { startingDocument } from "./templates.server";
import { NO_VEHICLE, type CreateDesignInput, type DesignFilter } from "./forms";
import { checkDraft, revisionRefusal } from "./proof";
import { readRevisionDesign } from "./revision-document";
import type { DesignStatus, DesignSummary } from "./types";

const { design, designRevision, designDraft, vehicle, user, workspace } = schema;
/** The member who archived a design (a second join on the user table). */
const archiver = alias(user, "archiver");

export function statusOf(latestRevision: number | null | undefined): DesignStatus {
  return latestRevision ? "proven" : "draft";
}

// ---------------------------------------------------------------- access

/**
 * The design named in an API URL, for a member of its workspace with one of the allowed roles.
 * Signed out: 401. No such design, or not a member of its workspace: 404. Wrong role: 403.
 */
export async function requireDesign(
  context: RequestContext,
  request: Request,
  designId: string,
  action: Action,
): Promise<{ member: Membership; design: DesignRecord }> {
  await requireApiCaller(context, request);
  const notFound = apiError(404, "not_found", "No such design.");
  // No id holds a NUL character, and PostgreSQL would refuse the query text.
  if (designId.includes("\u0000")) throw notFound;
  // The one lookup by id alone: it finds the workspace whose membership is then required.
  const rows = await db
    .select({ design, slug: workspace.slug })
    .from(design)
    .innerJoin(workspace, eq(design.workspaceId, workspace.id))
    .where(eq(design.id, designId))
    .limit(1);
  const row = rows[0];
  if (!row) throw notFound;
  try {
    const member = await requireApiCan(context, request, row.slug, action);
    return { member, design: row.design };
  } catch (e) {
    if (e instanceof Response && e.status === 404) throw notFound;
    throw e;
  }
}

export async function getDesign(workspaceId: string, designId: string) {
  if (designId.includes("\u0000")) return null;
  const rows = await db
    .select({ design, vehicleName: vehicle.name, archivedByName: archiver.name })
    .from(design)
    .leftJoin(vehicle, and(eq(vehicle.id, design.vehicleId), eq(vehicle.workspaceId, design.workspaceId)))
    .leftJoin(archiver, eq(archiver.id, design.archivedBy))
    .where(and(eq(design.id, designId), eq(design.workspaceId, workspaceId)))
    .limit(1);
  const row = rows[0];
  return row ? { ...row.design, vehicleName: row.vehicleName, archived: archivedOf(row.design, row.archivedByName) } : null;
}

/** Who archived a design and when, or null while it is in use (docs/decisions/167). */
export type Archived = { at: Date; by: { id: string; name: string } };

export function archivedOf(d: { archivedAt: Date | null; archivedBy: string | null }, byName: string | null): Archived | null {
  return d.archivedAt && d.archivedBy ? { at: d.archivedAt, by: { id: d.archivedBy, name: byName ?? "" } } : null;
}

// ---------------------------------------------------------------- listing

/** How many of the workspace's designs are archived (the designs page says so when they are all it has). */
export async function countArchivedDesigns(workspaceId: string): Promise<number> {
  const [row] = await db
    .select({ n: count() })
    .from(design)
    .where(and(eq(design.workspaceId, workspaceId), isNotNull(design.archivedAt)));
  return row?.n ?? 0;
}

export async function listDesigns(workspaceId: string, filter: DesignFilter = {}): Promise<DesignSummary[]> {
  const vehicleCond =
    filter.vehicle === undefined
      ? undefined
      : filter.vehicle === NO_VEHICLE
        ? isNull(design.vehicleId)
        : eq(design.vehicleId, filter.vehicle);
  // Archived designs are kept for audit but left out of lists unless asked for (docs/decisions/167).
  const archivedCond =
    filter.archived === "include" ? undefined : filter.archived === "only" ? isNotNull(design.archivedAt) : isNull(design.archivedAt);
  const [designs, latest, drafts] = await Promise.all([
    db
      .select({
        id: design.id,
        name: design.name,
        vehicleId: design.vehicleId,
        vehicleName: vehicle.name,
        createdAt: design.createdAt,
        archivedAt: design.archivedAt,
        archivedBy: design.archivedBy,
        archivedByName: archiver.name,
      })
      .from(design)
      .leftJoin(vehicle, and(eq(vehicle.id, design.vehicleId), eq(vehicle.workspaceId, design.workspaceId)))
      .leftJoin(archiver, eq(archiver.id, design.archivedBy))
      .where(and(eq(design.workspaceId, workspaceId), vehicleCond, archivedCond))
      .orderBy(asc(design.name), asc(design.createdAt)),
    db
      .selectDistinctOn([designRevision.designId], {
        designId: designRevision.designId,
        number: designRevision.number,
        contentHash: designRevision.contentHash,
        createdAt: designRevision.createdAt,
        authorName: user.name,
        rules: sql<number>`jsonb_array_length(${designRevision.verdict}->'rules')`,
        singleFaults: sql<number>`jsonb_array_length(${designRevision.verdict}->'singleFaults')`,
      })
      .from(designRevision)
      .innerJoin(user, eq(user.id, designRevision.authorId))
      .where(eq(designRevision.workspaceId, workspaceId))
      .orderBy(designRevision.designId, desc(designRevision.number)),
    db
      .select({
        designId: designDraft.designId,
        version: designDraft.version,
        baseRevision: designDraft.baseRevision,
        updatedAt: designDraft.updatedAt,
        contentHash: designDraft.contentHash,
        check: designDraft.check,
      })
      .from(designDraft)
      .where(eq(designDraft.workspaceId, workspaceId)),
  ]);
  const latestOf = new Map(latest.map((r) => [r.designId, r]));
  const draftOf = new Map(drafts.map((r) => [r.designId, r]));
  const out: DesignSummary[] = designs.map((d) => {
    const rev = latestOf.get(d.id);
    const draft = draftOf.get(d.id);
    const archived = archivedOf(d, d.archivedByName);
    return {
      id: d.id,
      name: d.name,
      vehicleId: d.vehicleId,
      vehicleName: d.vehicleName,
      status: statusOf(rev?.number),
      createdAt: d.createdAt.toISOString(),
      archived: archived ? { at: archived.at.toISOString(), by: archived.by } : null,
      latestRevision: rev
        ? {
            number: rev.number,
            contentHash: rev.contentHash,
            createdAt: rev.createdAt.toISOString(),
            authorName: rev.authorName,
            rules: rev.rules,
            singleFaults: rev.singleFaults,
          }
        : null,
      draft: draft
        ? {
            version: draft.version,
            baseRevision: draft.baseRevision,
            updatedAt: draft.updatedAt.toISOString(),
            changed: !rev || rev.contentHash !== draft.contentHash,
            check: draft.check,
          }
        : null,
    };
  });
  return filter.status ? out.filter((d) => d.status === filter.status) : out;
}

// ---------------------------------------------------------------- creating

export type CreateOutcome = { ok: true; id: string; draftVersion: number } | { ok: false; fields: Record<string, string> };

export async function createDesign(workspaceId: string, actorId: string, input: CreateDesignInput): Promise<CreateOutcome> {
  if (input.vehicleId && !(await getVehicle(workspaceId, input.vehicleId))) {
    return { ok: false, fields: { vehicleId: "Choose a vehicle of this workspace." } };
  }
  const document = startingDocument(input.start, input.name);
  const id = crypto.randomUUID();
  await db.transaction(async (tx) => {
    await tx.insert(design).values({ id, workspaceId, vehicleId: input.vehicleId, name: input.name, createdBy: actorId });
    await tx.insert(designDraft).values({
      designId: id,
      workspaceId,
      version: 1,
      document,
      contentHash: contentHash(document),
      check: checkDraft(document),
      baseRevision: 0,
      updatedBy: actorId,
    });
    await recordAudit(
      { workspaceId, actorId, action: "design.created", subject: input.name, detail: { designId: id, start: input.start } },
      tx,
    );
  });
  return { ok: true, id, draftVersion: 1 };
}

// ---------------------------------------------------------------- revisions

export type SaveRevisionOutcome =
  | { kind: "saved"; number: number; contentHash: string }
  | { kind: "stale"; latestRevision: number }
  | { kind: "missing" }
  /** The design was archived: no new revisions (docs/decisions/167). */
  | { kind: "archived" };

function isUniqueViolation(e: unknown): boolean {
  const code = (x: unknown) => (x && typeof x === "object" && "code" in x ? (x as { code: unknown }).code : undefined);
  return code(e) === "23505" || code((e as { cause?: unknown } | null)?.cause) === "23505";
}

async function latestNumber(workspaceId: string, designId: string, executor: Pick<typeof db, "select"> = db): Promise<number> {
  const rows = await executor
    .select({ n: sql<number>`coalesce(max(${designRevision.number}), 0)::int` })
    .from(designRevision)
    .where(and(eq(designRevision.designId, designId), eq(designRevision.workspaceId, workspaceId)));
  return rows[0]?.n ?? 0;
}

/**
 * Saves a proven document as the next revision, when baseRevision is still the latest number.
 * One transaction: the design row is locked (FOR UPDATE) so concurrent saves queue up and all but
 * the first see a newer latest number; the unique (design_id, number) index backs this up.
 */
async function saveRevision(
  workspaceId: string,
  designId: string,
  actorId: string,
  input: { design: Design; verdict: Verdict; baseRevision: number; message: string },
): Promise<SaveRevisionOutcome> {
  const hash = contentHash(input.design);
  try {
    return await db.transaction(async (tx) => {
      const locked = await tx
        .select({ id: design.id, name: design.name, archivedAt: design.archivedAt })
        .from(design)
        .where(and(eq(design.id, designId), eq(design.workspaceId, workspaceId)))
        .for("update");
      if (!locked[0]) return { kind: "missing" } as const;
      // Checked under the lock that archiving takes too, so a save and an archive cannot cross.
      if (locked[0].archivedAt) return { kind: "archived" } as const;
      const latest = await latestNumber(workspaceId, designId, tx);
      if (latest !== input.baseRevision) return { kind: "stale", latestRevision: latest } as const;
      const number = latest + 1;
      await tx.insert(designRevision).values({
        id: crypto.randomUUID(),
        designId,
        workspaceId,
        number,
        document: input.design,
        verdict: input.verdict,
        contentHash: hash,
        message: input.message,
        authorId: actorId,
      });
      // The working copy now builds on the new revision.
      await tx
        .update(designDraft)
        .set({ baseRevision: number })
        .where(and(eq(designDraft.designId, designId), eq(designDraft.workspaceId, workspaceId)));
      await recordAudit(
        { workspaceId, actorId, action: "design.revision-saved", subject: locked[0].name, detail: { designId, number, contentHash: hash } },
        tx,
      );
      return { kind: "saved", number, contentHash: hash } as const;
    });
  } catch (e) {
    if (isUniqueViolation(e)) return { kind: "stale", latestRevision: await latestNumber(workspaceId, designId) };
    throw e;
  }
}

export type SaveProvenOutcome =
  | { kind: "saved"; number: number; contentHash: string; verdict: Verdict }
  /** PostgreSQL could not store it as it is (NUL, a broken surrogate, nesting too deep). */
  | { kind: "unstorable"; problem: Problem }
  /** Not a design of the format: the engine's problems. */
  | { kind: "invalid"; problems: Problem[] }
  /** Proven, but not proven safe: a rule fails or it never drives (spec 1.1). */
  | { kind: "refused"; code: "never_drives" | "rules_fail"; message: string; verdict: Verdict }
  | { kind: "stale"; latestRevision: number }
  | { kind: "missing" }
  | { kind: "archived" };

/**
 * Only proven designs become revisions: the one way a document becomes a revision, for pages and
 * API alike. Checks that PostgreSQL can store it, proves it with the engine (off the request thread,
 * within the proof limits: a ProofLimitError escapes to the caller, who answers 422 or 429), refuses
 * it unless every rule holds and it drives, then saves the engine's own copy of the document.
 * Nothing is saved unless the outcome is "saved".
 */
export async function saveProvenRevision(
  workspaceId: string,
  designId: string,
  actorId: string,
  input: { document: unknown; baseRevision: number; message: string },
): Promise<SaveProvenOutcome> {
  // An archived design takes no new revision: say so before spending a proof on it (saveRevision checks again).
  if (await isArchived(workspaceId, designId)) return { kind: "archived" };
  // Before the engine: text jsonb cannot store and nesting too deep to walk.
  const unstorable = storableJsonProblem(input.document, "");
  if (unstorable) return { kind: "unstorable", problem: unstorable };
  const proof = await proveOffThread(input.document, { userId: actorId });
  if (!proof.ok) return { kind: "invalid", problems: proof.problems };
  const refusal = revisionRefusal(proof.verdict);
  if (refusal) return { kind: "refused", ...refusal, verdict: proof.verdict };
  const saved = await saveRevision(workspaceId, designId, actorId, {
    design: proof.design,
    verdict: proof.verdict,
    baseRevision: input.baseRevision,
    message: input.message,
  });
  return saved.kind === "saved" ? { ...saved, verdict: proof.verdict } : saved;
}

export async function listRevisions(workspaceId: string, designId: string) {
  return db
    .select({
      id: designRevision.id,
      number: designRevision.number,
      contentHash: designRevision.contentHash,
      message: designRevision.message,
      createdAt: designRevision.createdAt,
      authorId: designRevision.authorId,
      authorName: user.name,
      singleFaults: sql<number>`jsonb_array_length(${designRevision.verdict}->'singleFaults')`,
    })
    .from(designRevision)
    .innerJoin(user, eq(user.id, designRevision.authorId))
    .where(and(eq(designRevision.designId, designId), eq(designRevision.workspaceId, workspaceId)))
    .orderBy(desc(designRevision.number));
}

/** One revision with its document (validated, as the engine's Design) and verdict; the latest when number is omitted. */
export async function getRevision(workspaceId: string, designId: string, number?: number) {
  const rows = await db
    .select({ revision: designRevision, authorName: user.name })
    .from(designRevision)
    .innerJoin(user, eq(user.id, designRevision.authorId))
    .where(
      and(
        eq(designRevision.designId, designId),
        eq(designRevision.workspaceId, workspaceId),
        number === undefined ? undefined : eq(designRevision.number, number),
      ),
    )
    .orderBy(desc(designRevision.number))
    .limit(1);
  const row = rows[0];
  return row ? { ...row.revision, document: readRevisionDesign(row.revision.document, row.revision.id), authorName: row.authorName } : null;
}

// ---------------------------------------------------------------- drafts

export async function getDraft(workspaceId: string, designId: string) {
  const rows = await db
    .select({ draft: designDraft, updatedByName: user.name })
    .from(designDraft)
    .innerJoin(user, eq(user.id, designDraft.updatedBy))
    .where(and(eq(designDraft.designId, designId), eq(designDraft.workspaceId, workspaceId)))
    .limit(1);
  const row = rows[0];
  return row ? { ...row.draft, updatedByName: row.updatedByName } : null;
}

export type SaveDraftOutcome =
  | { ok: true; version: number }
  | { ok: false; currentVersion: number }
  /** The design was archived: its working copy no longer changes (docs/decisions/167). */
  | { ok: false; archived: true };

/**
 * Replaces the draft when `version` is the current one (0: there is no draft yet) and bumps the
 * version; otherwise reports the current version. One conditional statement, so two writers with
 * the same version cannot both win.
 */
export async function saveDraft(
  workspaceId: string,
  designId: string,
  actorId: string,
  input: { document: Record<string, unknown>; version: number; baseRevision?: number },
): Promise<SaveDraftOutcome> {
  const values = {
    document: input.document,
    contentHash: contentHash(input.document),
    check: checkDraft(input.document),
    updatedBy: actorId,
    updatedAt: new Date(),
    ...(input.baseRevision === undefined ? {} : { baseRevision: input.baseRevision }),
  };
  return db.transaction(async (tx): Promise<SaveDraftOutcome> => {
    // A shared lock on the design: archiving (FOR UPDATE) waits for this save, or this save sees it archived.
    const held = await tx
      .select({ archivedAt: design.archivedAt })
      .from(design)
      .where(and(eq(design.id, designId), eq(design.workspaceId, workspaceId)))
      .for("share");
    if (held[0]?.archivedAt) return { ok: false, archived: true };
    const written =
      input.version === 0
        ? await tx
            .insert(designDraft)
            .values({ designId, workspaceId, version: 1, ...values })
            .onConflictDoNothing()
            .returning({ version: designDraft.version })
        : await tx
            .update(designDraft)
            .set({ ...values, version: sql`${designDraft.version} + 1` })
            .where(
              and(eq(designDraft.designId, designId), eq(designDraft.workspaceId, workspaceId), eq(designDraft.version, input.version)),
            )
            .returning({ version: designDraft.version });
    if (written[0]) return { ok: true, version: written[0].version };
    const current = await tx
      .select({ version: designDraft.version })
      .from(designDraft)
      .where(and(eq(designDraft.designId, designId), eq(designDraft.workspaceId, workspaceId)));
    return { ok: false, currentVersion: current[0]?.version ?? 0 };
  });
}

// ---------------------------------------------------------------- archiving

async function isArchived(workspaceId: string, designId: string): Promise<boolean> {
  const rows = await db
    .select({ archivedAt: design.archivedAt })
    .from(design)
    .where(and(eq(design.id, designId), eq(design.workspaceId, workspaceId)))
    .limit(1);
  return Boolean(rows[0]?.archivedAt);
}

/** A sentence for "archived by NAME on DATE" (UTC date: the same on every server). */
export function archivedWords(a: Archived): string {
  return `archived by ${a.by.name || "a former member"} on ${a.at.toISOString().slice(0, 10)}`;
}

/** The API's 409 design_archived: what was refused, who archived the design and when, and the way back. */
export async function archivedAnswer(workspaceId: string, designId: string, what: "draft" | "revision"): Promise<Response> {
  const a = (await getDesign(workspaceId, designId))?.archived;
  const why = a ? `The design was ${archivedWords(a)}` : "The design is archived";
  const refused = what === "draft" ? "its draft no longer changes" : "it takes no new revisions";
  return apiError(409, "design_archived", `${why}; ${refused}. Bring it back from the archive (PATCH archived: false) to change it.`, [], {
    // null only when it was brought back in the meantime: saving again then works.
    archived: a ? { at: a.at.toISOString(), by: a.by } : null,
  });
}

export type ArchiveOutcome =
  /** changed: false when it already was in the state asked for (nothing written, no audit event). */
  { kind: "done"; changed: boolean; archived: Archived | null } | { kind: "missing" };

/**
 * Archives a design (archive: true) or brings it back (false). Kept for audit: nothing is deleted,
 * revisions, reviews and releases stay as they are; lists leave it out and it takes no new drafts,
 * revisions or releases while archived (docs/decisions/167). The design row is locked so a
 * revision or draft being saved finishes first; one audit event per change.
 */
export async function setArchived(workspaceId: string, designId: string, actorId: string, archive: boolean): Promise<ArchiveOutcome> {
  if (designId.includes("\u0000")) return { kind: "missing" };
  return db.transaction(async (tx): Promise<ArchiveOutcome> => {
    const locked = await tx
      .select({ name: design.name, archivedAt: design.archivedAt, archivedBy: design.archivedBy })
      .from(design)
      .where(and(eq(design.id, designId), eq(design.workspaceId, workspaceId)))
      .for("update");
    const row = locked[0];
    if (!row) return { kind: "missing" };
    if (Boolean(row.archivedAt) === archive) {
      const by = row.archivedBy ? await tx.select({ name: user.name }).from(user).where(eq(user.id, row.archivedBy)) : [];
      return { kind: "done", changed: false, archived: archivedOf(row, by[0]?.name ?? null) };
    }
    const at = archive ? new Date() : null;
    await tx
      .update(design)
      .set({ archivedAt: at, archivedBy: archive ? actorId : null })
      .where(and(eq(design.id, designId), eq(design.workspaceId, workspaceId)));
    await recordAudit(
      {
        workspaceId,
        actorId,
        action: archive ? "design.archived" : "design.unarchived",
        subject: row.name,
        // Unarchiving keeps who had archived it and when, so the log alone tells the whole story.
        detail: archive ? { designId } : { designId, archivedAt: row.archivedAt?.toISOString(), archivedBy: row.archivedBy },
      },
      tx,
    );
    if (!at) return { kind: "done", changed: true, archived: null };
    const me = await tx.select({ name: user.name }).from(user).where(eq(user.id, actorId));
    return { kind: "done", changed: true, archived: { at, by: { id: actorId, name: me[0]?.name ?? "" } } };
  });
}

// ---------------------------------------------------------------- what the editor opens

/**
 * The document the editor opens: the draft, unless the latest revision is newer than the draft's
 * last save (then the revision, whose number becomes the base). See docs/decisions/031.
 */
export function editorStart(
  draft: { version: number; baseRevision: number; document: unknown; updatedAt: Date } | null,
  latest: { number: number; document: unknown; createdAt: Date } | null,
): { document: unknown; draftVersion: number; baseRevision: number; source: "draft" | "revision" | "none" } {
  const draftVersion = draft?.version ?? 0;
  if (draft && (!latest || draft.updatedAt > latest.createdAt)) {
    return { document: draft.document, draftVersion, baseRevision: draft.baseRevision, source: "draft" };
  }
  if (latest) return { document: latest.document, draftVersion, baseRevision: latest.number, source: "revision" };
  return { document: null, draftVersion, baseRevision: 0, source: "none" };
}
