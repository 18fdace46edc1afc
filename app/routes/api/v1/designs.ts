// GET  /api/v1/designs?workspace=SLUG[&vehicle=ID|none][&status=draft|proven][&archived=include|only][&limit=N&cursor=C]
//        -> { designs: DesignSummary[], nextCursor }   (all of them when neither limit nor cursor is given;
//           archived designs only with archived=include or only, decision 167)
// POST /api/v1/designs?workspace=SLUG  { name, vehicleId?, start? }           -> 201 { design, draft: { version } }
import type { Route } from "./+types/designs";
import { requireApiCan } from "~/auth/context.server";
import { apiError, handleApi, readJsonBody, reply, requireMethod, zodFields } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { createDesign, listDesigns } from "~/designs/designs.server";
import { archivedFilterSchema, createDesignBodySchema, designFilterSchema } from "~/designs/forms";
import { DESIGN_BODY_MAX_BYTES } from "~/designs/types";
import { parseQuery } from "~/api/access.server";
import { ascending, pageOfList } from "~/api/pagination.server";
import { pageQuerySchema } from "~/api/schemas";
import { z } from "zod";

// The page ignores a nonsense archived filter; the API names it (400).
const archivedQuerySchema = z.object({ archived: archivedFilterSchema });

function workspaceOf(request: Request): string {
  const slug = new URL(request.url).searchParams.get("workspace");
  if (!slug) throw apiError(400, "invalid_query", "Name the workspace: ?workspace=SLUG.", [{ path: "workspace", message: "required" }]);
  return slug;
}

export async function loader({ request, context }: Route.LoaderArgs) {
  return handleApi(request, async () => {
    const m = await requireApiCan(context, request, workspaceOf(request), "workspace.view");
    const params = Object.fromEntries(new URL(request.url).searchParams);
    const filter = designFilterSchema.parse(params);
    parseQuery(request, archivedQuerySchema);
    const page = parseQuery(request, pageQuerySchema);
    const designs = await listDesigns(m.workspace.id, filter);
    // Without ?limit or ?cursor the whole list, in the page's order, as before paging existed.
    if (page.limit === undefined && page.cursor === undefined) return reply(api.listDesigns, 200, { designs, nextCursor: null });
    const one = pageOfList(designs, (d) => [d.name, d.id], ascending, page, "string");
    return reply(api.listDesigns, 200, { designs: one.items, nextCursor: one.nextCursor });
  });
}

export async function action({ request, context }: Route.ActionArgs) {
  return handleApi(request, async () => {
    requireMethod(request, "POST");
    const m = await requireApiCan(context, request, workspaceOf(request), "design.edit");
    const body = createDesignBodySchema.safeParse(await readJsonBody(request, DESIGN_BODY_MAX_BYTES));
    if (!body.success) return apiError(400, "invalid_body", "The new design is incomplete.", zodFields(body.error));
    const created = await createDesign(m.workspace.id, m.user.id, body.data);
    if (!created.ok) {
      const fields = Object.entries(created.fields).map(([path, message]) => ({ path, message }));
      return apiError(400, "invalid_body", "The new design is incomplete.", fields);
    }
    return reply(api.createDesign, 201, {
      design: { id: created.id, name: body.data.name, vehicleId: body.data.vehicleId, status: "draft" },
      draft: { version: created.draftVersion },
    });
  });
}
