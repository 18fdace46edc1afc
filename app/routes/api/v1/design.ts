// GET   /api/v1/designs/:designId -> { design: { id, name, vehicleId, status, archived }, latestRevision, contentHash, document, verdict, draft }
// document, verdict and contentHash are the latest revision's (null when there is none yet).
// PATCH /api/v1/designs/:designId { archived: true | false } -> { design, changed }   (admins and engineers; decision 167)
import type { Route } from "./+types/design";
import { apiError, handleApi, reply, requireMethod } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { parseBody } from "~/api/access.server";
import { getDesign, getDraft, getRevision, requireDesign, setArchived, statusOf, type Archived } from "~/designs/designs.server";
import { designPatchBodySchema } from "~/designs/forms";

const archivedJson = (a: Archived | null) => (a ? { at: a.at.toISOString(), by: a.by } : null);

export async function loader({ request, params, context }: Route.LoaderArgs) {
  return handleApi(request, async () => {
    const { member, design } = await requireDesign(context, request, params.designId, "workspace.view");
    const ws = member.workspace.id;
    const [found, latest, draft] = await Promise.all([getDesign(ws, design.id), getRevision(ws, design.id), getDraft(ws, design.id)]);
    return reply(api.getDesign, 200, {
      design: {
        id: design.id,
        name: design.name,
        vehicleId: design.vehicleId,
        status: statusOf(latest?.number),
        archived: archivedJson(found?.archived ?? null),
      },
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

export async function action({ request, params, context }: Route.ActionArgs) {
  return handleApi(request, async () => {
    requireMethod(request, "PATCH");
    const { member, design } = await requireDesign(context, request, params.designId, "design.archive");
    const body = await parseBody(request, designPatchBodySchema, "design change");
    const ws = member.workspace.id;
    const out = await setArchived(ws, design.id, member.user.id, body.archived);
    if (out.kind === "missing") return apiError(404, "not_found", "No such design.");
    const latest = await getRevision(ws, design.id);
    return reply(api.patchDesign, 200, {
      design: {
        id: design.id,
        name: design.name,
        vehicleId: design.vehicleId,
        status: statusOf(latest?.number),
        archived: archivedJson(out.archived),
      },
      changed: out.changed,
    });
  });
}
