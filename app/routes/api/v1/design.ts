// GET /api/v1/designs/:designId -> { design: { id, name, vehicleId, status }, latestRevision, contentHash, document, verdict, draft }
// document, verdict and contentHash are the latest revision's (null when there is none yet).
import type { Route } from "./+types/design";
import { handleApi, methodNotAllowed, reply } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { getDraft, getRevision, requireDesign, statusOf } from "~/designs/designs.server";

export async function loader({ request, params, context }: Route.LoaderArgs) {
  return handleApi(request, async () => {
    const { member, design } = await requireDesign(context, request, params.designId, "workspace.view");
    const ws = member.workspace.id;
    const [latest, draft] = await Promise.all([getRevision(ws, design.id), getDraft(ws, design.id)]);
    return reply(api.getDesign, 200, {
      design: { id: design.id, name: design.name, vehicleId: design.vehicleId, status: statusOf(latest?.number) },
      latestRevision: latest?.number ?? null,
      contentHash: latest?.contentHash ?? null,
      document: latest?.document ?? null,
      verdict: latest?.verdict ?? null,
      draft: draft
        ? {
            version: draft.version,
            baseRevision: draft.baseRevision,
            updatedAt: draft.updatedAt.toISOString(),
            changed: !latest || latest.contentHash !== draft.contentHash,
            check: draft.check,
          }
        : null,
    });
  });
}

export async function action() {
  return methodNotAllowed("GET");
}
