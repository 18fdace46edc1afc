// One bench-test run, made for a phone on the bench: each step says what to set and what must
// happen; every tap (pass, fail, skip), note and photo is saved at once, so a reload or a phone that
// slept shows the same progress. Progress is live (swr over GET /api/v1/bench-runs/:runId, every 10 s
// and on focus, so two technicians see each other's taps); a tap shows at once and is saved through
// PUT /api/v1/bench-runs/:runId/steps/:n, rolled back with a message if it fails. Clearing a result,
// notes and photos go through this route's action. A completed run is a signed, printable record.
import "~/components/diagnosis/bench-print.css";
import { useEffect } from "react";
import { data, Link, useNavigation, useRevalidator } from "react-router";
import type { Route } from "./+types/bench-run";
import { requireCan } from "~/auth/context.server";
import { can } from "~/lib/roles";
import { fieldErrors, type FieldErrors } from "~/lib/forms";
import {
  addStepPhoto,
  BenchRunError,
  completeRun,
  getRun,
  mailStepNow,
  setStepNote,
  setStepOutcome,
  verifyRecord,
} from "~/bench-runs/bench-runs.server";
import { runFormSchema } from "~/bench-runs/outcomes";
import { liveFromApi, progressOf, type LiveStep } from "~/bench-runs/live";
import { StepCard, type ActionResult } from "~/components/bench-runs/step-card";
import { useLiveRun } from "~/components/bench-runs/use-live-run";
import { CompleteRunForm, NotChecked, RunBanner, SignedRecord } from "~/components/bench-runs/run-sections";
import { runJson } from "~/api/views.server";
import { readCappedFormData, UploadError } from "~/uploads/uploads.server";
import { PageHeader } from "~/components/page-header";
import { SafetyNote } from "~/components/safety-note";
import { Card } from "~/components/ui/card";
import { HashPrefix, When } from "~/designs/design-bits";
import { RunBadge } from "~/components/diagnosis/run-list";

export async function loader({ params, context }: Route.LoaderArgs) {
  const m = requireCan(context, "workspace.view");
  const run = await getRun(m.workspace.id, params.runId);
  if (!run) throw new Response("Not found", { status: 404 });
  const plan = run.run.plan;
  return {
    slug: m.workspace.slug,
    canRecord: can(m.role, "bench.run") && run.run.status === "in-progress",
    run: {
      id: run.run.id,
      status: run.run.status,
      vehicleId: run.run.vehicleId,
      vehicleName: run.vehicleName,
      vehicleSerial: run.vehicleSerial,
      designId: run.designId,
      designName: run.designName,
      number: run.number,
      revisionHash: run.run.revisionHash,
      startedAt: run.run.startedAt.toISOString(),
      startedByName: run.startedByName,
      completedAt: run.run.completedAt?.toISOString() ?? null,
      completedBy: run.completedBy,
      resultsHash: run.run.resultsHash,
      intact: verifyRecord(run),
    },
    plan: { start: plan.start, uncovered: plan.uncovered, stats: plan.stats },
    // What a step asks for (frozen with the run); its result lives in `live`.
    steps: plan.steps,
    // The same shape the page's swr reads from the API, so the first paint needs no request.
    live: liveFromApi(runJson(run, m.workspace.slug)),
  };
}

function failure(fields: FieldErrors, status: number, step?: number) {
  return data<ActionResult>({ ok: false, fields, step }, { status });
}

