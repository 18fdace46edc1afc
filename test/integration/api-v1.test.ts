// The JSON API v1 against the running app: its OpenAPI document (valid 3.1, every route of
// app/routes.ts described), vehicles and bench runs (roles, isolation between workspaces, cursor
// pagination, field errors), and the diagnosis endpoint against the engine itself.
import { readFileSync } from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { validate } from "@readme/openapi-parser";
import { client, DEMO, signIn, type Client } from "../support/http";
import { createOutsider } from "../support/outsider";
import { compileDesign, diagnose, explainReadings, validateDesign } from "../../app/engine";

let admin: Client;
let engineer: Client;
let technician: Client;
let reviewer: Client;
let outsider: Client;
let outsiderSlug: string;
let haulerId: string;

const json = (method: string, body: unknown): RequestInit => ({
  method,
  body: JSON.stringify(body),
  headers: { "content-type": "application/json" },
});

async function getJson(c: Client, url: string) {
  const res = await c.fetch(url);
  return { status: res.status, body: (await res.json()) as any };
}

/** Follows nextCursor from the first page to the last; returns every id in order and the page count. */
async function walk(c: Client, url: string, key: string, limit: number): Promise<{ ids: string[]; pages: number }> {
  const ids: string[] = [];
  let cursor: string | null = null;
  let pages = 0;
  do {
    const sep = url.includes("?") ? "&" : "?";
    const res = await getJson(c, `${url}${sep}limit=${limit}${cursor ? `&cursor=${encodeURIComponent(cursor)}` : ""}`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body[key].length).toBeLessThanOrEqual(limit);
    ids.push(...res.body[key].map((x: { id?: string; number?: number }) => x.id ?? String(x.number)));
    cursor = res.body.nextCursor;
    pages += 1;
    expect(pages).toBeLessThan(500);
  } while (cursor);
  return { ids, pages };
}

async function expectEveryItemOnce(c: Client, url: string, key: string) {
  const all = await getJson(c, `${url}${url.includes("?") ? "&" : "?"}limit=100`);
  expect(all.status).toBe(200);
  const expected: string[] = all.body[key].map((x: { id?: string; number?: number }) => x.id ?? String(x.number));
  expect(expected.length, `${url} has items to page through`).toBeGreaterThan(2);
  for (const limit of [1, 2]) {
    const { ids, pages } = await walk(c, url, key, limit);
    expect(new Set(ids).size, "no item twice").toBe(ids.length);
    expect(ids, `limit=${limit}: the same items in the same order`).toEqual(expected);
    expect(pages).toBe(Math.ceil(expected.length / limit));
  }
}

beforeAll(async () => {
  [admin, engineer, technician, reviewer] = await Promise.all([
    signIn(DEMO.admin),
    signIn(DEMO.engineer),
    signIn(DEMO.technician),
    signIn(DEMO.reviewer),
  ]);
  const o = await createOutsider();
  outsider = o.client;
  outsiderSlug = o.slug;
  const list = await getJson(engineer, "/api/v1/vehicles?workspace=larkspur&limit=100");
  haulerId = list.body.vehicles.find((v: { name: string }) => v.name === "Haybarn campus hauler #3").id;
  // Enough runs on the hauler to page through.
  for (let i = 0; i < 3; i++)
    expect((await technician.fetch(`/api/v1/vehicles/${haulerId}/bench-runs`, { method: "POST" })).status).toBe(201);
});

