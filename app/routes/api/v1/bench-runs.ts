// GET /api/v1/bench-runs?workspace=SLUG[&vehicle=ID][&status=in-progress|completed|failures][&limit=N&cursor=C]
//   -> { runs: RunSummary[], nextCursor }   (newest first; any member)
import type { Route } from "./+types/bench-runs";
import { requireApiCan } from "~/auth/context.server";
import { handleApi, methodNotAllowed, reply } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { parseQuery } from "~/api/access.server";
import { runsPage } from "~/api/run-pages.server";
import { benchRunListQuerySchema } from "~/api/schemas";

export async function loader({ request, context }: Route.LoaderArgs) {
  return handleApi(request, async () => {
    const query = parseQuery(request, benchRunListQuerySchema);
    const m = await requireApiCan(context, request, query.workspace, "workspace.view");
    return reply(api.listRuns, 200, await runsPage(m.workspace.id, { vehicleId: query.vehicle, status: query.status }, query));
  });
}

export async function action({ request }: Route.ActionArgs) {
  return handleApi(request, async () => methodNotAllowed("GET"));
}
