// Archiving designs (issue 15, decision 167), against the running app: an archived design is left out
// of the design lists (page and API) and the release picker, stays readable (design, revisions, truth
// table, review, report, the vehicles it was released to), refuses new drafts, revisions and releases
// with a 409 naming why, and comes back when brought back. Admins and engineers may archive; the others
// are refused; bad input is a 400 naming the field. Each change is one audit event in words.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";
import { DEMO, formBody, signIn, type Client, sendJson as send } from "../support/http";
import { type Json } from "../support/hauler";
import { createOutsider } from "../support/outsider";
import { smallest as small } from "../support/smallest-design";

const WS = "larkspur";
let db: pg.Pool;
let engineer: Client, admin: Client, technician: Client, reviewer: Client;
const created: string[] = [];
const vehicles: string[] = [];

/** Page HTML without React's text separators (`a<!-- -->b`). */
async function page(c: Client, path: string): Promise<{ status: number; html: string }> {
  const res = await c.fetch(path);
  return { status: res.status, html: (await res.text()).replace(/<!-- -->/g, "") };
}

/** A design with revision 1 (every rule holds). */
async function designWithRevision(name: string): Promise<string> {
  const made = await send(engineer, "POST", `/api/v1/designs?workspace=${WS}`, { name, start: "blank" });
  expect(made.status).toBe(201);
  const id = made.body.design.id as string;
  created.push(id);
  const saved = await send(engineer, "POST", `/api/v1/designs/${id}/revisions`, {
    document: small(name),
    baseRevision: 0,
    message: "first",
  });
  expect(saved.status).toBe(201);
  return id;
}

const listIds = async (c: Client, query = "") => {
  const r = await send(c, "GET", `/api/v1/designs?workspace=${WS}${query}`);
  expect(r.status).toBe(200);
  return r.body.designs as Json[];
};

const revisionCount = async (id: string) =>
  (await db.query<{ n: number }>("SELECT count(*)::int AS n FROM design_revision WHERE design_id = $1", [id])).rows[0]!.n;

let archivedId: string, archivedName: string, revisionId: string, vehicleId: string, otherVehicleId: string;

beforeAll(async () => {
  db = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 });
  [engineer, admin, technician, reviewer] = await Promise.all([
    signIn(DEMO.engineer),
    signIn(DEMO.admin),
    signIn(DEMO.technician),
    signIn(DEMO.reviewer),
  ]);
  // A design whose approved revision 1 is on a vehicle, then archived from its page.
  archivedName = `Archive check ${Date.now()}`;
  archivedId = await designWithRevision(archivedName);
  revisionId = (await db.query<{ id: string }>("SELECT id FROM design_revision WHERE design_id = $1 AND number = 1", [archivedId])).rows[0]!
    .id;
  const reviewerId = (await db.query<{ id: string }>('SELECT id FROM "user" WHERE email = $1', [DEMO.reviewer])).rows[0]!.id;
  const asked = await engineer.fetch(
    `/w/${WS}/designs/${archivedId}/revisions/1/review`,
    formBody({ intent: "request", reviewers: reviewerId }),
  );
  expect(asked.status).toBe(200);
  const approve = await reviewer.fetch(
    `/w/${WS}/designs/${archivedId}/revisions/1/review`,
    formBody({ intent: "decide", verdict: "approved", comment: "fine" }),
  );
  expect(approve.status).toBe(200);
  for (const n of [1, 2]) {
    const v = await send(engineer, "POST", `/api/v1/vehicles?workspace=${WS}`, { name: `Archive test cart ${n} ${Date.now()}` });
    expect(v.status).toBe(201);
    vehicles.push(v.body.vehicle.id);
  }
  [vehicleId, otherVehicleId] = vehicles as [string, string];
  const released = await send(engineer, "POST", `/api/v1/vehicles/${vehicleId}/releases`, { revisionId, note: "before archiving" });
  expect(released.status).toBe(201);

  const res = await engineer.fetch(`/w/${WS}/designs/${archivedId}`, formBody({ intent: "archive" }));
  expect(res.status).toBe(200);
});

