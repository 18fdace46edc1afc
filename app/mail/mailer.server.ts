// Outgoing mail through SMTP (a local sink in development and tests; a real relay in production).
import nodemailer from "nodemailer";
import { env } from "~/env.server";

const transport = nodemailer.createTransport({
  host: env.SMTP_HOST,
  port: env.SMTP_PORT,
  secure: env.SMTP_SECURE === "1",
  ignoreTLS: env.SMTP_SECURE === "0",
  auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASSWORD ?? "" } : undefined,
});

export type Mail = {
  to: string;
  subject: string;
  text: string;
  html?: string;
  attachments?: Array<{ filename: string; content: Buffer; contentType: string }>;
};

const escapeHtml = (s: string) => s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");

/** Plain paragraphs and one call-to-action link, as text and HTML. */
export function composeMail(to: string, subject: string, paragraphs: string[], action?: { label: string; url: string }): Mail {
  const text = [...paragraphs, ...(action ? [`${action.label}: ${action.url}`] : []), "", "— Chainproof"].join("\n\n");
  const html = [
    ...paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`),
    action ? `<p><a href="${escapeHtml(action.url)}">${escapeHtml(action.label)}</a></p>` : "",
    "<p>— Chainproof</p>",
  ].join("\n");
  return { to, subject, text, html };
}

export async function sendMail(mail: Mail): Promise<void> {
  await transport.sendMail({ from: env.MAIL_FROM, ...mail });
}
