// The audit log: who did what, when. Written inside the caller's transaction when one is given.
import { desc, eq } from "drizzle-orm";
import { db, schema } from "~/db/client.server";

type Executor = Pick<typeof db, "insert">;

export async function recordAudit(
  event: { workspaceId?: string | null; actorId?: string | null; action: string; subject?: string | null; detail?: Record<string, unknown> },
  tx: Executor = db,
) {
  await tx.insert(schema.auditEvent).values({
    id: crypto.randomUUID(),
    workspaceId: event.workspaceId ?? null,
    actorId: event.actorId ?? null,
    action: event.action,
    subject: event.subject ?? null,
    detail: event.detail ?? null,
  });
}

export async function recentAudit(workspaceId: string, limit = 50) {
  return db
    .select({
      id: schema.auditEvent.id,
      action: schema.auditEvent.action,
      subject: schema.auditEvent.subject,
      at: schema.auditEvent.at,
      actor: schema.user.email,
    })
    .from(schema.auditEvent)
    .leftJoin(schema.user, eq(schema.auditEvent.actorId, schema.user.id))
    .where(eq(schema.auditEvent.workspaceId, workspaceId))
    .orderBy(desc(schema.auditEvent.at))
    .limit(limit);
}
