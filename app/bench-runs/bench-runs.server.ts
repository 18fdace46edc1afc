// Bench-test runs: started from the revision released to a vehicle (the generated procedure is
// frozen into the run), one saved result per step, a failed step flags the vehicle and tells the
// revision's author, and a completed run becomes a signed, hashed record (decisions 071-072).
import { and, asc, desc, eq, inArray, isNull, ne, sql } from "drizzle-orm";
import { db, schema } from "~/db/client.server";
import { recordAudit } from "~/audit/audit.server";
import { env } from "~/env.server";
import { composeMail, sendMail } from "~/mail/mailer.server";
import { contentHash } from "~/designs/content-hash.server";
import { generateBenchPlan, type BenchPlan } from "~/bench-tests/generate";
import { saveUpload } from "~/uploads/uploads.server";
import { STEP_PHOTOS } from "~/uploads/kinds";
import { getObject } from "~/uploads/storage.server";
import { ISOLATE_FIRST, SAFETY_TEXT } from "~/lib/safety";
import { currentRelease, raiseAttention } from "~/vehicles/vehicles.server";
import type { StepOutcome } from "./outcomes";

const { benchRun, benchStepResult, vehicle, designRevision, design, user, workspace, upload } = schema;

export const STEP_PHOTO_KIND = "bench-step";

export class BenchRunError extends Error {
  constructor(
    public readonly field: string,
    message: string,
    public readonly status = 400,
  ) {
    super(message);
  }
}

// ---------------------------------------------------------------- starting

/** Starts a run on the revision released to the vehicle now. */
export async function startRun(workspaceId: string, vehicleId: string, actorId: string): Promise<string> {
  const release = await currentRelease(workspaceId, vehicleId);
  if (!release) throw new BenchRunError("vehicle", "No revision is released to this vehicle, so there is no procedure to run.", 409);
  const plan = generateBenchPlan(release.document);
  if (plan.steps.length === 0)
    throw new BenchRunError(
      "revision",
      "The released revision gives no bench steps (nothing in it can be checked from the controller inputs).",
      409,
    );
  const id = crypto.randomUUID();
  await db.transaction(async (tx) => {
    await tx.insert(benchRun).values({
      id,
      workspaceId,
      vehicleId,
      revisionId: release.revisionId,
      revisionHash: release.contentHash,
      plan,
      startedBy: actorId,
    });
    await tx.insert(benchStepResult).values(plan.steps.map((s) => ({ id: crypto.randomUUID(), workspaceId, runId: id, n: s.n })));
    await recordAudit(
      {
        workspaceId,
        actorId,
        action: "bench-run.started",
        subject: release.designName,
        detail: { runId: id, vehicleId, revisionId: release.revisionId, steps: plan.steps.length },
      },
      tx,
    );
  });
  return id;
}

// ---------------------------------------------------------------- reading

export type RunFilter = { vehicleId?: string; status?: "in-progress" | "completed" | "failures" };
/** A page of runs for the API: at most `limit`, after the run whose sort key (`startKey`) and id are given. */
export type RunPage = { limit: number; after?: { startKey: string; id: string } };

/** The start time as exact text (microseconds, UTC): the sort key an API cursor carries. */
const startKey = sql<string>`to_char(${benchRun.startedAt} at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"')`;

// A run joined to its vehicle, revision and design, each within the run's own workspace.
const runsVehicle = and(eq(vehicle.id, benchRun.vehicleId), eq(vehicle.workspaceId, benchRun.workspaceId));
const runsRevision = and(eq(designRevision.id, benchRun.revisionId), eq(designRevision.workspaceId, benchRun.workspaceId));
const revisionsDesign = and(eq(design.id, designRevision.designId), eq(design.workspaceId, benchRun.workspaceId));

/**
 * Runs of the workspace (optionally of one vehicle), newest first (then by id), with their step
 * counts: the latest 200, or one page of `page.limit` (keyset: after `page.after`).
 */
