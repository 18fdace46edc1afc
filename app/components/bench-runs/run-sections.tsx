// The parts of a bench run's page around its steps: the signed record of a completed run, the progress
// banner of one in progress, what the procedure does not check, and the form that completes and signs it.
import { Form } from "react-router";
import type { BenchPlan } from "~/bench-tests/generate";
import { Button, Notice } from "~/components/ui/form";
import { cardVariants } from "~/components/ui/card";
import { When } from "~/designs/design-bits";

/** A completed run: who signed it and when, both hashes, and whether the stored results still match. */
export function SignedRecord({
  run,
}: {
  run: {
    completedBy: { name: string; email: string } | null;
    completedAt: string | null;
    revisionHash: string;
    resultsHash: string | null;
    /** null where there is no record to check. */
    intact: boolean | null;
  };
}) {
  return (
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
        {run.intact
          ? "Recomputed from the stored results: the record is intact."
          : "Recomputed from the stored results: the hash does NOT match. The record was altered."}
      </p>
      <Button type="button" tone="secondary" className="mt-3 print:hidden" onClick={() => window.print()}>
        Print the record
      </Button>
    </section>
  );
}

/** A run in progress: how many steps have a result, and a bar; it stays at the top while scrolling. */
export function RunBanner({ done, total, failed }: { done: number; total: number; failed: number }) {
  return (
    <div
      className="sticky top-0 z-10 mb-4 rounded-lg border border-ink-200 bg-white/95 px-3 py-2 shadow-sm backdrop-blur md:top-2 print:static"
      data-testid="run-banner"
    >
      <p className="text-base font-medium" data-testid="progress">
        {done} of {total} steps recorded{failed ? ` · ${failed} failed` : ""}
      </p>
      <div className="mt-1 h-2 rounded-full bg-ink-100" aria-hidden="true">
        <div className="h-2 rounded-full bg-copper-500" style={{ width: `${(100 * done) / Math.max(1, total)}%` }} />
      </div>
    </div>
  );
}

/** What the procedure leaves unchecked, and why (nothing when it checks everything). */
export function NotChecked({ uncovered }: { uncovered: BenchPlan["uncovered"] }) {
  if (uncovered.length === 0) return null;
  return (
    <details className={cardVariants({ className: "mt-6 text-base" })}>
      <summary className="flex min-h-11 cursor-pointer items-center font-semibold">
        Not checked by this procedure ({uncovered.length})
      </summary>
      <ul className="mt-2 list-disc space-y-1 pl-5">
        {uncovered.map((u) => (
          <li key={u.item}>
            <span className="font-mono">{u.item}</span>: {u.reason}
          </li>
        ))}
      </ul>
    </details>
  );
}

/** Completing signs the run: it says so, and how many steps still have no result. */
export function CompleteRunForm({ done, total, busy, error }: { done: number; total: number; busy: boolean; error: string | null }) {
  return (
    <Form method="post" className={cardVariants({ className: "mt-6 print:hidden" })}>
      <input type="hidden" name="intent" value="complete" />
      <p className="text-base text-ink-700">
        Completing signs the run with your name and the time, and fixes its results: they can no longer change.
        {done < total ? ` ${total - done} step${total - done > 1 ? "s have" : " has"} no result yet.` : ""}
      </p>
      {error ? (
        <div className="mt-2">
          <Notice tone="error">{error}</Notice>
        </div>
      ) : null}
      <Button type="submit" className="mt-3 min-h-12 w-full text-base" disabled={busy || done < total}>
        Complete and sign
      </Button>
    </Form>
  );
}
