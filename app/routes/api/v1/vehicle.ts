// GET   /api/v1/vehicles/:vehicleId -> { vehicle }   (details, released revision, release history,
//       open needs-attention flags; any member)
// PATCH /api/v1/vehicles/:vehicleId { name?, serial?, model?, controllerDescription?, notes? } -> { vehicle }
//       ("vehicle.manage"; fields not sent keep their values)
import type { Route } from "./+types/vehicle";
import { handleApi, reply, requireMethod } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { vehicleSchema } from "~/lib/forms";
import { getVehicle, openAttention, releaseHistory, updateVehicle } from "~/vehicles/vehicles.server";
import { parseBody, requireVehicleApi } from "~/api/access.server";
import { vehiclePatchBodySchema } from "~/api/schemas";
import { vehicleJson } from "~/api/views.server";

async function answer(workspaceId: string, vehicleId: string): Promise<Response> {
  const [v, history, attention] = await Promise.all([
    getVehicle(workspaceId, vehicleId),
    releaseHistory(workspaceId, vehicleId),
    openAttention(workspaceId, vehicleId),
  ]);
  return reply(api.getVehicle, 200, { vehicle: vehicleJson(v!, history, attention) });
}

export async function loader({ request, params, context }: Route.LoaderArgs) {
  return handleApi(request, async () => {
    const { member, vehicle } = await requireVehicleApi(context, request, params.vehicleId, "workspace.view");
    return answer(member.workspace.id, vehicle.id);
  });
}

export async function action({ request, params, context }: Route.ActionArgs) {
  return handleApi(request, async () => {
    requireMethod(request, "PATCH");
    const { member, vehicle } = await requireVehicleApi(context, request, params.vehicleId, "vehicle.manage");
    const patch = await parseBody(request, vehiclePatchBodySchema, "vehicle change");
    const current = {
      name: vehicle.name,
      serial: vehicle.serial,
      model: vehicle.model,
      controllerDescription: vehicle.controllerDescription,
      notes: vehicle.notes,
    };
    // The merged details pass the form's own schema, so the API and the page keep the same rules.
    const merged = vehicleSchema.parse({ ...current, ...Object.fromEntries(Object.entries(patch).filter(([, x]) => x !== undefined)) });
    await updateVehicle(member.workspace.id, vehicle.id, member.user.id, merged);
    return answer(member.workspace.id, vehicle.id);
  });
}
