// The design API against the running app and its PostgreSQL: revisions (201/400/409/422, roles,
// workspaces, concurrency, malformed bodies), drafts, proofs, listing, and the design pages.
import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";
import { client, DEMO, formBody, signIn, type Client } from "../support/http";
import { createOutsider } from "../support/outsider";

const WS = "larkspur";
const demo = (file: string) =>
  JSON.parse(readFileSync(new URL(`../../drizzle/demo-designs/${file}`, import.meta.url), "utf8")) as Record<string, unknown>;
const PROVEN = demo("haybarn-campus-hauler.json");
const NO_RESTART_FAILS = demo("meadowline-deck-mower.draft.json");
const SIDE_STAND_FAILS = demo("scree-trail-bike.draft.json");

let db: pg.Pool;
let engineer: Client, technician: Client, reviewer: Client, admin: Client;
const created: string[] = [];

type Json = Record<string, any>;

async function send(c: Client, method: string, path: string, body?: unknown): Promise<{ status: number; body: Json }> {
  const res = await c.fetch(path, {
    method,
    ...(body === undefined ? {} : { body: JSON.stringify(body), headers: { "content-type": "application/json" } }),
  });
  const text = await res.text();
  let parsed: Json;
  try {
    parsed = JSON.parse(text) as Json;
  } catch {
    parsed = { text };
  }
  return { status: res.status, body: parsed };
}

async function newDesign(name: string, start = "blank"): Promise<string> {
  const r = await send(engineer, "POST", `/api/v1/designs?workspace=${WS}`, { name, start });
  expect(r.status).toBe(201);
  created.push(r.body.design.id);
  return r.body.design.id as string;
}

async function revisionRows(designId: string) {
  const r = await db.query<{ number: number; content_hash: string }>(
    "SELECT number, content_hash FROM design_revision WHERE design_id = $1 ORDER BY number",
    [designId],
  );
  return r.rows;
}

const saveRevision = (c: Client, id: string, document: unknown, baseRevision: number, message?: string) =>
  send(c, "POST", `/api/v1/designs/${id}/revisions`, { document, baseRevision, ...(message === undefined ? {} : { message }) });

beforeAll(async () => {
  db = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 4 });
  [engineer, technician, reviewer, admin] = await Promise.all([
    signIn(DEMO.engineer),
    signIn(DEMO.technician),
    signIn(DEMO.reviewer),
    signIn(DEMO.admin),
  ]);
});

afterAll(async () => {
  if (created.length) await db.query("DELETE FROM design WHERE id = ANY($1)", [created]);
  await db.end();
});

