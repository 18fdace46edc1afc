// The live results of a bench run on its page (swr over the run's API, optimistic taps).
import { useCallback, useEffect, useRef, useState } from "react";
import { useFetchers } from "react-router";
import useSWR from "swr";
import { fetchLiveRun, putStepOutcome, runApiPath, withOutcome, withStep, type LiveRun } from "~/bench-runs/live";
import type { StepOutcome } from "~/bench-runs/outcomes";

/**
 * The run's results, live: swr over the run's API (every 10 s while open, and on focus), seeded and
 * re-seeded by the loader (which runs again after a note, a photo or a clear), with a tap's result
 * shown at once (optimistic) and rolled back with a message when the save fails. A clear still
 * pending in its fetcher shows as cleared.
 */
export function useLiveRun(runId: string, fromLoader: LiveRun, status: LiveRun["status"]) {
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
  useEffect(() => {
    latest.current = data;
  });
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
  const run: LiveRun =
    clearing.size === 0 ? current : { ...current, steps: current.steps.map((s) => (clearing.has(s.n) ? { ...s, outcome: null } : s)) };
  return { run, record, putting, errors };
}
