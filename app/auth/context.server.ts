// Who is asking, found once per request by route middleware and kept in a typed context
// (docs/decisions/151). The workspace layout (routes/workspace.ts) puts the member of /w/:ws there;
// the API layout (routes/api/v1/layout.ts) puts the caller there. Middleware only finds: every
// loader and action still states what it needs with requireCan / requireApiCan, so a route moved
// out of its layout, or a layout that stops checking, fails closed instead of open.
import { createContext, type MiddlewareFunction, type RouterContextProvider } from "react-router";
import { can, rolesThatCan, type Action } from "~/lib/roles";
import { requireMember, workspacesFor, type Membership, type WorkspaceOfUser } from "./guard.server";

/** The context a loader, action or middleware receives. */
export type RequestContext = Pick<RouterContextProvider, "get">;

const memberContext = createContext<Membership | null>(null);
const workspacesContext = createContext<WorkspaceOfUser[]>([]);

/**
 * Middleware of every /w/:ws route: the signed-in user's membership of that workspace, looked up
 * once. Signed out: redirect to sign-in. Not a member (or no such workspace): 404.
 */
export const workspaceMember: MiddlewareFunction<Response> = async ({ request, params, context }) => {
  const member = await requireMember(request, params.ws, rolesThatCan("workspace.view"));
  context.set(memberContext, member);
  context.set(workspacesContext, await workspacesFor(request, member.user.id));
};

/** The member found by the workspace layout, without asking for a role (the route asks with requireCan). */
function memberIn(context: RequestContext): Membership {
  const member = context.get(memberContext);
  // A route outside the workspace layout has no member: a programming error, refused.
  if (!member) throw new Error("requireCan: no workspace member in this request's context (is the route inside the workspace layout?)");
  return member;
}

/**
 * The workspace member, when their role may do `action`; a 403 page otherwise. Called by every
 * page loader and action under /w/:ws, whatever its layout already checked.
 */
export function requireCan(context: RequestContext, action: Action): Membership {
  const member = memberIn(context);
  if (!can(member.role, action)) {
    throw new Response(`This page needs the role ${rolesThatCan(action).join(" or ")}.`, { status: 403, statusText: "Forbidden" });
  }
  return member;
}

/** The signed-in user's workspaces and roles (the shell's switcher), found by the workspace layout. */
export function workspacesIn(context: RequestContext): WorkspaceOfUser[] {
  memberIn(context);
  return context.get(workspacesContext);
}
