// Controller settings records of vehicles: versions (each change a new row, with who and when), saving
// with a stale-version check, and the status of every vehicle's released proof against its record.
// Every query is scoped by workspace id.
import { and, desc, eq, inArray, sql } from "drizzle-orm";
import { db, schema } from "~/db/client.server";
import { recordAudit } from "~/audit/audit.server";
import { validateRecord } from "~/controller-record";
import type { Problem } from "~/engine";
import { controllerStatus, type ControllerStatus } from "./controller-status";

const { controllerRecord, vehicle, vehicleRelease, designRevision, user } = schema;

export type RecordVersion = {
  version: number;
  document: Record<string, unknown>;
  recordedAt: Date;
  recordedBy: { id: string; name: string };
};

const versionColumns = {
  version: controllerRecord.version,
  document: controllerRecord.document,
  recordedAt: controllerRecord.recordedAt,
  recordedById: controllerRecord.recordedBy,
  recordedByName: user.name,
};

const toVersion = (r: {
  version: number;
  document: Record<string, unknown>;
  recordedAt: Date;
  recordedById: string;
  recordedByName: string;
}): RecordVersion => ({
  version: r.version,
  document: r.document,
  recordedAt: r.recordedAt,
  recordedBy: { id: r.recordedById, name: r.recordedByName },
});

/** Every version of the vehicle's record, newest first. */
export async function recordHistory(workspaceId: string, vehicleId: string): Promise<RecordVersion[]> {
  const rows = await db
    .select(versionColumns)
    .from(controllerRecord)
    .innerJoin(user, eq(user.id, controllerRecord.recordedBy))
    .where(and(eq(controllerRecord.workspaceId, workspaceId), eq(controllerRecord.vehicleId, vehicleId)))
    .orderBy(desc(controllerRecord.version));
  return rows.map(toVersion);
}

/** Reads run on the pool or inside the caller's transaction. */
type Reader = Pick<typeof db, "select">;

/** One version, or the newest when `version` is not given; null when there is none. */
export async function recordVersion(
  workspaceId: string,
  vehicleId: string,
  version?: number,
  ex: Reader = db,
): Promise<RecordVersion | null> {
  const rows = await ex
    .select(versionColumns)
    .from(controllerRecord)
    .innerJoin(user, eq(user.id, controllerRecord.recordedBy))
    .where(
      and(
        eq(controllerRecord.workspaceId, workspaceId),
        eq(controllerRecord.vehicleId, vehicleId),
        version === undefined ? undefined : eq(controllerRecord.version, version),
      ),
    )
    .orderBy(desc(controllerRecord.version))
    .limit(1);
  return rows[0] ? toVersion(rows[0]) : null;
}

export type SaveOutcome =
  | { ok: true; version: number }
  | { ok: false; reason: "invalid"; problems: Problem[] }
  | { ok: false; reason: "stale"; currentVersion: number }
  | { ok: false; reason: "not-found" };

/**
 * Saves a new version of the vehicle's record. `baseVersion` is the version the change was made on
 * (0 for the first record): when another version was saved since, nothing is saved (stale). The
 * vehicle's row is locked, so two saves on the same base cannot both win; the record and its audit
 * event are written in one transaction.
 */
export async function saveRecord(
  workspaceId: string,
  vehicleId: string,
  actorId: string,
  input: { baseVersion: number; document: unknown },
): Promise<SaveOutcome> {
  const checked = validateRecord(input.document);
  if (!checked.ok) return { ok: false, reason: "invalid", problems: checked.problems };
  return db.transaction(async (tx) => {
    const v = await tx
      .select({ id: vehicle.id, name: vehicle.name })
      .from(vehicle)
      .where(and(eq(vehicle.id, vehicleId), eq(vehicle.workspaceId, workspaceId)))
      .for("update");
    if (!v[0]) return { ok: false, reason: "not-found" } as const;
    const latest = await tx
      .select({ n: sql<number>`coalesce(max(${controllerRecord.version}), 0)::int` })
      .from(controllerRecord)
      .where(and(eq(controllerRecord.workspaceId, workspaceId), eq(controllerRecord.vehicleId, vehicleId)));
    const current = latest[0]?.n ?? 0;
    if (current !== input.baseVersion) return { ok: false, reason: "stale", currentVersion: current } as const;
    const version = current + 1;
    await tx.insert(controllerRecord).values({
      id: crypto.randomUUID(),
      workspaceId,
      vehicleId,
      version,
      document: checked.record as Record<string, unknown>,
      recordedBy: actorId,
    });
    await recordAudit(
      { workspaceId, actorId, action: "vehicle.controller-recorded", subject: v[0].name, detail: { vehicleId, version } },
      tx,
    );
    return { ok: true, version } as const;
  });
}

// ---------------------------------------------------------------- status against the released proof