export async function listRuns(workspaceId: string, filter: RunFilter = {}, page?: RunPage) {
  const counts = db
    .select({
      runId: benchStepResult.runId,
      total: sql<number>`count(*)::int`.as("total"),
      done: sql<number>`count(${benchStepResult.outcome})::int`.as("done"),
      failed: sql<number>`count(*) filter (where ${benchStepResult.outcome} = 'fail')::int`.as("failed"),
      skipped: sql<number>`count(*) filter (where ${benchStepResult.outcome} = 'skip')::int`.as("skipped"),
    })
    .from(benchStepResult)
    .where(eq(benchStepResult.workspaceId, workspaceId))
    .groupBy(benchStepResult.runId)
    .as("counts");
  const rows = await db
    .select({
      id: benchRun.id,
      status: benchRun.status,
      startedAt: benchRun.startedAt,
      startKey,
      completedAt: benchRun.completedAt,
      vehicleId: vehicle.id,
      vehicleName: vehicle.name,
      designName: design.name,
      number: designRevision.number,
      startedByName: user.name,
      total: counts.total,
      done: counts.done,
      failed: counts.failed,
      skipped: counts.skipped,
    })
    .from(benchRun)
    .innerJoin(vehicle, runsVehicle)
    .innerJoin(designRevision, runsRevision)
    .innerJoin(design, revisionsDesign)
    .innerJoin(user, eq(user.id, benchRun.startedBy))
    .innerJoin(counts, eq(counts.runId, benchRun.id))
    .where(
      and(
        eq(benchRun.workspaceId, workspaceId),
        filter.vehicleId ? eq(benchRun.vehicleId, filter.vehicleId) : undefined,
        filter.status === "in-progress" || filter.status === "completed" ? eq(benchRun.status, filter.status) : undefined,
        filter.status === "failures" ? sql`${counts.failed} > 0` : undefined,
        page?.after ? sql`(${benchRun.startedAt}, ${benchRun.id}) < (${page.after.startKey}::timestamptz, ${page.after.id})` : undefined,
      ),
    )
    .orderBy(desc(benchRun.startedAt), desc(benchRun.id))
    .limit(page ? page.limit : 200);
  return rows;
}

export type RunSummary = Awaited<ReturnType<typeof listRuns>>[number];

/** One run with its plan, every step's result and photos; null when not in this workspace. */
export async function getRun(workspaceId: string, runId: string) {
  const rows = await db
    .select({
      run: benchRun,
      vehicleName: vehicle.name,
      vehicleSerial: vehicle.serial,
      designId: design.id,
      designName: design.name,
      number: designRevision.number,
      authorId: designRevision.authorId,
      startedByName: user.name,
      startedByEmail: user.email,
    })
    .from(benchRun)
    .innerJoin(vehicle, runsVehicle)
    .innerJoin(designRevision, runsRevision)
    .innerJoin(design, revisionsDesign)
    .innerJoin(user, eq(user.id, benchRun.startedBy))
    .where(and(eq(benchRun.id, runId), eq(benchRun.workspaceId, workspaceId)))
    .limit(1);
  const row = rows[0];
  if (!row) return null;
  const results = await db
    .select({
      id: benchStepResult.id,
      n: benchStepResult.n,
      outcome: benchStepResult.outcome,
      note: benchStepResult.note,
      updatedAt: benchStepResult.updatedAt,
      updatedByName: user.name,
      failureMailedAt: benchStepResult.failureMailedAt,
    })
    .from(benchStepResult)
    .leftJoin(user, eq(user.id, benchStepResult.updatedBy))
    .where(and(eq(benchStepResult.runId, runId), eq(benchStepResult.workspaceId, workspaceId)))
    .orderBy(asc(benchStepResult.n));
  const photos = results.length
    ? await db
        .select({
          id: upload.id,
          subjectId: upload.subjectId,
          filename: upload.filename,
          contentType: upload.contentType,
          sha256: upload.sha256,
          createdAt: upload.createdAt,
        })
        .from(upload)
        .where(
          and(
            eq(upload.workspaceId, workspaceId),
            eq(upload.subjectKind, STEP_PHOTO_KIND),
            inArray(
              upload.subjectId,
              results.map((r) => r.id),
            ),
          ),
        )
        .orderBy(asc(upload.createdAt), asc(upload.id))
    : [];
  let completedBy: { name: string; email: string } | null = null;
  if (row.run.completedBy) {
    const u = await db.select({ name: user.name, email: user.email }).from(user).where(eq(user.id, row.run.completedBy)).limit(1);
    completedBy = u[0] ?? null;
  }
  return {
    ...row,
    completedBy,
    results: results.map((r) => ({ ...r, photos: photos.filter((p) => p.subjectId === r.id) })),
  };
}

export type RunDetail = NonNullable<Awaited<ReturnType<typeof getRun>>>;

// ---------------------------------------------------------------- recording

