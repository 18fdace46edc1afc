// The revision save gate of spec 1.1 against the running app: 400 for a rule whose `when` matches
// no row (with its path), 422 for a design that never drives or whose require-drive rule fails,
// 201 otherwise; and on every refusal nothing is written (no revision, no audit event, the
// working copy untouched).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";
import { DEMO, signIn, type Client } from "../support/http";
import { HAULER_DRIVES as DRIVES, hauler, type Json } from "../support/hauler";

const WS = "larkspur";

let db: pg.Pool;
let engineer: Client;
const created: string[] = [];

async function send(method: string, path: string, body?: unknown): Promise<{ status: number; body: Json }> {
  const res = await engineer.fetch(path, {
    method,
    ...(body === undefined ? {} : { body: JSON.stringify(body), headers: { "content-type": "application/json" } }),
  });
  return { status: res.status, body: (await res.json()) as Json };
}

async function newDesign(name: string): Promise<string> {
  const r = await send("POST", `/api/v1/designs?workspace=${WS}`, { name, start: "blank" });
  expect(r.status).toBe(201);
  created.push(r.body.design.id);
  return r.body.design.id as string;
}

/** What a save may write: revisions, audit events about the design, and the working copy. */
async function written(designId: string) {
  const q = async (sql: string) => (await db.query(sql, [designId])).rows;
  return {
    revisions: await q("SELECT number, content_hash FROM design_revision WHERE design_id = $1 ORDER BY number"),
    audit: await q("SELECT id FROM audit_event WHERE detail->>'designId' = $1 ORDER BY id"),
    draft: await q("SELECT version, content_hash, base_revision FROM design_draft WHERE design_id = $1"),
  };
}

/** Posts a revision and checks that a refusal wrote nothing. */
async function save(designId: string, document: Json, baseRevision = 0) {
  const before = await written(designId);
  const r = await send("POST", `/api/v1/designs/${designId}/revisions`, { document, baseRevision, message: "gate" });
  if (r.status !== 201) expect(await written(designId)).toEqual(before);
  return r;
}

beforeAll(async () => {
  db = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 });
  engineer = await signIn(DEMO.engineer);
});

afterAll(async () => {
  if (created.length) await db.query("DELETE FROM design WHERE id = ANY($1)", [created]);
  await db.end();
});

describe("the revision save gate (spec 1.1)", () => {
  it.each([
    ["an empty state list", { cond: "plug", in: [] }],
    ['an "any" of nothing', { any: [] }],
    [
      "a contradiction",
      {
        all: [
          { cond: "key", in: ["on"] },
          { cond: "key", in: ["off"] },
        ],
      },
    ],
  ])("answers 400 with rules[i].when for a rule matching no row (%s), and writes nothing", async (_, when) => {
    const id = await newDesign(`Gate: empty rule ${Date.now()}`);
    const d = hauler();
    d.rules[2] = { ...d.rules[2], when };
    const r = await save(id, d);
    expect(r.status).toBe(400);
    expect(r.body.error.code).toBe("invalid_design");
    expect(r.body.error.fields).toEqual([{ path: "rules[2].when", message: expect.stringMatching(/holds in no row/) }]);
  });

  it("answers 400 for an empty require-drive rule as well", async () => {
    const id = await newDesign(`Gate: empty require-drive ${Date.now()}`);
    const d = hauler();
    d.rules.push({ ...DRIVES, when: { all: [{ cond: "seat", in: ["occupied"] }, { not: { cond: "seat", in: ["occupied"] } }] } });
    const r = await save(id, d);
    expect(r.status).toBe(400);
    expect(r.body.error.fields.map((f: Json) => f.path)).toEqual([`rules[${d.rules.length - 1}].when`]);
  });

  it("answers 422 never_drives, saying exactly that, for a design that can never drive, and writes nothing", async () => {
    const id = await newDesign(`Gate: never drives ${Date.now()}`);
    const d = hauler();
    d.wires = d.wires.filter((w: Json) => w.to !== "EN.in" && w.from !== "EN.in");
    const r = await save(id, d);
    expect(r.status).toBe(422);
    expect(r.body.error.code).toBe("never_drives");
    expect(r.body.error.message).toMatch(/^The design never drives: no row of its truth table has the drive on/);
    expect(r.body.verdict).toMatchObject({ ok: false, driveRows: 0 });
    // Every inhibit rule holds: the design is refused only because it never drives.
    expect(r.body.verdict.rules.every((x: Json) => x.holds)).toBe(true);
  });

  it("answers 422 rules_fail when a require-drive rule fails, with its example, and writes nothing", async () => {
    const id = await newDesign(`Gate: require-drive fails ${Date.now()}`);
    const d = hauler();
    // Demands drive with the park brake set as well: the park-brake contact forbids it.
    d.rules.push({ ...DRIVES, when: { all: DRIVES.when.all.filter((p) => p.cond !== "park") } });
    const r = await save(id, d);
    expect(r.status).toBe(422);
    expect(r.body.error.code).toBe("rules_fail");
    expect(r.body.error.message).toMatch(/1 of 9 rules fail \(drives\)/);
    const rule = r.body.verdict.rules.find((x: Json) => x.id === "drives");
    expect(rule).toMatchObject({ holds: false, demandRows: 4, failingRows: 2 });
    expect(rule.example).toMatchObject({ park: "set", pedal: "down" });
  });

  it("answers 201 for a proven design that drives, require-drive rule included, and stores its verdict", async () => {
    const id = await newDesign(`Gate: proven ${Date.now()}`);
    const d = hauler();
    d.rules.push(DRIVES);
    const r = await save(id, d);
    expect(r.status).toBe(201);
    expect(r.body.revision.verdict).toMatchObject({ ok: true });
    expect(r.body.revision.verdict.driveRows).toBeGreaterThan(0);
    expect(r.body.revision.verdict.rules.find((x: Json) => x.id === "drives")).toEqual({
      id: "drives",
      holds: true,
      demandRows: 2,
      failingRows: 0,
    });
    const after = await written(id);
    expect(after.revisions.map((x) => x.number)).toEqual([1]);
  });
});
