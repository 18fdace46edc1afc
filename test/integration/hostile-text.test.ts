// Issue 11: text no form or API field may store (NUL, an unpaired surrogate, 1 MB, right-to-left
// override) posted into every text field of every form action and API write. Every answer is 4xx naming
// the field (never a 5xx), and the database is exactly as before. Path ids with %00 answer 404.
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { client, DEMO, signIn, type Client } from "../support/http";

const HOSTILE: Array<[string, string]> = [
  ["NUL", "before\u0000after"],
  ["an unpaired surrogate", "before\ud800after"],
  ["a 1 MB string", "x".repeat(1_000_000)],
  ["a right-to-left override", "invoice\u202Efdp.exe"],
];

let db: pg.Client;
let admin: Client, engineer: Client, technician: Client, reviewer: Client;
const ids: Record<string, string> = {};

/** Everything the product keeps, except what any request may touch (sessions, rate counters, the mail sink, the audit of failed sign-ins). */
async function snapshot(): Promise<string> {
  const tables = await db.query<{ table_name: string }>(
    `SELECT table_name FROM information_schema.tables WHERE table_schema = 'public' AND table_type = 'BASE TABLE'
       AND table_name NOT IN ('session', 'rate_limit', 'verification', 'mail_message', 'audit_event', '__drizzle_migrations')
       AND table_name NOT LIKE 'rate_limit%' ORDER BY table_name`,
  );
  const parts: string[] = [];
  for (const { table_name } of tables.rows) {
    const r = await db.query(
      `SELECT md5(coalesce(string_agg(t::text, '|' ORDER BY t::text), '')) AS h, count(*) AS n FROM "${table_name}" t`,
    );
    parts.push(`${table_name}:${r.rows[0].n}:${r.rows[0].h}`);
  }
  return parts.join("\n");
}

type Target = {
  name: string;
  as: () => Client;
  method: string;
  path: () => string;
  kind: "form" | "json";
  base: () => Record<string, unknown>;
  fields: string[];
};

const form = (name: string, as: () => Client, path: () => string, base: () => Record<string, unknown>, fields: string[]): Target => ({
  name,
  as,
  method: "POST",
  path,
  kind: "form",
  base,
  fields,
});
const json = (
  name: string,
  method: string,
  as: () => Client,
  path: () => string,
  base: () => Record<string, unknown>,
  fields: string[],
): Target => ({ name, as, method, path, kind: "json", base, fields });

const vehicleFields = ["name", "serial", "model", "controllerDescription", "notes"];
const vehicleBase = () => ({ name: "Spare tug", serial: "T-1", model: "Tug", controllerDescription: "48 V", notes: "kept in bay 2" });
const reviewPath = () => `/w/larkspur/designs/${ids.design}/revisions/1/review`;

