// One vehicle: its details, the revision released to it (and the history of releases), photos,
// "needs attention" flags, bench-test runs, and the ways into diagnosis and bench testing.
import { useState } from "react";
import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/vehicle";
import { requireCan } from "~/auth/context.server";
import { can, type Action } from "~/lib/roles";
import { fieldErrors, formObject, vehicleSchema, type FieldErrors } from "~/lib/forms";
import { useFormCheck } from "~/lib/use-form-check";
import { clearAttentionSchema, releaseSchema } from "~/vehicles/forms";
import {
  clearAttention,
  getVehicle,
  openAttention,
  releasableRevisions,
  releaseHistory,
  releaseRevision,
  updateVehicle,
} from "~/vehicles/vehicles.server";
import { BenchRunError, listRuns, startRun } from "~/bench-runs/bench-runs.server";
import { listUploads, readCappedFormData, saveUpload, UploadError } from "~/uploads/uploads.server";
import { acceptedWords, acceptOf, VEHICLE_FILES } from "~/uploads/kinds";
import { UploadForm } from "~/components/upload-form";
import { PageHeader } from "~/components/page-header";
import { SafetyNote } from "~/components/safety-note";
import { Button, Notice, SelectField, TextArea, TextField } from "~/components/ui/form";
import { HashPrefix, When } from "~/designs/design-bits";
import { RunList } from "~/components/diagnosis/run-list";
import { statusAgainstRevisions, vehicleControllerStatus } from "~/vehicles/controller-records.server";
import { differenceInWords, proofDoesNotHold } from "~/vehicles/controller-status";
import { ProofMark } from "~/components/controller-record/proof-mark";
import { standingsFor } from "~/designs/standing.server";
import { REFUSED_MARK } from "~/designs/standing-words";
import { RefusedBadge, RefusedNotice } from "~/components/refused-mark";
import { cardVariants } from "~/components/ui/card";
import { Badge } from "~/components/ui/badge";
import { ButtonLink } from "~/components/ui/link";

export async function loader({ params, context }: Route.LoaderArgs) {
  const m = requireCan(context, "workspace.view");
  const v = await getVehicle(m.workspace.id, params.vehicleId);
  if (!v) throw new Response("Not found", { status: 404 });
  const canRelease = can(m.role, "revision.release");
  const [photos, history, attention, runs, releasable, controller] = await Promise.all([
    listUploads(m.workspace.id, "vehicle", v.id),
    releaseHistory(m.workspace.id, v.id),
    openAttention(m.workspace.id, v.id),
    listRuns(m.workspace.id, { vehicleId: v.id }),
    canRelease ? releasableRevisions(m.workspace.id, v.id) : Promise.resolve([]),
    vehicleControllerStatus(m.workspace.id, v.id),
  ]);
  // Which revisions the controller record contradicts: releasing one of them needs a reason.
  const [against, standings] = await Promise.all([
    canRelease
      ? statusAgainstRevisions(
          m.workspace.id,
          v.id,
          releasable.map((r) => r.id),
        )
      : null,
    standingsFor(
      m.workspace.id,
      history.map((r) => r.revisionId),
    ),
  ]);
  const refusedOf = (revisionId: string) => {
    const st = standings.get(revisionId);
    return st && !st.passes ? st.reasons : null;
  };
  const conflictOf = (id: string) => {
    const s = against?.byRevision.get(id);
    return s && proofDoesNotHold(s) ? differenceInWords(s) : [];
  };
  return {
    slug: m.workspace.slug,
    canEdit: can(m.role, "vehicle.manage"),
    canRelease,
    canRunBench: can(m.role, "bench.run"),
    vehicle: { id: v.id, name: v.name, serial: v.serial, model: v.model, controllerDescription: v.controllerDescription, notes: v.notes },
    photos: photos.map((p) => ({ id: p.id, filename: p.filename, contentType: p.contentType, size: p.size })),
    releases: history.map((r) => ({ ...r, at: r.at.toISOString(), refused: refusedOf(r.revisionId) })),
    attention: attention.map((a) => ({ ...a, raisedAt: a.raisedAt.toISOString() })),
    runs: runs.map((r) => ({ ...r, startedAt: r.startedAt.toISOString(), completedAt: r.completedAt?.toISOString() ?? null })),
    releasable: releasable.map((r) => ({
      id: r.id,
      number: r.number,
      designName: r.designName,
      forThisVehicle: r.forThisVehicle,
      approval: r.approval,
      refused: r.refused,
      controllerConflicts: conflictOf(r.id),
    })),
    controller: {
      state: controller.status.state,
      mark: proofDoesNotHold(controller.status),
      differences: differenceInWords(controller.status),
      warnings: controller.status.warnings.length,
      latest: controller.latest
        ? {
            version: controller.latest.version,
            recordedAt: controller.latest.recordedAt.toISOString(),
            recordedBy: controller.latest.recordedBy.name,
          }
        : null,
    },
  };
}

