// Who is asking, found once per request by route middleware and kept in a typed context
// (docs/decisions/151). The workspace layout (routes/workspace.ts) puts the member of /w/:ws there;
// the API layout (routes/api/v1/layout.ts) puts the caller there. Middleware only finds: every
// loader and action still states what it needs with requireCan / requireApiCan, so a route moved
// out of its layout, or a layout that stops checking, fails closed instead of open.
import { createContext, type MiddlewareFunction, type RouterContextProvider } from "react-router";
import { can, rolesThatCan, type Action } from "~/lib/roles";
import {
  getSignedIn,
  requireMember,
  requireUser,
  workspacesFor,
  type Membership,
  type SignedIn,
  type WorkspaceOfUser,
} from "./guard.server";

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

// ---------------------------------------------------------------- the JSON API

type ApiCaller = { signedIn: Promise<SignedIn | null> };
const apiCallerContext = createContext<ApiCaller | null>(null);

/**
 * Middleware of every /api/v1 route: who is calling (a session or a personal API key), looked up
 * once. Nothing is refused here: the OpenAPI document is public, and the routes that need a caller
 * answer 401, 403 or an outage's 503 in the API's JSON shape when they ask.
 */
export const apiCaller: MiddlewareFunction<Response> = async ({ request, context }) => {
  const signedIn = getSignedIn(request);
  await signedIn.catch(() => null);
  context.set(apiCallerContext, { signedIn });
};

function callerIn(context: RequestContext): ApiCaller {
  const caller = context.get(apiCallerContext);
  if (!caller) throw new Error("requireApiCan: no API caller in this request's context (is the route inside the api/v1 layout?)");
  return caller;
}

/** The API caller: 401 when signed out or the key is not valid; 403 for a cookie mutation from another origin. */
export function requireApiCaller(context: RequestContext, request: Request): Promise<SignedIn> {
  return requireUser(request, "api", callerIn(context).signedIn);
}

/**
 * The caller's membership of the workspace named by slug, when their role may do `action`.
 * Signed out: 401. Not a member (or a key of another workspace): 404. Role: 403. All in JSON.
 */
export function requireApiCan(context: RequestContext, request: Request, slug: string | undefined, action: Action): Promise<Membership> {
  return requireMember(request, slug, rolesThatCan(action), "api", callerIn(context).signedIn);
}
