// Controller settings records through the pages, against the running app and its database: versions with
// who and when, bad input per field with nothing saved, a stale version refused, the mark on every page
// that shows it, and a release over a contradicting record only with a reason kept in the audit.
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { recordToForm, validateRecord, type ControllerRecord } from "../../app/controller-record";
import { PROOF_DOES_NOT_HOLD } from "../../app/vehicles/controller-status";
import { DEMO, formBody, signIn, type Client } from "../support/http";
import { exampleRecord, withValue, type Json } from "../unit/controller-record/fixtures";

let db: pg.Client;
let engineer: Client;
let technician: Client;
let reviewer: Client;
let admin: Client;
let workspaceId: string;
let approvedRevisionId: string;

const json = (method: string, body: unknown): RequestInit => ({
  method,
  body: JSON.stringify(body),
  headers: { "content-type": "application/json" },
});
const pagePath = (vehicleId: string) => `/w/larkspur/vehicles/${vehicleId}/controller`;

/** The Haybarn revision's lockouts, all four, on a pack that fits: a record that agrees with it. */
function agreeing(): Json {
  let r = withValue(exampleRecord(), "settings.lockouts", ["power-on", "enable-restore", "direction-engage", "brake-release"]);
  r = withValue(r, "settings.batteryCurrentPercent", 25); // 100 A: within the pack's 100 A
  return r;
}
const valid = (doc: Json): ControllerRecord => {
  const v = validateRecord(doc);
  if (!v.ok) throw new Error(JSON.stringify(v.problems));
  return v.record;
};
const form = (doc: Json, baseVersion: number, change: Record<string, string> = {}) =>
  formBody({ ...recordToForm(valid(doc)), baseVersion: String(baseVersion), ...change });

async function newVehicle(name: string): Promise<string> {
  const res = await engineer.fetch("/api/v1/vehicles?workspace=larkspur", json("POST", { name: `${name} ${Date.now()}` }));
  expect(res.status).toBe(201);
  return ((await res.json()) as { vehicle: { id: string } }).vehicle.id;
}
const versions = async (vehicleId: string) =>
  (await db.query("SELECT version, recorded_by, document FROM controller_record WHERE vehicle_id = $1 ORDER BY version", [vehicleId])).rows;

beforeAll(async () => {
  db = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await db.connect();
  workspaceId = (await db.query("SELECT id FROM workspace WHERE slug = 'larkspur'")).rows[0].id;
  // The demo seed approves revision 1 of the Haybarn design (lockouts power-on, enable-restore, direction-engage, brake-release).
  approvedRevisionId = (
    await db.query(
      `SELECT r.id FROM design_revision r JOIN design d ON d.id = r.design_id
       WHERE r.workspace_id = $1 AND d.name = 'Haybarn hauler #3, drive inhibit' AND r.number = 1`,
      [workspaceId],
    )
  ).rows[0].id;
  [engineer, technician, reviewer, admin] = await Promise.all([
    signIn(DEMO.engineer),
    signIn(DEMO.technician),
    signIn(DEMO.reviewer),
    signIn(DEMO.admin),
  ]);
});

afterAll(async () => {
  await db.end();
});