describe("saving revisions", () => {
  it("saves a proven design as revision 1, then 2, with its content hash and verdict", async () => {
    const id = await newDesign("Test: proven save");
    const first = await saveRevision(engineer, id, PROVEN, 0, "first wiring");
    expect(first.status).toBe(201);
    expect(first.body.revision.number).toBe(1);
    expect(first.body.revision.contentHash).toMatch(/^[0-9a-f]{64}$/);
    expect(first.body.revision.verdict.ok).toBe(true);
    expect(first.body.revision.verdict.rows).toBe(192);

    // Key order does not change the content hash (canonical JSON).
    const reordered = Object.fromEntries(Object.entries(PROVEN).reverse());
    const second = await saveRevision(engineer, id, reordered, 1);
    expect(second.status).toBe(201);
    expect(second.body.revision.number).toBe(2);
    expect(second.body.revision.contentHash).toBe(first.body.revision.contentHash);

    expect(await revisionRows(id)).toEqual([
      { number: 1, content_hash: first.body.revision.contentHash },
      { number: 2, content_hash: first.body.revision.contentHash },
    ]);
    const one = await send(engineer, "GET", `/api/v1/designs/${id}/revisions/1`);
    expect(one.status).toBe(200);
    expect(one.body.revision.message).toBe("first wiring");
    expect(one.body.revision.document).toEqual(PROVEN);
    const list = await send(reviewer, "GET", `/api/v1/designs/${id}/revisions`);
    expect(list.body.revisions.map((r: Json) => r.number)).toEqual([2, 1]);
  });

  it("answers 400 invalid_design with the engine's field paths and saves nothing", async () => {
    const id = await newDesign("Test: invalid save");
    const broken = structuredClone(PROVEN) as Json;
    const seatAt = broken.components.findIndex((c: Json) => c.id === "SEAT");
    broken.components[seatAt].closedIn = ["standing"];
    broken.wires.push({ from: "PACK.+", to: "NOWHERE.1" });
    const r = await saveRevision(engineer, id, broken, 0);
    expect(r.status).toBe(400);
    expect(r.body.error.code).toBe("invalid_design");
    const paths = r.body.error.fields.map((f: Json) => f.path);
    expect(paths).toContain(`components[${seatAt}].closedIn[0]`);
    expect(paths).toContain(`wires[${broken.wires.length - 1}].to`);
    for (const f of r.body.error.fields) expect(typeof f.message).toBe("string");
    expect(await revisionRows(id)).toEqual([]);
  });

  it("answers 422 rules_fail with the verdict when a rule fails, and saves nothing", async () => {
    const id = await newDesign("Test: failing save");
    const mower = await saveRevision(engineer, id, NO_RESTART_FAILS, 0);
    expect(mower.status).toBe(422);
    expect(mower.body.error.code).toBe("rules_fail");
    expect(mower.body.verdict.ok).toBe(false);
    const noRestart = mower.body.verdict.rules.find((r: Json) => r.id === "no-restart");
    expect(noRestart.holds).toBe(false);
    expect(noRestart.trace.length).toBeGreaterThan(1);

    const bike = await saveRevision(engineer, id, SIDE_STAND_FAILS, 0);
    expect(bike.status).toBe(422);
    const stand = bike.body.verdict.rules.find((r: Json) => r.id === "stand");
    expect(stand).toMatchObject({ holds: false, violatingRows: 1 });
    expect(stand.example).toMatchObject({ stand: "down", walk: "held" });
    expect(await revisionRows(id)).toEqual([]);
  });

  it("answers 409 stale_revision with the latest number when the base is not the latest", async () => {
    const id = await newDesign("Test: stale save");
    expect((await saveRevision(engineer, id, PROVEN, 0)).status).toBe(201);
    const again = await saveRevision(engineer, id, PROVEN, 0);
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe("stale_revision");
    expect(again.body.latestRevision).toBe(1);
    const ahead = await saveRevision(engineer, id, PROVEN, 5);
    expect(ahead.status).toBe(409);
    expect(ahead.body.latestRevision).toBe(1);
    expect((await revisionRows(id)).map((r) => r.number)).toEqual([1]);
  });

  it("ten simultaneous saves on the same base give exactly one 201 and nine 409", async () => {
    const id = await newDesign("Test: concurrent saves");
    const results = await Promise.all(Array.from({ length: 10 }, (_, i) => saveRevision(engineer, id, PROVEN, 0, `attempt ${i}`)));
    const statuses = results.map((r) => r.status).sort();
    expect(statuses).toEqual([201, 409, 409, 409, 409, 409, 409, 409, 409, 409]);
    for (const r of results.filter((x) => x.status === 409)) expect(r.body.latestRevision).toBe(1);
    expect((await revisionRows(id)).map((r) => r.number)).toEqual([1]);
  });

  it("refuses technicians, reviewers and admins with 403 and lets them read", async () => {
    const id = await newDesign("Test: roles");
    for (const c of [technician, reviewer, admin]) {
      const r = await saveRevision(c, id, PROVEN, 0);
      expect(r.status).toBe(403);
      expect(r.body.error.code).toBe("forbidden");
      const d = await send(c, "PUT", `/api/v1/designs/${id}/draft`, { document: PROVEN, version: 1 });
      expect(d.status).toBe(403);
      expect((await send(c, "GET", `/api/v1/designs/${id}`)).status).toBe(200);
    }
    expect(await revisionRows(id)).toEqual([]);
  });

  it("answers 401 without a session", async () => {
    const id = await newDesign("Test: anonymous");
    const r = await saveRevision(client(), id, PROVEN, 0);
    expect(r.status).toBe(401);
    expect(r.body.error.code).toBe("unauthenticated");
  });

  it("refuses to update a saved revision in the database", async () => {
    const id = await newDesign("Test: immutable");
    expect((await saveRevision(engineer, id, PROVEN, 0)).status).toBe(201);
    await expect(db.query("UPDATE design_revision SET message = 'changed' WHERE design_id = $1", [id])).rejects.toThrow(/immutable/);
  });
});

