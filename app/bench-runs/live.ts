// The live part of a bench run on its page: each step's result, note and photos, and whether the run
// is still open. The page keeps it in swr, read from GET /api/v1/bench-runs/:runId (every 10 s and
// when the tab regains focus), and changes it at once when a technician taps a result (optimistic),
// then saves through PUT /api/v1/bench-runs/:runId/steps/:n. No server imports: runs in the browser.
import type { RunJson, RunStepJson } from "~/api/answers";
import { api } from "~/api/endpoints";
import { ApiError, apiFetcher, apiUrl, fetchApi } from "~/api/client";
import type { StepOutcome } from "./outcomes";

type ApiRun = RunJson;
type ApiStep = RunStepJson;

export type LiveStep = {
  n: number;
  outcome: StepOutcome | null;
  note: string;
  updatedAt: string | null;
  updatedByName: string | null;
  /** When the failure was mailed to the revision's author (once per step). */
  failureMailedAt: string | null;
  photos: Array<{ id: string; filename: string; contentType: string }>;
};
export type LiveRun = { status: ApiRun["status"]; steps: LiveStep[] };

export const runApiPath = (runId: string) => apiUrl(api.getRun, { runId });

export function liveStep(s: ApiStep): LiveStep {
  return {
    n: s.n,
    outcome: s.status,
    note: s.note,
    updatedAt: s.updatedAt,
    updatedByName: s.updatedBy?.name ?? null,
    failureMailedAt: s.failureMailedAt,
    photos: s.photos.map((p) => ({ id: p.id, filename: p.filename, contentType: p.contentType })),
  };
}

export function liveFromApi(run: ApiRun): LiveRun {
  return { status: run.status, steps: run.steps.map(liveStep) };
}

/** The run with one step's result replaced (the optimistic state of a tap). */
export function withOutcome(run: LiveRun, n: number, outcome: StepOutcome | null): LiveRun {
  return { ...run, steps: run.steps.map((s) => (s.n === n ? { ...s, outcome } : s)) };
}

/** The run with one step as the server saved it. */
export function withStep(run: LiveRun, step: LiveStep): LiveRun {
  return { ...run, steps: run.steps.map((s) => (s.n === step.n ? step : s)) };
}

export function progressOf(steps: readonly Pick<LiveStep, "outcome">[]) {
  return { done: steps.filter((s) => s.outcome).length, failed: steps.filter((s) => s.outcome === "fail").length };
}

const fetchRun = apiFetcher(api.getRun);

/** swr's fetcher of the run (keyed by runApiPath). */
export async function fetchLiveRun(url: string): Promise<LiveRun> {
  return liveFromApi((await fetchRun(url)).run);
}

/** Saves a step's result; the answer is the step as saved. Throws an Error with a message for people. */
export async function putStepOutcome(runId: string, n: number, status: StepOutcome): Promise<LiveStep> {
  try {
    return liveStep((await fetchApi(api.recordStep, { params: { runId, n }, body: { status } })).step);
  } catch (e) {
    if (e instanceof ApiError && e.status === 0)
      throw new Error("The server could not be reached; check the connection and tap again.", { cause: e });
    throw e;
  }
}
