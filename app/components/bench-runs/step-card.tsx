// One step of a bench run on the technician's phone: what to set, what must happen, the result
// buttons, the note, photos and whether the engineer has been mailed about a failure.
import { useState } from "react";
import { useFetcher } from "react-router";
import type { BenchPlan } from "~/bench-tests/generate";
import { OUTCOME_LABELS, STEP_OUTCOMES, type StepOutcome } from "~/bench-runs/outcomes";
import type { LiveStep } from "~/bench-runs/live";
import type { FieldErrors } from "~/lib/forms";
import { Button, Chip } from "~/components/ui/button";
import { acceptedWords, acceptOf, STEP_PHOTOS } from "~/uploads/kinds";

/** What the run page's action answers. */
export type ActionResult = { ok: boolean; fields: FieldErrors; step?: number };

type Step = BenchPlan["steps"][number];

const OUTCOME_TONE = { pass: "proven", fail: "failing", skip: "skipped" } as const satisfies Record<StepOutcome, string>;

function Expect({ step }: { step: Step }) {
  const live = Object.entries(step.expect.inputs)
    .filter(([, on]) => on)
    .map(([id]) => id);
  const dead = Object.entries(step.expect.inputs)
    .filter(([, on]) => !on)
    .map(([id]) => id);
  return (
    <div className="mt-3 rounded-md bg-ink-50 p-3 text-base">
      <p className={`font-semibold ${step.expect.drive ? "text-moss-700" : "text-brick-700"}`}>
        {step.expect.drive ? "Drive must run" : "Drive must stay off"}
      </p>
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
export const clearKey = (n: number) => `outcome-${n}`;

export function StepCard({ step, result, slug, canRecord, putting, tapError, onOutcome }: CardProps) {
  const outcomeFetcher = useFetcher<ActionResult>({ key: clearKey(step.n) });
  const noteFetcher = useFetcher<ActionResult>({ key: `note-${step.n}` });
  const photoFetcher = useFetcher<ActionResult>({ key: `photo-${step.n}` });
  const mailFetcher = useFetcher<ActionResult>({ key: `mail-${step.n}` });
  // `result` already carries an optimistic tap and a pending clear.
  const outcome = result.outcome;
  const [note, setNote] = useState(result.note);
  // What the server holds; a pending save counts as saved so the button does not invite a second one.
  const pendingNote = noteFetcher.formData?.get("note");
  const savedNote = result.note;
  const noteSaved = note === (typeof pendingNote === "string" ? pendingNote : savedNote);
  const saveNote = () => {
    if (noteSaved) return;
    noteFetcher.submit({ intent: "note", step: String(step.n), note }, { method: "post" });
  };
  const clearError =
    outcomeFetcher.state === "idle" && outcomeFetcher.data?.ok === false ? Object.values(outcomeFetcher.data.fields)[0] : null;
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
          {step.kind === "sequence" ? <span className="ml-2 text-base font-normal text-ink-600">(lockout sequence)</span> : null}
        </h3>
        <span className="text-base text-ink-500" aria-live="polite">
          {saving ? "Saving…" : result.updatedAt ? "Saved" : ""}
        </span>
      </div>
      {step.caution ? <p className="mt-2 rounded-md bg-copper-50 px-3 py-2 text-base font-medium text-copper-700">{step.caution}</p> : null}
      <p className="mt-2">{step.instruction}</p>
      <details className="mt-2 text-base">
        <summary className="flex min-h-11 cursor-pointer items-center text-ink-600">Every condition in this step</summary>
        <ul className="mt-1 grid grid-cols-2 gap-x-3 font-mono text-base">
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
            <Chip
              key={o}
              pressed={outcome === o}
              tone={OUTCOME_TONE[o]}
              size="bench"
              onClick={() =>
                outcome === o
                  ? outcomeFetcher.submit({ intent: "outcome", step: String(step.n), outcome: "" }, { method: "post" })
                  : onOutcome(step.n, o)
              }
            >
              {OUTCOME_LABELS[o]}
            </Chip>
          ))}
        </div>
      ) : (
        <p className="mt-3 text-base font-semibold">Result: {outcome ? OUTCOME_LABELS[outcome] : "not recorded"}</p>
      )}
      {error ? (
        <p role="alert" className="mt-2 text-base text-brick-700">
          {error}
        </p>
      ) : null}

      {canRecord ? (
        <div className="mt-3 print:hidden">
          <label htmlFor={`note-${step.n}`} className="block text-base font-medium text-ink-700">
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
          <Button type="button" variant="secondary" size="bench" className="mt-2" onClick={saveNote} disabled={noteSaved}>
            Save note
          </Button>
          {noteError ? <p className="mt-1 text-base text-brick-700">{noteError}</p> : null}
        </div>
      ) : result.note ? (
        <p className="mt-2 whitespace-pre-wrap text-base">Note: {result.note}</p>
      ) : null}
      {canRecord && result.note ? <p className="hidden whitespace-pre-wrap text-base print:block">Note: {result.note}</p> : null}

      {result.photos.length > 0 ? (
        <ul className="mt-3 flex flex-wrap gap-2">
          {result.photos.map((p) => (
            <li key={p.id}>
              <a href={`/w/${slug}/files/${p.id}`} className="block min-h-11 min-w-11">
                {p.contentType.startsWith("image/") ? (
                  <img src={`/w/${slug}/files/${p.id}`} alt={p.filename} className="h-20 w-20 rounded object-cover" />
                ) : (
                  <span className="flex h-20 w-20 items-center justify-center rounded border text-base">PDF</span>
                )}
              </a>
            </li>
          ))}
        </ul>
      ) : null}
      {outcome === "fail" ? (
        <div
          className="mt-3 rounded-md bg-brick-50 px-3 py-2 text-base text-brick-700"
          data-testid="failure-mail"
          data-mailed={result.failureMailedAt ? "yes" : "no"}
        >
          {result.failureMailedAt ? (
            <p>The design's engineer was mailed about this failure, with its note and photos.</p>
          ) : (
            <>
              <p>
                The design's engineer is mailed once about this failure, with its note and photos, when you move on to another step or
                complete the run.
              </p>
              {canRecord ? (
                <mailFetcher.Form method="post" className="mt-2">
                  <input type="hidden" name="intent" value="mail-step" />
                  <input type="hidden" name="step" value={step.n} />
                  <Button type="submit" variant="secondary" size="bench" disabled={mailFetcher.state !== "idle"}>
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
          <label className="inline-flex min-h-11 cursor-pointer items-center rounded-md border border-ink-300 bg-white px-3 text-base font-medium hover:bg-ink-100">
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
          {photoError ? <p className="mt-1 text-base text-brick-700">{photoError}</p> : null}
        </photoFetcher.Form>
      ) : null}
    </article>
  );
}
