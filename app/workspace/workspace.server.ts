// Workspaces, members and invitations. Every function takes the workspace id it is scoped to.
import { and, asc, eq, isNull, gt, sql } from "drizzle-orm";
import { createHash, randomBytes } from "node:crypto";
import { db, schema } from "~/db/client.server";
import { env } from "~/env.server";
import { recordAudit } from "~/audit/audit.server";
import { composeMail, sendMail } from "~/mail/mailer.server";
import { ROLE_DUTIES, ROLE_LABELS, type Role } from "~/lib/roles";

const hashToken = (token: string) => createHash("sha256").update(token).digest("hex");

export function slugify(name: string): string {
  const base = name
    .toLowerCase()
    .normalize("NFKD")
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 40);
  return base || "workspace";
}

/** PostgreSQL's unique_violation: another request took the slug first. */
const isUniqueViolation = (err: unknown) =>
  (err as { code?: string; cause?: { code?: string } })?.code === "23505" ||
  (err as { cause?: { code?: string } })?.cause?.code === "23505";

/**
 * A new workspace with its owner as admin. Workspaces of one name made at the same moment race for
 * the same slug: the loser tries again with the next free one (issue 11), a few times at most.
 */
export async function createWorkspace(name: string, ownerId: string) {
  for (let attempt = 1; ; attempt++) {
    try {
      return await insertWorkspace(name, ownerId);
    } catch (err) {
      if (!isUniqueViolation(err) || attempt >= 8) throw err;
    }
  }
}

async function insertWorkspace(name: string, ownerId: string) {
  return db.transaction(async (tx) => {
    const base = slugify(name);
    const taken = await tx
      .select({ slug: schema.workspace.slug })
      .from(schema.workspace)
      .where(sql`${schema.workspace.slug} = ${base} or ${schema.workspace.slug} like ${base + "-%"}`);
    const used = new Set(taken.map((t) => t.slug));
    let slug = base;
    for (let i = 2; used.has(slug); i++) slug = `${base}-${i}`;
    const id = crypto.randomUUID();
    await tx.insert(schema.workspace).values({ id, slug, name });
    await tx.insert(schema.member).values({ id: crypto.randomUUID(), workspaceId: id, userId: ownerId, role: "admin" });
    await recordAudit({ workspaceId: id, actorId: ownerId, action: "workspace.created", subject: name }, tx);
    return { id, slug, name };
  });
}

export async function listMembers(workspaceId: string) {
  return db
    .select({ id: schema.member.id, role: schema.member.role, userId: schema.user.id, name: schema.user.name, email: schema.user.email })
    .from(schema.member)
    .innerJoin(schema.user, eq(schema.member.userId, schema.user.id))
    .where(eq(schema.member.workspaceId, workspaceId))
    .orderBy(asc(schema.user.email));
}

export async function listOpenInvitations(workspaceId: string) {
  return db
    .select({
      id: schema.invitation.id,
      email: schema.invitation.email,
      role: schema.invitation.role,
      expiresAt: schema.invitation.expiresAt,
    })
    .from(schema.invitation)
    .where(
      and(
        eq(schema.invitation.workspaceId, workspaceId),
        isNull(schema.invitation.acceptedAt),
        isNull(schema.invitation.revokedAt),
        gt(schema.invitation.expiresAt, new Date()),
      ),
    )
    .orderBy(asc(schema.invitation.email));
}

export async function inviteMember(ws: { id: string; name: string }, inviter: { id: string; name: string }, email: string, role: Role) {
  const token = randomBytes(24).toString("base64url");
  await db.transaction(async (tx) => {
    await tx.insert(schema.invitation).values({
      id: crypto.randomUUID(),
      workspaceId: ws.id,
      email,
      role,
      tokenHash: hashToken(token),
      invitedBy: inviter.id,
      expiresAt: new Date(Date.now() + 7 * 24 * 3600 * 1000),
    });
    await recordAudit({ workspaceId: ws.id, actorId: inviter.id, action: "member.invited", subject: email, detail: { role } }, tx);
  });
  const url = new URL(`/invite/${token}`, env.APP_URL).href;
  await sendMail(
    composeMail(
      email,
      `${inviter.name} invited you to ${ws.name} on Chainproof`,
      [
        `${inviter.name} invited you to join the workspace "${ws.name}" as ${ROLE_LABELS[role].toLowerCase()}, to ${ROLE_DUTIES[role]}.`,
        "The invitation is valid for seven days.",
      ],
      { label: "Accept the invitation", url },
    ),
  );
  return url;
}