export async function action({ request, params, context }: Route.ActionArgs) {
  const m = requireCan(context, "bench.run");
  try {
    if ((request.headers.get("content-type") ?? "").startsWith("multipart/form-data")) {
      const form = await readCappedFormData(request);
      const step = Number(form.get("step"));
      if (form.get("intent") !== "photo") return failure({ intent: "Unknown action." }, 400);
      await addStepPhoto(m.workspace.id, params.runId, step, form.get("file"), m.user.id);
      return { ok: true, fields: {}, step } satisfies ActionResult;
    }
    const raw = Object.fromEntries([...(await request.formData())].filter(([, v]) => typeof v === "string"));
    const parsed = runFormSchema.safeParse(raw);
    if (!parsed.success) return failure(fieldErrors(parsed.error), 400);
    const input = parsed.data;
    switch (input.intent) {
      case "outcome":
        await setStepOutcome(m.workspace.id, params.runId, input.step, input.outcome === "" ? null : input.outcome, m.user.id);
        return { ok: true, fields: {}, step: input.step } satisfies ActionResult;
      case "note":
        await setStepNote(m.workspace.id, params.runId, input.step, input.note, m.user.id);
        return { ok: true, fields: {}, step: input.step } satisfies ActionResult;
      case "mail-step":
        await mailStepNow(m.workspace.id, params.runId, input.step, m.user.id);
        return { ok: true, fields: {}, step: input.step } satisfies ActionResult;
      case "complete":
        await completeRun(m.workspace.id, params.runId, m.user.id);
        return { ok: true, fields: {} } satisfies ActionResult;
    }
  } catch (err) {
    if (err instanceof BenchRunError) {
      if (err.status === 404) throw new Response("Not found", { status: 404 });
      return failure({ [err.field]: err.message }, err.status);
    }
    if (err instanceof UploadError) return failure({ [err.field]: err.message }, err.status);
    throw err;
  }
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Bench test · ${data?.run.vehicleName ?? ""} · Chainproof` }];

export default function BenchRun({ loaderData, actionData }: Route.ComponentProps) {
  const { run, plan, steps, slug } = loaderData;
  const live = useLiveRun(run.id, loaderData.live, run.status);
  // A run completed elsewhere: no more taps here, and the loader brings its signed record.
  const canRecord = loaderData.canRecord && live.run.status === "in-progress";
  const revalidator = useRevalidator();
  useEffect(() => {
    if (live.run.status === "completed" && run.status !== "completed" && revalidator.state === "idle") void revalidator.revalidate();
  }, [live.run.status, run.status, revalidator]);
  const results = live.run.steps;
  const resultOf = (n: number): LiveStep =>
    results.find((r) => r.n === n) ?? {
      n,
      outcome: null,
      note: "",
      updatedAt: null,
      updatedByName: null,
      failureMailedAt: null,
      photos: [],
    };
  const { done, failed } = progressOf(results);
  const busy = useNavigation().state === "submitting";
  const completeError = actionData && !actionData.ok && actionData.step === undefined ? Object.values(actionData.fields)[0] : null;
  return (
    <div className="mx-auto max-w-3xl">
      <p className="mb-2 flex flex-wrap items-center gap-x-2 text-base print:hidden" data-testid="breadcrumbs">
        <Link to={`/w/${slug}/bench-tests`} className="inline-flex min-h-11 items-center text-copper-700 underline">
          All bench tests
        </Link>{" "}
        ·{" "}
        <Link to={`/w/${slug}/vehicles/${run.vehicleId}`} className="inline-flex min-h-11 items-center text-copper-700 underline">
          {run.vehicleName}
        </Link>
      </p>
      <PageHeader
        title={`Bench test: ${run.vehicleName}`}
        description={
          <>
            Revision {run.number} of {run.designName} <HashPrefix hash={run.revisionHash} /> · started by {run.startedByName},{" "}
            <When iso={run.startedAt} />
          </>
        }
        actions={<RunBadge run={{ status: live.run.status, failed }} />}
      />
      <SafetyNote className="mb-4" />

      {run.status === "completed" ? <SignedRecord run={run} /> : <RunBanner done={done} total={steps.length} failed={failed} />}

      <Card as="section" className="mb-4">
        <h2 className="font-semibold">Before step 1</h2>
        <p className="mt-1">{plan.start.instruction}</p>
      </Card>

      <div className="space-y-4">
        {steps.map((s) => (
          <StepCard
            key={s.n}
            step={s}
            result={resultOf(s.n)}
            slug={slug}
            canRecord={canRecord}
            putting={(live.putting[s.n] ?? 0) > 0}
            tapError={live.errors[s.n] ?? null}
            onOutcome={live.record}
          />
        ))}
      </div>

      <NotChecked uncovered={plan.uncovered} />

      <p className="mt-6 print:hidden">
        <a
          href={`/w/${slug}/bench-tests/${run.id}/results.csv`}
          className="inline-flex min-h-11 items-center text-base text-copper-700 underline"
          download
        >
          Download the results (CSV)
        </a>
      </p>

      {canRecord ? <CompleteRunForm done={done} total={steps.length} busy={busy} error={completeError ?? null} /> : null}
    </div>
  );
}
