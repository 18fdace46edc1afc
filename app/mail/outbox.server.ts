import { desc } from "drizzle-orm";
import { db, schema } from "~/db/client.server";

export async function recentMail(limit = 100) {
  return db
    .select({
      id: schema.mailMessage.id,
      recipients: schema.mailMessage.recipients,
      subject: schema.mailMessage.subject,
      textBody: schema.mailMessage.textBody,
      attachments: schema.mailMessage.attachments,
      receivedAt: schema.mailMessage.receivedAt,
    })
    .from(schema.mailMessage)
    .orderBy(desc(schema.mailMessage.receivedAt))
    .limit(limit);
}
