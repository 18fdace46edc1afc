// The controller settings records of vehicles (chainproof/controller-record@1): every change is a new
// numbered version, never an update, with who recorded it and when.
import { check, index, integer, jsonb, pgTable, text, timestamp, uniqueIndex } from "drizzle-orm/pg-core";
import { sql } from "drizzle-orm";
import { user } from "./auth.server";
import { workspace } from "./workspace.server";
import { vehicle } from "./vehicle.server";

export const controllerRecord = pgTable(
  "controller_record",
  {
    id: text("id").primaryKey(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspace.id, { onDelete: "cascade" }),
    vehicleId: text("vehicle_id")
      .notNull()
      .references(() => vehicle.id, { onDelete: "cascade" }),
    version: integer("version").notNull(),
    /** The record as entered and validated, unknown keys included. */
    document: jsonb("document").$type<Record<string, unknown>>().notNull(),
    recordedBy: text("recorded_by")
      .notNull()
      .references(() => user.id),
    recordedAt: timestamp("recorded_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("controller_record_version_idx").on(t.vehicleId, t.version),
    index("controller_record_workspace_idx").on(t.workspaceId, t.vehicleId),
    check("controller_record_version_positive", sql`${t.version} >= 1`),
  ],
);

export type ControllerRecordRow = typeof controllerRecord.$inferSelect;