type LockedRun = { id: string; status: string; vehicleId: string; revisionId: string; plan: BenchPlan };

async function lockRun(tx: Pick<typeof db, "select">, workspaceId: string, runId: string): Promise<LockedRun> {
  const rows = await tx
    .select({
      id: benchRun.id,
      status: benchRun.status,
      vehicleId: benchRun.vehicleId,
      revisionId: benchRun.revisionId,
      plan: benchRun.plan,
    })
    .from(benchRun)
    .where(and(eq(benchRun.id, runId), eq(benchRun.workspaceId, workspaceId)))
    .for("update");
  const run = rows[0];
  if (!run) throw new BenchRunError("run", "No such bench run.", 404);
  if (run.status === "completed")
    throw new BenchRunError("run", "This run is completed and signed; its results can no longer change.", 409);
  return run;
}

function checkStep(run: LockedRun, n: number): void {
  if (!Number.isInteger(n) || n < 1 || n > run.plan.steps.length) {
    throw new BenchRunError("step", `There is no step ${n} in this run (it has steps 1 to ${run.plan.steps.length}).`);
  }
}

/**
 * Saves a step's outcome (null clears it). A step turning to "fail" flags the vehicle. Its mail to the
 * revision's author waits until the technician moves on (records another step), asks for it, or
 * completes the run, so it carries the note and photos; each failed step is mailed once (decision 136).
 * The result is saved even if a mail cannot go.
 */
export async function setStepOutcome(
  workspaceId: string,
  runId: string,
  n: number,
  outcome: StepOutcome | null,
  actorId: string,
): Promise<{ mailed: boolean }> {
  await db.transaction(async (tx) => {
    const run = await lockRun(tx, workspaceId, runId);
    checkStep(run, n);
    const before = await tx
      .select({ outcome: benchStepResult.outcome })
      .from(benchStepResult)
      .where(and(eq(benchStepResult.runId, runId), eq(benchStepResult.workspaceId, workspaceId), eq(benchStepResult.n, n)));
    await tx
      .update(benchStepResult)
      .set({ outcome, updatedBy: actorId, updatedAt: new Date() })
      .where(and(eq(benchStepResult.runId, runId), eq(benchStepResult.workspaceId, workspaceId), eq(benchStepResult.n, n)));
    await recordAudit({ workspaceId, actorId, action: "bench-run.step-recorded", detail: { runId, step: n, outcome } }, tx);
    if (outcome !== "fail" || before[0]?.outcome === "fail") return;
    await raiseAttention(tx, {
      workspaceId,
      vehicleId: run.vehicleId,
      reason: `Bench step ${n} failed`,
      benchRunId: runId,
      stepNumber: n,
      actorId,
    });
  });
  // Moving on: the other failed steps are finished with (their note and photos are in).
  return { mailed: await mailFailedSteps(workspaceId, runId, actorId, { except: n }) };
}

/** Mails one failed step now, as it stands (the technician's "Send to the engineer now"). */
export async function mailStepNow(workspaceId: string, runId: string, n: number, actorId: string): Promise<{ mailed: boolean }> {
  await db.transaction(async (tx) => {
    const run = await lockRun(tx, workspaceId, runId);
    checkStep(run, n);
  });
  return { mailed: await mailFailedSteps(workspaceId, runId, actorId, { only: n }) };
}

type ClaimedStep = { id: string; n: number; note: string };

/**
 * Marks failed, not yet mailed steps as mailed and returns them; the mark is taken in one statement,
 * so two requests at once never both mail a step.
 */
async function claimFailedSteps(
  tx: Pick<typeof db, "update">,
  workspaceId: string,
  runId: string,
  which: { except?: number; only?: number },
): Promise<ClaimedStep[]> {
  const rows = await tx
    .update(benchStepResult)
    .set({ failureMailedAt: new Date() })
    .where(
      and(
        eq(benchStepResult.runId, runId),
        eq(benchStepResult.workspaceId, workspaceId),
        eq(benchStepResult.outcome, "fail"),
        isNull(benchStepResult.failureMailedAt),
        ...(which.except !== undefined ? [ne(benchStepResult.n, which.except)] : []),
        ...(which.only !== undefined ? [eq(benchStepResult.n, which.only)] : []),
      ),
    )
    .returning({ id: benchStepResult.id, n: benchStepResult.n, note: benchStepResult.note });
  return rows.sort((a, b) => a.n - b.n);
}

