// Vehicles and bench runs as the API answers them; each view returns the type of its answer schema
// (app/api/answers.ts), so a field the schema does not describe does not compile.
import type { z } from "zod";
import type { listVehicles, openAttention, ReleaseSummary } from "~/vehicles/vehicles.server";
import { verifyRecord, type RunDetail, type RunSummary } from "~/bench-runs/bench-runs.server";
import type { Vehicle } from "~/db/schema.server";
import type {
  controllerRecordAnswer,
  controllerRecordDocumentSchema,
  releaseSchema,
  runSchema,
  runSummarySchema,
  vehicleSchema,
  vehicleSummarySchema,
} from "./answers";
import { CONTROLLER_CHECK_FORMAT } from "~/controller-record";
import type { recordWithStatus } from "~/vehicles/controller-records.server";
import { differenceInWords } from "~/vehicles/controller-status";
import { RECORD_CAUTION } from "~/components/controller-record/record-caution";

type Listed = Awaited<ReturnType<typeof listVehicles>>[number];
type Current = NonNullable<Listed["release"]>;

export function releaseJson(r: ReleaseSummary | Current): z.input<typeof releaseSchema> {
  return {
    id: r.id,
    revisionId: r.revisionId,
    designId: r.designId,
    designName: r.designName,
    number: r.number,
    contentHash: r.contentHash,
    at: r.at.toISOString(),
    note: r.note,
    releasedBy: { name: r.releasedByName },
  };
}

export function vehicleSummaryJson(v: Listed): z.input<typeof vehicleSummarySchema> {
  return {
    id: v.id,
    name: v.name,
    serial: v.serial,
    model: v.model,
    needsAttention: v.needsAttention,
    release: v.release ? releaseJson(v.release) : null,
  };
}

export function vehicleJson(
  v: Vehicle,
  history: ReleaseSummary[],
  attention: Awaited<ReturnType<typeof openAttention>>,
): z.input<typeof vehicleSchema> {
  return {
    id: v.id,
    name: v.name,
    serial: v.serial,
    model: v.model,
    controllerDescription: v.controllerDescription,
    notes: v.notes,
    createdAt: v.createdAt.toISOString(),
    updatedAt: v.updatedAt.toISOString(),
    needsAttention: attention.length > 0,
    release: history[0] ? releaseJson(history[0]) : null,
    releases: history.map(releaseJson),
    attention: attention.map((a) => ({
      id: a.id,
      reason: a.reason,
      benchRunId: a.benchRunId,
      step: a.stepNumber,
      raisedAt: a.raisedAt.toISOString(),
      raisedBy: a.raisedByName === null ? null : { name: a.raisedByName },
    })),
  };
}

export function runSummaryJson(r: RunSummary): z.input<typeof runSummarySchema> {
  return {
    id: r.id,
    status: r.status as "in-progress" | "completed",
    vehicle: { id: r.vehicleId, name: r.vehicleName },
    designName: r.designName,
    revision: r.number,
    startedAt: r.startedAt.toISOString(),
    startedBy: { name: r.startedByName },
    completedAt: r.completedAt?.toISOString() ?? null,
    steps: { total: r.total, done: r.done, failed: r.failed, skipped: r.skipped },
  };
}

export function runJson(run: RunDetail, slug: string): z.input<typeof runSchema> {
  const plan = run.run.plan;
  return {
    id: run.run.id,
    status: run.run.status as "in-progress" | "completed",
    vehicle: { id: run.run.vehicleId, name: run.vehicleName, serial: run.vehicleSerial },
    design: { id: run.designId, name: run.designName },
    revision: { id: run.run.revisionId, number: run.number, contentHash: run.run.revisionHash },
    startedAt: run.run.startedAt.toISOString(),
    startedBy: { name: run.startedByName },
    completedAt: run.run.completedAt?.toISOString() ?? null,
    completedBy: run.completedBy ? { name: run.completedBy.name } : null,
    resultsHash: run.run.resultsHash,
    intact: verifyRecord(run),
    start: plan.start,
    uncovered: plan.uncovered,
    steps: plan.steps.map((s) => {
      const r = run.results.find((x) => x.n === s.n);
      return {
        n: s.n,
        kind: s.kind,
        instruction: s.instruction,
        caution: s.caution ?? null,
        set: s.set,
        expect: s.expect,
        covers: s.covers,
        status: r?.outcome ?? null,
        note: r?.note ?? "",
        updatedAt: r?.updatedAt?.toISOString() ?? null,
        updatedBy: r?.updatedByName ? { name: r.updatedByName } : null,
        failureMailedAt: r?.failureMailedAt?.toISOString() ?? null,
        photos: (r?.photos ?? []).map((p) => ({
          id: p.id,
          filename: p.filename,
          contentType: p.contentType,
          url: `/w/${slug}/files/${p.id}`,
        })),
      };
    }),
  };
}

/** A vehicle's controller settings record as the API answers it. */
export function controllerRecordJson(r: Awaited<ReturnType<typeof recordWithStatus>>): z.input<typeof controllerRecordAnswer> {
  const version = (v: { version: number; recordedAt: Date; recordedBy: { id: string; name: string } }) => ({
    version: v.version,
    recordedAt: v.recordedAt.toISOString(),
    recordedBy: v.recordedBy,
  });
  const s = r.newestStatus;
  const chosen = r.chosen && r.chosenStatus?.derived ? { chosen: r.chosen, status: r.chosenStatus, derived: r.chosenStatus.derived } : null;
  return {
    record: chosen
      ? {
          ...version(chosen.chosen),
          document: chosen.chosen.document as z.input<typeof controllerRecordDocumentSchema>,
          check: {
            format: CONTROLLER_CHECK_FORMAT,
            derived: chosen.derived,
            findings: [...chosen.status.errors, ...chosen.status.warnings],
          },
        }
      : null,
    versions: r.history.map(version),
    proof: {
      state: s.state,
      holds: s.state === "holds" ? true : s.state === "does-not-hold" || s.state === "record-invalid" ? false : null,
      differences: differenceInWords(s),
    },
    caution: RECORD_CAUTION,
  };
}
