// GET /api/v1/designs/:designId/revisions/:number/table.csv?only=&rule=&where=COND:STATE
//   -> text/csv, streamed (the engine's csvChunks: header line, then the matching rows; any member)
import type { Route } from "./+types/revision-table-csv";
import { handleApi, requireMethod } from "~/api/http.server";
import { requireRevisionApi } from "~/reviews/access.server";
import { csvStream, requestFilter } from "~/reviews/truth-table.server";
import { create as contentDisposition } from "content-disposition";

/** A file name of safe characters: "haybarn-campus-hauler-3-r2-unsafe.csv". */
function fileName(designName: string, number: number, params: URLSearchParams): string {
  const base =
    designName
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-|-$/g, "")
      .slice(0, 60) || "design";
  const only = params.get("only");
  return `${base}-r${number}${only ? `-${only}` : ""}${params.getAll("where").length > 0 ? "-filtered" : ""}.csv`;
}

export async function loader({ request, params, context }: Route.LoaderArgs) {
  return handleApi(request, async () => {
    requireMethod(request, "GET");
    const { compiled, design, ref } = await requireRevisionApi(context, request, params.designId, params.number, "workspace.view");
    const search = new URL(request.url).searchParams;
    const filter = requestFilter(compiled, search);
    return new Response(csvStream(compiled, filter), {
      headers: {
        "content-type": "text/csv; charset=utf-8",
        "content-disposition": contentDisposition(fileName(design.name, ref.number, search)),
        "cache-control": "private, no-store",
        "x-content-type-options": "nosniff",
      },
    });
  });
}
