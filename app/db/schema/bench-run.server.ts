// Bench-test runs: the generated procedure frozen at the start, one result row per step, and on
// completion the signed record (who, when, the revision's content hash and a hash of the results).
import { check, index, integer, jsonb, pgTable, text, timestamp, uniqueIndex } from "drizzle-orm/pg-core";
import { sql } from "drizzle-orm";
import type { BenchPlan } from "~/bench-tests/types";
import { user } from "./auth.server";
import { workspace } from "./workspace.server";
import { vehicle } from "./vehicle.server";
import { designRevision } from "./design.server";

export const benchRun = pgTable(
  "bench_run",
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
    /** The revision's content hash when the run started (decision 032). */
    revisionHash: text("revision_hash").notNull(),
    plan: jsonb("plan").$type<BenchPlan>().notNull(),
    status: text("status", { enum: ["in-progress", "completed"] })
      .notNull()
      .default("in-progress"),
    startedBy: text("started_by")
      .notNull()
      .references(() => user.id),
    startedAt: timestamp("started_at", { withTimezone: true }).notNull().defaultNow(),
    completedBy: text("completed_by").references(() => user.id),
    completedAt: timestamp("completed_at", { withTimezone: true }),
    /** SHA-256 of the canonical JSON of the record (decision 072); set on completion. */
    resultsHash: text("results_hash"),
  },
  (t) => [
    index("bench_run_workspace_idx").on(t.workspaceId, t.startedAt),
    index("bench_run_vehicle_idx").on(t.workspaceId, t.vehicleId),
    check("bench_run_status", sql`${t.status} in ('in-progress', 'completed')`),
    check(
      "bench_run_completed_signed",
      sql`(${t.status} = 'completed') = (${t.completedAt} is not null and ${t.completedBy} is not null and ${t.resultsHash} is not null)`,
    ),
  ],
);

export const benchStepResult = pgTable(
  "bench_step_result",
  {
    id: text("id").primaryKey(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspace.id, { onDelete: "cascade" }),
    runId: text("run_id")
      .notNull()
      .references(() => benchRun.id, { onDelete: "cascade" }),
    /** The plan's step number, from 1. */
    n: integer("n").notNull(),
    outcome: text("outcome", { enum: ["pass", "fail", "skip"] }),
    note: text("note").notNull().default(""),
    updatedBy: text("updated_by").references(() => user.id, { onDelete: "set null" }),
    updatedAt: timestamp("updated_at", { withTimezone: true }),
    /** When the failure of this step was mailed to the revision's author (once per step: decision 137). */
    failureMailedAt: timestamp("failure_mailed_at", { withTimezone: true }),
  },
  (t) => [
    uniqueIndex("bench_step_result_run_n_idx").on(t.runId, t.n),
    index("bench_step_result_workspace_idx").on(t.workspaceId),
    check("bench_step_result_outcome", sql`${t.outcome} is null or ${t.outcome} in ('pass', 'fail', 'skip')`),
  ],
);

export type BenchRun = typeof benchRun.$inferSelect;
export type BenchStepResult = typeof benchStepResult.$inferSelect;