type ActionResult = { intent: string; fields: FieldErrors; done?: string; contradictions?: string[]; revisionId?: string };

function fail(intent: string, fields: FieldErrors, status = 400, more: Partial<ActionResult> = {}) {
  return data<ActionResult>({ intent, fields, ...more }, { status });
}

export async function action({ request, params, context }: Route.ActionArgs) {
  // Photos: the only multipart form; the role is checked before the body is read.
  if ((request.headers.get("content-type") ?? "").startsWith("multipart/form-data")) {
    const m = requireCan(context, "vehicle.manage");
    const v = await getVehicle(m.workspace.id, params.vehicleId);
    if (!v) throw new Response("Not found", { status: 404 });
    try {
      const form = await readCappedFormData(request);
      if (form.get("intent") !== "upload-photo") return fail("upload-photo", { intent: "Unknown action." });
      await saveUpload({
        workspaceId: m.workspace.id,
        subjectKind: "vehicle",
        subjectId: v.id,
        file: form.get("file"),
        userId: m.user.id,
        accept: VEHICLE_FILES,
      });
      return { intent: "upload-photo", fields: {}, done: "Photo added." } satisfies ActionResult;
    } catch (err) {
      if (err instanceof UploadError) return fail("upload-photo", { [err.field]: err.message }, err.status);
      throw err;
    }
  }
  requireCan(context, "workspace.view");
  const form = formObject(await request.formData());
  const intent = form.intent ?? "";
  const needs: Record<string, Action> = {
    edit: "vehicle.manage",
    release: "revision.release",
    "start-bench-run": "bench.run",
    "clear-attention": "vehicle.manage",
  };
  const action = needs[intent];
  if (!action) return fail(intent, { intent: "Unknown action." });
  const m = requireCan(context, action);
  const v = await getVehicle(m.workspace.id, params.vehicleId);
  if (!v) throw new Response("Not found", { status: 404 });
  switch (intent) {
    case "edit": {
      const parsed = vehicleSchema.safeParse(form);
      if (!parsed.success) return fail(intent, fieldErrors(parsed.error));
      await updateVehicle(m.workspace.id, v.id, m.user.id, parsed.data);
      return { intent, fields: {}, done: "Details saved." } satisfies ActionResult;
    }
    case "release": {
      const parsed = releaseSchema.safeParse(form);
      if (!parsed.success) return fail(intent, fieldErrors(parsed.error));
      const out = await releaseRevision(m.workspace.id, v.id, m.user.id, parsed.data);
      if (!out.ok) return fail(intent, out.fields, 409, { contradictions: out.contradictions, revisionId: parsed.data.revisionId });
      return { intent, fields: {}, done: "Released." } satisfies ActionResult;
    }
    case "start-bench-run": {
      try {
        const runId = await startRun(m.workspace.id, v.id, m.user.id);
        return redirect(`/w/${m.workspace.slug}/bench-tests/${runId}`);
      } catch (err) {
        if (err instanceof BenchRunError) return fail(intent, { [err.field]: err.message }, err.status);
        throw err;
      }
    }
    case "clear-attention": {
      const parsed = clearAttentionSchema.safeParse(form);
      if (!parsed.success) return fail(intent, fieldErrors(parsed.error));
      await clearAttention(m.workspace.id, v.id, m.user.id, parsed.data.note);
      return { intent, fields: {}, done: "Cleared." } satisfies ActionResult;
    }
  }
  return fail(intent, { intent: "Unknown action." });
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.vehicle.name ?? "Vehicle"} · Chainproof` }];

const label = "text-xs font-medium uppercase tracking-wide text-ink-500";

export default function Vehicle({ loaderData, actionData }: Route.ComponentProps) {
  const { slug, vehicle: v, releases, attention, runs } = loaderData;
  const current = releases[0] ?? null;
  const result = actionData as ActionResult | undefined;
  const errorsOf = (intent: string) => (result?.intent === intent ? result.fields : undefined);
  const busy = useNavigation().state === "submitting";
  return (
    <>
      <p className="mb-2 text-sm">
        <Link to=".." relative="path" className="text-copper-700 underline">
          All vehicles
        </Link>
      </p>
      <PageHeader
        title={v.name}
        description={[v.model, v.serial].filter(Boolean).join(" · ")}
        actions={
          attention.length > 0 ? (
            <Badge tone="failing-solid" size="md" data-testid="needs-attention">
              Needs attention
            </Badge>
          ) : null
        }
      />

      <div className="grid max-w-3xl gap-6">
        <div className="flex flex-wrap gap-3">
          <ButtonLink to="why" variant="action" size="lg">
            Why won't it drive?
          </ButtonLink>
          {loaderData.canRunBench && current ? (
            <Form method="post">
              <input type="hidden" name="intent" value="start-bench-run" />
              <Button type="submit" tone="secondary" className="min-h-12 text-base" disabled={busy}>
                Start a bench test
              </Button>
            </Form>
          ) : null}
        </div>
        {errorsOf("start-bench-run") ? <Notice tone="error">{Object.values(errorsOf("start-bench-run")!)[0]}</Notice> : null}
        {/* A form this page does not have (a forged or stale intent): no field of it to mark. */}
        {result?.fields.intent ? <Notice tone="error">{result.fields.intent}</Notice> : null}

        {loaderData.controller.mark ? <ProofMark differences={loaderData.controller.differences} to="controller" /> : null}

        {attention.length > 0 ? (
          <section className="rounded-lg border-2 border-brick-600 bg-brick-50 p-5" aria-labelledby="attention-h">
            <h2 id="attention-h" className="font-semibold text-brick-700">
              Needs attention
            </h2>
            <ul className="mt-2 space-y-1 text-sm">
              {attention.map((a) => (
                <li key={a.id}>
                  {a.reason}
                  {a.benchRunId ? (
                    <>
                      {" "}
                      in{" "}
                      <Link className="underline" to={`/w/${slug}/bench-tests/${a.benchRunId}#step-${a.stepNumber}`}>
                        this bench run
                      </Link>
                    </>
                  ) : null}{" "}
                  · {a.raisedByName ?? "someone"}, <When iso={a.raisedAt} />
                </li>
              ))}
            </ul>
            {loaderData.canEdit ? (
              <Form method="post" className="mt-4 space-y-3">
                <input type="hidden" name="intent" value="clear-attention" />
                <TextArea label="What was done (clears the flag)" name="note" rows={2} error={errorsOf("clear-attention")?.note} />
                <Button type="submit" tone="secondary" disabled={busy}>
                  Clear the flag
                </Button>
              </Form>
            ) : null}
          </section>
        ) : null}

        <section className={cardVariants({ padding: "lg" })} aria-labelledby="release-h">
          <h2 id="release-h" className="font-semibold">
            Released design
          </h2>
          {current ? (
            <p className="mt-2" data-testid="current-release">
              Revision {current.number} of{" "}
              <Link className="font-medium underline" to={`/w/${slug}/designs/${current.designId}`}>
                {current.designName}
              </Link>{" "}
              <HashPrefix hash={current.contentHash} />
              {current.refused ? <RefusedBadge reasons={current.refused} className="ml-2" /> : null}
              <span className="block text-sm text-ink-600">
                Released by {current.releasedByName}, <When iso={current.at} />
                {current.note ? ` — ${current.note}` : ""}
              </span>
            </p>
          ) : (
            <p className="mt-2 text-sm text-ink-600">No revision is released to this vehicle yet.</p>
          )}
          {current?.refused ? <RefusedNotice reasons={current.refused} className="mt-3" /> : null}
          {releases.length > 1 ? (
            <details className="mt-3 text-sm">
              <summary className="cursor-pointer font-medium">Earlier releases ({releases.length - 1})</summary>
              <ul className="mt-2 space-y-1">
                {releases.slice(1).map((r) => (
                  <li key={r.id}>
                    Revision {r.number} of {r.designName} · {r.releasedByName}, <When iso={r.at} />
                    {r.refused ? <RefusedBadge reasons={r.refused} className="ml-2" /> : null}
                    {r.note ? ` — ${r.note}` : ""}
                  </li>
                ))}
              </ul>
            </details>
          ) : null}
          {loaderData.canRelease ? (
            <ReleaseForm
              releasable={loaderData.releasable}
              errors={errorsOf("release")}
              contradictions={result?.intent === "release" ? result.contradictions : undefined}
              chosen={result?.intent === "release" ? result.revisionId : undefined}
              busy={busy}
            />
          ) : null}
        </section>

        <ControllerSection controller={loaderData.controller} />

        <section className={cardVariants({ padding: "lg" })} aria-labelledby="runs-h">
          <h2 id="runs-h" className="font-semibold">
            Bench tests
          </h2>
          <RunList slug={slug} runs={runs} showVehicle={false} empty="No bench test has been run on this vehicle." />
        </section>

        <section className={cardVariants({ padding: "lg" })}>
          <h2 className="font-semibold">Details</h2>
          <dl className="mt-3 grid gap-4 sm:grid-cols-2">
            <div>
              <dt className={label}>Serial or VIN</dt>
              <dd className="mt-1">{v.serial || "—"}</dd>
            </div>
            <div>
              <dt className={label}>Model</dt>
              <dd className="mt-1">{v.model || "—"}</dd>
            </div>
            <div className="sm:col-span-2">
              <dt className={label}>Motor controller</dt>
              <dd className="mt-1 whitespace-pre-wrap">{v.controllerDescription || "—"}</dd>
            </div>
            <div className="sm:col-span-2">
              <dt className={label}>Notes</dt>
              <dd className="mt-1 whitespace-pre-wrap">{v.notes || "—"}</dd>
            </div>
          </dl>
          {loaderData.canEdit ? (
            <EditForm vehicle={v} errors={errorsOf("edit")} busy={busy} saved={result?.intent === "edit" && !!result.done} />
          ) : null}
        </section>

        <section className={cardVariants({ padding: "lg" })}>
          <h2 className="font-semibold">Photos and documents</h2>
          {loaderData.photos.length === 0 ? (
            <p className="mt-2 text-sm text-ink-600">None yet.</p>
          ) : (
            <ul className="mt-3 grid grid-cols-2 gap-3 sm:grid-cols-3">
              {loaderData.photos.map((p) => (
                <li key={p.id}>
                  <a href={`/w/${slug}/files/${p.id}`} className="block rounded-md border border-ink-200 p-1 hover:border-copper-500">
                    {p.contentType.startsWith("image/") ? (
                      <img
                        src={`/w/${slug}/files/${p.id}`}
                        alt={p.filename}
                        className="aspect-square w-full rounded object-cover"
                        loading="lazy"
                      />
                    ) : (
                      <span className="flex aspect-square items-center justify-center text-sm text-ink-600">PDF</span>
                    )}
                    <span className="mt-1 block truncate text-xs text-ink-600">{p.filename}</span>
                  </a>
                </li>
              ))}
            </ul>
          )}
          {loaderData.canEdit ? (
            <div className="mt-4">
              <UploadForm
                intent="upload-photo"
                label={`Add a photo or document: ${acceptedWords(VEHICLE_FILES)}, up to 20 MB`}
                accept={acceptOf(VEHICLE_FILES)}
                error={errorsOf("upload-photo")?.file}
              />
            </div>
          ) : null}
        </section>
        <SafetyNote />
      </div>
    </>
  );
}

