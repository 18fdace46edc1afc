// POST /api/v1/vehicles/:vehicleId/releases { revisionId, note?, override? } -> 201 { vehicle }
//      ("revision.release"; 409 release_refused naming why: not approved, refused by format 1.1
//      (decision 111), or contradicted by the controller record without an override reason)
import type { Route } from "./+types/vehicle-releases";
import { apiError, handleApi, reply, requireMethod } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { parseBody, requireVehicleApi } from "~/api/access.server";
import { vehicleJson } from "~/api/views.server";
import { releaseSchema } from "~/vehicles/forms";
import { getVehicle, openAttention, releaseHistory, releaseRevision } from "~/vehicles/vehicles.server";

export async function action({ request, params, context }: Route.ActionArgs) {
  return handleApi(request, async () => {
    requireMethod(request, "POST");
    const { member, vehicle } = await requireVehicleApi(context, request, params.vehicleId, "revision.release");
    const body = await parseBody(request, releaseSchema, "release");
    const out = await releaseRevision(member.workspace.id, vehicle.id, member.user.id, body);
    if (!out.ok) {
      const fields = Object.entries(out.fields).map(([path, message]) => ({ path, message }));
      const why = [...fields.map((f) => f.message), ...(out.contradictions ?? [])].join(" ");
      return apiError(409, "release_refused", why || "The revision cannot be released.", fields);
    }
    const [v, history, attention] = await Promise.all([
      getVehicle(member.workspace.id, vehicle.id),
      releaseHistory(member.workspace.id, vehicle.id),
      openAttention(member.workspace.id, vehicle.id),
    ]);
    return reply(api.releaseToVehicle, 201, { vehicle: vehicleJson(v!, history, attention) });
  });
}
