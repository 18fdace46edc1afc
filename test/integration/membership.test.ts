// Issue 11, low: membership changes that used to leave a workspace without admins, revive removed
// members' keys, answer 500 to a race, or claim to have withdrawn another workspace's invitation.
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BASE_URL, DEMO, formBody, signIn, type Client } from "../support/http";
import { createOutsider } from "../support/outsider";

let db: pg.Client;
beforeAll(async () => {
  db = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await db.connect();
});
afterAll(async () => {
  await db.end();
});

async function inviteLink(admin: Client, slug: string, email: string, role: string): Promise<string> {
  const since = (await db.query("SELECT now() AS t")).rows[0].t as Date;
  const sent = await admin.fetch(`/w/${slug}/settings`, formBody({ intent: "invite", email, role }));
  expect(sent.status).toBe(200);
  for (let i = 0; i < 50; i++) {
    const r = await db.query(
      "SELECT text_body FROM mail_message WHERE recipients LIKE $1 AND text_body LIKE $2 AND received_at >= $3 ORDER BY received_at DESC LIMIT 1",
      [`%${email}%`, `%/invite/%`, since],
    );
    const link = (r.rows[0]?.text_body as string | undefined)?.match(/https?:\/\/\S+\/invite\/\S+/)?.[0];
    if (link) return new URL(link).pathname;
    await new Promise((res) => setTimeout(res, 100));
  }
  throw new Error(`no invitation mail to ${email}`);
}

async function roleOf(email: string, slug: string): Promise<string | undefined> {
  const r = await db.query(
    `SELECT m.role FROM member m JOIN "user" u ON u.id = m.user_id JOIN workspace w ON w.id = m.workspace_id WHERE u.email = $1 AND w.slug = $2`,
    [email, slug],
  );
  return r.rows[0]?.role;
}

async function memberId(email: string, slug: string): Promise<string> {
  const r = await db.query(
    `SELECT m.id FROM member m JOIN "user" u ON u.id = m.user_id JOIN workspace w ON w.id = m.workspace_id WHERE u.email = $1 AND w.slug = $2`,
    [email, slug],
  );
  return r.rows[0].id;
}

describe("membership", () => {
  it("the only admin accepting an invitation to their own address as technician stays admin", async () => {
    const owner = await createOutsider();
    const path = await inviteLink(owner.client, owner.slug, owner.email, "technician");
    const res = await owner.client.fetch(path, { method: "POST" });
    expect(res.status).toBe(400);
    expect(await res.text()).toContain("only admin");
    expect(await roleOf(owner.email, owner.slug)).toBe("admin");
  });

  it("removing a member revokes their API keys; a new invitation does not revive them", async () => {
    const admin = await signIn(DEMO.admin);
    const person = await createOutsider();
    expect((await person.client.fetch(await inviteLink(admin, "larkspur", person.email, "engineer"), { method: "POST" })).status).toBe(302);
    const made = await person.client.fetch("/w/larkspur/settings", formBody({ intent: "create-key", name: "laptop" }));
    const key = (await made.text()).match(/data-testid="new-api-key">([^<]+)</)![1]!;
    const read = () => fetch(new URL("/api/v1/designs?workspace=larkspur", BASE_URL), { headers: { authorization: `Bearer ${key}` } });
    expect((await read()).status).toBe(200);

    expect(
      (await admin.fetch("/w/larkspur/settings", formBody({ intent: "remove", id: await memberId(person.email, "larkspur") }))).status,
    ).toBe(200);
    expect((await read()).status).toBe(401);
    expect((await person.client.fetch(await inviteLink(admin, "larkspur", person.email, "engineer"), { method: "POST" })).status).toBe(302);
    expect((await read()).status).toBe(401);
    // The demo workspace goes back to its four members for the tests after this one.
    expect(
      (await admin.fetch("/w/larkspur/settings", formBody({ intent: "remove", id: await memberId(person.email, "larkspur") }))).status,
    ).toBe(200);
  });

  it("two admins demoting each other at once: no 500, and the workspace keeps an admin", { timeout: 60_000 }, async () => {
    const a = await createOutsider();
    const b = await createOutsider();
    let [admin, other] = [a, b];
    for (let round = 0; round < 4; round++) {
      expect((await other.client.fetch(await inviteLink(admin.client, a.slug, other.email, "admin"), { method: "POST" })).status).toBe(302);
      const [aId, bId] = [await memberId(a.email, a.slug), await memberId(b.email, a.slug)];
      const answers = await Promise.all([
        a.client.fetch(`/w/${a.slug}/settings`, formBody({ intent: "change-role", memberId: bId, role: "engineer" })),
        b.client.fetch(`/w/${a.slug}/settings`, formBody({ intent: "change-role", memberId: aId, role: "engineer" })),
      ]);
      for (const r of answers) expect([200, 400, 403, 409]).toContain(r.status);
      const admins = await db.query(
        `SELECT count(*)::int AS n FROM member m JOIN workspace w ON w.id = m.workspace_id WHERE w.slug = $1 AND m.role = 'admin'`,
        [a.slug],
      );
      expect(admins.rows[0].n).toBe(1);
      [admin, other] = (await roleOf(a.email, a.slug)) === "admin" ? [a, b] : [b, a];
    }
  });

  it("five workspaces of one name created at once all get made, each with its own address", async () => {
    const c = (await createOutsider()).client;
    const name = `Racing Carts ${Date.now()}`;
    const answers = await Promise.all([1, 2, 3, 4, 5].map(() => c.fetch("/welcome", formBody({ name }))));
    expect(answers.map((r) => r.status)).toEqual([302, 302, 302, 302, 302]);
    const slugs = answers.map((r) => r.headers.get("location"));
    expect(new Set(slugs).size).toBe(5);
    expect((await db.query("SELECT count(*)::int AS n FROM workspace WHERE name = $1", [name])).rows[0].n).toBe(5);
  });

  it("withdrawing another workspace's invitation answers 404 and leaves it open", async () => {
    const other = await createOutsider();
    await inviteLink(other.client, other.slug, `guest-${Date.now()}@example.org`, "reviewer");
    const inv = await db.query(
      "SELECT i.id FROM invitation i JOIN workspace w ON w.id = i.workspace_id WHERE w.slug = $1 ORDER BY i.created_at DESC LIMIT 1",
      [other.slug],
    );
    const admin = await signIn(DEMO.admin);
    const res = await admin.fetch("/w/larkspur/settings", formBody({ intent: "revoke", id: inv.rows[0].id }));
    expect(res.status).toBe(404);
    expect(await res.text()).not.toContain("Invitation withdrawn.");
    expect((await db.query("SELECT revoked_at FROM invitation WHERE id = $1", [inv.rows[0].id])).rows[0].revoked_at).toBeNull();
  });
});