type Releasable = Route.ComponentProps["loaderData"]["releasable"][number];

function ReleaseForm({
  releasable,
  errors,
  contradictions,
  chosen,
  busy,
}: {
  releasable: Releasable[];
  errors?: FieldErrors;
  contradictions?: string[];
  chosen?: string;
  busy: boolean;
}) {
  const { errors: shown, onSubmit } = useFormCheck(releaseSchema, errors);
  const [selected, setSelected] = useState(chosen ?? "");
  if (releasable.length === 0)
    return <p className="mt-4 text-sm text-ink-600">No design in this workspace has a saved revision to release yet.</p>;
  const conflicts = releasable.find((r) => r.id === selected)?.controllerConflicts ?? contradictions ?? [];
  return (
    <Form method="post" className="mt-5 space-y-3 border-t border-ink-200 pt-4" onSubmit={onSubmit} noValidate>
      <input type="hidden" name="intent" value="release" />
      <h3 className="text-sm font-semibold">Release a revision to this vehicle</h3>
      <p className="text-xs text-ink-600">Only a revision a reviewer has approved, and that passes design format 1.1, can be released.</p>
      <SelectField
        label="Revision"
        name="revisionId"
        value={selected}
        onChange={(e) => setSelected(e.target.value)}
        error={shown.revisionId}
      >
        <option value="" disabled>
          Choose a revision
        </option>
        {releasable.map((r) => (
          <option key={r.id} value={r.id} disabled={r.approval !== "approved" || r.refused !== null}>
            {r.designName} · revision {r.number}
            {r.refused ? ` · ${REFUSED_MARK.toLowerCase()}: cannot be released` : ""}
            {r.approval === "approved" ? " · approved" : " · not approved"}
            {r.forThisVehicle ? "" : " (design for another vehicle)"}
            {r.controllerConflicts.length > 0 ? " · contradicted by the controller record" : ""}
          </option>
        ))}
      </SelectField>
      <TextField label="Note (optional)" name="note" error={shown.note} />
      {conflicts.length > 0 || shown.override ? (
        <div className="space-y-2 rounded-md border-2 border-brick-600 bg-brick-50 p-3" data-testid="release-override">
          <p className="text-sm font-semibold text-brick-700">The vehicle's controller settings record contradicts this revision:</p>
          <ul className="list-disc pl-5 text-sm text-brick-700">
            {conflicts.map((c) => (
              <li key={c}>{c}</li>
            ))}
          </ul>
          <TextArea
            label="Reason to release it anyway (kept in the audit log)"
            name="override"
            rows={2}
            error={shown.override}
            hint="For example: the controller is being reprogrammed before the vehicle returns to service."
          />
        </div>
      ) : null}
      <Button type="submit" disabled={busy}>
        {conflicts.length > 0 ? "Release over these findings" : "Release"}
      </Button>
    </Form>
  );
}

