// Reviews of saved revisions: who was asked to review, comments (on the revision, pinned to a
// truth-table row or to a component) and decisions. Decisions record the revision's content hash;
// none of these rows are ever updated, so the history of a review is its rows.
import { check, index, integer, jsonb, pgEnum, pgTable, text, timestamp, uniqueIndex } from "drizzle-orm/pg-core";
import { sql } from "drizzle-orm";
import { user } from "./auth.server";
import { workspace } from "./workspace.server";
import { design, designRevision } from "./design.server";

export const faultDispositionEnum = pgEnum("fault_disposition_kind", ["accepted", "fix-next-revision", "ruled-out"]);
export const reviewVerdictEnum = pgEnum("review_verdict", ["approved", "changes-requested"]);
export const reviewCommentAnchorEnum = pgEnum("review_comment_anchor", ["revision", "row", "component"]);

/** One reviewer asked to review one revision (asking the same reviewer again refreshes the row). */
export const reviewRequest = pgTable(
  "review_request",
  {
    id: text("id").primaryKey(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspace.id, { onDelete: "cascade" }),
    designId: text("design_id")
      .notNull()
      .references(() => design.id, { onDelete: "cascade" }),
    revisionId: text("revision_id")
      .notNull()
      .references(() => designRevision.id, { onDelete: "cascade" }),
    reviewerId: text("reviewer_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    requestedBy: text("requested_by")
      .notNull()
      .references(() => user.id),
    note: text("note").notNull().default(""),
    requestedAt: timestamp("requested_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("review_request_revision_reviewer_idx").on(t.revisionId, t.reviewerId),
    index("review_request_workspace_idx").on(t.workspaceId),
    index("review_request_reviewer_idx").on(t.reviewerId),
  ],
);

export type RowStates = Record<string, string>;

export const reviewComment = pgTable(
  "review_comment",
  {
    id: text("id").primaryKey(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspace.id, { onDelete: "cascade" }),
    revisionId: text("revision_id")
      .notNull()
      .references(() => designRevision.id, { onDelete: "cascade" }),
    authorId: text("author_id")
      .notNull()
      .references(() => user.id),
    anchor: reviewCommentAnchorEnum("anchor").notNull().default("revision"),
    /** Truth-table row index and its states, for anchor "row". */
    rowIndex: integer("row_index"),
    rowStates: jsonb("row_states").$type<RowStates>(),
    /** Component id, for anchor "component". */
    componentId: text("component_id"),
    body: text("body").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("review_comment_revision_idx").on(t.revisionId, t.createdAt),
    index("review_comment_workspace_idx").on(t.workspaceId),
    check(
      "review_comment_anchor_fields",
      sql`(${t.anchor} = 'row' AND ${t.rowIndex} IS NOT NULL AND ${t.rowIndex} >= 0 AND ${t.rowStates} IS NOT NULL)
        OR (${t.anchor} = 'component' AND ${t.componentId} IS NOT NULL)
        OR (${t.anchor} = 'revision')`,
    ),
  ],
);

export const reviewDecision = pgTable(
  "review_decision",
  {
    id: text("id").primaryKey(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspace.id, { onDelete: "cascade" }),
    designId: text("design_id")
      .notNull()
      .references(() => design.id, { onDelete: "cascade" }),
    revisionId: text("revision_id")
      .notNull()
      .references(() => designRevision.id, { onDelete: "cascade" }),
    reviewerId: text("reviewer_id")
      .notNull()
      .references(() => user.id),
    verdict: reviewVerdictEnum("verdict").notNull(),
    comment: text("comment").notNull().default(""),
    /** The revision's content hash at the time of the decision: what was signed. */
    contentHash: text("content_hash").notNull(),
    decidedAt: timestamp("decided_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("review_decision_revision_idx").on(t.revisionId, t.decidedAt), index("review_decision_workspace_idx").on(t.workspaceId)],
);

/**
 * How one single fault that defeats a rule is dealt with (docs/decisions/161). Tied to the revision
 * and the content hash it was recorded against; never updated: a later row for the same fault
 * supersedes the earlier one, and both stay as history.
 */
export const faultDisposition = pgTable(
  "fault_disposition",
  {
    id: text("id").primaryKey(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspace.id, { onDelete: "cascade" }),
    designId: text("design_id")
      .notNull()
      .references(() => design.id, { onDelete: "cascade" }),
    revisionId: text("revision_id")
      .notNull()
      .references(() => designRevision.id, { onDelete: "cascade" }),
    contentHash: text("content_hash").notNull(),
    /** The contact's id and how it is stuck. */
    component: text("component").notNull(),
    mode: text("mode").notNull(),
    disposition: faultDispositionEnum("disposition").notNull(),
    justification: text("justification").notNull(),
    authorId: text("author_id")
      .notNull()
      .references(() => user.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("fault_disposition_revision_idx").on(t.revisionId, t.createdAt),
    index("fault_disposition_workspace_idx").on(t.workspaceId),
    check("fault_disposition_mode", sql`${t.mode} IN ('stuck-open', 'stuck-closed')`),
  ],
);

export type FaultDispositionRecord = typeof faultDisposition.$inferSelect;
export type ReviewRequestRecord = typeof reviewRequest.$inferSelect;
export type NewReviewRequestRecord = typeof reviewRequest.$inferInsert;
export type ReviewCommentRecord = typeof reviewComment.$inferSelect;
export type NewReviewCommentRecord = typeof reviewComment.$inferInsert;
export type ReviewDecisionRecord = typeof reviewDecision.$inferSelect;
export type NewReviewDecisionRecord = typeof reviewDecision.$inferInsert;
