// GET /api/v1/vehicles/:vehicleId/controller-record[?version=N] -> { record, versions, proof, caution } (any member)
// PUT /api/v1/vehicles/:vehicleId/controller-record { version, record } -> the same answer
//   (technicians and engineers; a new version; 409 stale_record with currentVersion; 400 invalid_record by field)
import type { Route } from "./+types/vehicle-controller-record";
import { apiError, handleApi, readJsonBody, reply, requireMethod, zodFields } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { parseQuery, requireVehicleApi, SMALL_BODY_MAX_BYTES } from "~/api/access.server";
import { controllerRecordPutBodySchema, controllerRecordQuerySchema } from "~/api/schemas";
import { controllerRecordJson } from "~/api/views.server";
import { jsonObjectSchema } from "~/designs/forms";
import { storableJsonProblem } from "~/lib/storable-json";
import { recordWithStatus, saveRecord } from "~/vehicles/controller-records.server";

export async function loader({ request, params, context }: Route.LoaderArgs) {
  return handleApi(request, async () => {
    const { member, vehicle } = await requireVehicleApi(context, request, params.vehicleId, "workspace.view");
    const query = parseQuery(request, controllerRecordQuerySchema);
    const found = await recordWithStatus(member.workspace.id, vehicle.id, query.version);
    if (query.version !== undefined && !found.chosen)
      throw apiError(404, "not_found", `This vehicle's record has no version ${query.version}.`);
    return reply(api.getControllerRecord, 200, controllerRecordJson(found));
  });
}

export async function action({ request, params, context }: Route.ActionArgs) {
  return handleApi(request, async () => {
    requireMethod(request, "PUT");
    const { member, vehicle } = await requireVehicleApi(context, request, params.vehicleId, "controller.record");
    const raw = jsonObjectSchema.safeParse(await readJsonBody(request, SMALL_BODY_MAX_BYTES));
    if (!raw.success) return apiError(400, "invalid_body", "The request body is a JSON object.", zodFields(raw.error));
    const unstorable = storableJsonProblem(raw.data.record, "record");
    if (unstorable) return apiError(400, "invalid_record", "The record holds something that cannot be stored.", [unstorable]);
    const body = controllerRecordPutBodySchema.safeParse(raw.data);
    if (!body.success) {
      const fields = zodFields(body.error);
      const code = fields.some((f) => f.path === "record" || f.path.startsWith("record.")) ? "invalid_record" : "invalid_body";
      const n = fields.length;
      return apiError(400, code, `The request has ${n} ${n === 1 ? "problem" : "problems"}; nothing was saved.`, fields);
    }
    const saved = await saveRecord(member.workspace.id, vehicle.id, member.user.id, {
      baseVersion: body.data.version,
      document: body.data.record,
    });
    if (!saved.ok) {
      if (saved.reason === "not-found") throw apiError(404, "not_found", "No such vehicle.");
      if (saved.reason === "invalid") {
        return apiError(
          400,
          "invalid_record",
          "The record has a problem; nothing was saved.",
          saved.problems.map((p) => ({ path: p.path ? `record.${p.path}` : "record", message: p.message })),
        );
      }
      return apiError(
        409,
        "stale_record",
        `Version ${saved.currentVersion} of this record was saved since version ${body.data.version}; nothing was saved. Read it again before saving.`,
        [],
        { currentVersion: saved.currentVersion },
      );
    }
    return reply(api.putControllerRecord, 200, controllerRecordJson(await recordWithStatus(member.workspace.id, vehicle.id)));
  });
}