afterAll(async () => {
  if (vehicles.length) await db.query("DELETE FROM vehicle_release WHERE vehicle_id = ANY($1)", [vehicles]);
  if (vehicles.length) await db.query("DELETE FROM vehicle WHERE id = ANY($1)", [vehicles]);
  if (created.length) await db.query("DELETE FROM design WHERE id = ANY($1)", [created]);
  await db.end();
});

describe("an archived design", () => {
  it("records who archived it and when, and its page says so", async () => {
    const row = (
      await db.query<{ archived_at: Date | null; email: string | null }>(
        'SELECT d.archived_at, u.email FROM design d LEFT JOIN "user" u ON u.id = d.archived_by WHERE d.id = $1',
        [archivedId],
      )
    ).rows[0]!;
    expect(row.email).toBe(DEMO.engineer);
    expect(row.archived_at).toBeInstanceOf(Date);
    const engineerName = (await db.query<{ name: string }>('SELECT name FROM "user" WHERE email = $1', [DEMO.engineer])).rows[0]!.name;
    const { status, html } = await page(reviewer, `/w/${WS}/designs/${archivedId}`);
    expect(status).toBe(200);
    expect(html).toContain('data-testid="archived-notice"');
    // The same minute the database holds, as the page writes it (UTC).
    const when = `${row.archived_at!.toISOString().slice(0, 10)} ${row.archived_at!.toISOString().slice(11, 16)} UTC`;
    expect(html).toMatch(new RegExp(`Archived by ${engineerName}, <time[^>]*>${when}</time>`));
    // The API says the same.
    const api = await send(reviewer, "GET", `/api/v1/designs/${archivedId}`);
    expect(api.status).toBe(200);
    expect(api.body.design.archived).toEqual({ at: row.archived_at!.toISOString(), by: { id: expect.any(String), name: engineerName } });
  });

  it("is left out of the design lists and the release picker unless archived designs are asked for", async () => {
    expect((await listIds(engineer)).map((d) => d.id)).not.toContain(archivedId);
    const all = await listIds(engineer, "&archived=include");
    expect(all.find((d) => d.id === archivedId)?.archived?.by.name).toBeTruthy();
    // archived=include lists exactly the default list plus the archived ones.
    const only = await listIds(engineer, "&archived=only");
    expect(only.every((d) => d.archived !== null)).toBe(true);
    expect(only.map((d) => d.id)).toContain(archivedId);
    expect(new Set(all.map((d) => d.id))).toEqual(new Set([...(await listIds(engineer)).map((d) => d.id), ...only.map((d) => d.id)]));

    const listPage = await page(engineer, `/w/${WS}/designs`);
    expect(listPage.html).not.toContain(`/designs/${archivedId}"`);
    expect(listPage.html).toContain("Show archived");
    const shown = await page(engineer, `/w/${WS}/designs?archived=include`);
    expect(shown.html).toMatch(new RegExp(`data-archived="true"[\\s\\S]{0,600}/designs/${archivedId}"`));

    // The vehicle page's release choices no longer offer its revision.
    const vehiclePage = await page(engineer, `/w/${WS}/vehicles/${otherVehicleId}`);
    expect(vehiclePage.status).toBe(200);
    expect(vehiclePage.html).not.toContain(`<option value="${revisionId}"`);
  });

  it("keeps its revisions, truth table, review, report and releases readable", async () => {
    const base = `/w/${WS}/designs/${archivedId}`;
    for (const path of [base, `${base}/revisions/1/review`, `${base}/revisions/1/table`, `${base}/revisions/1/report`, `${base}/edit`]) {
      expect((await page(reviewer, path)).status, path).toBe(200);
    }
    const pdf = await engineer.fetch(`${base}/revisions/1/report.pdf`);
    expect(pdf.status).toBe(200);
    for (const path of [
      `/api/v1/designs/${archivedId}/revisions`,
      `/api/v1/designs/${archivedId}/revisions/1`,
      `/api/v1/designs/${archivedId}/revisions/1/rows?from=0&count=5`,
      `/api/v1/designs/${archivedId}/draft`,
    ]) {
      expect((await send(reviewer, "GET", path)).status, path).toBe(200);
    }
    // The design page lists the vehicle it was released to, still current.
    const designPage = await page(reviewer, base);
    expect(designPage.html).toMatch(
      new RegExp(`/vehicles/${vehicleId}"[^>]*>Archive test cart 1[^<]*</a>: revision 1 · <span[^>]*>current`),
    );
    // The vehicle keeps it: page and API.
    const vehiclePage = await page(technician, `/w/${WS}/vehicles/${vehicleId}`);
    expect(vehiclePage.html).toMatch(new RegExp(`data-testid="current-release"[\\s\\S]{0,400}${archivedName}`));
    const vehicle = await send(technician, "GET", `/api/v1/vehicles/${vehicleId}`);
    expect(vehicle.body.vehicle.release).toMatchObject({ revisionId, designId: archivedId, number: 1 });
  });

  it("opens in the editor read-only, even for engineers", async () => {
    const { html } = await page(engineer, `/w/${WS}/designs/${archivedId}/edit`);
    expect(html).toContain("read-only (the design is archived)");
    const designPage = await page(engineer, `/w/${WS}/designs/${archivedId}`);
    expect(designPage.html).not.toContain("Open the editor");
    expect(designPage.html).not.toContain("Continue the draft");
  });

  it("refuses a new revision and a draft save with 409 design_archived, and writes nothing", async () => {
    const before = await revisionCount(archivedId);
    const doc = small("changed");
    const rev = await send(engineer, "POST", `/api/v1/designs/${archivedId}/revisions`, { document: doc, baseRevision: 1 });
    expect(rev.status).toBe(409);
    expect(rev.body.error.code).toBe("design_archived");
    expect(rev.body.error.message).toMatch(/archived by .+; it takes no new revisions/);
    expect(rev.body.archived.by.name).toBeTruthy();
    expect(await revisionCount(archivedId)).toBe(before);

    const draftBefore = (await send(engineer, "GET", `/api/v1/designs/${archivedId}/draft`)).body.draft;
    const draft = await send(engineer, "PUT", `/api/v1/designs/${archivedId}/draft`, { document: doc, version: draftBefore.version });
    expect(draft.status).toBe(409);
    expect(draft.body.error.code).toBe("design_archived");
    expect(draft.body.error.message).toContain("its draft no longer changes");
    expect((await send(engineer, "GET", `/api/v1/designs/${archivedId}/draft`)).body.draft.version).toBe(draftBefore.version);
    // The role is still checked first: a reviewer gets 403, not the archive's 409.
    expect((await send(reviewer, "POST", `/api/v1/designs/${archivedId}/revisions`, { document: doc, baseRevision: 1 })).status).toBe(403);
  });

  it("refuses a new release of its revision (page and API) with the reason at revisionId", async () => {
    const count = async () =>
      (await db.query<{ n: number }>("SELECT count(*)::int AS n FROM vehicle_release WHERE vehicle_id = $1", [otherVehicleId])).rows[0]!.n;
    const before = await count();
    const viaApi = await send(engineer, "POST", `/api/v1/vehicles/${otherVehicleId}/releases`, { revisionId, note: "" });
    expect(viaApi.status).toBe(409);
    expect(viaApi.body.error.code).toBe("release_refused");
    expect(viaApi.body.error.fields).toEqual([{ path: "revisionId", message: expect.stringContaining("the design is archived") }]);
    const viaPage = await engineer.fetch(`/w/${WS}/vehicles/${otherVehicleId}`, formBody({ intent: "release", revisionId, note: "" }));
    expect(viaPage.status).toBe(409);
    expect(await viaPage.text()).toContain("the design is archived");
    expect(await count()).toBe(before);
  });

  it("shows in the activity in words", async () => {
    const { html } = await page(admin, `/w/${WS}/activity`);
    expect(html).toContain(`archived the design “${archivedName}”; its revisions stay readable.`);
    const events = await db.query<{ n: number }>(
      "SELECT count(*)::int AS n FROM audit_event WHERE action = 'design.archived' AND detail->>'designId' = $1",
      [archivedId],
    );
    expect(events.rows[0]!.n).toBe(1);
  });
});

