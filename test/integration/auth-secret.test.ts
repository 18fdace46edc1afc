// Issue 11, critical: on a default install nobody can sign better-auth's e-mail tokens. The test stack
// runs with a random secret of its own (scripts/test.ts), as `npm start` does with the one it keeps in
// .data/auth-secret; tokens signed with the secret that used to be public in app/env.server.ts are refused.
// A production server refuses to start with no secret, the public one, or one under 32 bytes.
import { createHmac, randomUUID } from "node:crypto";
import { spawn } from "node:child_process";
import pg from "pg";
import { describe, expect, it } from "vitest";
import { BASE_URL, client, clientAddress } from "../support/http";

/** The value app/env.server.ts used to fall back to: public, so anyone could sign with it. */
const PUBLIC_SECRET = "chainproof-local-development-secret-change-me";

/** An HS256 JWT (RFC 7519) signed with `secret`, written by hand so no library decides what is valid. */
function forgeToken(payload: Record<string, unknown>, secret: string): string {
  const part = (o: unknown) => Buffer.from(JSON.stringify(o)).toString("base64url");
  const now = Math.floor(Date.now() / 1000);
  const body = `${part({ alg: "HS256", typ: "JWT" })}.${part({ ...payload, iat: now, exp: now + 3600 })}`;
  return `${body}.${createHmac("sha256", secret).update(body).digest("base64url")}`;
}

async function userRow(id: string) {
  const db = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await db.connect();
  try {
    const r = await db.query<{ email: string; email_verified: boolean }>('SELECT email, email_verified FROM "user" WHERE id = $1', [id]);
    return r.rows[0];
  } finally {
    await db.end();
  }
}

async function signUp(email: string): Promise<string> {
  const res = await fetch(new URL("/api/auth/sign-up/email", BASE_URL), {
    method: "POST",
    headers: { "content-type": "application/json", origin: BASE_URL, "x-forwarded-for": clientAddress() },
    body: JSON.stringify({ email, password: "a-long-enough-password", name: "Token Victim" }),
  });
  expect(res.status).toBe(200);
  return ((await res.json()) as { user: { id: string } }).user.id;
}

describe("e-mail tokens signed with the once-public secret", () => {
  it("do not verify an address nobody confirmed", async () => {
    const email = `unconfirmed-${randomUUID().slice(0, 8)}@example.com`;
    const id = await signUp(email);
    const res = await client().fetch(`/api/auth/verify-email?token=${forgeToken({ email }, PUBLIC_SECRET)}`);
    expect(res.status).toBe(401);
    expect((await userRow(id))?.email_verified).toBe(false);
  });

  it("do not move an account's address to someone else's", async () => {
    const email = `victim-${randomUUID().slice(0, 8)}@example.com`;
    const id = await signUp(email);
    const token = forgeToken({ email, updateTo: "attacker@example.net", userId: id }, PUBLIC_SECRET);
    const res = await client().fetch(`/api/auth/verify-email?token=${token}`);
    expect(res.status).toBe(401);
    expect((await userRow(id))?.email).toBe(email);
  });

  it("are refused for their secret alone: the same token signed with this install's own secret verifies", async () => {
    // Positive control: the hand-made token is what better-auth accepts, so the 401s above come from the secret.
    const own = process.env.AUTH_SECRET;
    expect(own && own !== PUBLIC_SECRET).toBeTruthy();
    const email = `control-${randomUUID().slice(0, 8)}@example.com`;
    const id = await signUp(email);
    const res = await client().fetch(`/api/auth/verify-email?token=${forgeToken({ email }, own!)}`);
    expect(res.status).toBe(200);
    expect((await userRow(id))?.email_verified).toBe(true);
  });
});

/** Starts the production server with `secret` (or none) and returns its exit code and output. */
function startWith(secret: string | undefined) {
  const port = Number(new URL(BASE_URL).port) + 91;
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    PORT: String(port),
    APP_URL: `http://127.0.0.1:${port}`,
    WEB_CONCURRENCY: "1",
    NODE_ENV: "production",
  };
  delete env.AUTH_SECRET;
  if (secret !== undefined) env.AUTH_SECRET = secret;
  const child = spawn(process.execPath, ["--import", "tsx", "scripts/serve.ts"], { env, stdio: ["ignore", "pipe", "pipe"] });
  let output = "";
  child.stdout!.on("data", (d) => (output += d));
  child.stderr!.on("data", (d) => (output += d));
  const timer = setTimeout(() => child.kill("SIGKILL"), 20_000);
  return new Promise<{ code: number | null; output: string }>((resolve) =>
    child.on("exit", (code) => {
      clearTimeout(timer);
      resolve({ code, output });
    }),
  );
}

describe("a production server without a secret of its own", () => {
  it.each([
    ["no AUTH_SECRET", undefined, /AUTH_SECRET is not set/],
    ["the built-in development value", PUBLIC_SECRET, /built-in development value/],
    ["a secret under 32 bytes", "only-twenty-six-bytes-long", /26 bytes; it needs at least 32/],
  ])("refuses to start with %s, saying why", { timeout: 30_000 }, async (_what, secret, message) => {
    const { code, output } = await startWith(secret);
    expect(code).toBe(1);
    expect(output).toMatch(message);
    // A clear message, not a stack trace.
    expect(output).not.toMatch(/\n\s+at /);
  });
});
