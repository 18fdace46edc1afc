// GET  /api/v1/vehicles?workspace=SLUG[&limit=N&cursor=C] -> { vehicles: VehicleSummary[], nextCursor }   (any member)
// POST /api/v1/vehicles?workspace=SLUG { name, serial?, model?, controllerDescription?, notes? }
//   -> 201 { vehicle }   ("vehicle.manage": admins, engineers, technicians; as the vehicles page)
import type { Route } from "./+types/vehicles";
import { requireApiCan } from "~/auth/context.server";
import { handleApi, reply, requireMethod } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { createVehicle, getVehicle, listVehicles } from "~/vehicles/vehicles.server";
import { parseBody, parseQuery } from "~/api/access.server";
import { ascending, pageOfList } from "~/api/pagination.server";
import { vehicleCreateBodySchema, vehicleListQuerySchema, workspaceQuerySchema } from "~/api/schemas";
import { vehicleJson, vehicleSummaryJson } from "~/api/views.server";

export async function loader({ request, context }: Route.LoaderArgs) {
  return handleApi(request, async () => {
    const query = parseQuery(request, vehicleListQuerySchema);
    const m = await requireApiCan(context, request, query.workspace, "workspace.view");
    const page = pageOfList(await listVehicles(m.workspace.id), (v) => [v.name, v.id], ascending, query, "string");
    return reply(api.listVehicles, 200, { vehicles: page.items.map(vehicleSummaryJson), nextCursor: page.nextCursor });
  });
}

export async function action({ request, context }: Route.ActionArgs) {
  return handleApi(request, async () => {
    requireMethod(request, "POST");
    const { workspace } = parseQuery(request, workspaceQuerySchema);
    const m = await requireApiCan(context, request, workspace, "vehicle.manage");
    const body = await parseBody(request, vehicleCreateBodySchema, "new vehicle");
    const id = await createVehicle(m.workspace.id, m.user.id, body);
    const v = (await getVehicle(m.workspace.id, id))!;
    return reply(api.createVehicle, 201, { vehicle: vehicleJson(v, [], []) });
  });
}