describe("recording versions on the vehicle's page", () => {
  it("keeps every change as a new version with who and when, and the audit", async () => {
    const id = await newVehicle("Record cart");
    const first = await technician.fetch(pagePath(id), form(agreeing(), 0));
    expect(first.status).toBe(302);
    expect(first.headers.get("location")).toBe(`${pagePath(id)}?saved=1`);
    const second = await engineer.fetch(pagePath(id), form(agreeing(), 1, { "settings.throttle.restV": "0.8" }));
    expect(second.status).toBe(302);
    const rows = await versions(id);
    expect(rows.map((r) => r.version)).toEqual([1, 2]);
    const who = await db.query('SELECT id, email FROM "user" WHERE id = ANY($1)', [rows.map((r) => r.recorded_by)]);
    const emailOf = new Map(who.rows.map((u) => [u.id, u.email]));
    expect(rows.map((r) => emailOf.get(r.recorded_by))).toEqual([DEMO.technician, DEMO.engineer]);
    expect(rows[0].document.settings.throttle.restV).toBe(0.85);
    expect(rows[1].document.settings.throttle.restV).toBe(0.8);
    const audit = await db.query(
      "SELECT detail FROM audit_event WHERE action = 'vehicle.controller-recorded' AND detail->>'vehicleId' = $1 ORDER BY at",
      [id],
    );
    expect(audit.rows.map((r) => r.detail.version)).toEqual([1, 2]);
    // The page compares the two versions in words.
    const page = await reviewer.fetch(`${pagePath(id)}?from=1&to=2`);
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).toContain("From version 1 to version 2");
    expect(html).toMatch(/Reading at rest.*0\.85.*0\.8/s);
    // A version is history: the database refuses to rewrite it.
    await expect(db.query("UPDATE controller_record SET version = 9 WHERE vehicle_id = $1", [id])).rejects.toThrow(/versioned/);
  });

  it("refuses a stale version with 409 and saves nothing", async () => {
    const id = await newVehicle("Stale cart");
    expect((await technician.fetch(pagePath(id), form(agreeing(), 0))).status).toBe(302);
    const stale = await engineer.fetch(pagePath(id), form(agreeing(), 0, { "pack.capacityAh": "120" }));
    expect(stale.status).toBe(409);
    expect(await stale.text()).toContain("Version 1 was saved while you were editing version 0, so nothing was saved");
    expect((await versions(id)).length).toBe(1);
  });

  it.each([
    ["a rest voltage above full", { "settings.throttle.restV": "4.3" }, "the reading at rest must be below the reading fully applied"],
    [
      "thresholds out of order",
      { "settings.throttle.faultBelowV": "1.05" },
      "the low fault threshold must be below the released threshold",
    ],
    ["a negative capacity", { "pack.capacityAh": "-100" }, "must be above 0"],
    ["an unknown chemistry", { "pack.chemistry": "nickel-zinc" }, "must be one of lifepo4, nmc, lto, lead-acid"],
    ["a percentage over 100", { "settings.motorCurrentPercent": "101" }, "must be from 0 to 100 %"],
    ["a number that is not one", { "pack.seriesCells": "sixteen" }, "must be a whole number"],
    ["an unknown sensor", { "settings.throttle.sensor": "optical" }, "must be one of hall, resistive-3wire, voltage"],
    ["a NUL character in the description", { "controller.description": "a\u0000b" }, "must not contain a NUL character"],
    ["a missing rated current", { "controller.ratedCurrentA": "" }, "is required"],
  ])("refuses %s at its field with 400 and saves nothing", async (_what, change, message) => {
    const id = await newVehicle("Bad input cart");
    const res = await technician.fetch(pagePath(id), form(agreeing(), 0, change));
    expect(res.status).toBe(400);
    const html = await res.text();
    // The error sits under its field (the page writes messages as sentences).
    const [field] = Object.keys(change);
    const fieldId = `cr-${field.replace(/[^A-Za-z0-9-]/g, "-")}-error`;
    expect(html).toMatch(
      new RegExp(`id="${fieldId}"[^>]*>${message.charAt(0).toUpperCase()}${message.slice(1).replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}`),
    );
    expect((await versions(id)).length).toBe(0);
  });

  it("only technicians and engineers record; every member reads", async () => {
    const id = await newVehicle("Roles cart");
    for (const c of [reviewer, admin]) expect((await c.fetch(pagePath(id), form(agreeing(), 0))).status).toBe(403);
    expect((await versions(id)).length).toBe(0);
    for (const c of [reviewer, admin, technician, engineer]) expect((await c.fetch(pagePath(id))).status).toBe(200);
  });
});