describe("who may archive, and bad input", () => {
  it("refuses technicians and reviewers (page and API) and leaves the design as it was", async () => {
    const id = await designWithRevision(`Archive roles ${Date.now()}`);
    for (const c of [technician, reviewer]) {
      expect((await c.fetch(`/w/${WS}/designs/${id}`, formBody({ intent: "archive" }))).status).toBe(403);
      expect((await send(c, "PATCH", `/api/v1/designs/${id}`, { archived: true })).status).toBe(403);
    }
    expect((await send(engineer, "GET", `/api/v1/designs/${id}`)).body.design.archived).toBeNull();
    // A member of another workspace does not learn it exists (checked in the role matrix too); an admin may archive.
    const byAdmin = await send(admin, "PATCH", `/api/v1/designs/${id}`, { archived: true });
    expect(byAdmin.status).toBe(200);
    expect(byAdmin.body).toMatchObject({ changed: true, design: { id, archived: { by: { name: expect.any(String) } } } });
  });

  it("answers 400 naming the field for a bad body or intent", async () => {
    const id = await designWithRevision(`Archive input ${Date.now()}`);
    const cases: Array<[unknown, string]> = [
      [{}, "archived"],
      [{ archived: "yes" }, "archived"],
      [{ archived: true, reason: "old" }, "reason"],
    ];
    for (const [body, field] of cases) {
      const r = await send(engineer, "PATCH", `/api/v1/designs/${id}`, body);
      expect(r.status, JSON.stringify(body)).toBe(400);
      expect(JSON.stringify(r.body.error.fields), JSON.stringify(body)).toContain(field);
    }
    const notJson = await engineer.fetch(`/api/v1/designs/${id}`, { method: "PATCH", body: "archived" });
    expect(notJson.status).toBe(415);
    const badIntent = await engineer.fetch(`/w/${WS}/designs/${id}`, formBody({ intent: "delete" }));
    expect(badIntent.status).toBe(400);
    // Shown on the page, not only carried in the hydration data.
    expect((await badIntent.text()).replace(/<script\b[\s\S]*?<\/script>/g, "")).toContain("intent is archive or restore");
    const badFilter = await send(engineer, "GET", `/api/v1/designs?workspace=${WS}&archived=yes`);
    expect(badFilter.status).toBe(400);
    expect(badFilter.body.error.fields[0].path).toBe("archived");
    // Nothing changed.
    expect((await send(engineer, "GET", `/api/v1/designs/${id}`)).body.design.archived).toBeNull();
  });
});

