// GET /api/v1/designs/:designId/revisions/:number -> { revision: { number, contentHash, message, author, createdAt, document, verdict,
//     refusedByFormat11 } }   (refusedByFormat11: why format 1.1 would refuse a revision saved before it; decision 111)
import type { Route } from "./+types/design-revision";
import { apiError, handleApi, methodNotAllowed, reply } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { getRevision, requireDesign } from "~/designs/designs.server";
import { standingOf } from "~/designs/standing";

export async function loader({ request, params, context }: Route.LoaderArgs) {
  return handleApi(request, async () => {
    const { member, design } = await requireDesign(context, request, params.designId, "workspace.view");
    const number = /^[1-9][0-9]{0,8}$/.test(params.number) ? Number(params.number) : null;
    const r = number === null ? null : await getRevision(member.workspace.id, design.id, number);
    if (!r) return apiError(404, "not_found", `This design has no revision ${params.number}.`);
    const standing = standingOf(r.id, r.document, r.verdict);
    return reply(api.getRevision, 200, {
      revision: {
        number: r.number,
        contentHash: r.contentHash,
        message: r.message,
        author: { id: r.authorId, name: r.authorName },
        createdAt: r.createdAt.toISOString(),
        document: r.document,
        verdict: r.verdict,
        refusedByFormat11: standing.passes ? [] : standing.reasons,
      },
    });
  });
}

export async function action() {
  return methodNotAllowed("GET");
}
