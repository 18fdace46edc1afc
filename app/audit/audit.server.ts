// The audit log: who did what, when. Written inside the caller's transaction when one is given.
import { and, desc, eq, inArray } from "drizzle-orm";
import { db, schema } from "~/db/client.server";
import { DESIGN_EVENT_ACTIONS } from "./design-events";

type Executor = Pick<typeof db, "insert">;

export async function recordAudit(
  event: {
    workspaceId?: string | null;
    actorId?: string | null;
    action: string;
    subject?: string | null;
    detail?: Record<string, unknown>;
  },
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

/** The workspace's design events, newest first, with who did each (names, never addresses). */
export async function designEvents(workspaceId: string, limit = 100) {
  return db
    .select({
      id: schema.auditEvent.id,
      action: schema.auditEvent.action,
      subject: schema.auditEvent.subject,
      detail: schema.auditEvent.detail,
      at: schema.auditEvent.at,
      actorName: schema.user.name,
    })
    .from(schema.auditEvent)
    .leftJoin(schema.user, eq(schema.auditEvent.actorId, schema.user.id))
    .where(and(eq(schema.auditEvent.workspaceId, workspaceId), inArray(schema.auditEvent.action, [...DESIGN_EVENT_ACTIONS])))
    .orderBy(desc(schema.auditEvent.at))
    .limit(limit);
}
