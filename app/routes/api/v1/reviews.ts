// GET /api/v1/reviews?workspace=SLUG -> { slug, isReviewer, items }   (the review inbox, as the
//     reviews page shows it: a reviewer gets the requests addressed to them, anyone else every
//     request of the workspace; newest first, at most 200; any member)
import type { Route } from "./+types/reviews";
import { requireApiCan } from "~/auth/context.server";
import { handleApi, methodNotAllowed, reply } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { parseQuery } from "~/api/access.server";
import { workspaceQuerySchema } from "~/api/schemas";
import { inboxFor } from "~/reviews/inbox.server";

export async function loader({ request, context }: Route.LoaderArgs) {
  return handleApi(request, async () => {
    const query = parseQuery(request, workspaceQuerySchema);
    const m = await requireApiCan(context, request, query.workspace, "workspace.view");
    return reply(api.reviewInbox, 200, await inboxFor(m));
  });
}

export async function action({ request }: Route.ActionArgs) {
  return handleApi(request, async () => methodNotAllowed("GET"));
}
