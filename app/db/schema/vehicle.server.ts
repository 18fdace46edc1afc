// Vehicles of a workspace.
import { index, pgTable, text, timestamp } from "drizzle-orm/pg-core";
import { workspace } from "./workspace.server";

export const vehicle = pgTable(
  "vehicle",
  {
    id: text("id").primaryKey(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspace.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    serial: text("serial").notNull().default(""),
    model: text("model").notNull().default(""),
    controllerDescription: text("controller_description").notNull().default(""),
    notes: text("notes").notNull().default(""),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("vehicle_workspace_idx").on(t.workspaceId)],
);

export type Vehicle = typeof vehicle.$inferSelect;
