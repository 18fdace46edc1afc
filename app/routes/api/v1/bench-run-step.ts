// PUT /api/v1/bench-runs/:runId/steps/:n { status: "pass" | "fail" | "skip", note? } -> { step, mailed }
//   (technicians; a step turning to "fail" flags the vehicle and mails the revision's author, as on
//    the run page; a completed run answers 409)
import type { Route } from "./+types/bench-run-step";
import { apiError, handleApi, methodNotAllowed, reply, requireMethod } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { BenchRunError, getRun, setStepNote, setStepOutcome } from "~/bench-runs/bench-runs.server";
import { parseBody, requireRunApi } from "~/api/access.server";
import { stepResultBodySchema } from "~/api/schemas";
import { runJson } from "~/api/views.server";

export async function loader({ request }: Route.LoaderArgs) {
  return handleApi(request, async () => methodNotAllowed("PUT"));
}

export async function action({ request, params, context }: Route.ActionArgs) {
  return handleApi(request, async () => {
    requireMethod(request, "PUT");
    const { member } = await requireRunApi(context, request, params.runId, "bench.run");
    const n = /^[1-9][0-9]{0,5}$/.test(params.n) ? Number(params.n) : -1;
    const body = await parseBody(request, stepResultBodySchema, "step result");
    const ws = member.workspace.id;
    let mailed: boolean;
    try {
      // The note first: it has no side effects, so a refused step leaves nothing saved.
      if (body.note !== undefined) await setStepNote(ws, params.runId, n, body.note, member.user.id);
      mailed = (await setStepOutcome(ws, params.runId, n, body.status, member.user.id)).mailed;
    } catch (err) {
      if (err instanceof BenchRunError) {
        const code =
          err.status === 404 ? "not_found" : err.status === 409 ? "run_completed" : err.field === "step" ? "not_found" : "invalid_body";
        const status = err.field === "step" ? 404 : err.status;
        return apiError(status, code, err.message, [{ path: err.field, message: err.message }]);
      }
      throw err;
    }
    const run = runJson((await getRun(ws, params.runId))!, member.workspace.slug);
    const step = run.steps.find((s) => s.n === n);
    if (!step) return apiError(404, "not_found", `This run has no step ${params.n}.`, [{ path: "step", message: "a step of this run" }]);
    return reply(api.recordStep, 200, { step, mailed });
  });
}