describe("the OpenAPI document", () => {
  let doc: any;
  beforeAll(async () => {
    const res = await client().fetch("/api/v1/openapi.json");
    expect(res.status).toBe(200);
    expect(res.headers.get("cache-control")).toContain("max-age");
    doc = await res.json();
  });

  it("is OpenAPI 3.1 and passes a structural validator (@readme/openapi-parser)", async () => {
    expect(doc.openapi).toMatch(/^3\.1\.\d+$/);
    const copy = structuredClone(doc);
    const result = await validate(copy);
    expect(result.valid, JSON.stringify(result)).toBe(true);
  });

  it("describes every /api/v1 resource route declared in app/routes.ts, and nothing else", () => {
    const text = readFileSync(path.resolve(import.meta.dirname, "../../app/routes.ts"), "utf8");
    const declared = new Set<string>();
    const block = text.slice(text.indexOf('prefix("api/v1", ['));
    const inPrefix = block.slice(0, block.indexOf("]),"));
    for (const m of inPrefix.matchAll(/route\("([^"]+)",\s*"routes\/api\/[^"]+"\)/g)) declared.add(`/api/v1/${m[1]}`);
    for (const m of text.matchAll(/route\("(api\/v1\/[^"]+)",\s*"routes\/api\/[^"]+"\)/g)) declared.add(`/${m[1]}`);
    const asOpenApi = [...declared].map((p) => p.replace(/:([A-Za-z]+)/g, "{$1}")).sort();
    expect(asOpenApi.length).toBeGreaterThan(15);
    expect(Object.keys(doc.paths).sort()).toEqual(asOpenApi);
  });

  it("names both ways in, the error shape, and the main answers", () => {
    expect(doc.components.securitySchemes.apiKey).toMatchObject({ type: "http", scheme: "bearer" });
    expect(doc.components.securitySchemes.session).toMatchObject({ type: "apiKey", in: "cookie" });
    expect(Object.keys(doc.components.schemas)).toEqual(
      expect.arrayContaining(["Error", "Verdict", "DesignSummary", "Vehicle", "BenchRun", "Diagnosis"]),
    );
    // The request bodies are the routes' own zod schemas: the vehicle form's 120-character name limit shows.
    const body = doc.paths["/api/v1/vehicles"].post.requestBody.content["application/json"].schema;
    expect(body.properties.name.maxLength).toBe(120);
    expect(
      doc.paths["/api/v1/bench-runs/{runId}/steps/{n}"].put.requestBody.content["application/json"].schema.properties.status.enum,
    ).toEqual(["pass", "fail", "skip"]);
  });

  it("is rendered at /api/v1/docs for anyone", async () => {
    const res = await client().fetch("/api/v1/docs");
    expect(res.status).toBe(200);
    const html = await res.text();
    expect(html).toContain("/api/v1/vehicles/{vehicleId}/bench-runs");
    expect(html).toContain("Record a step&#x27;s result");
  });
});

describe("vehicles", () => {
  it("lists with cursor pages that hold every vehicle exactly once", async () => {
    // At least three vehicles: the demo has three; add one if a fresh database has fewer.
    await technician.fetch("/api/v1/vehicles?workspace=larkspur", json("POST", { name: `API test cart ${Date.now()}` }));
    await expectEveryItemOnce(engineer, "/api/v1/vehicles?workspace=larkspur", "vehicles");
  });

  it("gives one vehicle with its release, release history and flags", async () => {
    const { status, body } = await getJson(reviewer, `/api/v1/vehicles/${haulerId}`);
    expect(status).toBe(200);
    expect(body.vehicle.name).toBe("Haybarn campus hauler #3");
    expect(body.vehicle.release).not.toBeNull();
    expect(body.vehicle.releases[0]).toEqual(body.vehicle.release);
    expect(typeof body.vehicle.needsAttention).toBe("boolean");
    expect(Array.isArray(body.vehicle.attention)).toBe(true);
  });

  it("creates and changes vehicles for the roles of the vehicle pages only", async () => {
    const name = `Meadowline spare ${Date.now()}`;
    const created = await technician.fetch("/api/v1/vehicles?workspace=larkspur", json("POST", { name, serial: "SP-1" }));
    expect(created.status).toBe(201);
    const v = ((await created.json()) as any).vehicle;
    expect(v).toMatchObject({ name, serial: "SP-1", model: "", release: null, releases: [] });

    expect((await reviewer.fetch("/api/v1/vehicles?workspace=larkspur", json("POST", { name: "No" }))).status).toBe(403);
    expect((await reviewer.fetch(`/api/v1/vehicles/${v.id}`, json("PATCH", { model: "No" }))).status).toBe(403);

    const patched = await engineer.fetch(`/api/v1/vehicles/${v.id}`, json("PATCH", { model: "Deck 42" }));
    expect(patched.status).toBe(200);
    expect(((await patched.json()) as any).vehicle).toMatchObject({ name, serial: "SP-1", model: "Deck 42" });
  });

  it("answers bad input with 400 and the field paths", async () => {
    const res = await admin.fetch("/api/v1/vehicles?workspace=larkspur", json("POST", { name: "", serial: "x".repeat(65) }));
    expect(res.status).toBe(400);
    const body = (await res.json()) as any;
    expect(body.error.code).toBe("invalid_body");
    expect(body.error.fields.map((f: { path: string }) => f.path).sort()).toEqual(["name", "serial"]);

    const patch = await admin.fetch(`/api/v1/vehicles/${haulerId}`, json("PATCH", {}));
    expect(patch.status).toBe(400);
    const list = await getJson(admin, "/api/v1/vehicles?workspace=larkspur&limit=0");
    expect(list.status).toBe(400);
    expect(list.body.error.fields[0].path).toBe("limit");
    const cursor = await getJson(admin, "/api/v1/vehicles?workspace=larkspur&cursor=not-a-cursor");
    expect(cursor.status).toBe(400);
    expect(cursor.body.error.fields[0].path).toBe("cursor");
    const noWorkspace = await getJson(admin, "/api/v1/vehicles");
    expect(noWorkspace.status).toBe(400);
    expect(noWorkspace.body.error.fields[0].path).toBe("workspace");
  });

  it("is invisible across workspaces (404) and needs a sign-in (401)", async () => {
    expect((await outsider.fetch(`/api/v1/vehicles/${haulerId}`)).status).toBe(404);
    expect((await outsider.fetch(`/api/v1/vehicles/${haulerId}`, json("PATCH", { model: "x" }))).status).toBe(404);
    expect((await outsider.fetch("/api/v1/vehicles?workspace=larkspur")).status).toBe(404);
    // The outsider's own workspace lists only its own vehicles (none).
    const own = await getJson(outsider, `/api/v1/vehicles?workspace=${outsiderSlug}`);
    expect(own).toMatchObject({ status: 200, body: { vehicles: [], nextCursor: null } });
    // And a demo member cannot see into the outsider's workspace.
    expect((await engineer.fetch(`/api/v1/vehicles?workspace=${outsiderSlug}`)).status).toBe(404);
    expect((await client().fetch(`/api/v1/vehicles/${haulerId}`)).status).toBe(401);
  });
});

