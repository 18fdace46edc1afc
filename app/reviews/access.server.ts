// Finding a revision named in a URL, for a member of its workspace with the needed role.
import type { Membership } from "~/auth/guard.server";
import { requireCan, type RequestContext } from "~/auth/context.server";
import { apiError } from "~/api/http.server";
import { getDesign, requireDesign } from "~/designs/designs.server";
import type { Action } from "~/lib/roles";
import { compiledRevision, revisionNumber, revisionRef, type RevisionRef } from "./compiled.server";

/** API routes (/api/v1/designs/:designId/revisions/:number/...): 401 / 404 / 403 as JSON. */
export async function requireRevisionApi(context: RequestContext, request: Request, designId: string, number: string, action: Action) {
  const { member, design } = await requireDesign(context, request, designId, action);
  const n = revisionNumber(number);
  const ref = n === null ? null : await revisionRef(member.workspace.id, design.id, n);
  if (!ref) throw apiError(404, "not_found", `This design has no revision ${number}.`);
  const compiled = await compiledRevision(member.workspace.id, ref);
  return { member, design, ref, compiled };
}

/** Pages (/w/:ws/designs/:designId/revisions/:number/...): 403 for the role (first), then 404. */
export async function requireRevisionPage(
  context: RequestContext,
  params: { designId?: string; number?: string },
  action: Action,
): Promise<{ member: Membership; design: NonNullable<Awaited<ReturnType<typeof getDesign>>>; ref: RevisionRef }> {
  const member = requireCan(context, action);
  const design = await getDesign(member.workspace.id, params.designId ?? "");
  const n = revisionNumber(params.number);
  const ref = design && n !== null ? await revisionRef(member.workspace.id, design.id, n) : null;
  if (!design || !ref) throw new Response("Not found", { status: 404, statusText: "Not found" });
  return { member, design, ref };
}
