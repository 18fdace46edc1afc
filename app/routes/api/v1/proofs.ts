// POST /api/v1/proofs?workspace=SLUG { document } -> 200 { verdict } | 400 { error: { code: "invalid_design", fields } }
// Proves without saving anything; any member of the workspace may ask.
import type { Route } from "./+types/proofs";
import { requireApiCan } from "~/auth/context.server";
import { apiError, handleApi, methodNotAllowed, readJsonBody, reply, requireMethod, zodFields } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { storableJsonProblem } from "~/lib/storable-json";
import { proofLimitAnswer, proveOffThread } from "~/proofs/pool.server";
import { jsonObjectSchema, proofBodySchema } from "~/designs/forms";
import { DESIGN_BODY_MAX_BYTES } from "~/designs/types";

export async function loader() {
  return methodNotAllowed("POST");
}

export async function action({ request, context }: Route.ActionArgs) {
  return handleApi(request, async () => {
    requireMethod(request, "POST");
    const slug = new URL(request.url).searchParams.get("workspace");
    if (!slug) return apiError(400, "invalid_query", "Name the workspace: ?workspace=SLUG.", [{ path: "workspace", message: "required" }]);
    const member = await requireApiCan(context, request, slug, "workspace.view");
    const raw = jsonObjectSchema.safeParse(await readJsonBody(request, DESIGN_BODY_MAX_BYTES));
    if (!raw.success) return apiError(400, "invalid_body", "The request body is a JSON object.", zodFields(raw.error));
    const body = proofBodySchema.safeParse(raw.data);
    if (!body.success) return apiError(400, "invalid_body", 'Send { "document": ... }.', zodFields(body.error));
    const unstorable = storableJsonProblem(body.data.document, "");
    if (unstorable) return apiError(400, "invalid_design", "The design holds something the server does not read.", [unstorable]);
    const proof = await proveOffThread(body.data.document, { userId: member.user.id }).catch(proofLimitAnswer);
    if (!proof.ok) {
      const n = proof.problems.length;
      return apiError(400, "invalid_design", `The design breaks the format in ${n} ${n === 1 ? "place" : "places"}.`, proof.problems);
    }
    return reply(api.prove, 200, { verdict: proof.verdict });
  });
}
