// Files (photos and PDFs) kept in S3-compatible storage; this table is the record of each one.
import { bigint, index, pgTable, text, timestamp } from "drizzle-orm/pg-core";
import { user } from "./auth.server";
import { workspace } from "./workspace.server";

export const upload = pgTable(
  "upload",
  {
    id: text("id").primaryKey(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspace.id, { onDelete: "cascade" }),
    // What the file is attached to, e.g. "vehicle" + vehicle id, "bench-step" + step id.
    subjectKind: text("subject_kind").notNull(),
    subjectId: text("subject_id").notNull(),
    storageKey: text("storage_key").notNull().unique(),
    filename: text("filename").notNull(),
    contentType: text("content_type").notNull(),
    size: bigint("size", { mode: "number" }).notNull(),
    sha256: text("sha256").notNull(),
    uploadedBy: text("uploaded_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("upload_subject_idx").on(t.workspaceId, t.subjectKind, t.subjectId)],
);

export type Upload = typeof upload.$inferSelect;