describe("malformed requests", () => {
  it("answer 400 with a clear message, never 500, and leave the table unchanged", async () => {
    const id = await newDesign("Test: malformed");
    const path = `/api/v1/designs/${id}/revisions`;
    const deep: Json = {};
    let at = deep;
    for (let i = 0; i < 200; i++) at = at.next = {};
    const cases: Array<{ name: string; body: BodyInit; code: string; field?: string }> = [
      { name: "not JSON", body: "this is not json", code: "invalid_json" },
      { name: "truncated JSON", body: '{"document": {', code: "invalid_json" },
      { name: "empty body", body: "", code: "invalid_json" },
      { name: "invalid UTF-8", body: new Uint8Array([0x7b, 0x22, 0xff, 0xfe, 0x22, 0x7d]), code: "invalid_json" },
      { name: "an array", body: "[]", code: "invalid_body" },
      { name: "null", body: "null", code: "invalid_body" },
      { name: "a number", body: "42", code: "invalid_body" },
      { name: "no document", body: JSON.stringify({ baseRevision: 0 }), code: "invalid_body", field: "document" },
      { name: "no base", body: JSON.stringify({ document: PROVEN }), code: "invalid_body", field: "baseRevision" },
      { name: "base as text", body: JSON.stringify({ document: PROVEN, baseRevision: "0" }), code: "invalid_body", field: "baseRevision" },
      { name: "negative base", body: JSON.stringify({ document: PROVEN, baseRevision: -1 }), code: "invalid_body", field: "baseRevision" },
      {
        name: "fractional base",
        body: JSON.stringify({ document: PROVEN, baseRevision: 0.5 }),
        code: "invalid_body",
        field: "baseRevision",
      },
      {
        name: "message not text",
        body: JSON.stringify({ document: PROVEN, baseRevision: 0, message: 7 }),
        code: "invalid_body",
        field: "message",
      },
      { name: "document is text", body: JSON.stringify({ document: "design", baseRevision: 0 }), code: "invalid_design" },
      { name: "document is empty", body: JSON.stringify({ document: {}, baseRevision: 0 }), code: "invalid_design", field: "format" },
      {
        name: "NUL in a label",
        body: JSON.stringify({ document: { ...PROVEN, name: "a\u0000b" }, baseRevision: 0 }),
        code: "invalid_design",
        field: "name",
      },
      {
        name: "lone surrogate",
        body: `{"document": ${JSON.stringify({ ...PROVEN, name: "X" })}, "baseRevision": 0}`.replace('"name":"X"', '"name":"\\ud800"'),
        code: "invalid_design",
        field: "name",
      },
      {
        name: "nesting too deep",
        body: JSON.stringify({ document: { ...PROVEN, layout: { deep } }, baseRevision: 0 }),
        code: "invalid_design",
      },
    ];
    for (const c of cases) {
      const res = await engineer.fetch(path, { method: "POST", body: c.body, headers: { "content-type": "application/json" } });
      const body = (await res.json()) as Json;
      expect(res.status, c.name).toBe(400);
      expect(body.error.code, c.name).toBe(c.code);
      expect(body.error.message.length, c.name).toBeGreaterThan(10);
      expect(Array.isArray(body.error.fields), c.name).toBe(true);
      if (c.field)
        expect(
          body.error.fields.map((f: Json) => f.path),
          c.name,
        ).toContain(c.field);
    }
    const wrongType = await engineer.fetch(path, {
      method: "POST",
      body: JSON.stringify({ document: PROVEN, baseRevision: 0 }),
      headers: { "content-type": "text/plain" },
    });
    expect(wrongType.status).toBe(415);
    expect(((await wrongType.json()) as Json).error.code).toBe("unsupported_media_type");
    const huge = JSON.stringify({ document: { ...PROVEN, layout: { padding: "x".repeat(1_100_000) } }, baseRevision: 0 });
    const tooLarge = await engineer.fetch(path, { method: "POST", body: huge, headers: { "content-type": "application/json" } });
    expect(tooLarge.status).toBe(413);
    expect(((await tooLarge.json()) as Json).error.code).toBe("too_large");
    const foreign = await engineer.fetch(path, {
      method: "POST",
      body: JSON.stringify({ document: PROVEN, baseRevision: 0 }),
      headers: { "content-type": "application/json", origin: "https://elsewhere.example" },
    });
    expect(foreign.status).toBe(403);
    expect(await revisionRows(id)).toEqual([]);
  });

  it("answer a method the endpoint does not take with 405 in the same error shape", async () => {
    const id = await newDesign("Test: methods");
    for (const [method, path] of [
      ["DELETE", `/api/v1/designs/${id}`],
      ["POST", `/api/v1/designs/${id}/draft`],
      ["PUT", `/api/v1/designs/${id}/revisions`],
      ["GET", `/api/v1/proofs?workspace=${WS}`],
    ] as const) {
      const r = await send(engineer, method, path, method === "GET" || method === "DELETE" ? undefined : {});
      expect(r.status, `${method} ${path}`).toBe(405);
      expect(r.body.error.code).toBe("method_not_allowed");
    }
  });
});

