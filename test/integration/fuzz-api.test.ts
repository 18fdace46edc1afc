// Fuzzing the design API against the running app and its PostgreSQL: 1,500 generated request bodies
// (mutations of the shipped designs, arbitrary JSON, raw text and bytes, wrong content types) sent
// to the proof, revision, draft and create endpoints. Every answer is one of the documented statuses,
// never a 5xx; errors come in the error shape and name real field paths; the database changes only
// by the saves the API reported, and the engine, run here, agrees with the verdicts.
import fc from "fast-check";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { prove, validateDesign } from "../../app/engine";
import { DEMO, signIn, type Client } from "../support/http";
import { mutatedBody, pathNamesPlaceIn, rawBodyArb, BASE_DESIGNS, type Json, type RawBody } from "../support/fuzz-designs";

const WS = "larkspur";
// Fixed seeds so CI replays the same cases; fast-check prints seed and path of a failure.
const SEED = 0x5eed_0a71;
// Generous limits for a shared machine; these are not timing assertions.
const SLOW = 240_000;
/** Stands for "the current number" (revision or draft version) until the request is sent. */
const CURRENT = 777_777;
const BODY_MAX = 1_000_000;

type Answer = { status: number; text: string; json: any; contentType: string };
type Case = { kind: "json"; body: Json } | { kind: "raw"; raw: RawBody };

let db: pg.Pool;
let engineerId: string;
const createdDesigns: string[] = [];

async function signedInEngineer(): Promise<Client> {
  return signIn(DEMO.engineer);
}

/** Replaces the CURRENT placeholder at the body's top level (a mutated one stays as it is). */
function withCurrent(body: Json, key: string, current: number): Json {
  if (body && typeof body === "object" && !Array.isArray(body) && body[key] === CURRENT) {
    Object.defineProperty(body, key, { value: current, enumerable: true, writable: true, configurable: true });
  }
  return body;
}

async function send(c: Client, method: string, path: string, item: Case): Promise<Answer & { sent: unknown; bytes: number }> {
  const text = item.kind === "json" ? JSON.stringify(item.body) : item.raw.text;
  const contentType = item.kind === "json" ? "application/json" : item.raw.contentType;
  const headers: Record<string, string> = {};
  if (contentType) headers["content-type"] = contentType;
  const res = await c.fetch(path, { method, body: typeof text === "string" ? text : new Blob([text as Uint8Array<ArrayBuffer>]), headers });
  const answer = await res.text();
  let json: any;
  try {
    json = JSON.parse(answer);
  } catch {
    json = undefined;
  }
  let sent: unknown;
  if (item.kind === "json") sent = item.body;
  else if (typeof text === "string") {
    try {
      sent = JSON.parse(text);
    } catch {
      sent = undefined;
    }
  }
  const bytes = typeof text === "string" ? Buffer.byteLength(text) : text.byteLength;
  return { status: res.status, text: answer, json, contentType: res.headers.get("content-type") ?? "", sent, bytes };
}

const isObj = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);

/**
 * The checks every answer passes: a documented status, JSON, and for errors the error shape with
 * non-empty field paths that name a place in what was sent (the document for invalid_design).
 */
function checkAnswer(a: Answer & { sent: unknown; bytes: number }, allowed: number[]): void {
  if (!allowed.includes(a.status)) throw new Error(`status ${a.status} (allowed ${allowed.join(", ")}): ${a.text.slice(0, 600)}`);
  expect(a.contentType).toMatch(/^application\/json/);
  expect(a.json).toBeTypeOf("object");
  if (a.status >= 400) {
    const e = a.json.error;
    expect(typeof e.code).toBe("string");
    expect(e.code).not.toBe("internal");
    expect(typeof e.message).toBe("string");
    expect(e.message.trim()).not.toBe("");
    expect(Array.isArray(e.fields)).toBe(true);
    for (const f of e.fields) {
      expect(typeof f.path).toBe("string");
      expect(f.path).not.toBe("");
      expect(typeof f.message).toBe("string");
      expect(f.message.trim()).not.toBe("");
    }
    if (a.status === 400 && (e.code === "invalid_design" || e.code === "invalid_body")) {
      expect(e.fields.length).toBeGreaterThan(0);
      const where = e.code === "invalid_design" && isObj(a.sent) ? a.sent.document : a.sent;
      if (a.sent !== undefined) {
        for (const f of e.fields) {
          if (!pathNamesPlaceIn(where, f.path))
            throw new Error(`${e.code} path ${JSON.stringify(f.path)} names no place in what was sent (${f.message})`);
        }
      }
    }
  }
}