describe("bringing a design back", () => {
  it("lists it again and takes revisions again; asking twice changes nothing", async () => {
    const name = `Archive and back ${Date.now()}`;
    const id = await designWithRevision(name);
    // A reviewer asks for changes: the author's home page lists it until it is archived.
    const reviewerId = (await db.query<{ id: string }>('SELECT id FROM "user" WHERE email = $1', [DEMO.reviewer])).rows[0]!.id;
    const request = await engineer.fetch(
      `/w/${WS}/designs/${id}/revisions/1/review`,
      formBody({ intent: "request", reviewers: reviewerId }),
    );
    expect(request.status).toBe(200);
    const asked = await reviewer.fetch(
      `/w/${WS}/designs/${id}/revisions/1/review`,
      formBody({ intent: "decide", verdict: "changes-requested", comment: "Label the seat switch." }),
    );
    expect(asked.status).toBe(200);
    const review = `designs/${id}/revisions/1/review`;
    expect((await page(engineer, `/w/${WS}`)).html).toContain(review);

    expect((await send(engineer, "PATCH", `/api/v1/designs/${id}`, { archived: true })).body.changed).toBe(true);
    const again = await send(engineer, "PATCH", `/api/v1/designs/${id}`, { archived: true });
    expect(again.status).toBe(200);
    expect(again.body.changed).toBe(false);
    expect((await page(engineer, `/w/${WS}`)).html).not.toContain(review);
    expect((await listIds(engineer)).map((d) => d.id)).not.toContain(id);

    // Brought back from its page by an admin: listed again, the home page asks again, and a revision saves.
    const back = await admin.fetch(`/w/${WS}/designs/${id}`, formBody({ intent: "restore" }));
    expect(back.status).toBe(200);
    expect((await send(engineer, "GET", `/api/v1/designs/${id}`)).body.design.archived).toBeNull();
    expect((await listIds(engineer)).map((d) => d.id)).toContain(id);
    expect((await page(engineer, `/w/${WS}`)).html).toContain(review);
    const doc = small("changed");
    const saved = await send(engineer, "POST", `/api/v1/designs/${id}/revisions`, { document: doc, baseRevision: 1 });
    expect(saved.status).toBe(201);
    expect(saved.body.revision.number).toBe(2);

    // One event each way (the second archive wrote none); the activity says it in words.
    const events = await db.query<{ action: string }>(
      "SELECT action FROM audit_event WHERE detail->>'designId' = $1 AND action LIKE 'design.%archived' ORDER BY at",
      [id],
    );
    expect(events.rows.map((r) => r.action)).toEqual(["design.archived", "design.unarchived"]);
    expect((await page(admin, `/w/${WS}/activity`)).html).toContain(`brought back the design “${name}” from the archive.`);
  });
});

