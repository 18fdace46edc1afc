// Spec 1.1 on the server beyond the save gate: a new blank design starts with one require-drive rule
// that is valid but plainly unfinished (decision 112); revisions stored before 1.1 that 1.1 would
// refuse stay readable, are marked on every page that shows them, and cannot be released
// (decision 111).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";
import { DEMO, signIn, type Client } from "../support/http";
import { refRow, refVerdict } from "../unit/engine/reference";
import type { Design } from "../../app/engine";

const WS = "larkspur";
type Json = Record<string, any>;

let db: pg.Pool;
let engineer: Client;
const created: string[] = [];

async function send(c: Client, method: string, path: string, body?: unknown): Promise<{ status: number; body: Json }> {
  const res = await c.fetch(path, {
    method,
    ...(body === undefined ? {} : { body: JSON.stringify(body), headers: { "content-type": "application/json" } }),
  });
  const text = await res.text();
  try {
    return { status: res.status, body: JSON.parse(text) as Json };
  } catch {
    return { status: res.status, body: { text } };
  }
}

async function newDesign(name: string): Promise<{ id: string; document: Json }> {
  const r = await send(engineer, "POST", `/api/v1/designs?workspace=${WS}`, { name, start: "blank" });
  expect(r.status).toBe(201);
  created.push(r.body.design.id);
  const draft = await send(engineer, "GET", `/api/v1/designs/${r.body.design.id}/draft`);
  expect(draft.status).toBe(200);
  return { id: r.body.design.id, document: draft.body.draft.document };
}

beforeAll(async () => {
  db = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 });
  engineer = await signIn(DEMO.engineer);
});

afterAll(async () => {
  if (created.length) await db.query("DELETE FROM design WHERE id = ANY($1)", [created]);
  await db.end();
});

describe("a new blank design", () => {
  it("starts with one require-drive rule: valid, but it never drives and the rule fails until the engineer wires it", async () => {
    const { id, document } = await newDesign(`Blank start ${Date.now()}`);
    const rules = document.rules as Json[];
    expect(rules).toHaveLength(1);
    expect(rules[0]).toMatchObject({ type: "require-drive", when: { all: [{ cond: "throttle", in: ["applied"] }] } });
    expect(rules[0].label).toMatch(/complete/);

    // Valid (the proof endpoint answers a verdict, not 400) and not ok.
    const proof = await send(engineer, "POST", `/api/v1/proofs?workspace=${WS}`, { document });
    expect(proof.status).toBe(200);
    expect(proof.body.verdict).toMatchObject({ ok: false, driveRows: 0 });
    expect(proof.body.verdict.rules[0]).toMatchObject({ id: rules[0].id, holds: false });
    // The same, row by row, by the independent reference (spec 1.4: an unwired enable input is dead).
    const ref = refVerdict(document as Design);
    expect(ref.driveRows).toBe(0);
    expect(refRow(document as Design, { throttle: "applied" }).drive).toBe(false);

    // Saving it as a revision is refused because it never drives.
    const save = await send(engineer, "POST", `/api/v1/designs/${id}/revisions`, { document, baseRevision: 0, message: "as created" });
    expect(save.status).toBe(422);
    expect(save.body.error.code).toBe("never_drives");

    // Wired (supply to the enable input) it drives when the throttle is applied, and the rule holds.
    const wired = { ...document, wires: [{ from: "PACK.+", to: "EN.in" }] };
    const ok = await send(engineer, "POST", `/api/v1/proofs?workspace=${WS}`, { document: wired });
    expect(ok.body.verdict).toMatchObject({ ok: true, driveRows: 1 });
    expect(refRow(wired as Design, { throttle: "applied" }).drive).toBe(true);
  });
});
