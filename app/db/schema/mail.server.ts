// Messages caught by the local SMTP sink (scripts/services.ts); shown on the outbox page.
import { pgTable, text, timestamp, index } from "drizzle-orm/pg-core";

export const mailMessage = pgTable(
  "mail_message",
  {
    id: text("id").primaryKey(),
    sender: text("sender").notNull(),
    recipients: text("recipients").notNull(),
    subject: text("subject").notNull(),
    textBody: text("text_body").notNull(),
    htmlBody: text("html_body").notNull(),
    /** The attachments' names, types and sizes, one per line (the sink keeps no content). */
    attachments: text("attachments").notNull().default(""),
    receivedAt: timestamp("received_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("mail_received_idx").on(t.receivedAt)],
);
