// One bench-test run, made for a phone on the bench: each step says what to set and what must
// happen; every tap (pass, fail, skip), note and photo is saved at once, so a reload or a phone that
// slept shows the same progress. Progress is live (swr over GET /api/v1/bench-runs/:runId, every 10 s
// and on focus, so two technicians see each other's taps); a tap shows at once and is saved through
// PUT /api/v1/bench-runs/:runId/steps/:n, rolled back with a message if it fails. Clearing a result,
// notes and photos go through this route's action. A completed run is a signed, printable record.
import "~/components/diagnosis/bench-print.css";
import { useCallback, useEffect, useRef, useState } from "react";
import { data, Form, Link, useFetcher, useFetchers, useNavigation, useRevalidator } from "react-router";
import useSWR from "swr";
import type { Route } from "./+types/bench-run";
import { requireCan } from "~/auth/context.server";
import { can } from "~/lib/roles";
import { fieldErrors, type FieldErrors } from "~/lib/forms";
import { addStepPhoto, BenchRunError, completeRun, getRun, mailStepNow, setStepNote, setStepOutcome, verifyRecord } from "~/bench-runs/bench-runs.server";
import { OUTCOME_LABELS, runFormSchema, STEP_OUTCOMES, type StepOutcome } from "~/bench-runs/outcomes";
import { fetchLiveRun, liveFromApi, progressOf, putStepOutcome, runApiPath, withOutcome, withStep, type LiveRun, type LiveStep } from "~/bench-runs/live";
import { runJson } from "~/api/views.server";
import { readCappedFormData, UploadError } from "~/uploads/uploads.server";
import { acceptedWords, acceptOf, STEP_PHOTOS } from "~/uploads/kinds";
import { PageHeader } from "~/components/page-header";
import { SafetyNote } from "~/components/safety-note";
import { Button, Notice } from "~/components/ui/form";
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

type ActionResult = { ok: boolean; fields: FieldErrors; step?: number };

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

type Step = Route.ComponentProps["loaderData"]["steps"][number];

const OUTCOME_STYLE: Record<StepOutcome, string> = {
  pass: "border-moss-600 bg-moss-600 text-white",
  fail: "border-brick-600 bg-brick-600 text-white",
  skip: "border-ink-700 bg-ink-700 text-white",
};

function Expect({ step }: { step: Step }) {
  const live = Object.entries(step.expect.inputs).filter(([, on]) => on).map(([id]) => id);
  const dead = Object.entries(step.expect.inputs).filter(([, on]) => !on).map(([id]) => id);
  return (
    <div className="mt-3 rounded-md bg-ink-50 p-3 text-sm">
      <p className={`font-semibold ${step.expect.drive ? "text-moss-700" : "text-brick-700"}`}>{step.expect.drive ? "Drive must run" : "Drive must stay off"}</p>
      <p className="mt-1">
        {live.length ? (
          <>
            Live: <span className="font-mono">{live.join(", ")}</span>.{" "}
          </>
        ) : null}
        {dead.length ? (
          <>
            Dead: <span className="font-mono">{dead.join(", ")}</span>.
          </>
        ) : null}
      </p>
    </div>
  );
}

type CardProps = {
  step: Step;
  result: LiveStep;
  slug: string;
  canRecord: boolean;
  /** A PUT of this step's result is on its way. */
  putting: boolean;
  /** Why the last tap was not saved (it was rolled back). */
  tapError: string | null;
  onOutcome: (n: number, outcome: StepOutcome) => void;
};

// The fetcher that clears a step's result (the API records pass, fail or skip only); the page reads
// its pending form too, so progress counts a clear at once.
const clearKey = (n: number) => `outcome-${n}`;

