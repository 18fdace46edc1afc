// Vehicles of a workspace; every query is scoped by workspace id.
import { and, asc, eq } from "drizzle-orm";
import { db, schema } from "~/db/client.server";
import { recordAudit } from "~/audit/audit.server";
import type { z } from "zod";
import type { vehicleSchema } from "~/lib/forms";

export async function listVehicles(workspaceId: string) {
  return db.select().from(schema.vehicle).where(eq(schema.vehicle.workspaceId, workspaceId)).orderBy(asc(schema.vehicle.name));
}

export async function getVehicle(workspaceId: string, id: string) {
  const rows = await db
    .select()
    .from(schema.vehicle)
    .where(and(eq(schema.vehicle.id, id), eq(schema.vehicle.workspaceId, workspaceId)))
    .limit(1);
  return rows[0] ?? null;
}

export async function createVehicle(workspaceId: string, actorId: string, input: z.infer<typeof vehicleSchema>) {
  return db.transaction(async (tx) => {
    const id = crypto.randomUUID();
    await tx.insert(schema.vehicle).values({ id, workspaceId, ...input });
    await recordAudit({ workspaceId, actorId, action: "vehicle.created", subject: input.name }, tx);
    return id;
  });
}