/** What the engine says of a document sent in a body that the server reads as JSON. */
function engineView(a: { sent: unknown; bytes: number }): {
  readable: boolean;
  valid: boolean;
  proven: boolean | null;
  neverDrives: boolean | null;
  rows: number;
} {
  const readable = a.bytes <= BODY_MAX && isObj(a.sent) && a.sent.document !== undefined;
  if (!readable) return { readable, valid: false, proven: null, neverDrives: null, rows: 0 };
  const v = validateDesign((a.sent as { document: unknown }).document);
  if (!v.ok) return { readable, valid: false, proven: null, neverDrives: null, rows: 0 };
  const rows = v.design.conditions.reduce((n, c) => n * c.states.length, 1);
  const verdict = rows <= 2 ** 14 ? prove(v.design) : null;
  return { readable, valid: true, proven: verdict ? verdict.ok : null, neverDrives: verdict ? verdict.driveRows === 0 : null, rows };
}

function cases(wrap: (design: Record<string, Json>) => Record<string, Json>, rawAround: Json): fc.Arbitrary<Case> {
  return fc.oneof(
    { weight: 8, arbitrary: mutatedBody(wrap, 4).map((body): Case => ({ kind: "json", body })) },
    { weight: 2, arbitrary: rawBodyArb(rawAround).map((raw): Case => ({ kind: "raw", raw })) },
  );
}

async function newDesign(c: Client, name: string): Promise<string> {
  const res = await c.fetch(`/api/v1/designs?workspace=${WS}`, {
    method: "POST",
    body: JSON.stringify({ name, start: "blank" }),
    headers: { "content-type": "application/json" },
  });
  expect(res.status).toBe(201);
  const id = ((await res.json()) as { design: { id: string } }).design.id;
  createdDesigns.push(id);
  return id;
}

beforeAll(async () => {
  db = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 });
  engineerId = (await db.query<{ id: string }>('SELECT id FROM "user" WHERE email = $1', [DEMO.engineer])).rows[0]!.id;
});

afterAll(async () => {
  if (createdDesigns.length) await db.query("DELETE FROM design WHERE id = ANY($1)", [createdDesigns]);
  await db.end();
});

