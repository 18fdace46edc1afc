// Designs of a workspace: the design itself (archived or not), its numbered revisions (immutable, always proven)
// and one working copy per design (the draft, not proven, guarded by a version number).
import { check, foreignKey, index, integer, jsonb, pgTable, primaryKey, text, timestamp, unique, uniqueIndex } from "drizzle-orm/pg-core";
import { sql } from "drizzle-orm";
import type { DraftCheck, Verdict } from "~/designs/types";
import type { Design } from "~/engine";
import { user } from "./auth.server";
import { workspace } from "./workspace.server";
import { vehicle } from "./vehicle.server";

export const design = pgTable(
  "design",
  {
    id: text("id").primaryKey(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspace.id, { onDelete: "cascade" }),
    vehicleId: text("vehicle_id").references(() => vehicle.id, { onDelete: "set null" }),
    name: text("name").notNull(),
    createdBy: text("created_by")
      .notNull()
      .references(() => user.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    // Archived: kept for audit, hidden from lists, no new drafts or revisions (docs/decisions/167).
    archivedAt: timestamp("archived_at", { withTimezone: true }),
    archivedBy: text("archived_by").references(() => user.id),
  },
  (t) => [
    index("design_workspace_idx").on(t.workspaceId),
    index("design_vehicle_idx").on(t.vehicleId),
    // Target of the (design_id, workspace_id) keys below: a revision or draft cannot sit in another workspace.
    unique("design_id_workspace_uq").on(t.id, t.workspaceId),
    // Who archived it is known exactly when it is archived.
    check("design_archived_with_whom", sql`(${t.archivedAt} is null) = (${t.archivedBy} is null)`),
  ],
);

export const designRevision = pgTable(
  "design_revision",
  {
    id: text("id").primaryKey(),
    designId: text("design_id").notNull(),
    workspaceId: text("workspace_id").notNull(),
    number: integer("number").notNull(),
    document: jsonb("document").$type<Design>().notNull(),
    verdict: jsonb("verdict").$type<Verdict>().notNull(),
    contentHash: text("content_hash").notNull(),
    message: text("message").notNull().default(""),
    authorId: text("author_id")
      .notNull()
      .references(() => user.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("design_revision_number_idx").on(t.designId, t.number),
    index("design_revision_workspace_idx").on(t.workspaceId),
    foreignKey({
      columns: [t.designId, t.workspaceId],
      foreignColumns: [design.id, design.workspaceId],
      name: "design_revision_design_fk",
    }).onDelete("cascade"),
    check("design_revision_number_positive", sql`${t.number} >= 1`),
  ],
);

export const designDraft = pgTable(
  "design_draft",
  {
    designId: text("design_id").notNull(),
    workspaceId: text("workspace_id").notNull(),
    version: integer("version").notNull().default(1),
    document: jsonb("document").$type<Record<string, unknown>>().notNull(),
    contentHash: text("content_hash").notNull(),
    check: jsonb("check").$type<DraftCheck>().notNull(),
    baseRevision: integer("base_revision").notNull().default(0),
    updatedBy: text("updated_by")
      .notNull()
      .references(() => user.id),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    primaryKey({ columns: [t.designId], name: "design_draft_pk" }),
    index("design_draft_workspace_idx").on(t.workspaceId),
    foreignKey({
      columns: [t.designId, t.workspaceId],
      foreignColumns: [design.id, design.workspaceId],
      name: "design_draft_design_fk",
    }).onDelete("cascade"),
  ],
);

// "Record" tells these rows apart from the engine's design document type.
export type DesignRecord = typeof design.$inferSelect;
export type NewDesignRecord = typeof design.$inferInsert;
export type DesignRevisionRecord = typeof designRevision.$inferSelect;
export type NewDesignRevisionRecord = typeof designRevision.$inferInsert;
export type DesignDraftRecord = typeof designDraft.$inferSelect;
export type NewDesignDraftRecord = typeof designDraft.$inferInsert;