async function mailFailedSteps(
  workspaceId: string,
  runId: string,
  actorId: string,
  which: { except?: number; only?: number },
): Promise<boolean> {
  const claimed = await claimFailedSteps(db, workspaceId, runId, which);
  if (claimed.length === 0) return false;
  const sent = await mailFailures(workspaceId, runId, claimed, actorId, "steps");
  if (!sent) {
    // Not sent: let the next occasion try again.
    await db
      .update(benchStepResult)
      .set({ failureMailedAt: null })
      .where(
        and(
          eq(benchStepResult.workspaceId, workspaceId),
          inArray(
            benchStepResult.id,
            claimed.map((c) => c.id),
          ),
        ),
      )
      .catch(() => {});
  }
  return sent;
}

/** The most photo bytes one mail carries; past that the photos are named with a link to the run. */
const MAIL_ATTACHMENT_BYTES = 15 * 1024 * 1024;

async function photosOf(workspaceId: string, stepIds: string[]) {
  if (stepIds.length === 0) return [];
  return db
    .select({
      subjectId: upload.subjectId,
      storageKey: upload.storageKey,
      filename: upload.filename,
      contentType: upload.contentType,
      size: upload.size,
    })
    .from(upload)
    .where(and(eq(upload.workspaceId, workspaceId), eq(upload.subjectKind, STEP_PHOTO_KIND), inArray(upload.subjectId, stepIds)))
    .orderBy(asc(upload.createdAt), asc(upload.id));
}

async function readObject(key: string): Promise<Buffer> {
  const obj = await getObject(key);
  return Buffer.from(await new Response(obj.body).arrayBuffer());
}

/**
 * One mail to the revision's author about failed steps: one step ("steps" with one) or several
 * ("digest", when the run is completed), each with its instruction, what was expected, the note and
 * the photos attached, and the isolation caution.
 */
async function mailFailures(
  workspaceId: string,
  runId: string,
  steps: ClaimedStep[],
  actorId: string,
  kind: "steps" | "digest",
): Promise<boolean> {
  const rows = await db
    .select({
      authorEmail: user.email,
      authorName: user.name,
      vehicleName: vehicle.name,
      designName: design.name,
      number: designRevision.number,
      slug: workspace.slug,
      plan: benchRun.plan,
    })
    .from(benchRun)
    .innerJoin(designRevision, runsRevision)
    .innerJoin(design, revisionsDesign)
    .innerJoin(user, eq(user.id, designRevision.authorId))
    .innerJoin(vehicle, runsVehicle)
    .innerJoin(workspace, eq(workspace.id, benchRun.workspaceId))
    .where(and(eq(benchRun.id, runId), eq(benchRun.workspaceId, workspaceId)))
    .limit(1);
  const r = rows[0];
  if (!r) return false;
  try {
    const tech = (await db.select({ name: user.name }).from(user).where(eq(user.id, actorId)).limit(1))[0];
    const photos = await photosOf(
      workspaceId,
      steps.map((s) => s.id),
    );
    const attachments: Array<{ filename: string; content: Buffer; contentType: string }> = [];
    const notAttached: string[] = [];
    let bytes = 0;
    for (const p of photos) {
      if (bytes + p.size > MAIL_ATTACHMENT_BYTES) {
        notAttached.push(p.filename);
        continue;
      }
      attachments.push({ filename: p.filename, content: await readObject(p.storageKey), contentType: p.contentType });
      bytes += p.size;
    }
    const base = `${env.APP_URL}/w/${r.slug}/bench-tests/${runId}`;
    const blocks = steps.flatMap((st) => {
      const step = r.plan.steps.find((x) => x.n === st.n);
      const mine = photos.filter((p) => p.subjectId === st.id).map((p) => p.filename);
      return [
        `Step ${st.n}${step ? `: ${step.instruction}` : ""}`,
        ...(step ? [`Expected: ${describeExpected(step.expect)}`] : []),
        st.note.trim() ? `The technician's note: ${st.note.trim()}` : "The technician wrote no note.",
        mine.length > 0
          ? `Photos: ${mine.join(", ")}${mine.some((f) => notAttached.includes(f)) ? " (some too large to attach: open the run)" : " (attached)"}.`
          : "No photos were added.",
        `This step in the run: ${base}#step-${st.n}`,
      ];
    });
    const who = tech?.name ?? "A technician";
    const against = `revision ${r.number} of "${r.designName}", which you saved`;
    const subject =
      kind === "digest"
        ? `Bench test of ${r.vehicleName} completed: ${steps.length} failed step${steps.length > 1 ? "s" : ""} not yet reported`
        : steps.length === 1
          ? `Bench step ${steps[0].n} failed on ${r.vehicleName}`
          : `Bench steps ${steps.map((s) => s.n).join(", ")} failed on ${r.vehicleName}`;
    const intro =
      kind === "digest"
        ? `${who} completed the bench test of ${r.vehicleName} against ${against}. These failed steps had not been reported to you yet:`
        : `${who} marked ${steps.length === 1 ? `step ${steps[0].n}` : `steps ${steps.map((s) => s.n).join(", ")}`} as failed while bench-testing ${r.vehicleName} against ${against}.`;
    await sendMail({
      ...composeMail(
        r.authorEmail,
        subject,
        [
          `Hello ${r.authorName},`,
          intro,
          ...blocks,
          "The vehicle is flagged as needing attention until someone clears it.",
          `Caution: ${ISOLATE_FIRST} ${SAFETY_TEXT}`,
        ],
        { label: "Open the bench run", url: steps.length === 1 ? `${base}#step-${steps[0].n}` : base },
      ),
      attachments,
    });
    return true;
  } catch (err) {
    console.error("bench failure mail could not be sent", err);
    await recordAudit({
      workspaceId,
      actorId,
      action: "bench-run.mail-failed",
      detail: { runId, steps: steps.map((s) => s.n), to: r.authorEmail },
    });
    return false;
  }
}