describe("the design API under generated bad input", () => {
  it("POST /api/v1/proofs: 500 bodies, 200 or 400/413/415, verdicts agree with the engine, nothing stored", { timeout: SLOW }, async () => {
    const c = await signedInEngineer();
    const snapshot = async () =>
      (
        await db.query<{ s: string }>(
          `SELECT (SELECT count(*) FROM design_revision)::text || '/' || (SELECT count(*) FROM design)::text || '/' ||
                  (SELECT coalesce(sum(version), 0) FROM design_draft)::text AS s`,
        )
      ).rows[0]!.s;
    const before = await snapshot();
    const tally: Record<number, number> = {};
    await fc.assert(
      fc.asyncProperty(
        cases((d) => ({ document: d }), { document: BASE_DESIGNS[0]! }),
        async (item) => {
          const a = await send(c, "POST", `/api/v1/proofs?workspace=${WS}`, item);
          tally[a.status] = (tally[a.status] ?? 0) + 1;
          checkAnswer(a, [200, 400, 413, 415]);
          if (item.kind !== "json") return;
          const e = engineView(a);
          if (e.readable && !e.valid) {
            expect(a.status).toBe(400);
            expect(a.json.error.code).toBe("invalid_design");
          }
          if (a.status === 200) {
            expect(e.valid).toBe(true);
            expect(a.json.verdict.format).toBe("chainproof/verdict@1");
            expect(a.json.verdict.rows).toBe(e.rows);
            if (e.proven !== null) expect(a.json.verdict.ok).toBe(e.proven);
          }
        },
      ),
      { seed: SEED, numRuns: 500 },
    );
    expect(await snapshot()).toBe(before);
    // Both outcomes were exercised.
    expect(tally[200] ?? 0).toBeGreaterThan(10);
    expect(tally[400] ?? 0).toBeGreaterThan(200);
  });

  it("POST /api/v1/designs/:id/revisions: 450 bodies; a revision row exactly for each 201", { timeout: SLOW }, async () => {
    const c = await signedInEngineer();
    const id = await newDesign(c, "Fuzz: revisions");
    const latest = async () =>
      (
        await db.query<{ n: number; count: number }>(
          "SELECT coalesce(max(number), 0)::int AS n, count(*)::int AS count FROM design_revision WHERE design_id = $1",
          [id],
        )
      ).rows[0]!;
    const tally: Record<number, number> = {};
    await fc.assert(
      fc.asyncProperty(
        cases((d) => ({ document: d, baseRevision: CURRENT, message: "fuzz" }), { document: BASE_DESIGNS[0]!, baseRevision: 0 }),
        async (item) => {
          const before = await latest();
          const sent: Case = item.kind === "json" ? { kind: "json", body: withCurrent(item.body, "baseRevision", before.n) } : item;
          const a = await send(c, "POST", `/api/v1/designs/${id}/revisions`, sent);
          tally[a.status] = (tally[a.status] ?? 0) + 1;
          checkAnswer(a, [201, 400, 409, 413, 415, 422]);
          const after = await latest();
          expect(after.count).toBe(before.count + (a.status === 201 ? 1 : 0));
          if (a.status === 201) expect(a.json.revision.number).toBe(after.n);
          if (sent.kind !== "json") return;
          const e = engineView(a);
          if (e.readable && !e.valid && isObj(a.sent) && a.sent.baseRevision === before.n) {
            expect(a.status).toBe(400);
          }
          if (a.status === 201) expect(e.valid && e.proven !== false).toBe(true);
          if (a.status === 422) {
            expect(e.proven === null || e.proven === false).toBe(true);
            // Spec 1.1: a design that never drives is refused as such, whatever its rules say.
            if (e.neverDrives !== null) expect(a.json.error.code).toBe(e.neverDrives ? "never_drives" : "rules_fail");
            else expect(["never_drives", "rules_fail"]).toContain(a.json.error.code);
          }
        },
      ),
      { seed: SEED + 1, numRuns: 450 },
    );
    expect(tally[201] ?? 0).toBeGreaterThan(5);
    expect(tally[400] ?? 0).toBeGreaterThan(150);
  });

  it("PUT /api/v1/designs/:id/draft: 300 bodies; the version moves exactly with each 200", { timeout: SLOW }, async () => {
    const c = await signedInEngineer();
    const id = await newDesign(c, "Fuzz: drafts");
    const draft = async () =>
      (
        await db.query<{ version: number; content_hash: string }>("SELECT version, content_hash FROM design_draft WHERE design_id = $1", [
          id,
        ])
      ).rows[0]!;
    const tally: Record<number, number> = {};
    await fc.assert(
      fc.asyncProperty(
        cases((d) => ({ document: d, version: CURRENT, baseRevision: 0 }), { document: BASE_DESIGNS[1]!, version: 1 }),
        async (item) => {
          const before = await draft();
          const sent: Case = item.kind === "json" ? { kind: "json", body: withCurrent(item.body, "version", before.version) } : item;
          const a = await send(c, "PUT", `/api/v1/designs/${id}/draft`, sent);
          tally[a.status] = (tally[a.status] ?? 0) + 1;
          checkAnswer(a, [200, 400, 409, 413, 415]);
          const after = await draft();
          if (a.status === 200) {
            expect(after.version).toBe(before.version + 1);
            expect(a.json.version).toBe(after.version);
            expect(isObj(isObj(a.sent) ? a.sent.document : undefined)).toBe(true);
          } else {
            expect(after).toEqual(before);
          }
          if (a.status === 409) expect(a.json.currentVersion).toBe(before.version);
        },
      ),
      { seed: SEED + 2, numRuns: 300 },
    );
    expect(tally[200] ?? 0).toBeGreaterThan(50);
    expect(tally[400] ?? 0).toBeGreaterThan(20);
  });

  it("POST /api/v1/designs: 250 bodies; a design row exactly for each 201", { timeout: SLOW }, async () => {
    const c = await signedInEngineer();
    const vehicleId =
      (
        await db.query<{ id: string }>("SELECT v.id FROM vehicle v JOIN workspace w ON w.id = v.workspace_id WHERE w.slug = $1 LIMIT 1", [
          WS,
        ])
      ).rows[0]?.id ?? null;
    const count = async () =>
      (
        await db.query<{ n: number }>(
          "SELECT count(*)::int AS n FROM design d JOIN workspace w ON w.id = d.workspace_id WHERE w.slug = $1",
          [WS],
        )
      ).rows[0]!.n;
    const bodies = fc.oneof(
      {
        weight: 8,
        arbitrary: fc.tuple(fc.constantFrom("haybarn", "meadowline", "scree", "blank"), fc.boolean()).chain(([start, withVehicle]) =>
          mutatedBody(() => ({ name: "Fuzz: created", vehicleId: withVehicle ? vehicleId : null, start }), 3).map((body): Case => ({
            kind: "json",
            body,
          })),
        ),
      },
      { weight: 2, arbitrary: rawBodyArb({ name: "Fuzz: created", start: "blank" }).map((raw): Case => ({ kind: "raw", raw })) },
    );
    const tally: Record<number, number> = {};
    await fc.assert(
      fc.asyncProperty(bodies, async (item) => {
        const before = await count();
        const a = await send(c, "POST", `/api/v1/designs?workspace=${WS}`, item);
        tally[a.status] = (tally[a.status] ?? 0) + 1;
        if (a.status === 201) createdDesigns.push(a.json.design.id);
        checkAnswer(a, [201, 400, 413, 415]);
        expect(await count()).toBe(before + (a.status === 201 ? 1 : 0));
        if (a.status === 201) {
          const row = await db.query("SELECT 1 FROM design WHERE id = $1 AND created_by = $2", [a.json.design.id, engineerId]);
          expect(row.rowCount).toBe(1);
        }
      }),
      { seed: SEED + 3, numRuns: 250 },
    );
    expect(tally[201] ?? 0).toBeGreaterThan(10);
    expect(tally[400] ?? 0).toBeGreaterThan(50);
  });
});