describe("bench runs", () => {
  let runId: string;
  beforeAll(async () => {
    const res = await technician.fetch(`/api/v1/vehicles/${haulerId}/bench-runs`, { method: "POST" });
    expect(res.status).toBe(201);
    const run = ((await res.json()) as any).run;
    expect(run.status).toBe("in-progress");
    expect(run.steps.length).toBeGreaterThan(1);
    expect(run.steps.every((s: { status: unknown }) => s.status === null)).toBe(true);
    runId = run.id;
  });

  it("starts only for technicians", async () => {
    for (const c of [admin, engineer, reviewer])
      expect((await c.fetch(`/api/v1/vehicles/${haulerId}/bench-runs`, { method: "POST" })).status).toBe(403);
    expect((await outsider.fetch(`/api/v1/vehicles/${haulerId}/bench-runs`, { method: "POST" })).status).toBe(404);
  });

  it("records a step's result with its note, for technicians only", async () => {
    const res = await technician.fetch(
      `/api/v1/bench-runs/${runId}/steps/1`,
      json("PUT", { status: "pass", note: "Drive ran as expected." }),
    );
    expect(res.status).toBe(200);
    const body = (await res.json()) as any;
    expect(body.step).toMatchObject({ n: 1, status: "pass", note: "Drive ran as expected." });
    expect(body.mailed).toBe(false);
    const run = await getJson(reviewer, `/api/v1/bench-runs/${runId}`);
    expect(run.status).toBe(200);
    expect(run.body.run.steps[0]).toMatchObject({
      n: 1,
      status: "pass",
      note: "Drive ran as expected.",
      updatedBy: { name: expect.any(String) },
    });
    expect(run.body.run.steps[1].status).toBeNull();

    expect((await engineer.fetch(`/api/v1/bench-runs/${runId}/steps/2`, json("PUT", { status: "skip" }))).status).toBe(403);
    expect((await outsider.fetch(`/api/v1/bench-runs/${runId}/steps/2`, json("PUT", { status: "skip" }))).status).toBe(404);
    expect((await outsider.fetch(`/api/v1/bench-runs/${runId}`)).status).toBe(404);
  });

  it("answers bad step input with 400 and the field paths, and an unknown step with 404", async () => {
    const bad = await technician.fetch(`/api/v1/bench-runs/${runId}/steps/2`, json("PUT", { status: "maybe", note: 5 }));
    expect(bad.status).toBe(400);
    const body = (await bad.json()) as any;
    expect(body.error.fields.map((f: { path: string }) => f.path).sort()).toEqual(["note", "status"]);
    const missing = await technician.fetch(`/api/v1/bench-runs/${runId}/steps/999`, json("PUT", { status: "skip" }));
    expect(missing.status).toBe(404);
    expect(((await missing.json()) as any).error.fields[0].path).toBe("step");
    // Nothing was saved by either.
    const run = await getJson(technician, `/api/v1/bench-runs/${runId}`);
    expect(run.body.run.steps[1]).toMatchObject({ status: null, note: "" });
  });

  it("lists runs per vehicle and per workspace in cursor pages holding every run exactly once", async () => {
    await expectEveryItemOnce(reviewer, `/api/v1/vehicles/${haulerId}/bench-runs`, "runs");
    await expectEveryItemOnce(reviewer, `/api/v1/bench-runs?workspace=larkspur&vehicle=${haulerId}`, "runs");
    const first = await getJson(reviewer, "/api/v1/bench-runs?workspace=larkspur&limit=1");
    expect(first.body.runs).toHaveLength(1);
    const cursor = await getJson(reviewer, "/api/v1/bench-runs?workspace=larkspur&cursor=WyJub3QgYSB0aW1lIiwieCJd");
    expect(cursor.status).toBe(400);
    expect(cursor.body.error.fields[0].path).toBe("cursor");
    expect((await outsider.fetch("/api/v1/bench-runs?workspace=larkspur")).status).toBe(404);
    expect((await outsider.fetch(`/api/v1/vehicles/${haulerId}/bench-runs`)).status).toBe(404);
  });
});