/** The released revision's design document of one vehicle (only its controller is read), or null. */
async function releasedDesign(workspaceId: string, vehicleId: string): Promise<unknown | null> {
  const rows = await db
    .select({ controller: sql<unknown>`${designRevision.document}->'controller'` })
    .from(vehicleRelease)
    .innerJoin(
      designRevision,
      and(eq(designRevision.id, vehicleRelease.revisionId), eq(designRevision.workspaceId, vehicleRelease.workspaceId)),
    )
    .where(and(eq(vehicleRelease.workspaceId, workspaceId), eq(vehicleRelease.vehicleId, vehicleId)))
    .orderBy(desc(vehicleRelease.at), desc(vehicleRelease.id))
    .limit(1);
  return rows[0] ? { controller: rows[0].controller } : null;
}

/**
 * What the API answers of a vehicle's record: every version, the one asked for (the newest by default;
 * null when there is no such version) with its status against the released revision, and the newest's.
 */
export async function recordWithStatus(workspaceId: string, vehicleId: string, version?: number) {
  const [history, released] = await Promise.all([recordHistory(workspaceId, vehicleId), releasedDesign(workspaceId, vehicleId)]);
  const newest = history[0] ?? null;
  const chosen = version === undefined ? newest : (history.find((h) => h.version === version) ?? null);
  return {
    history,
    chosen,
    chosenStatus: chosen ? controllerStatus(chosen.document, released) : null,
    newestStatus: controllerStatus(newest?.document ?? null, released),
  };
}

/** The vehicle's newest record against its released revision. */
export async function vehicleControllerStatus(
  workspaceId: string,
  vehicleId: string,
): Promise<{ status: ControllerStatus; latest: RecordVersion | null }> {
  const [latest, released] = await Promise.all([recordVersion(workspaceId, vehicleId), releasedDesign(workspaceId, vehicleId)]);
  return { status: controllerStatus(latest?.document ?? null, released), latest };
}

/**
 * The vehicle's newest record against each of the given revisions (a release asks before it writes;
 * the release form marks the revisions the record contradicts). Revisions of other workspaces are absent.
 */
export async function statusAgainstRevisions(
  workspaceId: string,
  vehicleId: string,
  revisionIds: string[],
  ex: Reader = db,
): Promise<{ version: number | null; byRevision: Map<string, ControllerStatus> }> {
  const [latest, revs] = await Promise.all([
    recordVersion(workspaceId, vehicleId, undefined, ex),
    revisionIds.length === 0
      ? Promise.resolve([])
      : ex
          .select({ id: designRevision.id, controller: sql<unknown>`${designRevision.document}->'controller'` })
          .from(designRevision)
          .where(and(inArray(designRevision.id, revisionIds), eq(designRevision.workspaceId, workspaceId))),
  ]);
  const byRevision = new Map(revs.map((r) => [r.id, controllerStatus(latest?.document ?? null, { controller: r.controller })]));
  return { version: latest?.version ?? null, byRevision };
}

export type FleetControllerStatus = { vehicleId: string; vehicleName: string; version: number | null; status: ControllerStatus };

/** Every vehicle's newest record against its released revision, for lists. */
export async function fleetControllerStatus(workspaceId: string): Promise<Map<string, FleetControllerStatus>> {
  const [vehicles, records, releases] = await Promise.all([
    db.select({ id: vehicle.id, name: vehicle.name }).from(vehicle).where(eq(vehicle.workspaceId, workspaceId)),
    db
      .selectDistinctOn([controllerRecord.vehicleId], {
        vehicleId: controllerRecord.vehicleId,
        version: controllerRecord.version,
        document: controllerRecord.document,
      })
      .from(controllerRecord)
      .where(eq(controllerRecord.workspaceId, workspaceId))
      .orderBy(controllerRecord.vehicleId, desc(controllerRecord.version)),
    db
      .selectDistinctOn([vehicleRelease.vehicleId], {
        vehicleId: vehicleRelease.vehicleId,
        controller: sql<unknown>`${designRevision.document}->'controller'`,
      })
      .from(vehicleRelease)
      .innerJoin(
        designRevision,
        and(eq(designRevision.id, vehicleRelease.revisionId), eq(designRevision.workspaceId, vehicleRelease.workspaceId)),
      )
      .where(eq(vehicleRelease.workspaceId, workspaceId))
      .orderBy(vehicleRelease.vehicleId, desc(vehicleRelease.at), desc(vehicleRelease.id)),
  ]);
  const recordOf = new Map(records.map((r) => [r.vehicleId, r]));
  const releaseOf = new Map(releases.map((r) => [r.vehicleId, r]));
  const out = new Map<string, FleetControllerStatus>();
  for (const v of vehicles) {
    const rec = recordOf.get(v.id);
    const rel = releaseOf.get(v.id);
    out.set(v.id, {
      vehicleId: v.id,
      vehicleName: v.name,
      version: rec?.version ?? null,
      status: controllerStatus(rec?.document ?? null, rel ? { controller: rel.controller } : null),
    });
  }
  return out;
}
