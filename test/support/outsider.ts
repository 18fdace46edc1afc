// A signed-in user who belongs to a workspace of their own, not to the demo workspace.
import pg from "pg";
import { BASE_URL, clientAddress, signIn, type Client } from "./http";

export async function createOutsider(): Promise<{ email: string; client: Client; slug: string }> {
  const email = `outsider-${Date.now()}-${Math.floor(Math.random() * 1e6)}@example.net`;
  const password = "outsider-password-1";
  const res = await fetch(new URL("/api/auth/sign-up/email", BASE_URL), {
    method: "POST",
    headers: { "content-type": "application/json", origin: BASE_URL, "x-forwarded-for": clientAddress() },
    body: JSON.stringify({ email, password, name: "Outside Person" }),
  });
  if (!res.ok) throw new Error(`sign-up failed: ${res.status} ${await res.text()}`);
  // The verification mail is tested end to end in the browser; here we mark the address verified directly.
  const db = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await db.connect();
  await db.query('UPDATE "user" SET email_verified = true WHERE email = $1', [email]);
  await db.end();
  const c = await signIn(email, password);
  const created = await c.fetch("/welcome", {
    method: "POST",
    body: new URLSearchParams({ name: `Outside Works ${Date.now()}` }),
    headers: { "content-type": "application/x-www-form-urlencoded" },
  });
  if (created.status !== 302) throw new Error(`workspace creation failed: ${created.status}`);
  const slug = (created.headers.get("location") ?? "").split("/w/")[1] ?? "";
  return { email, client: c, slug };
}