describe("designs of another workspace", () => {
  let otherDesign: string;
  let outsider: Awaited<ReturnType<typeof createOutsider>>;

  beforeAll(async () => {
    outsider = await createOutsider();
    const ws = await db.query<{ id: string }>("SELECT id FROM workspace WHERE slug = $1", [outsider.slug]);
    const u = await db.query<{ id: string }>('SELECT id FROM "user" WHERE email = $1', [outsider.email]);
    otherDesign = crypto.randomUUID();
    await db.query("INSERT INTO design (id, workspace_id, name, created_by) VALUES ($1, $2, 'Elsewhere', $3)", [
      otherDesign,
      ws.rows[0]!.id,
      u.rows[0]!.id,
    ]);
    await db.query(
      `INSERT INTO design_draft (design_id, workspace_id, version, document, content_hash, "check", updated_by)
       VALUES ($1, $2, 1, '{}', 'x', '{"state":"invalid","problems":1}', $3)`,
      [otherDesign, ws.rows[0]!.id, u.rows[0]!.id],
    );
    created.push(otherDesign);
  });

  it("are 404 to a member of another workspace, on every endpoint and page", async () => {
    expect((await send(engineer, "GET", `/api/v1/designs/${otherDesign}`)).status).toBe(404);
    expect((await send(engineer, "GET", `/api/v1/designs/${otherDesign}/revisions`)).status).toBe(404);
    expect((await send(engineer, "GET", `/api/v1/designs/${otherDesign}/draft`)).status).toBe(404);
    const save = await saveRevision(engineer, otherDesign, PROVEN, 0);
    expect(save.status).toBe(404);
    expect(save.body.error.code).toBe("not_found");
    expect((await send(engineer, "PUT", `/api/v1/designs/${otherDesign}/draft`, { document: PROVEN, version: 1 })).status).toBe(404);
    expect((await send(engineer, "GET", `/api/v1/designs?workspace=${outsider.slug}`)).status).toBe(404);
    expect((await engineer.fetch(`/w/${WS}/designs/${otherDesign}`)).status).toBe(404);
    expect(await revisionRows(otherDesign)).toEqual([]);
  });

  it("and the demo workspace's designs are 404 to the outsider", async () => {
    const id = await newDesign("Test: not for outsiders");
    expect((await send(outsider.client, "GET", `/api/v1/designs/${id}`)).status).toBe(404);
    expect((await saveRevision(outsider.client, id, PROVEN, 0)).status).toBe(404);
    expect((await send(outsider.client, "POST", `/api/v1/proofs?workspace=${WS}`, { document: PROVEN })).status).toBe(404);
  });

  it("an unknown design id is 404", async () => {
    expect((await send(engineer, "GET", `/api/v1/designs/${crypto.randomUUID()}`)).status).toBe(404);
  });
});

