// GET  /api/v1/vehicles/:vehicleId/bench-runs[?status=&limit=N&cursor=C] -> { runs: RunSummary[], nextCursor }   (any member)
// POST /api/v1/vehicles/:vehicleId/bench-runs -> 201 { run }   (technicians: starts a run on the
//      revision released to the vehicle now; 409 when none is released)
import type { Route } from "./+types/vehicle-bench-runs";
import { apiError, handleApi, reply, requireMethod } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { BenchRunError, getRun, startRun } from "~/bench-runs/bench-runs.server";
import { parseQuery, requireVehicleApi } from "~/api/access.server";
import { runsPage } from "~/api/run-pages.server";
import { vehicleRunListQuerySchema } from "~/api/schemas";
import { runJson } from "~/api/views.server";

export async function loader({ request, params, context }: Route.LoaderArgs) {
  return handleApi(request, async () => {
    const { member, vehicle } = await requireVehicleApi(context, request, params.vehicleId, "workspace.view");
    const query = parseQuery(request, vehicleRunListQuerySchema);
    return reply(api.listVehicleRuns, 200, await runsPage(member.workspace.id, { vehicleId: vehicle.id, status: query.status }, query));
  });
}

export async function action({ request, params, context }: Route.ActionArgs) {
  return handleApi(request, async () => {
    requireMethod(request, "POST");
    const { member, vehicle } = await requireVehicleApi(context, request, params.vehicleId, "bench.run");
    try {
      const id = await startRun(member.workspace.id, vehicle.id, member.user.id);
      const run = (await getRun(member.workspace.id, id))!;
      return reply(api.startRun, 201, { run: runJson(run, member.workspace.slug) });
    } catch (err) {
      if (err instanceof BenchRunError) {
        return apiError(err.status, err.status === 409 ? "cannot_start" : "invalid_body", err.message, [
          { path: err.field, message: err.message },
        ]);
      }
      throw err;
    }
  });
}