function ControllerSection({ controller }: { controller: Route.ComponentProps["loaderData"]["controller"] }) {
  const { latest, state } = controller;
  return (
    <section className={cardVariants({ padding: "lg" })} aria-labelledby="controller-h">
      <h2 id="controller-h" className="font-semibold">
        Controller settings
      </h2>
      <p className="mt-2 text-sm" data-testid="controller-summary">
        {latest ? (
          <>
            Version {latest.version}, recorded by {latest.recordedBy}, <When iso={latest.recordedAt} />.{" "}
            {state === "holds"
              ? "The released revision's assumptions agree with it."
              : state === "no-release"
                ? "No revision is released to check it against."
                : controller.mark
                  ? "The released proof does not hold for it (see above)."
                  : ""}
            {controller.warnings > 0 ? ` ${controller.warnings} warning${controller.warnings === 1 ? "" : "s"}.` : ""}
          </>
        ) : (
          "Not recorded yet: the released proof's assumptions about the controller (lockouts, brake, throttle) are unchecked."
        )}
      </p>
      <p className="mt-1 text-xs text-ink-600">What a technician entered, not what the controller holds: verify on the vehicle.</p>
      <ButtonLink to="controller" variant="secondary" size="lg" className="mt-3">
        {latest ? "Controller settings and versions" : "Record the controller settings"}
      </ButtonLink>
    </section>
  );
}