describe("design lists in pages", () => {
  it("gives every design exactly once across cursor pages, and the whole list without a cursor", async () => {
    const whole = await getJson(engineer, "/api/v1/designs?workspace=larkspur");
    expect(whole.status).toBe(200);
    expect(whole.body.nextCursor).toBeNull();
    await expectEveryItemOnce(engineer, "/api/v1/designs?workspace=larkspur", "designs");
    const paged = await getJson(engineer, "/api/v1/designs?workspace=larkspur&limit=100");
    expect([...paged.body.designs.map((d: { id: string }) => d.id)].sort()).toEqual(
      [...whole.body.designs.map((d: { id: string }) => d.id)].sort(),
    );
  });

  it("pages revisions newest first", async () => {
    const designs = await getJson(engineer, "/api/v1/designs?workspace=larkspur");
    const withRevisions = designs.body.designs.find((d: { latestRevision: unknown }) => d.latestRevision);
    const whole = await getJson(engineer, `/api/v1/designs/${withRevisions.id}/revisions`);
    const { ids } = await walk(engineer, `/api/v1/designs/${withRevisions.id}/revisions`, "revisions", 1);
    expect(ids).toEqual(whole.body.revisions.map((r: { number: number }) => String(r.number)));
  });
});

describe("diagnosis", () => {
  it("agrees with the engine's diagnose and explainReadings for a demo row", async () => {
    const designs = await getJson(technician, "/api/v1/designs?workspace=larkspur");
    const hauler = designs.body.designs.find(
      (d: { name: string; latestRevision: unknown }) => d.name.startsWith("Haybarn") && d.latestRevision,
    );
    const n = hauler.latestRevision.number;
    const rev = await getJson(technician, `/api/v1/designs/${hauler.id}/revisions/${n}`);
    const valid = validateDesign(rev.body.revision.document);
    if (!valid.ok) throw new Error("the demo revision is valid");
    const compiled = compileDesign(valid.design);
    // Every condition in its first state, and a reading that the design cannot give there.
    const states = Object.fromEntries(valid.design.conditions.map((c) => [c.id, c.states[0]!]));
    const input = valid.design.components.find((c) => c.type === "input")!.id;
    const measured = { [input]: !diagnose(compiled, states).inputs.find((x) => x.input === input)!.energized };

    const res = await technician.fetch(`/api/v1/designs/${hauler.id}/revisions/${n}/diagnosis`, json("POST", { states, measured }));
    expect(res.status).toBe(200);
    const body = (await res.json()) as any;
    expect(body.diagnosis).toEqual(JSON.parse(JSON.stringify(diagnose(compiled, states))));
    expect(body.readings).toEqual(JSON.parse(JSON.stringify(explainReadings(compiled, states, measured))));
    // Any member may ask.
    expect((await reviewer.fetch(`/api/v1/designs/${hauler.id}/revisions/${n}/diagnosis`, json("POST", { states }))).status).toBe(200);
    expect((await outsider.fetch(`/api/v1/designs/${hauler.id}/revisions/${n}/diagnosis`, json("POST", { states }))).status).toBe(404);

    const bad = await technician.fetch(
      `/api/v1/designs/${hauler.id}/revisions/${n}/diagnosis`,
      json("POST", { states: { ...states, nowhere: "x" }, measured: { "no-such-input": true } }),
    );
    expect(bad.status).toBe(400);
    const paths = ((await bad.json()) as any).error.fields.map((f: { path: string }) => f.path);
    expect(paths).toEqual(expect.arrayContaining(["states", "measured.no-such-input"]));
    const shape = await technician.fetch(`/api/v1/designs/${hauler.id}/revisions/${n}/diagnosis`, json("POST", { states: "all" }));
    expect(shape.status).toBe(400);
    expect(((await shape.json()) as any).error.fields[0].path).toBe("states");
  });
});

describe("the local outbox", () => {
  it("answers the mail the app sent, newest first, without signing in (local mode)", async () => {
    const outsider = await createOutsider(); // signing up mails a confirmation link
    const res = await client().fetch("/api/v1/outbox");
    expect(res.status).toBe(200);
    const { mail } = (await res.json()) as { mail: { recipients: string; subject: string; receivedAt: string }[] };
    expect(mail.some((m) => m.recipients.includes(outsider.email))).toBe(true);
    const times = mail.map((m) => Date.parse(m.receivedAt));
    expect(times).toEqual([...times].sort((a, b) => b - a));
  });
});
