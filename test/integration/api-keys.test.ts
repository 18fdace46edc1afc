// Personal API keys: shown once, stored hashed, one workspace, the member's role, revocable;
// cookie-authenticated API mutations must come from our own origin.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";
import { createHash } from "node:crypto";
import { BASE_URL, DEMO, formBody, signIn, type Client } from "../support/http";
import { createOutsider } from "../support/outsider";

let db: pg.Client;

async function createKey(c: Client, name: string): Promise<string> {
  const res = await c.fetch("/w/larkspur/settings", formBody({ intent: "create-key", name }));
  expect(res.status).toBe(200);
  const key = (await res.text()).match(/data-testid="new-api-key">([^<]+)</)?.[1];
  expect(key).toMatch(/^cpk_/);
  return key!;
}

const api = (path: string, key: string, init: RequestInit = {}) =>
  fetch(new URL(path, BASE_URL), { ...init, headers: { authorization: `Bearer ${key}`, ...(init.headers ?? {}) } });

beforeAll(async () => {
  db = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await db.connect();
});
afterAll(async () => {
  await db.end();
});

describe("personal API keys", () => {
  it("a key is shown once, stored only as a hash, and reads the workspace with the member's role", async () => {
    const technician = await signIn(DEMO.technician);
    const key = await createKey(technician, "meter logger");
    const stored = await db.query("SELECT key_hash, prefix FROM api_key WHERE name = 'meter logger'");
    expect(stored.rows[0].key_hash).toBe(createHash("sha256").update(key).digest("hex"));
    expect(JSON.stringify(stored.rows)).not.toContain(key);
    // Not shown again.
    expect(await (await technician.fetch("/w/larkspur/settings")).text()).not.toContain(key);

    const list = await api("/api/v1/designs?workspace=larkspur", key);
    expect(list.status).toBe(200);
    expect(Array.isArray((await list.json()).designs)).toBe(true);
    // A technician's key cannot create designs: the key carries the member's role.
    const create = await api("/api/v1/designs?workspace=larkspur", key, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ name: "Should not exist" }),
    });
    expect(create.status).toBe(403);
    expect((await create.json()).error.code).toBe("forbidden");
  });

  it("a key works in its own workspace only", async () => {
    const outsider = await createOutsider();
    const res = await outsider.client.fetch(`/w/${outsider.slug}/settings`, formBody({ intent: "create-key", name: "elsewhere" }));
    const key = (await res.text()).match(/data-testid="new-api-key">([^<]+)</)![1]!;
    expect((await api(`/api/v1/designs?workspace=${outsider.slug}`, key)).status).toBe(200);
    expect((await api("/api/v1/designs?workspace=larkspur", key)).status).toBe(404);
  });

  it("a revoked or unknown key gets 401 with a JSON error", async () => {
    const engineer = await signIn(DEMO.engineer);
    const key = await createKey(engineer, "ci job");
    const id = (await db.query("SELECT id FROM api_key WHERE name = 'ci job'")).rows[0].id;
    const revoked = await engineer.fetch("/w/larkspur/settings", formBody({ intent: "revoke-key", id }));
    expect(revoked.status).toBe(200);
    const after = await api("/api/v1/designs?workspace=larkspur", key);
    expect(after.status).toBe(401);
    expect((await after.json()).error.message).toContain("not valid or was revoked");
    expect((await api("/api/v1/designs?workspace=larkspur", "cpk_made-up")).status).toBe(401);
  });

  it("refuses a cookie-authenticated API mutation from another origin", async () => {
    const engineer = await signIn(DEMO.engineer);
    const res = await engineer.fetch("/api/v1/designs?workspace=larkspur", {
      method: "POST",
      headers: { "content-type": "application/json", origin: "https://elsewhere.example" },
      body: JSON.stringify({ name: "Forged" }),
    });
    expect(res.status).toBe(403);
    expect((await res.json()).error.code).toBe("bad_origin");
  });

  it("names the field when a key has no name", async () => {
    const engineer = await signIn(DEMO.engineer);
    const res = await engineer.fetch("/w/larkspur/settings", formBody({ intent: "create-key", name: "  " }));
    expect(res.status).toBe(400);
    expect(await res.text()).toContain("Name the key");
  });
});
