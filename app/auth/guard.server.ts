// The one place that decides who may see or do what. Called by EVERY loader and action.
import { eq } from "drizzle-orm";
import { redirect } from "react-router";
import { auth } from "./auth.server";
import { db, schema } from "~/db/client.server";
import type { Role } from "~/lib/roles";
import { env } from "~/env.server";
import { resolveApiKey } from "./api-keys.server";
import { databaseDownResponse, isDatabaseDown } from "~/db/unavailable.server";
import { cachedSession, rememberSession, sessionCookieOf } from "./session-cache.server";

/** Runs a lookup; a database outage becomes a clean 503 for the caller instead of a 500. */
async function orUnavailable<T>(kind: Kind, run: () => Promise<T>): Promise<T> {
  try {
    return await run();
  } catch (err) {
    // The pool turns an outage into a 503 page response; an API caller gets it as JSON.
    if (isDatabaseDown(err) || (err instanceof Response && err.status === 503)) throw databaseDownResponse(kind);
    throw err;
  }
}

/** Who is asking: a browser session, or a personal API key bound to one workspace. */
export type SignedIn = { user: { id: string; email: string; name: string }; sessionId: string; apiKeyWorkspaceId?: string };
export type Membership = SignedIn & { workspace: { id: string; slug: string; name: string }; role: Role };

type Kind = "page" | "api";

function apiError(status: number, code: string, message: string): Response {
  return Response.json({ error: { code, message, fields: [] } }, { status });
}

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

/**
 * Who is asking. Asked once per request however many loaders ask (the shell's and the page's run
 * side by side), and a browser session confirmed in the last seconds is not looked up again.
 */
export function getSignedIn(request: Request): Promise<SignedIn | null> {
  let found = signedInOf.get(request);
  if (!found) {
    found = lookUpSignedIn(request);
    signedInOf.set(request, found);
  }
  return found;
}

const signedInOf = new WeakMap<Request, Promise<SignedIn | null>>();

/** Personal API keys open the JSON API only: never a page, a form action, a file or the report PDF. */
export const API_KEY_PATH_PREFIX = "/api/v1/";

async function lookUpSignedIn(request: Request): Promise<SignedIn | null> {
  const authorization = request.headers.get("authorization");
  // Elsewhere the header is ignored, so a leaked key cannot make another key or a workspace (issue 11).
  if (authorization?.toLowerCase().startsWith("bearer ") && new URL(request.url).pathname.startsWith(API_KEY_PATH_PREFIX)) {
    const key = await resolveApiKey(authorization.slice(7).trim());
    if (!key) return null;
    return { user: { id: key.userId, email: key.email, name: key.name }, sessionId: `key:${key.id}`, apiKeyWorkspaceId: key.workspaceId };
  }
  const cookie = sessionCookieOf(request.headers.get("cookie"));
  if (!cookie) return null;
  const cached = cachedSession(cookie);
  if (cached) return cached;
  const found = await auth.api.getSession({ headers: request.headers });
  if (!found) return null;
  const signedIn = { user: { id: found.user.id, email: found.user.email, name: found.user.name }, sessionId: found.session.id };
  rememberSession(cookie, signedIn, new Date(found.session.expiresAt));
  return signedIn;
}

/** Who is asking, or the answer for someone signed out; `found` is the caller the API layout already looked up. */
export async function requireUser(
  request: Request,
  kind: Kind = "page",
  found: Promise<SignedIn | null> = getSignedIn(request),
): Promise<SignedIn> {
  const signedIn = await orUnavailable(kind, () => found);
  if (signedIn) {
    // A cookie-authenticated API mutation must come from our own pages (keys are not sent by browsers on their own).
    if (kind === "api" && !signedIn.apiKeyWorkspaceId && !SAFE_METHODS.has(request.method.toUpperCase())) {
      const origin = request.headers.get("origin");
      if (origin !== new URL(env.APP_URL).origin)
        throw apiError(403, "bad_origin", "This request must come from Chainproof's own pages, or carry an API key.");
    }
    return signedIn;
  }
  if (kind === "api") {
    const withKey = request.headers.get("authorization")?.toLowerCase().startsWith("bearer ");
    throw apiError(
      401,
      "unauthenticated",
      withKey ? "This API key is not valid or was revoked." : "Sign in, or send a personal API key as Authorization: Bearer <key>.",
    );
  }
  const url = new URL(request.url);
  throw redirect(`/sign-in?next=${encodeURIComponent(url.pathname + url.search)}`);
}

/**
 * The signed-in user's membership of the workspace named by slug, with one of the allowed roles.
 * Not a member: 404 (a workspace's existence is not revealed). Wrong role: 403.
 */
export async function requireMember(
  request: Request,
  slug: string | undefined,
  allowed: readonly Role[],
  kind: Kind = "page",
  found?: Promise<SignedIn | null>,
): Promise<Membership> {
  const signedIn = await requireUser(request, kind, found);
  // A slug the database cannot hold (NUL) names no workspace.
  if (!slug || slug.includes("\u0000")) {
    if (kind === "api") throw apiError(404, "not_found", "No such workspace.");
    throw new Response("Not found", { status: 404, statusText: "Not found" });
  }
  const row = (await orUnavailable(kind, () => workspacesFor(request, signedIn.user.id))).find((w) => w.slug === slug);
  // A key works only in the workspace it was made for.
  if (!row || (signedIn.apiKeyWorkspaceId && signedIn.apiKeyWorkspaceId !== row.id)) {
    if (kind === "api") throw apiError(404, "not_found", "No such workspace.");
    throw new Response("Not found", { status: 404, statusText: "Not found" });
  }
  if (!allowed.includes(row.role)) {
    if (kind === "api") throw apiError(403, "forbidden", `This needs the role ${allowed.join(" or ")}; you are ${row.role}.`);
    throw new Response(`This page needs the role ${allowed.join(" or ")}.`, { status: 403, statusText: "Forbidden" });
  }
  return { ...signedIn, workspace: { id: row.id, slug: row.slug, name: row.name }, role: row.role };
}

export type WorkspaceOfUser = { id: string; slug: string; name: string; role: Role };
const workspacesOfRequest = new WeakMap<Request, { userId: string; rows: Promise<WorkspaceOfUser[]> }>();

/** The signed-in user's workspaces and roles, fetched once per request (the guard and the shell both need them). */
export function workspacesFor(request: Request, userId: string): Promise<WorkspaceOfUser[]> {
  const known = workspacesOfRequest.get(request);
  if (known && known.userId === userId) return known.rows;
  const rows = workspacesOf(userId);
  workspacesOfRequest.set(request, { userId, rows });
  return rows;
}

export async function workspacesOf(userId: string): Promise<WorkspaceOfUser[]> {
  return db
    .select({ id: schema.workspace.id, slug: schema.workspace.slug, name: schema.workspace.name, role: schema.member.role })
    .from(schema.member)
    .innerJoin(schema.workspace, eq(schema.member.workspaceId, schema.workspace.id))
    .where(eq(schema.member.userId, userId))
    .orderBy(schema.workspace.name);
}