function EditForm({
  vehicle: v,
  errors,
  busy,
  saved,
}: {
  vehicle: Route.ComponentProps["loaderData"]["vehicle"];
  errors?: FieldErrors;
  busy: boolean;
  saved: boolean;
}) {
  const { errors: shown, onSubmit } = useFormCheck(vehicleSchema, errors);
  const open = Object.keys(shown).length > 0;
  return (
    <details className="mt-4 border-t border-ink-200 pt-4" open={open}>
      <summary className="cursor-pointer text-sm font-semibold">Edit details</summary>
      {saved ? <p className="mt-2 text-sm text-moss-700">Details saved.</p> : null}
      <Form method="post" className="mt-3 space-y-4" onSubmit={onSubmit} noValidate>
        <input type="hidden" name="intent" value="edit" />
        <TextField label="Name" name="name" required defaultValue={v.name} error={shown.name} />
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField label="Serial or VIN" name="serial" defaultValue={v.serial} error={shown.serial} />
          <TextField label="Model" name="model" defaultValue={v.model} error={shown.model} />
        </div>
        <TextArea
          label="Motor controller (free text)"
          name="controllerDescription"
          rows={2}
          defaultValue={v.controllerDescription}
          error={shown.controllerDescription}
        />
        <TextArea label="Notes" name="notes" rows={3} defaultValue={v.notes} error={shown.notes} />
        <Button type="submit" disabled={busy}>
          Save details
        </Button>
      </Form>
    </details>
  );
}