describe("the released proof against the record", () => {
  let vehicleId: string;
  let vehicleName: string;

  beforeAll(async () => {
    vehicleId = await newVehicle("Proof cart");
    vehicleName = (await db.query("SELECT name FROM vehicle WHERE id = $1", [vehicleId])).rows[0].name;
    // No record yet: the release asks for no reason.
    const release = await engineer.fetch(
      `/w/larkspur/vehicles/${vehicleId}`,
      formBody({ intent: "release", revisionId: approvedRevisionId, note: "first" }),
    );
    expect(release.status).toBe(200);
  });

  it("marks the vehicle on the list, its page, its why page and home when the record drops a lockout the proof assumes", async () => {
    // The technician records settings without the brake-release lockout.
    const dropped = withValue(agreeing(), "settings.lockouts", ["power-on", "enable-restore", "direction-engage"]);
    expect((await technician.fetch(pagePath(vehicleId), form(dropped, 0))).status).toBe(302);
    const difference = "The proof assumes the brake-release lockout";
    for (const path of [
      "/w/larkspur/vehicles",
      `/w/larkspur/vehicles/${vehicleId}`,
      `/w/larkspur/vehicles/${vehicleId}/why`,
      "/w/larkspur",
      pagePath(vehicleId),
    ]) {
      const html = await (await reviewer.fetch(path)).text();
      expect(html, path).toContain(PROOF_DOES_NOT_HOLD.replace("'", "&#x27;"));
      expect(html, path).toContain(difference);
    }
    // The record is what was entered, not what the controller holds: the page says so.
    expect(await (await technician.fetch(pagePath(vehicleId))).text()).toContain(
      "This record is what a technician entered, not what the controller holds",
    );
  });

  it("a release over the contradicting record needs a reason, and the audit keeps it with the findings", async () => {
    const refused = await engineer.fetch(
      `/w/larkspur/vehicles/${vehicleId}`,
      formBody({ intent: "release", revisionId: approvedRevisionId, note: "again" }),
    );
    expect(refused.status).toBe(409);
    expect(await refused.text()).toContain("To release revision 1 anyway, give the reason");
    const before = (await db.query("SELECT count(*)::int AS n FROM vehicle_release WHERE vehicle_id = $1", [vehicleId])).rows[0].n;
    const done = await engineer.fetch(
      `/w/larkspur/vehicles/${vehicleId}`,
      formBody({
        intent: "release",
        revisionId: approvedRevisionId,
        note: "again",
        override: "Controller is reprogrammed before the cart leaves the shop",
      }),
    );
    expect(done.status).toBe(200);
    expect((await db.query("SELECT count(*)::int AS n FROM vehicle_release WHERE vehicle_id = $1", [vehicleId])).rows[0].n).toBe(
      before + 1,
    );
    const audit = await db.query(
      "SELECT detail FROM audit_event WHERE action = 'vehicle.revision-released' AND detail->>'vehicleId' = $1 ORDER BY at DESC LIMIT 1",
      [vehicleId],
    );
    expect(audit.rows[0].detail.controllerOverride).toMatchObject({
      reason: "Controller is reprogrammed before the cart leaves the shop",
      recordVersion: 1,
      findings: [{ code: "lockout-missing", message: expect.stringContaining("brake-release") }],
    });
  });

  it("the mark goes once the record agrees again", async () => {
    expect((await technician.fetch(pagePath(vehicleId), form(agreeing(), 1))).status).toBe(302);
    const list = await (await reviewer.fetch("/w/larkspur/vehicles")).text();
    // Other vehicles (the demo's hauler #5) may carry the mark; this one no longer does.
    const card = list.slice(list.indexOf(vehicleName), list.indexOf("</a>", list.indexOf(vehicleName)));
    expect(card).not.toContain("The proof does not hold");
    expect(await (await reviewer.fetch(pagePath(vehicleId))).text()).toContain("agree with this record");
  });
});

describe("the demo", () => {
  it("has one vehicle whose record agrees with its released revision and one whose record does not", async () => {
    const list = await (await reviewer.fetch("/w/larkspur/vehicles")).text();
    const card = (name: string) => list.slice(list.indexOf(name), list.indexOf("</a>", list.indexOf(name)));
    expect(card("Haybarn campus hauler #3")).not.toContain("The proof does not hold");
    // #3 has a record of its own that agrees (not merely no record), against its released revision.
    const three = (await db.query("SELECT id FROM vehicle WHERE workspace_id = $1 AND name = 'Haybarn campus hauler #3'", [workspaceId]))
      .rows[0].id;
    const state = (await (await reviewer.fetch(`/api/v1/vehicles/${three}/controller-record`)).json()) as any;
    expect(state.record).not.toBeNull();
    expect(state.proof).toMatchObject({ state: "holds", holds: true, differences: [] });
    expect(card("Haybarn campus hauler #5")).toContain("The proof does not hold");
    expect(card("Haybarn campus hauler #5")).toContain("brake-release");
  });
});