function StepCard({ step, result, slug, canRecord, putting, tapError, onOutcome }: CardProps) {
  const outcomeFetcher = useFetcher<ActionResult>({ key: clearKey(step.n) });
  const noteFetcher = useFetcher<ActionResult>({ key: `note-${step.n}` });
  const photoFetcher = useFetcher<ActionResult>({ key: `photo-${step.n}` });
  const mailFetcher = useFetcher<ActionResult>({ key: `mail-${step.n}` });
  // `result` already carries an optimistic tap and a pending clear.
  const outcome = result.outcome;
  const [note, setNote] = useState(result.note);
  // What the server holds; a pending save counts as saved so the button does not invite a second one.
  const pendingNote = noteFetcher.formData?.get("note");
  const [savedNote, setSavedNote] = useState(result.note);
  useEffect(() => setSavedNote(result.note), [result.note]);
  const noteSaved = note === (typeof pendingNote === "string" ? pendingNote : savedNote);
  const saveNote = () => {
    if (noteSaved) return;
    noteFetcher.submit({ intent: "note", step: String(step.n), note }, { method: "post" });
  };
  const clearError = outcomeFetcher.state === "idle" && outcomeFetcher.data?.ok === false ? Object.values(outcomeFetcher.data.fields)[0] : null;
  const error = tapError ?? clearError;
  const noteError = noteFetcher.data?.ok === false ? Object.values(noteFetcher.data.fields)[0] : null;
  const photoError = photoFetcher.data?.ok === false ? Object.values(photoFetcher.data.fields)[0] : null;
  const saving = putting || outcomeFetcher.state !== "idle" || noteFetcher.state !== "idle" || photoFetcher.state !== "idle";
  return (
    <article
      id={`step-${step.n}`}
      data-step={step.n}
      data-outcome={outcome ?? "none"}
      className={`scroll-mt-20 rounded-lg border bg-white p-4 ${outcome === "fail" ? "border-brick-600" : outcome === "pass" ? "border-moss-600" : "border-ink-200"}`}
    >
      <div className="flex items-start justify-between gap-2">
        <h3 className="text-lg font-semibold">
          Step {step.n}
          {step.kind === "sequence" ? <span className="ml-2 text-sm font-normal text-ink-600">(lockout sequence)</span> : null}
        </h3>
        <span className="text-xs text-ink-500" aria-live="polite">
          {saving ? "Saving…" : result.updatedAt ? "Saved" : ""}
        </span>
      </div>
      {step.caution ? <p className="mt-2 rounded-md bg-copper-50 px-3 py-2 text-sm font-medium text-copper-700">{step.caution}</p> : null}
      <p className="mt-2">{step.instruction}</p>
      <details className="mt-2 text-sm">
        <summary className="cursor-pointer text-ink-600">Every condition in this step</summary>
        <ul className="mt-1 grid grid-cols-2 gap-x-3 font-mono text-xs">
          {Object.entries(step.set).map(([k, v]) => (
            <li key={k}>
              {k}: {v}
            </li>
          ))}
        </ul>
      </details>
      <Expect step={step} />

      {canRecord ? (
        <div className="mt-4 grid grid-cols-3 gap-2 print:hidden" role="group" aria-label={`Result of step ${step.n}`}>
          {STEP_OUTCOMES.map((o) => (
            <button
              key={o}
              type="button"
              aria-pressed={outcome === o}
              onClick={() =>
                outcome === o
                  ? outcomeFetcher.submit({ intent: "outcome", step: String(step.n), outcome: "" }, { method: "post" })
                  : onOutcome(step.n, o)
              }
              className={`min-h-12 rounded-md border text-base font-semibold ${outcome === o ? OUTCOME_STYLE[o] : "border-ink-300 bg-white text-ink-800 hover:bg-ink-100"}`}
            >
              {OUTCOME_LABELS[o]}
            </button>
          ))}
        </div>
      ) : (
        <p className="mt-3 text-sm font-semibold">Result: {outcome ? OUTCOME_LABELS[outcome] : "not recorded"}</p>
      )}
      {error ? (
        <p role="alert" className="mt-2 text-sm text-brick-700">
          {error}
        </p>
      ) : null}

      {canRecord ? (
        <div className="mt-3 print:hidden">
          <label htmlFor={`note-${step.n}`} className="block text-sm font-medium text-ink-700">
            Note
          </label>
          <textarea
            id={`note-${step.n}`}
            rows={2}
            value={note}
            onChange={(e) => setNote(e.target.value)}
            onBlur={saveNote}
            maxLength={2000}
            className="mt-1 block w-full rounded-md border border-ink-300 px-3 py-2 text-base"
          />
          <Button type="button" tone="secondary" className="mt-2" onClick={saveNote} disabled={noteSaved}>
            Save note
          </Button>
          {noteError ? <p className="mt-1 text-sm text-brick-700">{noteError}</p> : null}
        </div>
      ) : result.note ? (
        <p className="mt-2 whitespace-pre-wrap text-sm">Note: {result.note}</p>
      ) : null}
      {canRecord && result.note ? <p className="hidden whitespace-pre-wrap text-sm print:block">Note: {result.note}</p> : null}

      {result.photos.length > 0 ? (
        <ul className="mt-3 flex flex-wrap gap-2">
          {result.photos.map((p) => (
            <li key={p.id}>
              <a href={`/w/${slug}/files/${p.id}`} className="block">
                {p.contentType.startsWith("image/") ? (
                  <img src={`/w/${slug}/files/${p.id}`} alt={p.filename} className="h-20 w-20 rounded object-cover" />
                ) : (
                  <span className="flex h-20 w-20 items-center justify-center rounded border text-xs">PDF</span>
                )}
              </a>
            </li>
          ))}
        </ul>
      ) : null}
      {outcome === "fail" ? (
        <div className="mt-3 rounded-md bg-brick-50 px-3 py-2 text-base text-brick-700" data-testid="failure-mail" data-mailed={result.failureMailedAt ? "yes" : "no"}>
          {result.failureMailedAt ? (
            <p>The design's engineer was mailed about this failure, with its note and photos.</p>
          ) : (
            <>
              <p>The design's engineer is mailed once about this failure, with its note and photos, when you move on to another step or complete the run.</p>
              {canRecord ? (
                <mailFetcher.Form method="post" className="mt-2">
                  <input type="hidden" name="intent" value="mail-step" />
                  <input type="hidden" name="step" value={step.n} />
                  <Button type="submit" tone="secondary" className="min-h-11 text-base" disabled={mailFetcher.state !== "idle"}>
                    Send to the engineer now
                  </Button>
                </mailFetcher.Form>
              ) : null}
            </>
          )}
        </div>
      ) : null}
      {canRecord ? (
        <photoFetcher.Form method="post" encType="multipart/form-data" className="mt-3 print:hidden">
          <input type="hidden" name="intent" value="photo" />
          <input type="hidden" name="step" value={step.n} />
          <label className="inline-flex min-h-11 cursor-pointer items-center rounded-md border border-ink-300 bg-white px-3 text-sm font-medium hover:bg-ink-100">
            {photoFetcher.state !== "idle" ? "Uploading photo…" : `Add a photo (${acceptedWords(STEP_PHOTOS)})`}
            <input
              type="file"
              name="file"
              accept={acceptOf(STEP_PHOTOS)}
              capture="environment"
              className="sr-only"
              aria-label={`Photo for step ${step.n}`}
              onChange={(e) => {
                if (e.currentTarget.files?.length) photoFetcher.submit(e.currentTarget.form);
              }}
            />
          </label>
          {photoError ? <p className="mt-1 text-sm text-brick-700">{photoError}</p> : null}
        </photoFetcher.Form>
      ) : null}
    </article>
  );
}

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
    results.find((r) => r.n === n) ?? { n, outcome: null, note: "", updatedAt: null, updatedByName: null, failureMailedAt: null, photos: [] };
  const { done, failed } = progressOf(results);
  const busy = useNavigation().state === "submitting";
  const completeError = actionData && !actionData.ok && actionData.step === undefined ? Object.values(actionData.fields)[0] : null;
  return (
    <div className="mx-auto max-w-3xl">
      <p className="mb-2 text-sm print:hidden">
        <Link to={`/w/${slug}/bench-tests`} className="text-copper-700 underline">
          All bench tests
        </Link>{" "}
        ·{" "}
        <Link to={`/w/${slug}/vehicles/${run.vehicleId}`} className="text-copper-700 underline">
          {run.vehicleName}
        </Link>
      </p>
      <PageHeader
        title={`Bench test: ${run.vehicleName}`}
        description={
          <>
            Revision {run.number} of {run.designName} <HashPrefix hash={run.revisionHash} /> · started by {run.startedByName}, <When iso={run.startedAt} />
          </>
        }
        actions={<RunBadge run={{ status: live.run.status, failed }} />}
      />
      <SafetyNote className="mb-4" />

      {run.status === "completed" ? (
        <section className="mb-6 rounded-lg border-2 border-moss-600 bg-white p-5" data-testid="signed-record" aria-labelledby="record-h">
          <h2 id="record-h" className="font-semibold">
            Signed record
          </h2>
          <dl className="mt-2 grid gap-2 text-sm sm:grid-cols-2">
            <div>
              <dt className="text-ink-500">Completed by</dt>
              <dd>
                {run.completedBy?.name} ({run.completedBy?.email})
              </dd>
            </div>
            <div>
              <dt className="text-ink-500">Completed</dt>
              <dd>{run.completedAt ? <When iso={run.completedAt} /> : null}</dd>
            </div>
            <div className="sm:col-span-2">
              <dt className="text-ink-500">Revision content hash (SHA-256)</dt>
              <dd className="break-all font-mono text-xs">{run.revisionHash}</dd>
            </div>
            <div className="sm:col-span-2">
              <dt className="text-ink-500">Results hash (SHA-256)</dt>
              <dd className="break-all font-mono text-xs" data-testid="results-hash">
                {run.resultsHash}
              </dd>
            </div>
          </dl>
          <p className={`mt-3 text-sm font-medium ${run.intact ? "text-moss-700" : "text-brick-700"}`}>
            {run.intact ? "Recomputed from the stored results: the record is intact." : "Recomputed from the stored results: the hash does NOT match. The record was altered."}
          </p>
          <Button type="button" tone="secondary" className="mt-3 print:hidden" onClick={() => window.print()}>
            Print the record
          </Button>
        </section>
      ) : (
        <div className="sticky top-16 z-10 mb-4 rounded-lg border border-ink-200 bg-white/95 p-3 shadow-sm backdrop-blur md:top-2 print:static">
          <p className="text-sm font-medium" data-testid="progress">
            {done} of {steps.length} steps recorded{failed ? ` · ${failed} failed` : ""}
          </p>
          <div className="mt-2 h-2 rounded-full bg-ink-100" aria-hidden="true">
            <div className="h-2 rounded-full bg-copper-500" style={{ width: `${(100 * done) / Math.max(1, steps.length)}%` }} />
          </div>
        </div>
      )}

      <section className="mb-4 rounded-lg border border-ink-200 bg-white p-4">
        <h2 className="font-semibold">Before step 1</h2>
        <p className="mt-1">{plan.start.instruction}</p>
      </section>

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

      {plan.uncovered.length > 0 ? (
        <details className="mt-6 rounded-lg border border-ink-200 bg-white p-4 text-sm">
          <summary className="cursor-pointer font-semibold">Not checked by this procedure ({plan.uncovered.length})</summary>
          <ul className="mt-2 list-disc space-y-1 pl-5">
            {plan.uncovered.map((u) => (
              <li key={u.item}>
                <span className="font-mono">{u.item}</span>: {u.reason}
              </li>
            ))}
          </ul>
        </details>
      ) : null}

      <p className="mt-6 print:hidden">
        <a href={`/w/${slug}/bench-tests/${run.id}/results.csv`} className="inline-flex min-h-11 items-center text-base text-copper-700 underline" download>
          Download the results (CSV)
        </a>
      </p>

      {canRecord ? (
        <Form method="post" className="mt-6 rounded-lg border border-ink-200 bg-white p-4 print:hidden">
          <input type="hidden" name="intent" value="complete" />
          <p className="text-sm text-ink-700">
            Completing signs the run with your name and the time, and fixes its results: they can no longer change.
            {done < steps.length ? ` ${steps.length - done} step${steps.length - done > 1 ? "s have" : " has"} no result yet.` : ""}
          </p>
          {completeError ? (
            <div className="mt-2">
              <Notice tone="error">{completeError}</Notice>
            </div>
          ) : null}
          <Button type="submit" className="mt-3 min-h-12 w-full text-base" disabled={busy || done < steps.length}>
            Complete and sign
          </Button>
        </Form>
      ) : null}
    </div>
  );
}