export async function findInvitation(token: string) {
  const rows = await db
    .select({
      id: schema.invitation.id,
      email: schema.invitation.email,
      role: schema.invitation.role,
      expiresAt: schema.invitation.expiresAt,
      acceptedAt: schema.invitation.acceptedAt,
      revokedAt: schema.invitation.revokedAt,
      workspaceId: schema.workspace.id,
      workspaceSlug: schema.workspace.slug,
      workspaceName: schema.workspace.name,
    })
    .from(schema.invitation)
    .innerJoin(schema.workspace, eq(schema.invitation.workspaceId, schema.workspace.id))
    .where(eq(schema.invitation.tokenHash, hashToken(token)))
    .limit(1);
  return rows[0] ?? null;
}

export async function acceptInvitation(token: string, user: { id: string; email: string }) {
  return db.transaction(async (tx) => {
    const peek = await tx
      .select({ workspaceId: schema.invitation.workspaceId })
      .from(schema.invitation)
      .where(eq(schema.invitation.tokenHash, hashToken(token)))
      .limit(1);
    if (peek[0]) await lockWorkspace(tx, peek[0].workspaceId);
    const found = await tx
      .select()
      .from(schema.invitation)
      .where(eq(schema.invitation.tokenHash, hashToken(token)))
      .for("update")
      .limit(1);
    const inv = found[0];
    if (!inv || inv.acceptedAt || inv.revokedAt || inv.expiresAt < new Date())
      return { ok: false as const, reason: "This invitation is no longer valid." };
    if (inv.email.toLowerCase() !== user.email.toLowerCase())
      return { ok: false as const, reason: `This invitation is for ${inv.email}. Sign in with that address to accept it.` };
    // Accepting a lesser role as the workspace's only admin would leave it without one.
    const current = await tx
      .select({ role: schema.member.role })
      .from(schema.member)
      .where(and(eq(schema.member.workspaceId, inv.workspaceId), eq(schema.member.userId, user.id)));
    if (current[0]?.role === "admin" && inv.role !== "admin" && (await adminCount(tx, inv.workspaceId)) <= 1)
      return { ok: false as const, reason: "You are this workspace's only admin: make someone else admin before taking another role." };
    await tx
      .insert(schema.member)
      .values({ id: crypto.randomUUID(), workspaceId: inv.workspaceId, userId: user.id, role: inv.role })
      .onConflictDoUpdate({ target: [schema.member.workspaceId, schema.member.userId], set: { role: inv.role } });
    await tx.update(schema.invitation).set({ acceptedAt: new Date() }).where(eq(schema.invitation.id, inv.id));
    await recordAudit(
      { workspaceId: inv.workspaceId, actorId: user.id, action: "member.joined", subject: user.email, detail: { role: inv.role } },
      tx,
    );
    return { ok: true as const, workspaceId: inv.workspaceId };
  });
}

/** Withdraws an open invitation of this workspace; false when there is none by that id (another workspace's, say). */
export async function revokeInvitation(workspaceId: string, actorId: string, invitationId: string): Promise<boolean> {
  return db.transaction(async (tx) => {
    const r = await tx
      .update(schema.invitation)
      .set({ revokedAt: new Date() })
      .where(
        and(
          eq(schema.invitation.id, invitationId),
          eq(schema.invitation.workspaceId, workspaceId),
          isNull(schema.invitation.acceptedAt),
          isNull(schema.invitation.revokedAt),
        ),
      )
      .returning({ email: schema.invitation.email });
    if (r[0]) await recordAudit({ workspaceId, actorId, action: "member.invitation-revoked", subject: r[0].email }, tx);
    return r.length > 0;
  });
}

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

