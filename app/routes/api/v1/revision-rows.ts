// GET /api/v1/designs/:designId/revisions/:number/rows?from=&count=&only=&rule=&where=COND:STATE
//   -> { total, from, rows: TableRow[] }   (total: rows matching the filter; any member)
import type { Route } from "./+types/revision-rows";
import { handleApi, reply, requireMethod } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { requireRevisionApi } from "~/reviews/access.server";
import { rowsPage } from "~/reviews/truth-table.server";

export async function loader({ request, params, context }: Route.LoaderArgs) {
  return handleApi(request, async () => {
    requireMethod(request, "GET");
    const { compiled } = await requireRevisionApi(context, request, params.designId, params.number, "workspace.view");
    return reply(api.revisionRows, 200, rowsPage(compiled, new URL(request.url).searchParams), {
      headers: { "cache-control": "private, max-age=300" },
    });
  });
}
