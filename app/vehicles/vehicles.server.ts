// Vehicles of a workspace, the revisions released to them and their "needs attention" flags.
// Every query is scoped by workspace id.
import { and, asc, desc, eq, isNull, sql } from "drizzle-orm";
import { db, schema } from "~/db/client.server";
import { recordAudit } from "~/audit/audit.server";
import { readRevisionDesign } from "~/designs/revision-document";
import type { z } from "zod";
import type { vehicleSchema } from "~/lib/forms";
import { revisionApproval } from "./approval.server";
import { standingsFor } from "~/designs/standing.server";
import { standingSentence } from "~/designs/standing";
import { statusAgainstRevisions } from "./controller-records.server";
import { differenceInWords, proofDoesNotHold, PROOF_DOES_NOT_HOLD } from "./controller-status";

const { vehicle, vehicleRelease, vehicleAttention, designRevision, design, user } = schema;

export type VehicleInput = z.infer<typeof vehicleSchema>;

export async function listVehicles(workspaceId: string) {
  const [vehicles, releases, attention] = await Promise.all([
    db.select().from(vehicle).where(eq(vehicle.workspaceId, workspaceId)).orderBy(asc(vehicle.name)),
    currentReleases(workspaceId),
    db
      .select({ vehicleId: vehicleAttention.vehicleId, n: sql<number>`count(*)::int` })
      .from(vehicleAttention)
      .where(and(eq(vehicleAttention.workspaceId, workspaceId), isNull(vehicleAttention.clearedAt)))
      .groupBy(vehicleAttention.vehicleId),
  ]);
  const releaseOf = new Map(releases.map((r) => [r.vehicleId, r]));
  const attentionOf = new Map(attention.map((a) => [a.vehicleId, a.n]));
  return vehicles.map((v) => ({ ...v, release: releaseOf.get(v.id) ?? null, needsAttention: (attentionOf.get(v.id) ?? 0) > 0 }));
}

/** Only the names, for pickers and filters (no releases or flags to look up). */
export async function vehicleNames(workspaceId: string) {
  return db
    .select({ id: vehicle.id, name: vehicle.name })
    .from(vehicle)
    .where(eq(vehicle.workspaceId, workspaceId))
    .orderBy(asc(vehicle.name));
}

export async function countVehicles(workspaceId: string): Promise<number> {
  const rows = await db
    .select({ n: sql<number>`count(*)::int` })
    .from(vehicle)
    .where(eq(vehicle.workspaceId, workspaceId));
  return rows[0]?.n ?? 0;
}

export async function getVehicle(workspaceId: string, id: string) {
  const rows = await db
    .select()
    .from(vehicle)
    .where(and(eq(vehicle.id, id), eq(vehicle.workspaceId, workspaceId)))
    .limit(1);
  return rows[0] ?? null;
}

export async function createVehicle(workspaceId: string, actorId: string, input: VehicleInput) {
  return db.transaction(async (tx) => {
    const id = crypto.randomUUID();
    await tx.insert(vehicle).values({ id, workspaceId, ...input });
    await recordAudit({ workspaceId, actorId, action: "vehicle.created", subject: input.name }, tx);
    return id;
  });
}

export async function updateVehicle(workspaceId: string, id: string, actorId: string, input: VehicleInput): Promise<boolean> {
  return db.transaction(async (tx) => {
    const updated = await tx
      .update(vehicle)
      .set({ ...input, updatedAt: new Date() })
      .where(and(eq(vehicle.id, id), eq(vehicle.workspaceId, workspaceId)))
      .returning({ id: vehicle.id });
    if (!updated[0]) return false;
    await recordAudit({ workspaceId, actorId, action: "vehicle.updated", subject: input.name, detail: { vehicleId: id } }, tx);
    return true;
  });
}

// ---------------------------------------------------------------- releases

const releaseColumns = {
  id: vehicleRelease.id,
  vehicleId: vehicleRelease.vehicleId,
  revisionId: vehicleRelease.revisionId,
  at: vehicleRelease.at,
  note: vehicleRelease.note,
  releasedByName: user.name,
  designId: designRevision.designId,
  designName: design.name,
  number: designRevision.number,
  contentHash: designRevision.contentHash,
};