/**
 * Every change of who belongs to a workspace, or with which role, first locks the workspace's row, so
 * such changes run one after another: two admins demoting each other at once neither deadlock nor both
 * succeed, and the admin count each one reads is the one the other left.
 */
async function lockWorkspace(tx: Tx, workspaceId: string): Promise<void> {
  await tx.select({ id: schema.workspace.id }).from(schema.workspace).where(eq(schema.workspace.id, workspaceId)).for("no key update");
}

async function adminCount(tx: Tx, workspaceId: string): Promise<number> {
  const rows = await tx
    .select({ n: sql<number>`count(*)::int` })
    .from(schema.member)
    .where(and(eq(schema.member.workspaceId, workspaceId), eq(schema.member.role, "admin")));
  return rows[0]?.n ?? 0;
}

/** The member (with e-mail and role), locked for the rest of the transaction. */
async function lockMember(tx: Tx, workspaceId: string, memberId: string) {
  const rows = await tx
    .select({ id: schema.member.id, userId: schema.member.userId, role: schema.member.role, email: schema.user.email })
    .from(schema.member)
    .innerJoin(schema.user, eq(schema.member.userId, schema.user.id))
    .where(and(eq(schema.member.id, memberId), eq(schema.member.workspaceId, workspaceId)))
    .for("update");
  return rows[0];
}

/** Changes a member's role; refuses to leave the workspace without an admin. */
export async function changeRole(workspaceId: string, actorId: string, memberId: string, role: Role) {
  return db.transaction(async (tx) => {
    await lockWorkspace(tx, workspaceId);
    const target = await lockMember(tx, workspaceId, memberId);
    if (!target) return { ok: false as const, message: "No such member." };
    if (target.role === "admin" && role !== "admin") {
      if ((await adminCount(tx, workspaceId)) <= 1) return { ok: false as const, message: "A workspace needs at least one admin." };
    }
    await tx.update(schema.member).set({ role }).where(eq(schema.member.id, memberId));
    await recordAudit(
      { workspaceId, actorId, action: "member.role-changed", subject: target.email, detail: { from: target.role, to: role } },
      tx,
    );
    return { ok: true as const };
  });
}

export async function removeMember(workspaceId: string, actorId: string, memberId: string) {
  return db.transaction(async (tx) => {
    await lockWorkspace(tx, workspaceId);
    const target = await lockMember(tx, workspaceId, memberId);
    if (!target) return { ok: false as const, message: "No such member." };
    if (target.role === "admin") {
      if ((await adminCount(tx, workspaceId)) <= 1) return { ok: false as const, message: "A workspace needs at least one admin." };
    }
    await tx.delete(schema.member).where(eq(schema.member.id, memberId));
    // Their API keys for this workspace end with the membership, so a later invitation does not revive them.
    await tx
      .update(schema.apiKey)
      .set({ revokedAt: new Date() })
      .where(and(eq(schema.apiKey.workspaceId, workspaceId), eq(schema.apiKey.userId, target.userId), isNull(schema.apiKey.revokedAt)));
    await recordAudit({ workspaceId, actorId, action: "member.removed", subject: target.email }, tx);
    return { ok: true as const };
  });
}

export const DEMO_EMAILS = ["admin@example.com", "engineer@example.com", "technician@example.com", "reviewer@example.com"];

/** Whether the demo accounts are here (the shell then says so); asked at most once a minute. */
export async function demoAccountsExist(): Promise<boolean> {
  if (demoKnown && Date.now() - demoKnown.at < 60_000) return demoKnown.exists;
  const rows = await db
    .select({ n: sql<number>`count(*)::int` })
    .from(schema.user)
    .where(sql`${schema.user.email} in ${DEMO_EMAILS}`);
  demoKnown = { exists: (rows[0]?.n ?? 0) > 0, at: Date.now() };
  return demoKnown.exists;
}
let demoKnown: { exists: boolean; at: number } | null = null;