const TARGETS: Target[] = [
  form(
    "sign-up",
    () => client(),
    () => "/sign-up",
    () => ({ name: "New Person", email: `new-${Date.now()}@example.org`, password: "long-enough-password" }),
    ["name"],
  ),
  form(
    "sign-in",
    () => client(),
    () => "/sign-in",
    () => ({ email: DEMO.reviewer, password: "wrong-password-x", next: "/" }),
    ["email", "next"],
  ),
  form(
    "forgot password",
    () => client(),
    () => "/forgot-password",
    () => ({ email: "nobody@example.org" }),
    ["email"],
  ),
  form(
    "reset password",
    () => client(),
    () => "/reset-password",
    () => ({ token: "no-such-token", password: "long-enough-password" }),
    ["token"],
  ),
  form(
    "create workspace",
    () => engineer,
    () => "/welcome",
    () => ({ name: "Another works" }),
    ["name"],
  ),
  form(
    "create API key",
    () => engineer,
    () => "/w/larkspur/settings",
    () => ({ intent: "create-key", name: "ci" }),
    ["name"],
  ),
  form(
    "revoke API key",
    () => engineer,
    () => "/w/larkspur/settings",
    () => ({ intent: "revoke-key", id: "none" }),
    ["id"],
  ),
  form(
    "invite",
    () => admin,
    () => "/w/larkspur/settings",
    () => ({ intent: "invite", email: "invitee@example.org", role: "engineer" }),
    ["email"],
  ),
  form(
    "change role",
    () => admin,
    () => "/w/larkspur/settings",
    () => ({ intent: "change-role", memberId: ids.reviewerMember, role: "reviewer" }),
    ["memberId"],
  ),
  form(
    "remove member",
    () => admin,
    () => "/w/larkspur/settings",
    () => ({ intent: "remove", id: "none" }),
    ["id"],
  ),
  form(
    "withdraw invitation",
    () => admin,
    () => "/w/larkspur/settings",
    () => ({ intent: "revoke", id: "none" }),
    ["id"],
  ),
  form(
    "create vehicle",
    () => admin,
    () => "/w/larkspur/vehicles",
    vehicleBase,
    vehicleFields,
  ),
  form(
    "edit vehicle",
    () => admin,
    () => `/w/larkspur/vehicles/${ids.vehicle}`,
    () => ({ intent: "edit", ...vehicleBase() }),
    vehicleFields,
  ),
  form(
    "release",
    () => admin,
    () => `/w/larkspur/vehicles/${ids.vehicle}`,
    () => ({ intent: "release", revisionId: ids.revision, note: "ok" }),
    ["revisionId", "note"],
  ),
  form(
    "clear attention",
    () => admin,
    () => `/w/larkspur/vehicles/${ids.vehicle}`,
    () => ({ intent: "clear-attention", note: "fixed" }),
    ["note"],
  ),
  form(
    "new design",
    () => engineer,
    () => "/w/larkspur/designs/new",
    () => ({ name: "Fresh design", vehicleId: "", start: "blank" }),
    ["name", "vehicleId"],
  ),
  form(
    "review request",
    () => engineer,
    reviewPath,
    () => ({ intent: "request", reviewers: ids.reviewerUser, note: "please" }),
    ["reviewers", "note"],
  ),
  form(
    "review comment",
    () => reviewer,
    reviewPath,
    () => ({ intent: "comment", anchor: "component", component: "SS", body: "looks fine" }),
    ["component", "body"],
  ),
  form(
    "review decision",
    () => reviewer,
    reviewPath,
    () => ({ intent: "decide", verdict: "changes-requested", comment: "see notes" }),
    ["comment"],
  ),
  form(
    "bench note",
    () => technician,
    () => `/w/larkspur/bench-tests/${ids.run}`,
    () => ({ intent: "note", step: "1", note: "checked" }),
    ["note"],
  ),
  json(
    "API: create vehicle",
    "POST",
    () => admin,
    () => "/api/v1/vehicles?workspace=larkspur",
    vehicleBase,
    vehicleFields,
  ),
  json(
    "API: edit vehicle",
    "PATCH",
    () => admin,
    () => `/api/v1/vehicles/${ids.vehicle}`,
    () => ({ name: "Renamed" }),
    vehicleFields,
  ),
  json(
    "API: bench step",
    "PUT",
    () => technician,
    () => `/api/v1/bench-runs/${ids.run}/steps/1`,
    () => ({ status: "pass", note: "ok" }),
    ["note"],
  ),
  json(
    "API: create design",
    "POST",
    () => engineer,
    () => "/api/v1/designs?workspace=larkspur",
    () => ({ name: "Via API", start: "blank" }),
    ["name", "vehicleId"],
  ),
];