describe("bodies that fuzzing turned into 500s once", () => {
  it("answers 400 with the field's path: NUL or broken surrogates in text, integers past PostgreSQL's, __proto__ ids", async () => {
    const c = await signedInEngineer();
    const id = await newDesign(c, "Fuzz: regressions");
    const hauler = BASE_DESIGNS.find((d) => d.name === "Haybarn campus hauler, drive inhibit") ?? BASE_DESIGNS[0]!;
    const cases: Array<[string, string, Json, string]> = [
      ["POST", `/api/v1/designs?workspace=${WS}`, { name: "Fuzz a\u0000b" }, "name"],
      ["POST", `/api/v1/designs?workspace=${WS}`, { name: "Fuzz \ud800" }, "name"],
      ["POST", `/api/v1/designs?workspace=${WS}`, { name: "Fuzz", vehicleId: "v\u0000" }, "vehicleId"],
      ["POST", `/api/v1/designs/${id}/revisions`, { document: hauler, baseRevision: 0, message: "m\u0000" }, "message"],
      ["POST", `/api/v1/designs/${id}/revisions`, { document: hauler, baseRevision: 2 ** 31 }, "baseRevision"],
      ["PUT", `/api/v1/designs/${id}/draft`, { document: hauler, version: 2 ** 32 }, "version"],
      ["PUT", `/api/v1/designs/${id}/draft`, { document: hauler, version: 1, baseRevision: 2 ** 31 }, "baseRevision"],
      [
        "POST",
        `/api/v1/proofs?workspace=${WS}`,
        { document: { ...hauler, components: [{ id: "X", type: "__proto__" }] } },
        "components[0].type",
      ],
    ];
    for (const [method, path, body, field] of cases) {
      const a = await send(c, method, path, { kind: "json", body });
      checkAnswer(a, [400]);
      expect(a.json.error.fields.map((f: { path: string }) => f.path)).toContain(field);
    }
    // Legal ids that are also names of object properties prove like any other.
    const renamed = JSON.parse(JSON.stringify(hauler).replaceAll('"seat"', '"__proto__"').replaceAll('"plug"', '"constructor"'));
    const proof = await send(c, "POST", `/api/v1/proofs?workspace=${WS}`, { kind: "json", body: { document: renamed } });
    checkAnswer(proof, [200]);
    const original = await send(c, "POST", `/api/v1/proofs?workspace=${WS}`, { kind: "json", body: { document: hauler } });
    expect(proof.json.verdict.ok).toBe(original.json.verdict.ok);
    expect(proof.json.verdict.driveRows).toBe(original.json.verdict.driveRows);
    // Ids with a NUL are no ids: 404, not 500.
    for (const path of ["/api/v1/designs/%00", "/api/v1/designs/%00/draft", "/api/v1/designs/%00/revisions"]) {
      const res = await c.fetch(path);
      expect(res.status).toBe(404);
      expect(((await res.json()) as { error: { code: string } }).error.code).toBe("not_found");
    }
  });
});