function releaseQuery(workspaceId: string) {
  return db
    .select(releaseColumns)
    .from(vehicleRelease)
    .innerJoin(
      designRevision,
      and(eq(designRevision.id, vehicleRelease.revisionId), eq(designRevision.workspaceId, vehicleRelease.workspaceId)),
    )
    .innerJoin(design, and(eq(design.id, designRevision.designId), eq(design.workspaceId, designRevision.workspaceId)))
    .innerJoin(user, eq(user.id, vehicleRelease.releasedBy))
    .where(eq(vehicleRelease.workspaceId, workspaceId))
    .$dynamic();
}

export type ReleaseSummary = Awaited<ReturnType<typeof releaseHistory>>[number];

/** The current release of every vehicle of the workspace (the latest release row of each). */
async function currentReleases(workspaceId: string) {
  return db
    .selectDistinctOn([vehicleRelease.vehicleId], releaseColumns)
    .from(vehicleRelease)
    .innerJoin(
      designRevision,
      and(eq(designRevision.id, vehicleRelease.revisionId), eq(designRevision.workspaceId, vehicleRelease.workspaceId)),
    )
    .innerJoin(design, and(eq(design.id, designRevision.designId), eq(design.workspaceId, designRevision.workspaceId)))
    .innerJoin(user, eq(user.id, vehicleRelease.releasedBy))
    .where(eq(vehicleRelease.workspaceId, workspaceId))
    .orderBy(vehicleRelease.vehicleId, desc(vehicleRelease.at), desc(vehicleRelease.id));
}

/** Every release of the vehicle, newest first. */
export async function releaseHistory(workspaceId: string, vehicleId: string) {
  return releaseQuery(workspaceId)
    .where(and(eq(vehicleRelease.workspaceId, workspaceId), eq(vehicleRelease.vehicleId, vehicleId)))
    .orderBy(desc(vehicleRelease.at), desc(vehicleRelease.id));
}

/**
 * The vehicles a design's revisions were released to, newest release first, each saying whether it is
 * still the vehicle's current release: the design page shows it, archived or not (decision 167).
 */
export async function releasesOfDesign(workspaceId: string, designId: string) {
  const [rows, current] = await Promise.all([
    db
      .select({
        id: vehicleRelease.id,
        vehicleId: vehicle.id,
        vehicleName: vehicle.name,
        number: designRevision.number,
        at: vehicleRelease.at,
        releasedByName: user.name,
      })
      .from(vehicleRelease)
      .innerJoin(
        designRevision,
        and(eq(designRevision.id, vehicleRelease.revisionId), eq(designRevision.workspaceId, vehicleRelease.workspaceId)),
      )
      .innerJoin(vehicle, and(eq(vehicle.id, vehicleRelease.vehicleId), eq(vehicle.workspaceId, vehicleRelease.workspaceId)))
      .innerJoin(user, eq(user.id, vehicleRelease.releasedBy))
      .where(and(eq(vehicleRelease.workspaceId, workspaceId), eq(designRevision.designId, designId)))
      .orderBy(desc(vehicleRelease.at), desc(vehicleRelease.id)),
    currentReleases(workspaceId),
  ]);
  const currentIds = new Set(current.map((c) => c.id));
  return rows.map((r) => ({ ...r, current: currentIds.has(r.id) }));
}

/** The revision released to the vehicle now, with its document; null when none is. */
export async function currentRelease(workspaceId: string, vehicleId: string) {
  const latest = (await releaseHistory(workspaceId, vehicleId))[0];
  if (!latest) return null;
  const rows = await db
    .select({ document: designRevision.document, authorId: designRevision.authorId })
    .from(designRevision)
    .where(and(eq(designRevision.id, latest.revisionId), eq(designRevision.workspaceId, workspaceId)))
    .limit(1);
  return { ...latest, document: readRevisionDesign(rows[0]!.document, latest.revisionId), authorId: rows[0]!.authorId };
}

