// GET /api/v1/designs/:designId/revisions/:number/why?rule=ID[&limit=N]
//   -> chainproof/why@1 (spec section 4) plus groupCount per reason; 400 for a rule that is not an
//      inhibit rule forbidding drive (any member)
import type { Route } from "./+types/revision-why";
import { apiError, handleApi, reply, requireMethod, zodFields } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { whyQuerySchema } from "~/api/row-groups";
import { RowSetError, whyRuleHolds } from "~/engine";
import { requireRevisionApi } from "~/reviews/access.server";

export async function loader({ request, params, context }: Route.LoaderArgs) {
  return handleApi(request, async () => {
    requireMethod(request, "GET");
    const { compiled } = await requireRevisionApi(context, request, params.designId, params.number, "workspace.view");
    const query = whyQuerySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
    if (!query.success) return apiError(400, "invalid_query", "The query is not valid.", zodFields(query.error));
    try {
      return reply(api.revisionWhy, 200, whyRuleHolds(compiled, query.data.rule, { limit: query.data.limit }), {
        headers: { "cache-control": "private, max-age=300" },
      });
    } catch (e) {
      if (e instanceof RowSetError) return apiError(400, "invalid_query", e.message, [{ path: "rule", message: e.message }]);
      throw e;
    }
  });
}