function describeExpected(e: BenchPlan["steps"][number]["expect"]): string {
  const live = Object.entries(e.inputs)
    .filter(([, on]) => on)
    .map(([id]) => id);
  const dead = Object.entries(e.inputs)
    .filter(([, on]) => !on)
    .map(([id]) => id);
  return (
    [
      e.drive ? "drive runs" : "drive stays off",
      live.length ? `live: ${live.join(", ")}` : "",
      dead.length ? `dead: ${dead.join(", ")}` : "",
    ]
      .filter(Boolean)
      .join("; ") + "."
  );
}

export const NOTE_MAX = 2000;

export async function setStepNote(workspaceId: string, runId: string, n: number, note: string, actorId: string): Promise<void> {
  if (note.length > NOTE_MAX) throw new BenchRunError("note", `Use at most ${NOTE_MAX} characters.`);
  await db.transaction(async (tx) => {
    const run = await lockRun(tx, workspaceId, runId);
    checkStep(run, n);
    await tx
      .update(benchStepResult)
      .set({ note, updatedBy: actorId, updatedAt: new Date() })
      .where(and(eq(benchStepResult.runId, runId), eq(benchStepResult.workspaceId, workspaceId), eq(benchStepResult.n, n)));
  });
}

/** Attaches a photo to a step of a run in progress (stored through the shared upload module). */
export async function addStepPhoto(workspaceId: string, runId: string, n: number, file: FormDataEntryValue | null, actorId: string) {
  const step = await db.transaction(async (tx) => {
    const run = await lockRun(tx, workspaceId, runId);
    checkStep(run, n);
    const rows = await tx
      .select({ id: benchStepResult.id })
      .from(benchStepResult)
      .where(and(eq(benchStepResult.runId, runId), eq(benchStepResult.workspaceId, workspaceId), eq(benchStepResult.n, n)));
    return rows[0]!;
  });
  return saveUpload({ workspaceId, subjectKind: STEP_PHOTO_KIND, subjectId: step.id, file, userId: actorId, accept: STEP_PHOTOS });
}

// ---------------------------------------------------------------- the signed record

export const RECORD_FORMAT = "chainproof/bench-record@1";

/**
 * The content of a completed run that its results hash covers (decision 072): only what never
 * changes afterwards (ids, not names), and the photos stored up to the moment of completion.
 */
export function recordOf(run: RunDetail, completed: { by: string; at: Date }) {
  return {
    format: RECORD_FORMAT,
    run: run.run.id,
    workspace: run.run.workspaceId,
    vehicle: run.run.vehicleId,
    revision: { id: run.run.revisionId, contentHash: run.run.revisionHash },
    startedBy: run.run.startedBy,
    startedAt: run.run.startedAt.toISOString(),
    completedBy: completed.by,
    completedAt: completed.at.toISOString(),
    steps: run.run.plan.steps.map((s) => {
      const r = run.results.find((x) => x.n === s.n);
      return {
        n: s.n,
        set: s.set,
        expect: s.expect,
        outcome: r?.outcome ?? null,
        note: r?.note ?? "",
        photos: (r?.photos ?? []).filter((p) => p.createdAt <= completed.at).map((p) => p.sha256),
      };
    }),
  };
}