async function send(t: Target, values: Record<string, unknown>): Promise<Response> {
  const c = t.as();
  if (t.kind === "json")
    return c.fetch(t.path(), { method: t.method, headers: { "content-type": "application/json" }, body: JSON.stringify(values) });
  return c.fetch(t.path(), {
    method: t.method,
    headers: { "content-type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams(values as Record<string, string>),
  });
}

beforeAll(async () => {
  db = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await db.connect();
  [admin, engineer, technician, reviewer] = await Promise.all([
    signIn(DEMO.admin),
    signIn(DEMO.engineer),
    signIn(DEMO.technician),
    signIn(DEMO.reviewer),
  ]);
  const ws = (await db.query("SELECT id FROM workspace WHERE slug = 'larkspur'")).rows[0].id;
  ids.vehicle = (await db.query("SELECT id FROM vehicle WHERE workspace_id = $1 AND name = 'Haybarn campus hauler #3'", [ws])).rows[0].id;
  const rev = (
    await db.query(
      "SELECT r.id, r.design_id FROM design_revision r JOIN design d ON d.id = r.design_id WHERE d.workspace_id = $1 AND r.number = 1 ORDER BY d.name LIMIT 1",
      [ws],
    )
  ).rows[0];
  ids.revision = rev.id;
  ids.design = rev.design_id;
  const member = await db.query(
    `SELECT m.id, u.id AS user_id FROM member m JOIN "user" u ON u.id = m.user_id WHERE m.workspace_id = $1 AND u.email = $2`,
    [ws, DEMO.reviewer],
  );
  ids.reviewerMember = member.rows[0].id;
  ids.reviewerUser = member.rows[0].user_id;
  const started = await technician.fetch(`/w/larkspur/vehicles/${ids.vehicle}`, {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams({ intent: "start-bench-run" }),
  });
  ids.run = (started.headers.get("location") ?? "").split("/bench-tests/")[1] ?? "";
  expect(ids.run).toMatch(/^[0-9a-f-]{36}$/);
});
afterAll(async () => {
  await db.end();
});

describe("hostile text in every form action and API write", () => {
  for (const t of TARGETS) {
    it(`${t.name}: ${t.fields.join(", ")}`, { timeout: 120_000 }, async () => {
      for (const field of t.fields) {
        for (const [what, value] of HOSTILE) {
          const before = await snapshot();
          const res = await send(t, { ...t.base(), [field]: value });
          const body = await res.text();
          const where = `${t.name}, ${field} = ${what}: ${res.status} ${body.slice(0, 300)}`;
          expect(res.status >= 400 && res.status < 500, where).toBe(true);
          if (t.kind === "json" && res.status === 400) {
            const paths = (JSON.parse(body) as { error: { fields: Array<{ path: string }> } }).error.fields.map((f) => f.path);
            expect(paths, where).toContain(field);
          }
          expect(await snapshot(), where).toBe(before);
        }
      }
    });
  }
});

describe("%00 in a path id", () => {
  const pages = [
    "/w/larkspur/vehicles/%00",
    "/w/larkspur/vehicles/%00/why",
    "/w/larkspur/designs/%00",
    "/w/larkspur/designs/%00/edit",
    "/w/larkspur/designs/x/revisions/%00/table",
    "/w/larkspur/bench-tests/%00",
    "/w/larkspur/files/%00",
    "/invite/%00",
    "/w/%00",
  ];
  const api = [
    "/api/v1/vehicles/%00",
    "/api/v1/designs/%00",
    "/api/v1/designs/%00/draft",
    "/api/v1/designs/%00/revisions",
    "/api/v1/bench-runs/%00",
    "/api/v1/vehicles/%00/bench-runs",
  ];

  it.each(pages)("GET and POST %s answer 404", async (path) => {
    expect((await admin.fetch(path)).status).toBe(404);
    expect(
      (await admin.fetch(path, { method: "POST", headers: { "content-type": "application/x-www-form-urlencoded" }, body: "intent=edit" }))
        .status,
    ).toBe(404);
  });

  it.each(api)("GET %s answers 404 in the API's error shape", async (path) => {
    const res = await admin.fetch(path);
    expect(res.status).toBe(404);
    expect(((await res.json()) as { error: { code: string } }).error.code).toBe("not_found");
  });

  // A bench step is only written (PUT); its read is the run's GET above.
  it("PUT /api/v1/bench-runs/%00/steps/1 answers 404 in the API's error shape", async () => {
    const res = await admin.fetch("/api/v1/bench-runs/%00/steps/1", {
      method: "PUT",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ result: "pass" }),
    });
    expect(res.status).toBe(404);
    expect(((await res.json()) as { error: { code: string } }).error.code).toBe("not_found");
  });
});
