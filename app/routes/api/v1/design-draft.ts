// GET /api/v1/designs/:designId/draft -> { draft: { version, baseRevision, updatedAt, updatedBy, document, check } | null }
// PUT /api/v1/designs/:designId/draft { document, version, baseRevision? }
//   200 { version }   409 { error: { code: "stale_draft", ... }, currentVersion } | { error: { code: "design_archived", ... }, archived }
// The draft is the working copy: any JSON object (at most DESIGN_BODY_MAX_BYTES), not proven.
import type { Route } from "./+types/design-draft";
import { apiError, handleApi, readJsonBody, reply, requireMethod, zodFields } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { storableJsonProblem } from "~/lib/storable-json";
import { archivedAnswer, getDraft, requireDesign, saveDraft } from "~/designs/designs.server";

import { jsonObjectSchema, saveDraftBodySchema } from "~/designs/forms";
import { DESIGN_BODY_MAX_BYTES } from "~/designs/types";

export async function loader({ request, params, context }: Route.LoaderArgs) {
  return handleApi(request, async () => {
    const { member, design } = await requireDesign(context, request, params.designId, "workspace.view");
    const d = await getDraft(member.workspace.id, design.id);
    return reply(api.getDraft, 200, {
      draft: d
        ? {
            version: d.version,
            baseRevision: d.baseRevision,
            updatedAt: d.updatedAt.toISOString(),
            updatedBy: { id: d.updatedBy, name: d.updatedByName },
            contentHash: d.contentHash,
            check: d.check,
            document: d.document,
          }
        : null,
    });
  });
}

export async function action({ request, params, context }: Route.ActionArgs) {
  return handleApi(request, async () => {
    requireMethod(request, "PUT");
    const { member, design } = await requireDesign(context, request, params.designId, "design.edit");
    const raw = jsonObjectSchema.safeParse(await readJsonBody(request, DESIGN_BODY_MAX_BYTES));
    if (!raw.success) return apiError(400, "invalid_body", "The request body is a JSON object.", zodFields(raw.error));
    const body = saveDraftBodySchema.safeParse(raw.data);
    if (!body.success) return apiError(400, "invalid_body", "The draft request is incomplete.", zodFields(body.error));
    const unstorable = storableJsonProblem(body.data.document, "document");
    if (unstorable) return apiError(400, "invalid_body", "The draft holds something that cannot be stored.", [unstorable]);
    const saved = await saveDraft(member.workspace.id, design.id, member.user.id, body.data);
    if (!saved.ok && "archived" in saved) return archivedAnswer(member.workspace.id, design.id, "draft");
    if (!saved.ok) {
      return apiError(
        409,
        "stale_draft",
        `The draft was saved elsewhere since version ${body.data.version}; it is now at version ${saved.currentVersion}. Reload it before saving again.`,
        [],
        { currentVersion: saved.currentVersion },
      );
    }
    return reply(api.saveDraft, 200, { version: saved.version });
  });
}