/**
 * The run's results, live: swr over the run's API (every 10 s while open, and on focus), seeded and
 * re-seeded by the loader (which runs again after a note, a photo or a clear), with a tap's result
 * shown at once (optimistic) and rolled back with a message when the save fails. A clear still
 * pending in its fetcher shows as cleared.
 */
function useLiveRun(runId: string, fromLoader: LiveRun, status: LiveRun["status"]) {
  const key = runApiPath(runId);
  const { data, mutate } = useSWR<LiveRun>(key, fetchLiveRun, {
    fallbackData: fromLoader,
    revalidateOnMount: false,
    revalidateOnFocus: true,
    refreshInterval: status === "in-progress" ? 10_000 : 0,
  });
  useEffect(() => {
    void mutate(fromLoader, { revalidate: false });
  }, [fromLoader, mutate]);
  const latest = useRef(data);
  latest.current = data;
  const [putting, setPutting] = useState<Record<number, number>>({});
  const [errors, setErrors] = useState<Record<number, string>>({});
  const bump = (n: number, by: number) => setPutting((p) => ({ ...p, [n]: (p[n] ?? 0) + by }));

  const record = useCallback(
    (n: number, outcome: StepOutcome) => {
      setErrors(({ [n]: _, ...rest }) => rest);
      bump(n, 1);
      // The PUT answers the one step as saved; it is merged into what is shown by then (other
      // steps may have changed meanwhile), so the promise carries it as a one-step run.
      const saving = putStepOutcome(runId, n, outcome).then((saved): LiveRun => ({ status: "in-progress", steps: [saved] }));
      mutate(saving, {
        optimisticData: (current) => withOutcome(current ?? fromLoader, n, outcome),
        populateCache: (saved, current) => withStep(current ?? fromLoader, saved.steps[0]!),
        rollbackOnError: true,
        revalidate: false,
      })
        .catch((err: unknown) => {
          setErrors((e) => ({ ...e, [n]: `Not saved: ${err instanceof Error ? err.message : "the server did not answer."}` }));
          // What the server holds now (the run may have been completed elsewhere).
          void mutate();
        })
        // Recording a step sends the mail of earlier failed steps: show it.
        .then(() => {
          if ((latest.current ?? fromLoader).steps.some((s) => s.n !== n && s.outcome === "fail" && !s.failureMailedAt)) void mutate();
        })
        .finally(() => bump(n, -1));
    },
    [runId, fromLoader, mutate],
  );

  // Clears waiting in their fetchers count as done at once.
  const clearing = new Set(
    useFetchers()
      .filter((f) => f.formData?.get("intent") === "outcome" && f.formData.get("outcome") === "")
      .map((f) => Number(f.formData!.get("step"))),
  );
  const current = data ?? fromLoader;
  const run: LiveRun = clearing.size === 0 ? current : { ...current, steps: current.steps.map((s) => (clearing.has(s.n) ? { ...s, outcome: null } : s)) };
  return { run, record, putting, errors };
}
