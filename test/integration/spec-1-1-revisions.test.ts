// Spec 1.1 on the server beyond the save gate: a new blank design starts with one require-drive rule
// that is valid but plainly unfinished (decision 112); revisions stored before 1.1 that 1.1 would
// refuse stay readable, are marked on every page that shows them, and cannot be released
// (decision 111).
import { createHash, randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";
import { smallest } from "../support/smallest-design";
import { DEMO, formBody, signIn, type Client, sendJson as send } from "../support/http";
import { HAULER_DRIVES, hauler, type Json } from "../support/hauler";
import { refHolds, refMatchesSomeRow, refRow, refVerdict } from "../unit/engine/reference";
import { compileDesign, prove, type Design } from "../../app/engine";

const WS = "larkspur";

let db: pg.Pool;
let engineer: Client;
let reviewer: Client;
const created: string[] = [];
const vehicles: string[] = [];

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
  [engineer, reviewer] = await Promise.all([signIn(DEMO.engineer), signIn(DEMO.reviewer)]);
});

afterAll(async () => {
  if (vehicles.length) await db.query("DELETE FROM vehicle WHERE id = ANY($1)", [vehicles]);
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

/** Stores a revision as a session before format 1.1 could have: straight into the table, past the save gate. */
async function storeDirectly(designId: string, number: number, document: Json): Promise<string> {
  const id = randomUUID();
  // The engine proves it without validating (1.1 validation would refuse it); compileDesign reads any shape it can.
  const verdict = prove(document as Design);
  const meta = await db.query<{ workspace_id: string }>("SELECT workspace_id FROM design WHERE id = $1", [designId]);
  const author = await db.query<{ id: string }>('SELECT id FROM "user" WHERE email = $1', [DEMO.engineer]);
  await db.query(
    "INSERT INTO design_revision (id, design_id, workspace_id, number, document, verdict, content_hash, message, author_id) VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9)",
    [
      id,
      designId,
      meta.rows[0]!.workspace_id,
      number,
      document,
      verdict,
      createHash("sha256").update(JSON.stringify(document)).digest("hex"),
      "saved before format 1.1",
      author.rows[0]!.id,
    ],
  );
  return id;
}

const text = async (c: Client, path: string) => {
  const res = await c.fetch(path);
  return { status: res.status, body: await res.text() };
};

describe("revisions stored before format 1.1 that 1.1 would refuse", () => {
  it("stay readable, are marked on every page that shows them, and are refused at release with the reason", async () => {
    // Revision 1: rule R3's situation is an "any" of nothing, so it matches no row (spec 1.6, 1.1).
    const { id: emptyRuleDesign } = await newDesign(`Stored empty rule ${Date.now()}`);
    const empty = hauler();
    empty.rules[2] = { ...empty.rules[2], when: { any: [] } };
    expect(refMatchesSomeRow(empty as Design, empty.rules[2].when)).toBe(false);
    const emptyRev = await storeDirectly(emptyRuleDesign, 1, empty);
    // Revision 1 of another design: nothing wired to the enable input, so no row drives (spec 2: ok needs a drive row).
    const { id: neverDesign } = await newDesign(`Stored never drives ${Date.now()}`);
    const never = hauler();
    never.wires = never.wires.filter((w: Json) => w.to !== "EN.in" && w.from !== "EN.in");
    expect(refVerdict(never as Design).driveRows).toBe(0);
    const neverRev = await storeDirectly(neverDesign, 1, never);

    const ruleId = empty.rules[2].id as string;
    const cases = [
      {
        design: emptyRuleDesign,
        revision: emptyRev,
        why: new RegExp(`rule ${ruleId} matches no row of its truth table \\(rules\\[2\\]\\.when\\)`, "i"),
      },
      { design: neverDesign, revision: neverRev, why: /never drives/ },
    ];
    for (const c of cases) {
      const base = `/w/${WS}/designs/${c.design}`;
      // Readable: the API answers the revision, its rows and its CSV.
      const one = await send(engineer, "GET", `/api/v1/designs/${c.design}/revisions/1`);
      expect(one.status).toBe(200);
      // Marked in the API as well.
      expect(one.body.revision.refusedByFormat11.some((r: string) => c.why.test(r))).toBe(true);
      const rows = await send(engineer, "GET", `/api/v1/designs/${c.design}/revisions/1/rows?from=0&count=5`);
      expect(rows.status).toBe(200);
      expect(rows.body.rows).toHaveLength(5);
      expect((await engineer.fetch(`/api/v1/designs/${c.design}/revisions/1/table.csv`)).status).toBe(200);
      // Marked, with the reason, on the design page (its revision list too), review, truth table and report.
      for (const path of [base, `${base}/revisions/1/review`, `${base}/revisions/1/table`, `${base}/revisions/1/report`]) {
        const page = await text(reviewer, path);
        expect(page.status, path).toBe(200);
        expect(page.body, path).toContain("Refused by format 1.1");
        expect(page.body, path).toMatch(c.why);
      }
      expect((await text(reviewer, base)).body).toContain('data-testid="refused-mark"');
    }

    // A vehicle that already carries the empty-rule revision (released before 1.1) shows the mark; the picker offers it disabled.
    const made = await send(engineer, "POST", `/api/v1/vehicles?workspace=${WS}`, { name: `Format 1.1 test cart ${Date.now()}` });
    expect(made.status).toBe(201);
    const vehicleId = made.body.vehicle.id as string;
    vehicles.push(vehicleId);
    const ws = await db.query<{ workspace_id: string; id: string }>(
      'SELECT d.workspace_id, u.id FROM design d, "user" u WHERE d.id = $1 AND u.email = $2',
      [emptyRuleDesign, DEMO.engineer],
    );
    await db.query(
      "INSERT INTO vehicle_release (id, workspace_id, vehicle_id, revision_id, released_by, note) VALUES ($1, $2, $3, $4, $5, 'before 1.1')",
      [randomUUID(), ws.rows[0]!.workspace_id, vehicleId, emptyRev, ws.rows[0]!.id],
    );
    const vehiclePage = await text(engineer, `/w/${WS}/vehicles/${vehicleId}`);
    expect(vehiclePage.status).toBe(200);
    expect(vehiclePage.body).toMatch(/data-testid="current-release"[\s\S]*Refused by format 1\.1/);
    const option = new RegExp(`<option value="${neverRev}"([^>]*)>([\\s\\S]*?)</option>`).exec(vehiclePage.body);
    expect(option?.[1]).toContain('disabled=""');
    expect(option?.[2]).toContain("refused by format 1.1: cannot be released");

    // Releasing either is refused (409) with a message naming why; no release row is written.
    for (const c of cases) {
      const before = await db.query("SELECT count(*)::int AS n FROM vehicle_release WHERE vehicle_id = $1", [vehicleId]);
      const res = await engineer.fetch(`/w/${WS}/vehicles/${vehicleId}`, formBody({ intent: "release", revisionId: c.revision, note: "" }));
      expect(res.status).toBe(409);
      const body = await res.text();
      expect(body).toContain("cannot be released");
      expect(body).toContain("Refused by format 1.1");
      expect(body).toMatch(c.why);
      // The API refuses it the same way: 409 release_refused, the reason in the message and at revisionId.
      const viaApi = await send(engineer, "POST", `/api/v1/vehicles/${vehicleId}/releases`, {
        revisionId: c.revision,
        note: "via the API",
      });
      expect(viaApi.status).toBe(409);
      expect(viaApi.body.error.code).toBe("release_refused");
      expect(viaApi.body.error.message).toMatch(c.why);
      expect(viaApi.body.error.fields).toEqual([{ path: "revisionId", message: expect.stringContaining("Refused by format 1.1") }]);
      const after = await db.query("SELECT count(*)::int AS n FROM vehicle_release WHERE vehicle_id = $1", [vehicleId]);
      expect(after.rows[0].n).toBe(before.rows[0].n);
    }
    // Technicians may not release at all (403), whatever the revision.
    const technician = await signIn(DEMO.technician);
    expect((await send(technician, "POST", `/api/v1/vehicles/${vehicleId}/releases`, { revisionId: emptyRev })).status).toBe(403);

    // A revision that passes 1.1 replaces it: saved through the gate, unmarked, and its release is held up
    // only by the missing approval, not by format 1.1.
    const fixed = smallest("Replacement");
    const saved = await send(engineer, "POST", `/api/v1/designs/${emptyRuleDesign}/revisions`, {
      document: fixed,
      baseRevision: 1,
      message: "a design that passes format 1.1",
    });
    expect(saved.status).toBe(201);
    expect(saved.body.revision.number).toBe(2);
    expect((await send(engineer, "GET", `/api/v1/designs/${emptyRuleDesign}/revisions/2`)).body.revision.refusedByFormat11).toEqual([]);
    const review2 = await text(reviewer, `/w/${WS}/designs/${emptyRuleDesign}/revisions/2/review`);
    expect(review2.body).not.toContain("Refused by format 1.1");
    const fixedId = (
      await db.query<{ id: string }>("SELECT id FROM design_revision WHERE design_id = $1 AND number = 2", [emptyRuleDesign])
    ).rows[0]!.id;
    const res = await engineer.fetch(`/w/${WS}/vehicles/${vehicleId}`, formBody({ intent: "release", revisionId: fixedId, note: "" }));
    const body = await res.text();
    expect(body).toMatch(/Revision 2 of .{0,120}has not been approved/);
    expect(body).not.toMatch(/Revision 2 of .{0,120}cannot be released/);

    // Approved by a reviewer, the replacement is released through the API, and the vehicle carries it unmarked.
    const approve = await reviewer.fetch(
      `/w/${WS}/designs/${emptyRuleDesign}/revisions/2/review`,
      formBody({ intent: "decide", verdict: "approved", comment: "passes 1.1" }),
    );
    expect(approve.status).toBeLessThan(400);
    const released = await send(engineer, "POST", `/api/v1/vehicles/${vehicleId}/releases`, {
      revisionId: fixedId,
      note: "replaces the pre-1.1 revision",
    });
    expect(released.status).toBe(201);
    expect(released.body.vehicle.release).toMatchObject({ revisionId: fixedId, number: 2 });
    const after = await text(engineer, `/w/${WS}/vehicles/${vehicleId}`);
    // The current release is unmarked; the earlier pre-1.1 release keeps its mark in the history.
    expect(after.body).not.toContain('data-testid="refused-notice"');
    expect(after.body).toContain('data-testid="refused-mark"');
  });
});

describe("the truth table of a revision with a require-drive rule", () => {
  it("has a column per inhibit and require-drive rule, in the CSV header's order, with the same cells", async () => {
    const { id } = await newDesign(`Table with must drive ${Date.now()}`);
    const d = hauler();
    d.rules.push(HAULER_DRIVES);
    const saved = await send(engineer, "POST", `/api/v1/designs/${id}/revisions`, { document: d, baseRevision: 0 });
    expect(saved.status).toBe(201);
    const csv = await (await engineer.fetch(`/api/v1/designs/${id}/revisions/1/table.csv`)).text();
    const lines = csv.trim().split(/\r?\n/);
    const header = lines[0]!.split(",");
    const ruleColumns = header.filter((h) => h.startsWith("rule:")).map((h) => h.slice(5));
    // Spec 1.1 / decision 110: one rule:ID column per inhibit or require-drive rule, in design order.
    expect(ruleColumns).toEqual(d.rules.filter((r: Json) => r.type !== "no-restart").map((r: Json) => r.id));
    const rows = await send(engineer, "GET", `/api/v1/designs/${id}/revisions/1/rows?from=0&count=500`);
    const total = rows.body.total as number;
    expect(lines.length - 1).toBe(total);
    const at = header.indexOf(`rule:${ruleColumns[0]}`);
    const compiled = compileDesign(d as Design);
    let demand = 0;
    for (const [k, row] of (rows.body.rows as Json[]).entries()) {
      const cells = lines[k + 1]!.split(",").slice(at, at + ruleColumns.length);
      expect(row.rules, `row ${row.index}`).toEqual(cells);
      // The must-drive cell against the independent reference: demand where its when holds, failing without drive.
      const states = Object.fromEntries(compiled.conditions.map((c, i) => [c.id, row.states[i]]));
      const ref = refRow(d as Design, states);
      const holds = refHolds(d.rules.at(-1).when, states);
      expect(row.rules.at(-1)).toBe(holds ? (ref.drive ? "demand" : "failing") : "-");
      if (holds) demand++;
    }
    expect(demand).toBeGreaterThan(0);
    // The page shows the must-drive column and offers its filters.
    const page = await text(engineer, `/w/${WS}/designs/${id}/revisions/1/table`);
    expect(page.body).toContain("must drive");
    expect(page.body).toContain("Only rows where it must drive and does not");
    const failing = await send(engineer, "GET", `/api/v1/designs/${id}/revisions/1/rows?only=demand&rule=drives&from=0&count=5`);
    expect(failing.status).toBe(200);
    expect(failing.body.total).toBe(demand);
    const wrongType = await send(engineer, "GET", `/api/v1/designs/${id}/revisions/1/rows?only=unsafe&rule=drives`);
    expect(wrongType.status).toBe(400);
    expect(wrongType.body.error.fields[0].path).toBe("rule");
  });
});
