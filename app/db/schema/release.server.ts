// Which design revision is released to which vehicle: an append-only history; the latest row is current.
// And the "needs attention" flags a failed bench step raises on a vehicle, until someone clears them.
import { index, integer, pgTable, text, timestamp } from "drizzle-orm/pg-core";
import { user } from "./auth.server";
import { workspace } from "./workspace.server";
import { vehicle } from "./vehicle.server";
import { designRevision } from "./design.server";

export const vehicleRelease = pgTable(
  "vehicle_release",
  {
    id: text("id").primaryKey(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspace.id, { onDelete: "cascade" }),
    vehicleId: text("vehicle_id")
      .notNull()
      .references(() => vehicle.id, { onDelete: "cascade" }),
    revisionId: text("revision_id")
      .notNull()
      .references(() => designRevision.id, { onDelete: "restrict" }),
    releasedBy: text("released_by")
      .notNull()
      .references(() => user.id),
    at: timestamp("at", { withTimezone: true }).notNull().defaultNow(),
    note: text("note").notNull().default(""),
  },
  (t) => [index("vehicle_release_vehicle_idx").on(t.workspaceId, t.vehicleId, t.at)],
);

export const vehicleAttention = pgTable(
  "vehicle_attention",
  {
    id: text("id").primaryKey(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspace.id, { onDelete: "cascade" }),
    vehicleId: text("vehicle_id")
      .notNull()
      .references(() => vehicle.id, { onDelete: "cascade" }),
    reason: text("reason").notNull(),
    /** The bench run and step that raised it, when a failed step did. */
    benchRunId: text("bench_run_id"),
    stepNumber: integer("step_number"),
    raisedBy: text("raised_by").references(() => user.id, { onDelete: "set null" }),
    raisedAt: timestamp("raised_at", { withTimezone: true }).notNull().defaultNow(),
    clearedBy: text("cleared_by").references(() => user.id, { onDelete: "set null" }),
    clearedAt: timestamp("cleared_at", { withTimezone: true }),
    clearNote: text("clear_note").notNull().default(""),
  },
  (t) => [index("vehicle_attention_vehicle_idx").on(t.workspaceId, t.vehicleId)],
);

export type VehicleRelease = typeof vehicleRelease.$inferSelect;
export type VehicleAttention = typeof vehicleAttention.$inferSelect;
