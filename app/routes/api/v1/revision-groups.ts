// GET /api/v1/designs/:designId/revisions/:number/groups?set=SET[&limit=N]
//   -> chainproof/groups@1 (spec section 4) plus groupCount; 400 for a set that cannot be grouped (any member)
import type { Route } from "./+types/revision-groups";
import { apiError, handleApi, reply, requireMethod, zodFields } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { groupsQuerySchema } from "~/api/row-groups";
import { groupRows, RowSetError } from "~/engine";
import { requireRevisionApi } from "~/reviews/access.server";

export async function loader({ request, params, context }: Route.LoaderArgs) {
  return handleApi(request, async () => {
    requireMethod(request, "GET");
    const { compiled } = await requireRevisionApi(context, request, params.designId, params.number, "workspace.view");
    const query = groupsQuerySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
    if (!query.success) return apiError(400, "invalid_query", "The query is not valid.", zodFields(query.error));
    try {
      return reply(api.revisionGroups, 200, groupRows(compiled, query.data.set, { limit: query.data.limit }), {
        headers: { "cache-control": "private, max-age=300" },
      });
    } catch (e) {
      if (e instanceof RowSetError) return apiError(400, "invalid_query", e.message, [{ path: "set", message: e.message }]);
      throw e;
    }
  });
}
