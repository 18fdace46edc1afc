// GET  /api/v1/designs/:designId/revisions[?limit=N&cursor=C]
//        -> { revisions: [{ number, contentHash, message, author, createdAt, singleFaults }], nextCursor }
// POST /api/v1/designs/:designId/revisions { document, baseRevision, message? }
//   201 { revision: { number, contentHash, verdict } }
//   400 { error: { code: "invalid_design" | "invalid_body" | "invalid_json", message, fields } }
//   409 { error: { code: "stale_revision", ... }, latestRevision } | { error: { code: "design_archived", ... }, archived }
//   422 { error: { code: "never_drives" | "rules_fail", ... }, verdict }  (spec 1.1: ok needs a drive row)
import type { Route } from "./+types/design-revisions";
import { apiError, handleApi, readJsonBody, reply, requireMethod, zodFields } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { archivedAnswer, listRevisions, requireDesign, saveProvenRevision } from "~/designs/designs.server";

import { proofLimitAnswer } from "~/proofs/pool.server";
import { jsonObjectSchema, saveRevisionBodySchema } from "~/designs/forms";
import { DESIGN_BODY_MAX_BYTES } from "~/designs/types";
import { parseQuery } from "~/api/access.server";
import { descending, pageOfList } from "~/api/pagination.server";
import { pageQuerySchema } from "~/api/schemas";

export async function loader({ request, params, context }: Route.LoaderArgs) {
  return handleApi(request, async () => {
    const { member, design } = await requireDesign(context, request, params.designId, "workspace.view");
    const page = parseQuery(request, pageQuerySchema);
    const all = await listRevisions(member.workspace.id, design.id);
    // Newest first; without ?limit or ?cursor every revision, as before paging existed.
    const whole = page.limit === undefined && page.cursor === undefined;
    const one = whole ? { items: all, nextCursor: null } : pageOfList(all, (r) => [r.number, String(r.number)], descending, page, "number");
    return reply(api.listRevisions, 200, {
      nextCursor: one.nextCursor,
      revisions: one.items.map((r) => ({
        number: r.number,
        contentHash: r.contentHash,
        message: r.message,
        author: { id: r.authorId, name: r.authorName },
        createdAt: r.createdAt.toISOString(),
        singleFaults: r.singleFaults,
      })),
    });
  });
}

export async function action({ request, params, context }: Route.ActionArgs) {
  return handleApi(request, async () => {
    requireMethod(request, "POST");
    const { member, design } = await requireDesign(context, request, params.designId, "design.edit");
    const raw = jsonObjectSchema.safeParse(await readJsonBody(request, DESIGN_BODY_MAX_BYTES));
    if (!raw.success) return apiError(400, "invalid_body", "The request body is a JSON object.", zodFields(raw.error));
    const body = saveRevisionBodySchema.safeParse(raw.data);
    if (!body.success) return apiError(400, "invalid_body", "The revision request is incomplete.", zodFields(body.error));
    const { document, baseRevision, message } = body.data;

    const saved = await saveProvenRevision(member.workspace.id, design.id, member.user.id, { document, baseRevision, message }).catch(
      proofLimitAnswer,
    );
    if (saved.kind === "unstorable") {
      return apiError(400, "invalid_design", "The design holds something that cannot be stored; nothing was saved.", [saved.problem]);
    }
    if (saved.kind === "invalid") {
      const n = saved.problems.length;
      return apiError(
        400,
        "invalid_design",
        `The design breaks the format in ${n} ${n === 1 ? "place" : "places"}; nothing was saved.`,
        saved.problems,
      );
    }
    if (saved.kind === "refused") return apiError(422, saved.code, saved.message, [], { verdict: saved.verdict });
    if (saved.kind === "missing") return apiError(404, "not_found", "No such design.");
    if (saved.kind === "archived") return archivedAnswer(member.workspace.id, design.id, "revision");
    if (saved.kind === "stale") {
      return apiError(
        409,
        "stale_revision",
        `This change starts from revision ${baseRevision}, but the latest revision is ${saved.latestRevision}. Load the latest revision and apply the change to it.`,
        [],
        { latestRevision: saved.latestRevision },
      );
    }
    return reply(api.saveRevision, 201, { revision: { number: saved.number, contentHash: saved.contentHash, verdict: saved.verdict } });
  });
}
