// POST /api/v1/controller-checks?workspace=SLUG { record, design? } -> 200 { check } (chainproof/controller-check@1)
// Stateless: checks a controller settings record, against a design when one is sent; any member may ask.
import type { Route } from "./+types/controller-checks";
import { requireApiCan } from "~/auth/context.server";
import { apiError, handleApi, methodNotAllowed, readJsonBody, reply, requireMethod, zodFields } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { parseQuery } from "~/api/access.server";
import { controllerCheckBodySchema, workspaceQuerySchema } from "~/api/schemas";
import { jsonObjectSchema } from "~/designs/forms";
import { DESIGN_BODY_MAX_BYTES } from "~/designs/types";
import { storableJsonProblem } from "~/lib/storable-json";
import { checkRecord, deriveValues } from "~/controller-record";
import { validateDesign, type Problem } from "~/engine";

export async function loader() {
  return methodNotAllowed("POST");
}

export async function action({ request, context }: Route.ActionArgs) {
  return handleApi(request, async () => {
    requireMethod(request, "POST");
    const { workspace } = parseQuery(request, workspaceQuerySchema);
    await requireApiCan(context, request, workspace, "workspace.view");
    const raw = jsonObjectSchema.safeParse(await readJsonBody(request, DESIGN_BODY_MAX_BYTES));
    if (!raw.success) return apiError(400, "invalid_body", "The request body is a JSON object.", zodFields(raw.error));
    for (const key of ["record", "design"] as const) {
      const unstorable = raw.data[key] === undefined ? null : storableJsonProblem(raw.data[key], key);
      if (unstorable) return apiError(400, `invalid_${key}`, `The ${key} holds something the server does not read.`, [unstorable]);
    }
    const body = controllerCheckBodySchema.safeParse(raw.data);
    // The design's cross-references are the engine's validation (every problem, shape included).
    const design = raw.data.design === undefined ? null : validateDesign(raw.data.design);
    const designProblems: Problem[] =
      design && !design.ok ? design.problems.map((p) => ({ path: p.path ? `design.${p.path}` : "design", message: p.message })) : [];
    if (!body.success || designProblems.length > 0) {
      const fields = [...(body.success ? [] : zodFields(body.error).filter((f) => !f.path.startsWith("design"))), ...designProblems];
      const code = fields.some((f) => f.path.startsWith("record"))
        ? "invalid_record"
        : designProblems.length > 0
          ? "invalid_design"
          : "invalid_body";
      const n = fields.length;
      return apiError(400, code, `The request has ${n} ${n === 1 ? "problem" : "problems"}.`, fields);
    }
    const record = body.data.record;
    return reply(api.checkControllerRecord, 200, {
      check: checkRecord(record, design?.ok ? design.design : undefined, deriveValues(record)),
    });
  });
}