describe("drafts", () => {
  it("save with the current version (200, next version) and refuse a stale one (409, current version)", async () => {
    const id = await newDesign("Test: drafts");
    const start = await send(engineer, "GET", `/api/v1/designs/${id}/draft`);
    expect(start.body.draft.version).toBe(1);
    expect(start.body.draft.check.state).toBe("checked");

    const unfinished = { format: "chainproof/design@1", name: "half drawn", conditions: [], anything: { goes: [1, 2, 3] } };
    const saved = await send(engineer, "PUT", `/api/v1/designs/${id}/draft`, { document: unfinished, version: 1 });
    expect(saved).toEqual({ status: 200, body: { version: 2 } });
    const stale = await send(engineer, "PUT", `/api/v1/designs/${id}/draft`, { document: PROVEN, version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe("stale_draft");
    expect(stale.body.currentVersion).toBe(2);

    const now = await send(reviewer, "GET", `/api/v1/designs/${id}/draft`);
    expect(now.body.draft.document).toEqual(unfinished);
    expect(now.body.draft.check.state).toBe("invalid");
    const overview = await send(reviewer, "GET", `/api/v1/designs/${id}`);
    expect(overview.body).toMatchObject({ design: { id, status: "draft" }, latestRevision: null, document: null, verdict: null });
    expect(overview.body.draft).toMatchObject({ version: 2, changed: true });
  });

  it("concurrent writes of the same version: one 200, the rest 409", async () => {
    const id = await newDesign("Test: draft race");
    const results = await Promise.all(
      Array.from({ length: 6 }, (_, i) =>
        send(engineer, "PUT", `/api/v1/designs/${id}/draft`, { document: { ...PROVEN, name: `copy ${i}` }, version: 1 }),
      ),
    );
    expect(results.map((r) => r.status).sort()).toEqual([200, 409, 409, 409, 409, 409]);
    const row = await db.query<{ version: number }>("SELECT version FROM design_draft WHERE design_id = $1", [id]);
    expect(row.rows).toEqual([{ version: 2 }]);
  });

  it("refuse a document that is not an object, and malformed bodies, with 400", async () => {
    const id = await newDesign("Test: draft bodies");
    for (const body of [{ document: [1, 2], version: 1 }, { document: "x", version: 1 }, { document: {}, version: "1" }, { version: 1 }]) {
      const r = await send(engineer, "PUT", `/api/v1/designs/${id}/draft`, body);
      expect(r.status, JSON.stringify(body)).toBe(400);
      expect(r.body.error.code).toBe("invalid_body");
    }
    const res = await engineer.fetch(`/api/v1/designs/${id}/draft`, {
      method: "PUT",
      body: "{nope",
      headers: { "content-type": "application/json" },
    });
    expect(res.status).toBe(400);
    const row = await db.query<{ version: number }>("SELECT version FROM design_draft WHERE design_id = $1", [id]);
    expect(row.rows).toEqual([{ version: 1 }]);
  });

  it("a saved revision becomes the draft's base; the design reads as proven", async () => {
    const id = await newDesign("Test: draft base");
    expect((await send(engineer, "PUT", `/api/v1/designs/${id}/draft`, { document: PROVEN, version: 1 })).status).toBe(200);
    expect((await saveRevision(engineer, id, PROVEN, 0)).status).toBe(201);
    const d = await send(engineer, "GET", `/api/v1/designs/${id}`);
    expect(d.body).toMatchObject({ design: { status: "proven" }, latestRevision: 1, draft: { baseRevision: 1, changed: false } });
    expect(d.body.document).toEqual(PROVEN);
    expect(d.body.verdict.ok).toBe(true);
  });
});

describe("proofs", () => {
  it("any member gets the verdict of a valid design", async () => {
    for (const c of [engineer, technician, reviewer]) {
      const r = await send(c, "POST", `/api/v1/proofs?workspace=${WS}`, { document: SIDE_STAND_FAILS });
      expect(r.status).toBe(200);
      expect(r.body.verdict.format).toBe("chainproof/verdict@1");
      expect(r.body.verdict.ok).toBe(false);
      expect(r.body.verdict.rules.find((x: Json) => x.id === "stand").holds).toBe(false);
    }
  });

  it("answers 400 with field paths for an invalid design, a malformed body or no workspace", async () => {
    const r = await send(reviewer, "POST", `/api/v1/proofs?workspace=${WS}`, { document: { ...PROVEN, controller: {} } });
    expect(r.status).toBe(400);
    expect(r.body.error.code).toBe("invalid_design");
    expect(r.body.error.fields.map((f: Json) => f.path)).toContain("controller.throttle");
    const bad = await reviewer.fetch(`/api/v1/proofs?workspace=${WS}`, {
      method: "POST",
      body: "{",
      headers: { "content-type": "application/json" },
    });
    expect(bad.status).toBe(400);
    expect((await send(reviewer, "POST", "/api/v1/proofs", { document: PROVEN })).status).toBe(400);
  });
});

describe("listing", () => {
  it("lists the workspace's designs with filters by vehicle and status", async () => {
    const drafted = await newDesign("Test: listed draft", "scree");
    const all = await send(technician, "GET", `/api/v1/designs?workspace=${WS}`);
    expect(all.status).toBe(200);
    const mine = all.body.designs.find((d: Json) => d.id === drafted);
    expect(mine).toMatchObject({
      status: "draft",
      latestRevision: null,
      vehicleId: null,
      draft: { changed: true, check: { state: "checked", ok: false, failing: 1 } },
    });

    const drafts = await send(technician, "GET", `/api/v1/designs?workspace=${WS}&status=draft`);
    expect(drafts.body.designs.every((d: Json) => d.status === "draft")).toBe(true);
    const proven = await send(technician, "GET", `/api/v1/designs?workspace=${WS}&status=proven`);
    expect(proven.body.designs.every((d: Json) => d.status === "proven")).toBe(true);
    expect(proven.body.designs.some((d: Json) => d.id === drafted)).toBe(false);
    const none = await send(technician, "GET", `/api/v1/designs?workspace=${WS}&vehicle=none`);
    expect(none.body.designs.some((d: Json) => d.id === drafted)).toBe(true);
    expect(none.body.designs.every((d: Json) => d.vehicleId === null)).toBe(true);
    // A filter value that makes no sense is ignored rather than refused.
    const odd = await send(technician, "GET", `/api/v1/designs?workspace=${WS}&status=shiny`);
    expect(odd.body.designs.length).toBe(all.body.designs.length);
  });

  it("a vehicle from another workspace cannot be given to a new design", async () => {
    const r = await send(engineer, "POST", `/api/v1/designs?workspace=${WS}`, {
      name: "Test: foreign vehicle",
      vehicleId: crypto.randomUUID(),
    });
    expect(r.status).toBe(400);
    expect(r.body.error.fields.map((f: Json) => f.path)).toContain("vehicleId");
  });
});

describe("design pages", () => {
  it("list, overview and the create form render for members; engineers create", async () => {
    const id = await newDesign("Test: page view", "haybarn");
    expect((await saveRevision(engineer, id, PROVEN, 0, "from the test")).status).toBe(201);
    const list = await reviewer.fetch(`/w/${WS}/designs`);
    expect(list.status).toBe(200);
    expect(await list.text()).toContain("Test: page view");
    const overview = await reviewer.fetch(`/w/${WS}/designs/${id}`);
    expect(overview.status).toBe(200);
    const html = await overview.text();
    expect(html).toContain("Revision history");
    expect(html).toContain("from the test");
    expect(html).toContain("Safety caution");

    expect((await technician.fetch(`/w/${WS}/designs/new`)).status).toBe(403);
    expect((await technician.fetch(`/w/${WS}/designs/new`, formBody({ name: "Nope", start: "blank" }))).status).toBe(403);
    const empty = await engineer.fetch(`/w/${WS}/designs/new`, formBody({ name: "", start: "blank" }));
    expect(empty.status).toBe(400);
    const made = await engineer.fetch(`/w/${WS}/designs/new`, formBody({ name: "Test: made by form", vehicleId: "", start: "meadowline" }));
    expect(made.status).toBe(302);
    const location = made.headers.get("location") ?? "";
    expect(location).toMatch(new RegExp(`^/w/${WS}/designs/[0-9a-f-]{36}/edit$`));
    const newId = location.match(/designs\/([0-9a-f-]{36})/)?.[1];
    expect(newId).toBeTruthy();
    created.push(newId!);
    const row = await db.query<{ version: number; base_revision: number; name: string }>(
      "SELECT version, base_revision, document->>'name' AS name FROM design_draft WHERE design_id = $1",
      [newId],
    );
    expect(row.rows).toEqual([{ version: 1, base_revision: 0, name: "Test: made by form" }]);
  });

  it("the editor page opens for every member, a saved revision read-only, and 404 for what is not there", async () => {
    const id = await newDesign("Test: editor page", "haybarn");
    expect((await saveRevision(engineer, id, PROVEN, 0)).status).toBe(201);
    for (const c of [engineer, technician, reviewer, admin]) {
      const res = await c.fetch(`/w/${WS}/designs/${id}/edit`);
      expect(res.status).toBe(200);
      expect(await res.text()).toContain("Safety caution");
    }
    const rev = await reviewer.fetch(`/w/${WS}/designs/${id}/edit?revision=1`);
    expect(rev.status).toBe(200);
    expect(await rev.text()).toContain("Opened revision 1, read-only");
    expect((await reviewer.fetch(`/w/${WS}/designs/${id}/edit?revision=2`)).status).toBe(404);
    expect((await reviewer.fetch(`/w/${WS}/designs/${id}/edit?revision=first`)).status).toBe(404);
    expect((await reviewer.fetch(`/w/${WS}/designs/${crypto.randomUUID()}/edit`)).status).toBe(404);
  });
});