/** Revisions that could be released: every revision of the workspace's designs in use (not archived), designs for this vehicle first. */
export async function releasableRevisions(workspaceId: string, vehicleId: string) {
  const rows = await db
    .select({
      id: designRevision.id,
      number: designRevision.number,
      designId: design.id,
      designName: design.name,
      forThisVehicle: sql<boolean>`${design.vehicleId} is not distinct from ${vehicleId}`,
      createdAt: designRevision.createdAt,
    })
    .from(designRevision)
    .innerJoin(design, and(eq(design.id, designRevision.designId), eq(design.workspaceId, designRevision.workspaceId)))
    .where(and(eq(designRevision.workspaceId, workspaceId), isNull(design.archivedAt)))
    .orderBy(desc(sql`${design.vehicleId} is not distinct from ${vehicleId}`), asc(design.name), desc(designRevision.number));
  const [approved, standings] = await Promise.all([
    Promise.all(rows.map((r) => revisionApproval(workspaceId, r.id))),
    standingsFor(
      workspaceId,
      rows.map((r) => r.id),
    ),
  ]);
  return rows.map((r, i) => {
    const st = standings.get(r.id);
    return { ...r, approval: approved[i], refused: st && !st.passes ? st.reasons : null };
  });
}

export type ReleaseOutcome =
  | { ok: true; id: string }
  | { ok: false; fields: Record<string, string>; /** What the controller record contradicts, in words. */ contradictions?: string[] };

/**
 * Releases a revision to a vehicle: only a revision of this workspace with an approval record.
 * When the vehicle's controller settings record contradicts the revision (an error finding), only with
 * an override reason, kept in the audit with the findings it overrode. The history is append-only;
 * the newest row is the current release.
 */
export async function releaseRevision(
  workspaceId: string,
  vehicleId: string,
  actorId: string,
  input: { revisionId: string; note: string; override?: string },
): Promise<ReleaseOutcome> {
  const rev = await db
    .select({
      id: designRevision.id,
      number: designRevision.number,
      designName: design.name,
      contentHash: designRevision.contentHash,
      designId: design.id,
      archivedAt: design.archivedAt,
    })
    .from(designRevision)
    .innerJoin(design, and(eq(design.id, designRevision.designId), eq(design.workspaceId, designRevision.workspaceId)))
    .where(and(eq(designRevision.id, input.revisionId), eq(designRevision.workspaceId, workspaceId)))
    .limit(1);
  if (!rev[0]) return { ok: false, fields: { revisionId: "Choose a revision of a design in this workspace." } };
  // An archived design's revisions stay on the vehicles they were released to, but are not released anew (decision 167).
  const archivedRefusal: ReleaseOutcome = {
    ok: false,
    fields: {
      revisionId: `Revision ${rev[0].number} of "${rev[0].designName}" cannot be released: the design is archived. Bring the design back from the archive to release it.`,
    },
  };
  if (rev[0].archivedAt) return archivedRefusal;
  // A revision stored before format 1.1 that 1.1 would refuse stays readable but is not released (decision 111).
  const standing = (await standingsFor(workspaceId, [input.revisionId])).get(input.revisionId);
  if (standing && !standing.passes) {
    return {
      ok: false,
      fields: {
        revisionId: `Revision ${rev[0].number} of "${rev[0].designName}" cannot be released. ${standingSentence(standing)} Save a revision that passes format 1.1 and release that one.`,
      },
    };
  }
  const approval = await revisionApproval(workspaceId, input.revisionId);
  if (approval !== "approved") {
    return {
      ok: false,
      fields: {
        revisionId: `Revision ${rev[0].number} of "${rev[0].designName}" has not been approved by a reviewer; only an approved revision can be released.`,
      },
    };
  }
  return db.transaction(async (tx): Promise<ReleaseOutcome> => {
    const v = await tx
      .select({ id: vehicle.id, name: vehicle.name })
      .from(vehicle)
      .where(and(eq(vehicle.id, vehicleId), eq(vehicle.workspaceId, workspaceId)))
      .for("update");
    if (!v[0]) return { ok: false, fields: { vehicleId: "No such vehicle." } };
    // Asked again under a share lock on the design row, which archiving locks for update: an archive that
    // commits first is seen here, and one that comes later waits for this release.
    const d = await tx
      .select({ archivedAt: design.archivedAt })
      .from(design)
      .where(and(eq(design.id, rev[0].designId), eq(design.workspaceId, workspaceId)))
      .for("share");
    if (!d[0] || d[0].archivedAt) return archivedRefusal;
    // Read while the vehicle is locked: a record saved meanwhile waits for this release (saveRecord locks it too).
    const against = await statusAgainstRevisions(workspaceId, vehicleId, [input.revisionId], tx);
    const status = against.byRevision.get(input.revisionId);
    const contradictions = status && proofDoesNotHold(status) ? differenceInWords(status) : [];
    const override = (input.override ?? "").trim();
    if (contradictions.length > 0 && override === "") {
      return {
        ok: false,
        fields: {
          override: `${PROOF_DOES_NOT_HOLD} (record version ${against.version}). To release revision ${rev[0].number} anyway, give the reason.`,
        },
        contradictions,
      };
    }
    const id = crypto.randomUUID();
    await tx
      .insert(vehicleRelease)
      .values({ id, workspaceId, vehicleId, revisionId: input.revisionId, releasedBy: actorId, note: input.note });
    await recordAudit(
      {
        workspaceId,
        actorId,
        action: "vehicle.revision-released",
        subject: v[0].name,
        detail: {
          vehicleId,
          revisionId: input.revisionId,
          number: rev[0].number,
          design: rev[0].designName,
          contentHash: rev[0].contentHash,
          ...(contradictions.length > 0
            ? {
                controllerOverride: {
                  reason: override,
                  recordVersion: against.version,
                  findings: status!.errors.map((f) => ({ code: f.code, message: f.message })),
                  problems: status!.problems,
                },
              }
            : {}),
        },
      },
      tx,
    );
    return { ok: true, id };
  });
}

