// GET /api/v1/designs/:designId/revisions/:number/rows/:index
//   -> { row: TableRow, energizedTerminals, diagnosis }   (the engine's diagnosis of that row; any member)
import type { Route } from "./+types/revision-row";
import { apiError, handleApi, reply, requireMethod } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { requireRevisionApi } from "~/reviews/access.server";
import { rowDetail } from "~/reviews/truth-table.server";

export async function loader({ request, params, context }: Route.LoaderArgs) {
  return handleApi(request, async () => {
    requireMethod(request, "GET");
    const { compiled } = await requireRevisionApi(context, request, params.designId, params.number, "workspace.view");
    const index = /^[0-9]{1,10}$/.test(params.index) ? Number(params.index) : -1;
    if (index < 0 || index >= compiled.rows) {
      return apiError(404, "not_found", `This truth table has rows 0 to ${compiled.rows - 1}.`, [
        { path: "index", message: `a row from 0 to ${compiled.rows - 1}` },
      ]);
    }
    return reply(api.revisionRow, 200, rowDetail(compiled, index), { headers: { "cache-control": "private, max-age=300" } });
  });
}
