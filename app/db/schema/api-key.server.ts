// Personal API keys: scoped to one workspace, acting with the member's current role; stored hashed.
import { index, pgTable, text, timestamp } from "drizzle-orm/pg-core";
import { user } from "./auth.server";
import { workspace } from "./workspace.server";

export const apiKey = pgTable(
  "api_key",
  {
    id: text("id").primaryKey(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspace.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    // The first characters of the key, shown so the owner can tell keys apart.
    prefix: text("prefix").notNull(),
    keyHash: text("key_hash").notNull().unique(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    lastUsedAt: timestamp("last_used_at", { withTimezone: true }),
    revokedAt: timestamp("revoked_at", { withTimezone: true }),
  },
  (t) => [index("api_key_user_idx").on(t.userId, t.workspaceId)],
);

export type ApiKey = typeof apiKey.$inferSelect;