// ---------------------------------------------------------------- needs attention

type Executor = Pick<typeof db, "insert" | "select">;

export async function openAttention(workspaceId: string, vehicleId: string) {
  return db
    .select({
      id: vehicleAttention.id,
      reason: vehicleAttention.reason,
      benchRunId: vehicleAttention.benchRunId,
      stepNumber: vehicleAttention.stepNumber,
      raisedAt: vehicleAttention.raisedAt,
      raisedByName: user.name,
    })
    .from(vehicleAttention)
    .leftJoin(user, eq(user.id, vehicleAttention.raisedBy))
    .where(
      and(eq(vehicleAttention.workspaceId, workspaceId), eq(vehicleAttention.vehicleId, vehicleId), isNull(vehicleAttention.clearedAt)),
    )
    .orderBy(asc(vehicleAttention.raisedAt));
}

/** Flags the vehicle; a second flag for the same bench step while the first is open is not added. */
export async function raiseAttention(
  tx: Executor,
  input: { workspaceId: string; vehicleId: string; reason: string; benchRunId?: string; stepNumber?: number; actorId: string },
): Promise<boolean> {
  if (input.benchRunId !== undefined && input.stepNumber !== undefined) {
    const open = await tx
      .select({ id: vehicleAttention.id })
      .from(vehicleAttention)
      .where(
        and(
          eq(vehicleAttention.workspaceId, input.workspaceId),
          eq(vehicleAttention.benchRunId, input.benchRunId),
          eq(vehicleAttention.stepNumber, input.stepNumber),
          isNull(vehicleAttention.clearedAt),
        ),
      )
      .limit(1);
    if (open[0]) return false;
  }
  await tx.insert(vehicleAttention).values({
    id: crypto.randomUUID(),
    workspaceId: input.workspaceId,
    vehicleId: input.vehicleId,
    reason: input.reason,
    benchRunId: input.benchRunId ?? null,
    stepNumber: input.stepNumber ?? null,
    raisedBy: input.actorId,
  });
  return true;
}

/** Clears every open flag of the vehicle, with a note saying what was done. */
export async function clearAttention(workspaceId: string, vehicleId: string, actorId: string, note: string): Promise<number> {
  return db.transaction(async (tx) => {
    const cleared = await tx
      .update(vehicleAttention)
      .set({ clearedAt: new Date(), clearedBy: actorId, clearNote: note })
      .where(
        and(eq(vehicleAttention.workspaceId, workspaceId), eq(vehicleAttention.vehicleId, vehicleId), isNull(vehicleAttention.clearedAt)),
      )
      .returning({ id: vehicleAttention.id });
    if (cleared.length > 0) {
      await recordAudit(
        { workspaceId, actorId, action: "vehicle.attention-cleared", detail: { vehicleId, note, flags: cleared.length } },
        tx,
      );
    }
    return cleared.length;
  });
}