describe("the API", () => {
  const recordPath = (vehicleId: string) => `/api/v1/vehicles/${vehicleId}/controller-record`;
  const put = (c: Client, vehicleId: string, version: number, record: unknown) =>
    c.fetch(recordPath(vehicleId), json("PUT", { version, record }));

  it("round trip: nothing, a first version, its check and the proof against the released revision, an earlier version", async () => {
    const id = await newVehicle("API cart");
    const empty = await reviewer.fetch(recordPath(id));
    expect(empty.status).toBe(200);
    expect(await empty.json()).toMatchObject({ record: null, versions: [], proof: { state: "no-record", holds: null, differences: [] } });

    const withKept = withValue(agreeing(), "settings.throttle.note", "grip replaced in March");
    const first = await technician.fetch(recordPath(id), json("PUT", { version: 0, record: withKept }));
    expect(first.status).toBe(200);
    const body = (await first.json()) as any;
    expect(body.record).toMatchObject({ version: 1, recordedBy: { name: expect.any(String) } });
    expect(body.record.document).toEqual(withKept); // unknown keys kept
    expect(body.record.check.format).toBe("chainproof/controller-check@1");
    expect(body.proof.state).toBe("no-release");
    expect(body.caution).toContain("not what the controller holds");

    // Released revision assumes brake-release; version 2 drops it.
    expect(
      (await engineer.fetch(`/w/larkspur/vehicles/${id}`, formBody({ intent: "release", revisionId: approvedRevisionId }))).status,
    ).toBe(200);
    const dropped = withValue(agreeing(), "settings.lockouts", ["power-on", "enable-restore", "direction-engage"]);
    const second = await put(engineer, id, 1, dropped);
    expect(second.status).toBe(200);
    const after = (await second.json()) as any;
    expect(after.versions.map((v: { version: number }) => v.version)).toEqual([2, 1]);
    expect(after.proof).toMatchObject({ state: "does-not-hold", holds: false });
    expect(after.proof.differences).toEqual([expect.stringContaining("brake-release")]);
    expect(after.record.check.findings).toEqual([
      expect.objectContaining({ code: "lockout-missing", severity: "error", path: "settings.lockouts" }),
    ]);

    const old = (await (await reviewer.fetch(`${recordPath(id)}?version=1`)).json()) as any;
    expect(old.record.version).toBe(1);
    expect(old.record.check.findings.filter((f: { severity: string }) => f.severity === "error")).toEqual([]);
    expect(old.proof.state).toBe("does-not-hold"); // the proof is always about the newest version
    expect((await reviewer.fetch(`${recordPath(id)}?version=9`)).status).toBe(404);
    expect((await reviewer.fetch(`${recordPath(id)}?version=first`)).status).toBe(400);
  });

  it("a release through the API over a contradicting record is refused without a reason, and kept in the audit with one", async () => {
    const id = await newVehicle("API override cart");
    const dropped = withValue(agreeing(), "settings.lockouts", ["power-on", "enable-restore", "direction-engage"]);
    expect((await put(technician, id, 0, dropped)).status).toBe(200);
    const releases = async () => (await db.query("SELECT count(*)::int AS n FROM vehicle_release WHERE vehicle_id = $1", [id])).rows[0].n;
    const release = (body: Record<string, unknown>) =>
      engineer.fetch(`/api/v1/vehicles/${id}/releases`, json("POST", { revisionId: approvedRevisionId, ...body }));

    const refused = await release({ note: "first" });
    expect(refused.status).toBe(409);
    const why = (await refused.json()) as any;
    expect(why.error.code).toBe("release_refused");
    expect(why.error.message).toContain("brake-release");
    expect(await releases()).toBe(0);

    const reason = "Controller is reprogrammed at the depot before first use";
    const done = await release({ note: "first", override: reason });
    expect(done.status).toBe(201);
    expect(await releases()).toBe(1);
    const audit = await db.query(
      "SELECT detail FROM audit_event WHERE action = 'vehicle.revision-released' AND detail->>'vehicleId' = $1 ORDER BY at DESC LIMIT 1",
      [id],
    );
    expect(audit.rows[0].detail.controllerOverride).toMatchObject({
      reason,
      recordVersion: 1,
      findings: [{ code: "lockout-missing", message: expect.stringContaining("brake-release") }],
    });
  });

  it("a stale version answers 409 with the current version and saves nothing; of two saves on one base exactly one wins", async () => {
    const id = await newVehicle("API stale cart");
    expect((await put(technician, id, 0, agreeing())).status).toBe(200);
    const stale = await put(engineer, id, 0, agreeing());
    expect(stale.status).toBe(409);
    expect(await stale.json()).toMatchObject({ error: { code: "stale_record" }, currentVersion: 1 });
    expect((await versions(id)).length).toBe(1);
    const both = await Promise.all([
      put(technician, id, 1, agreeing()),
      put(engineer, id, 1, withValue(agreeing(), "pack.capacityAh", 90)),
    ]);
    expect(both.map((r) => r.status).sort()).toEqual([200, 409]);
    expect((await versions(id)).map((r) => r.version)).toEqual([1, 2]);
  });

  it.each([
    ["a rest voltage above full", "settings.throttle.restV", 4.3],
    ["thresholds out of order", "settings.throttle.releasedBelowV", 1.15],
    ["a negative capacity", "pack.capacityAh", -100],
    ["an unknown chemistry", "pack.chemistry", "nickel-zinc"],
    ["a percentage over 100", "settings.batteryCurrentPercent", 150],
    ["an unknown lockout", "settings.lockouts", ["power-on", "seat-return"]],
    ["a NUL character", "controller.description", "a\u0000b"],
    ["a number as text", "settings.overVoltageCutoffV", "62"],
  ])("refuses %s with 400 naming record.%s, and saves nothing", async (_what, path, value) => {
    const id = await newVehicle("API bad cart");
    const res = await put(technician, id, 0, withValue(agreeing(), path, value));
    expect(res.status).toBe(400);
    const body = (await res.json()) as any;
    expect(body.error.code).toBe("invalid_record");
    const expected = Array.isArray(value) ? `record.${path}[1]` : `record.${path}`;
    expect(body.error.fields.map((f: { path: string }) => f.path)).toContain(expected);
    expect((await versions(id)).length).toBe(0);
  });

  it("a bad version or no record is a 400 naming the field", async () => {
    const id = await newVehicle("API body cart");
    const noRecord = await technician.fetch(recordPath(id), json("PUT", { version: 0 }));
    expect(noRecord.status).toBe(400);
    expect(((await noRecord.json()) as any).error.fields.map((f: { path: string }) => f.path)).toContain("record");
    const badVersion = await put(technician, id, -1, agreeing());
    expect(badVersion.status).toBe(400);
    expect(((await badVersion.json()) as any).error.fields.map((f: { path: string }) => f.path)).toEqual(["version"]);
    expect((await versions(id)).length).toBe(0);
  });

  it("technicians and engineers write, everyone in the workspace reads, outsiders see nothing", async () => {
    const id = await newVehicle("API roles cart");
    for (const c of [admin, reviewer]) {
      const res = await put(c, id, 0, agreeing());
      expect(res.status).toBe(403);
    }
    expect((await versions(id)).length).toBe(0);
    expect((await put(technician, id, 0, agreeing())).status).toBe(200);
    expect((await put(engineer, id, 1, agreeing())).status).toBe(200);
    for (const c of [admin, reviewer, technician, engineer]) expect((await c.fetch(recordPath(id))).status).toBe(200);
    const { createOutsider } = await import("../support/outsider");
    const outsider = (await createOutsider()).client;
    expect((await outsider.fetch(recordPath(id))).status).toBe(404);
    expect((await put(outsider, id, 2, agreeing())).status).toBe(404);
  });

  describe("POST /api/v1/controller-checks", () => {
    const check = (c: Client, body: unknown) => c.fetch("/api/v1/controller-checks?workspace=larkspur", json("POST", body));

    it("answers the module's own check, against a design when one is sent, and saves nothing", async () => {
      const { checkRecord } = await import("../../app/controller-record");
      const { validateDesign } = await import("../../app/engine");
      const { readFileSync } = await import("node:fs");
      const design = JSON.parse(readFileSync("/work/shared/spec/examples/campus-hauler.design.json", "utf8"));
      const alone = await check(reviewer, { record: exampleRecord() });
      expect(alone.status).toBe(200);
      expect(((await alone.json()) as any).check).toEqual(JSON.parse(JSON.stringify(checkRecord(valid(exampleRecord())))));
      const against = await check(reviewer, { record: exampleRecord(), design });
      expect(against.status).toBe(200);
      const validated = validateDesign(design);
      if (!validated.ok) throw new Error("example design should be valid");
      const body = (await against.json()) as any;
      expect(body.check).toEqual(JSON.parse(JSON.stringify(checkRecord(valid(exampleRecord()), validated.design))));
      expect(body.check.findings.filter((f: { code: string }) => f.code === "lockout-missing")).toHaveLength(2);
    });

    it("names a bad record's and a bad design's fields", async () => {
      const badRecord = await check(technician, { record: withValue(exampleRecord(), "settings.throttle.faultAboveV", 6) });
      expect(badRecord.status).toBe(400);
      expect(await badRecord.json()).toMatchObject({
        error: { code: "invalid_record", fields: [{ path: "record.settings.throttle.faultAboveV" }] },
      });
      const badDesign = await check(technician, { record: exampleRecord(), design: { format: "chainproof/design@1" } });
      expect(badDesign.status).toBe(400);
      const body = (await badDesign.json()) as any;
      expect(body.error.code).toBe("invalid_design");
      expect(body.error.fields.every((f: { path: string }) => f.path.startsWith("design"))).toBe(true);
    });
  });
});
