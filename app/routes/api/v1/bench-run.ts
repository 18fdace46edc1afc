// GET /api/v1/bench-runs/:runId -> { run }   (the frozen procedure's steps with their results,
//     photos, and for a completed run its signed record's hash and whether it is intact; any member)
import type { Route } from "./+types/bench-run";
import { apiError, handleApi, methodNotAllowed, reply } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { getRun } from "~/bench-runs/bench-runs.server";
import { requireRunApi } from "~/api/access.server";
import { runJson } from "~/api/views.server";

export async function loader({ request, params, context }: Route.LoaderArgs) {
  return handleApi(request, async () => {
    const { member } = await requireRunApi(context, request, params.runId, "workspace.view");
    const run = await getRun(member.workspace.id, params.runId);
    if (!run) return apiError(404, "not_found", "No such bench run.");
    return reply(api.getRun, 200, { run: runJson(run, member.workspace.slug) });
  });
}

export async function action({ request }: Route.ActionArgs) {
  return handleApi(request, async () => methodNotAllowed("GET"));
}
