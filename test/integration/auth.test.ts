// Sign-in, sign-out, rate limits, invitations and session cookies against the running app.
import { describe, expect, it } from "vitest";
import pg from "pg";
import { BASE_URL, client, DEMO, formBody, signIn } from "../support/http";
import { createOutsider } from "../support/outsider";

async function latestMailTo(address: string): Promise<string> {
  const db = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await db.connect();
  try {
    for (let i = 0; i < 40; i++) {
      const r = await db.query("SELECT text_body FROM mail_message WHERE recipients LIKE $1 ORDER BY received_at DESC LIMIT 1", [
        `%${address}%`,
      ]);
      if (r.rows[0]) return r.rows[0].text_body as string;
      await new Promise((res) => setTimeout(res, 100));
    }
    throw new Error(`no mail to ${address}`);
  } finally {
    await db.end();
  }
}

describe("sign-in", () => {
  it("sets an HttpOnly, SameSite session cookie", async () => {
    const res = await fetch(new URL("/api/auth/sign-in/email", BASE_URL), {
      method: "POST",
      headers: { "content-type": "application/json", origin: BASE_URL, "x-forwarded-for": "198.51.100.7" },
      body: JSON.stringify({ email: DEMO.reviewer, password: "chainproof-demo" }),
    });
    expect(res.status).toBe(200);
    const cookie = res.headers.getSetCookie().find((c) => c.includes("session_token"));
    expect(cookie).toBeDefined();
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it("rejects a wrong password with a message and no session", async () => {
    const c = client();
    const res = await c.fetch("/sign-in", formBody({ email: DEMO.admin, password: "wrong-password" }));
    expect(res.status).toBe(400);
    expect(await res.text()).toContain("do not match an account");
    expect(res.headers.getSetCookie().some((s) => s.includes("session_token="))).toBe(false);
  });

  it("names the field when the e-mail is malformed", async () => {
    const res = await client().fetch("/sign-in", formBody({ email: "nope", password: "" }));
    expect(res.status).toBe(400);
    const html = await res.text();
    expect(html).toContain("Enter an e-mail address");
    expect(html).toContain("Enter your password");
  });

  it("limits sign-in attempts per client address", async () => {
    const c = client("", "203.0.113.99");
    const statuses: number[] = [];
    for (let i = 0; i < 8; i++) {
      const res = await c.fetch("/sign-in", formBody({ email: DEMO.admin, password: "wrong-password" }));
      statuses.push(res.status);
    }
    expect(statuses.slice(0, 5).every((s) => s === 400)).toBe(true);
    expect(statuses.slice(5)).toContain(429);
  });

  it("signs out: the session no longer opens the workspace, in any of the server's processes", async () => {
    const c = await signIn(DEMO.technician);
    // Several requests reach every process of the cluster (round robin), each of which now holds
    // the confirmed session for a few seconds (docs/decisions/090).
    for (let i = 0; i < 6; i++) expect((await c.fetch("/w/larkspur")).status).toBe(200);
    const out = await c.fetch("/sign-out", { method: "POST" });
    expect(out.status).toBe(302);
    for (let i = 0; i < 6; i++) expect((await c.fetch("/w/larkspur")).status).toBe(302);
  });

  it("a session ended elsewhere (deleted in the database) stops working within the session cache's 10 s", { timeout: 30_000 }, async () => {
    const c = await signIn(DEMO.technician);
    for (let i = 0; i < 4; i++) expect((await c.fetch("/w/larkspur")).status).toBe(200);
    const token = decodeURIComponent(/better-auth\.session_token=([^;.]+)/.exec(c.cookie)![1]!);
    const db = new pg.Client({ connectionString: process.env.DATABASE_URL });
    await db.connect();
    try {
      expect((await db.query("DELETE FROM session WHERE token = $1", [token])).rowCount).toBe(1);
    } finally {
      await db.end();
    }
    const ended = Date.now();
    let open = true;
    while (open && Date.now() - ended < 12_000) {
      const statuses = await Promise.all([1, 2, 3, 4].map(async () => (await c.fetch("/w/larkspur")).status));
      open = statuses.includes(200);
      if (open) await new Promise((r) => setTimeout(r, 250));
    }
    expect(open).toBe(false);
    // And it stays closed.
    expect((await c.fetch("/api/v1/designs?workspace=larkspur")).status).toBe(401);
  });
});

describe("invitations", () => {
  it("an admin invites by e-mail with a role; the invitee accepts through the link and gets that role", async () => {
    const outsider = await createOutsider();
    const admin = await signIn(DEMO.admin);
    const sent = await admin.fetch("/w/larkspur/settings", formBody({ intent: "invite", email: outsider.email, role: "reviewer" }));
    expect(sent.status).toBe(200);
    const mail = await latestMailTo(outsider.email);
    const link = mail.match(/https?:\/\/\S+\/invite\/\S+/)?.[0];
    expect(link).toBeDefined();
    const path = new URL(link!).pathname;
    expect((await outsider.client.fetch("/w/larkspur")).status).toBe(404);
    const accepted = await outsider.client.fetch(path, { method: "POST" });
    expect(accepted.status).toBe(302);
    expect(accepted.headers.get("location")).toBe("/w/larkspur");
    expect((await outsider.client.fetch("/w/larkspur")).status).toBe(200);
    // A reviewer may not invite.
    expect(
      (await outsider.client.fetch("/w/larkspur/settings", formBody({ intent: "invite", email: "a@b.co", role: "admin" }))).status,
    ).toBe(403);
    // The link works once.
    const again = await outsider.client.fetch(path, { method: "POST" });
    expect(again.status).toBe(400);
  });

  it("refuses an invitation accepted by a different account", async () => {
    const admin = await signIn(DEMO.admin);
    const email = `someone-${Date.now()}@example.org`;
    await admin.fetch("/w/larkspur/settings", formBody({ intent: "invite", email, role: "engineer" }));
    const mail = await latestMailTo(email);
    const path = new URL(mail.match(/https?:\/\/\S+\/invite\/\S+/)![0]).pathname;
    const other = await createOutsider();
    const res = await other.client.fetch(path, { method: "POST" });
    expect(res.status).toBe(400);
    expect(await res.text()).toContain(`This invitation is for ${email}`);
  });

  it("keeps at least one admin", async () => {
    const admin = await signIn(DEMO.admin);
    const db = new pg.Client({ connectionString: process.env.DATABASE_URL });
    await db.connect();
    const r = await db.query(
      `SELECT m.id FROM member m JOIN "user" u ON u.id = m.user_id JOIN workspace w ON w.id = m.workspace_id WHERE u.email = $1 AND w.slug = 'larkspur'`,
      [DEMO.admin],
    );
    await db.end();
    const res = await admin.fetch("/w/larkspur/settings", formBody({ intent: "change-role", memberId: r.rows[0].id, role: "engineer" }));
    expect(res.status).toBe(400);
    expect(await res.text()).toContain("at least one admin");
  });
});
