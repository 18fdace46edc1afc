// Creating, listing, revoking and resolving personal API keys.
import { createHash, randomBytes } from "node:crypto";
import { and, desc, eq, isNull } from "drizzle-orm";
import { db, schema } from "~/db/client.server";
import { recordAudit } from "~/audit/audit.server";

const hash = (key: string) => createHash("sha256").update(key).digest("hex");

/** Returns the key itself once; only its hash is kept. */
export async function createApiKey(workspaceId: string, userId: string, name: string) {
  const secret = randomBytes(24).toString("base64url");
  const key = `cpk_${secret}`;
  const id = crypto.randomUUID();
  await db.transaction(async (tx) => {
    await tx.insert(schema.apiKey).values({ id, workspaceId, userId, name, prefix: key.slice(0, 10), keyHash: hash(key) });
    await recordAudit({ workspaceId, actorId: userId, action: "api-key.created", subject: name }, tx);
  });
  return { id, key };
}

export async function listApiKeys(workspaceId: string, userId: string) {
  return db
    .select({
      id: schema.apiKey.id,
      name: schema.apiKey.name,
      prefix: schema.apiKey.prefix,
      createdAt: schema.apiKey.createdAt,
      lastUsedAt: schema.apiKey.lastUsedAt,
    })
    .from(schema.apiKey)
    .where(and(eq(schema.apiKey.workspaceId, workspaceId), eq(schema.apiKey.userId, userId), isNull(schema.apiKey.revokedAt)))
    .orderBy(desc(schema.apiKey.createdAt));
}

export async function revokeApiKey(workspaceId: string, userId: string, id: string) {
  return db.transaction(async (tx) => {
    const r = await tx
      .update(schema.apiKey)
      .set({ revokedAt: new Date() })
      .where(
        and(
          eq(schema.apiKey.id, id),
          eq(schema.apiKey.workspaceId, workspaceId),
          eq(schema.apiKey.userId, userId),
          isNull(schema.apiKey.revokedAt),
        ),
      )
      .returning({ name: schema.apiKey.name });
    if (r[0]) await recordAudit({ workspaceId, actorId: userId, action: "api-key.revoked", subject: r[0].name }, tx);
    return r.length > 0;
  });
}

/** The user and workspace of a live key, or null. */
export async function resolveApiKey(key: string) {
  if (!key.startsWith("cpk_") || key.length > 100) return null;
  const rows = await db
    .select({
      id: schema.apiKey.id,
      workspaceId: schema.apiKey.workspaceId,
      userId: schema.user.id,
      email: schema.user.email,
      name: schema.user.name,
    })
    .from(schema.apiKey)
    .innerJoin(schema.user, eq(schema.apiKey.userId, schema.user.id))
    .where(and(eq(schema.apiKey.keyHash, hash(key)), isNull(schema.apiKey.revokedAt)))
    .limit(1);
  const row = rows[0];
  if (!row) return null;
  // Best effort: a failed timestamp update must not fail the request.
  db.update(schema.apiKey)
    .set({ lastUsedAt: new Date() })
    .where(eq(schema.apiKey.id, row.id))
    .catch(() => {});
  return row;
}
