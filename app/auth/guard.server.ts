// The one place that decides who may see or do what. Called by EVERY loader and action.
import { and, eq } from "drizzle-orm";
import { redirect } from "react-router";
import { auth } from "./auth.server";
import { db, schema } from "~/db/client.server";
import type { Role } from "~/lib/roles";

export type SignedIn = { user: { id: string; email: string; name: string }; sessionId: string };
export type Membership = SignedIn & { workspace: { id: string; slug: string; name: string }; role: Role };

type Kind = "page" | "api";

function apiError(status: number, code: string, message: string): Response {
  return Response.json({ error: { code, message, fields: [] } }, { status });
}

export async function getSignedIn(request: Request): Promise<SignedIn | null> {
  const found = await auth.api.getSession({ headers: request.headers });
  if (!found) return null;
  return { user: { id: found.user.id, email: found.user.email, name: found.user.name }, sessionId: found.session.id };
}

export async function requireUser(request: Request, kind: Kind = "page"): Promise<SignedIn> {
  const signedIn = await getSignedIn(request);
  if (signedIn) return signedIn;
  if (kind === "api") throw apiError(401, "unauthenticated", "Sign in first.");
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
): Promise<Membership> {
  const signedIn = await requireUser(request, kind);
  const rows = await db
    .select({ id: schema.workspace.id, slug: schema.workspace.slug, name: schema.workspace.name, role: schema.member.role })
    .from(schema.member)
    .innerJoin(schema.workspace, eq(schema.member.workspaceId, schema.workspace.id))
    .where(and(eq(schema.workspace.slug, slug ?? ""), eq(schema.member.userId, signedIn.user.id)))
    .limit(1);
  const row = rows[0];
  if (!row) {
    if (kind === "api") throw apiError(404, "not_found", "No such workspace.");
    throw new Response("Not found", { status: 404, statusText: "Not found" });
  }
  if (!allowed.includes(row.role)) {
    if (kind === "api") throw apiError(403, "forbidden", `This needs the role ${allowed.join(" or ")}; you are ${row.role}.`);
    throw new Response(`This page needs the role ${allowed.join(" or ")}.`, { status: 403, statusText: "Forbidden" });
  }
  return { ...signedIn, workspace: { id: row.id, slug: row.slug, name: row.name }, role: row.role };
}

export async function workspacesOf(userId: string) {
  return db
    .select({ id: schema.workspace.id, slug: schema.workspace.slug, name: schema.workspace.name, role: schema.member.role })
    .from(schema.member)
    .innerJoin(schema.workspace, eq(schema.member.workspaceId, schema.workspace.id))
    .where(eq(schema.member.userId, userId))
    .orderBy(schema.workspace.name);
}