describe("a workspace whose designs are all archived", () => {
  it("says so on the designs list, with the way to show them, instead of 'No designs yet'", async () => {
    const other = await createOutsider();
    const { rows } = await db.query<{ ws: string; user: string }>(
      'SELECT w.id AS ws, u.id AS "user" FROM workspace w, "user" u WHERE w.slug = $1 AND u.email = $2',
      [other.slug, other.email],
    );
    const { ws, user } = rows[0]!;
    // Arranged in the database: the outsider is the workspace's admin, who may archive but not draw designs.
    const id = `archived-only-${Date.now()}`;
    await db.query(
      "INSERT INTO design (id, workspace_id, name, created_by, archived_at, archived_by) VALUES ($1, $2, 'Old mower loom', $3, now(), $3)",
      [id, ws, user],
    );
    const list = await page(other.client, `/w/${other.slug}/designs`);
    expect(list.status).toBe(200);
    expect(list.html).toContain("The one design is archived");
    expect(list.html).not.toContain("No designs yet");
    expect(list.html).toContain("?archived=include");
    const shown = await page(other.client, `/w/${other.slug}/designs?archived=include`);
    expect(shown.html).toContain("Old mower loom");
  });
});

describe("archiving and releasing at once", () => {
  it("never leaves a release made after the design was archived", { timeout: 120_000 }, async () => {
    const reviewerId = (await db.query<{ id: string }>('SELECT id FROM "user" WHERE email = $1', [DEMO.reviewer])).rows[0]!.id;
    for (let round = 0; round < 4; round++) {
      const id = await designWithRevision(`Race check ${round} ${Date.now()}`);
      created.push(id);
      const review = `/w/${WS}/designs/${id}/revisions/1/review`;
      expect((await engineer.fetch(review, formBody({ intent: "request", reviewers: reviewerId }))).status).toBe(200);
      expect((await reviewer.fetch(review, formBody({ intent: "decide", verdict: "approved", comment: "fine" }))).status).toBe(200);
      const rev = (await db.query<{ id: string }>("SELECT id FROM design_revision WHERE design_id = $1", [id])).rows[0]!.id;
      const [archived, released] = await Promise.all([
        send(engineer, "PATCH", `/api/v1/designs/${id}`, { archived: true }),
        send(engineer, "POST", `/api/v1/vehicles/${otherVehicleId}/releases`, { revisionId: rev, note: `race ${round}` }),
      ]);
      expect(archived.status).toBe(200);
      expect([201, 409]).toContain(released.status);
      // Either the release came first (and stays), or it was refused: none is dated after the archiving.
      const late = await db.query(
        `SELECT count(*)::int AS n FROM vehicle_release r JOIN design d ON d.id = $1
         WHERE r.revision_id = $2 AND r.at >= d.archived_at`,
        [id, rev],
      );
      expect(late.rows[0].n).toBe(0);
      const made = (await db.query("SELECT count(*)::int AS n FROM vehicle_release WHERE revision_id = $1", [rev])).rows[0].n;
      expect(made).toBe(released.status === 201 ? 1 : 0);
    }
  });
});