export function recordHash(record: ReturnType<typeof recordOf>): string {
  return contentHash(record);
}

/** Completes a run when every step has an outcome: fixes who and when and the hash of the record. */
export async function completeRun(workspaceId: string, runId: string, actorId: string): Promise<string> {
  let unreported: ClaimedStep[] = [];
  const hash = await db.transaction(async (tx) => {
    const run = await lockRun(tx, workspaceId, runId);
    const open = await tx
      .select({ n: benchStepResult.n })
      .from(benchStepResult)
      .where(and(eq(benchStepResult.runId, runId), eq(benchStepResult.workspaceId, workspaceId), sql`${benchStepResult.outcome} is null`))
      .orderBy(asc(benchStepResult.n));
    if (open.length > 0) {
      throw new BenchRunError(
        "run",
        `Mark every step before completing: step${open.length > 1 ? "s" : ""} ${open.map((o) => o.n).join(", ")} ${open.length > 1 ? "have" : "has"} no result yet (skip a step you cannot do).`,
        409,
      );
    }
    // Read inside the lock, so the hash covers exactly what is stored.
    const detail = await getRun(workspaceId, run.id);
    const at = new Date();
    const hash = recordHash(recordOf(detail!, { by: actorId, at }));
    // Failed steps not yet mailed go in one digest; marked before the record is frozen.
    unreported = await claimFailedSteps(tx, workspaceId, runId, {});
    await tx
      .update(benchRun)
      .set({ status: "completed", completedBy: actorId, completedAt: at, resultsHash: hash })
      .where(and(eq(benchRun.id, runId), eq(benchRun.workspaceId, workspaceId)));
    await recordAudit({ workspaceId, actorId, action: "bench-run.completed", detail: { runId, resultsHash: hash } }, tx);
    return hash;
  });
  if (unreported.length > 0) await mailFailures(workspaceId, runId, unreported, actorId, "digest");
  return hash;
}

/** Recomputes the hash of a completed run from what is stored, to show that the record is intact. */
export function verifyRecord(run: RunDetail): boolean | null {
  if (run.run.status !== "completed" || !run.run.completedAt || !run.run.completedBy) return null;
  const hash = recordHash(recordOf(run, { by: run.run.completedBy, at: run.run.completedAt }));
  return hash === run.run.resultsHash;
}

// ---------------------------------------------------------------- the author's home page

/**
 * Failed steps of bench runs on revisions `authorId` saved, while the vehicle's flag for that step is
 * still open (someone clears it with a note once it is dealt with); newest first.
 */
export async function failedStepsFor(workspaceId: string, authorId: string, limit = 50) {
  const { vehicleAttention } = schema;
  const rows = await db
    .select({
      runId: benchRun.id,
      n: benchStepResult.n,
      note: benchStepResult.note,
      failedAt: benchStepResult.updatedAt,
      vehicleId: vehicle.id,
      vehicleName: vehicle.name,
      designName: design.name,
      number: designRevision.number,
      plan: benchRun.plan,
    })
    .from(benchStepResult)
    .innerJoin(benchRun, and(eq(benchRun.id, benchStepResult.runId), eq(benchRun.workspaceId, benchStepResult.workspaceId)))
    .innerJoin(designRevision, runsRevision)
    .innerJoin(design, revisionsDesign)
    .innerJoin(vehicle, runsVehicle)
    .innerJoin(
      vehicleAttention,
      and(
        eq(vehicleAttention.workspaceId, benchRun.workspaceId),
        eq(vehicleAttention.benchRunId, benchRun.id),
        eq(vehicleAttention.stepNumber, benchStepResult.n),
        isNull(vehicleAttention.clearedAt),
      ),
    )
    .where(and(eq(benchStepResult.workspaceId, workspaceId), eq(benchStepResult.outcome, "fail"), eq(designRevision.authorId, authorId)))
    .orderBy(desc(benchStepResult.updatedAt), asc(benchStepResult.n))
    .limit(limit);
  return rows.map(({ plan, ...r }) => ({ ...r, instruction: plan.steps.find((s) => s.n === r.n)?.instruction ?? "" }));
}
