// Which role may load or act on which route: one table, iterated for every demo role and an outsider.
import { beforeAll, describe, expect, it } from "vitest";
import { client, DEMO, formBody, signIn, type Client, type DemoRole } from "../support/http";
import { createOutsider } from "../support/outsider";

type Expect = 200 | 302 | 400 | 401 | 403 | 404;
type Row = {
  name: string;
  method: "GET" | "POST" | "PUT" | "PATCH";
  path: string;
  body?: Record<string, string>;
  // A JSON body (API rows); sent with Content-Type: application/json instead of a form.
  json?: unknown;
  // Status for each role; "outsider" is a signed-in user of another workspace; "anonymous" has no session.
  expect: Record<DemoRole | "outsider" | "anonymous", Expect>;
};

const all = (s: Expect, over: Partial<Row["expect"]> = {}): Row["expect"] => ({
  admin: s,
  engineer: s,
  technician: s,
  reviewer: s,
  outsider: 404,
  anonymous: 302,
  ...over,
});

// JSON API rows: a signed-out caller gets 401, not a redirect.
const api = (s: Expect, over: Partial<Row["expect"]> = {}): Row["expect"] => all(s, { anonymous: 401, ...over });

export const MATRIX: Row[] = [
  { name: "workspace overview", method: "GET", path: "/w/larkspur", expect: all(200) },
  { name: "vehicles list", method: "GET", path: "/w/larkspur/vehicles", expect: all(200) },
  {
    name: "add a vehicle (invalid body: authorised roles get 400, others 403)",
    method: "POST",
    path: "/w/larkspur/vehicles",
    body: { name: "" },
    expect: all(400, { reviewer: 403 }),
  },
  { name: "designs list", method: "GET", path: "/w/larkspur/designs", expect: all(200) },
  { name: "designs list with archived designs", method: "GET", path: "/w/larkspur/designs?archived=include", expect: all(200) },
  // Archiving a demo design, with an intent that is not one: allowed roles get 400 (nothing changes), others 403.
  {
    name: "archive a design (bad intent: admins and engineers get 400, others 403)",
    method: "POST",
    path: "/w/larkspur/designs/:demoDesign",
    body: { intent: "delete" },
    expect: all(403, { admin: 400, engineer: 400 }),
  },
  {
    name: "archive a design of no such id (admins and engineers get 404, others 403)",
    method: "POST",
    path: "/w/larkspur/designs/no-such-design",
    body: { intent: "archive" },
    expect: all(403, { admin: 404, engineer: 404 }),
  },
  {
    name: "API: archive a design (bad body: admins and engineers get 400, others 403)",
    method: "PATCH",
    path: "/api/v1/designs/:demoDesign",
    json: { archived: "yes" },
    expect: api(403, { admin: 400, engineer: 400 }),
  },
  { name: "API: designs with archived ones", method: "GET", path: "/api/v1/designs?workspace=larkspur&archived=include", expect: api(200) },
  { name: "reviews", method: "GET", path: "/w/larkspur/reviews", expect: all(200) },
  {
    name: "design activity (admins, engineers, reviewers)",
    method: "GET",
    path: "/w/larkspur/activity",
    expect: all(200, { technician: 403 }),
  },
  // Review actions on a revision that does not exist: the role is checked first (403), then the revision (404).
  {
    name: "decide on a review (unknown design: reviewers get 404, others 403)",
    method: "POST",
    path: "/w/larkspur/designs/no-such-design/revisions/1/review",
    body: { intent: "decide", verdict: "approved", comment: "ok" },
    expect: all(403, { reviewer: 404 }),
  },
  {
    name: "request a review (unknown design: engineers get 404, others 403)",
    method: "POST",
    path: "/w/larkspur/designs/no-such-design/revisions/1/review",
    body: { intent: "request", reviewers: "nobody" },
    expect: all(403, { engineer: 404 }),
  },
  {
    name: "review page of an unknown design",
    method: "GET",
    path: "/w/larkspur/designs/no-such-design/revisions/1/review",
    expect: all(404),
  },
  {
    name: "truth-table page of an unknown design",
    method: "GET",
    path: "/w/larkspur/designs/no-such-design/revisions/1/table",
    expect: all(404),
  },
  { name: "bench tests", method: "GET", path: "/w/larkspur/bench-tests", expect: all(200) },
  { name: "bench tests with failures", method: "GET", path: "/w/larkspur/bench-tests?status=failures", expect: all(200) },
  { name: "bench results CSV of an unknown run", method: "GET", path: "/w/larkspur/bench-tests/no-such-run/results.csv", expect: all(404) },
  { name: "why won't it drive (no such vehicle)", method: "GET", path: "/w/larkspur/vehicles/no-such-vehicle/why", expect: all(404) },
  {
    name: "release to a vehicle (no such vehicle: engineers and admins get 404, others 403)",
    method: "POST",
    path: "/w/larkspur/vehicles/no-such-vehicle",
    body: { intent: "release", revisionId: "x" },
    expect: all(403, { admin: 404, engineer: 404 }),
  },
  {
    name: "start a bench test (no such vehicle: technicians get 404, others 403)",
    method: "POST",
    path: "/w/larkspur/vehicles/no-such-vehicle",
    body: { intent: "start-bench-run" },
    expect: all(403, { technician: 404 }),
  },
  {
    name: "record a bench step (no such run: technicians get 404, others 403)",
    method: "POST",
    path: "/w/larkspur/bench-tests/no-such-run",
    body: { intent: "outcome", step: "1", outcome: "pass" },
    expect: all(403, { technician: 404 }),
  },
  {
    name: "controller settings of an unknown vehicle",
    method: "GET",
    path: "/w/larkspur/vehicles/no-such-vehicle/controller",
    expect: all(404),
  },
  {
    name: "record controller settings (no such vehicle: technicians and engineers get 404, others 403)",
    method: "POST",
    path: "/w/larkspur/vehicles/no-such-vehicle/controller",
    body: { baseVersion: "0" },
    expect: all(403, { technician: 404, engineer: 404 }),
  },
  { name: "settings", method: "GET", path: "/w/larkspur/settings", expect: all(200) },
  {
    name: "invite a member (invalid e-mail: admin gets 400, others 403)",
    method: "POST",
    path: "/w/larkspur/settings",
    body: { intent: "invite", email: "not-an-address", role: "engineer" },
    expect: all(403, { admin: 400 }),
  },
  {
    name: "change a role (unknown member: admin gets 400, others 403)",
    method: "POST",
    path: "/w/larkspur/settings",
    body: { intent: "change-role", memberId: "nobody", role: "engineer" },
    expect: all(403, { admin: 400 }),
  },
  { name: "welcome (signed-in users only)", method: "GET", path: "/welcome", expect: all(200, { outsider: 200 }) },
  { name: "local outbox (open in local mode)", method: "GET", path: "/outbox", expect: all(200, { outsider: 200, anonymous: 200 }) },
  { name: "health", method: "GET", path: "/healthz", expect: all(200, { outsider: 200, anonymous: 200 }) },
  // The JSON API v1 (docs/decisions/086): vehicles, bench runs, diagnosis and the description.
  { name: "API: vehicles list", method: "GET", path: "/api/v1/vehicles?workspace=larkspur", expect: api(200) },
  {
    name: "API: add a vehicle (invalid body: vehicle roles get 400, reviewers 403)",
    method: "POST",
    path: "/api/v1/vehicles?workspace=larkspur",
    json: { name: "" },
    expect: api(400, { reviewer: 403 }),
  },
  { name: "API: unknown vehicle", method: "GET", path: "/api/v1/vehicles/no-such-vehicle", expect: api(404) },
  {
    name: "API: change an unknown vehicle",
    method: "PATCH",
    path: "/api/v1/vehicles/no-such-vehicle",
    json: { model: "x" },
    expect: api(404),
  },
  {
    name: "API: controller record of an unknown vehicle",
    method: "GET",
    path: "/api/v1/vehicles/no-such-vehicle/controller-record",
    expect: api(404),
  },
  {
    name: "API: record controller settings on an unknown vehicle",
    method: "PUT",
    path: "/api/v1/vehicles/no-such-vehicle/controller-record",
    json: { version: 0, record: {} },
    expect: api(404),
  },
  {
    name: "API: check a controller record (invalid record: members get 400)",
    method: "POST",
    path: "/api/v1/controller-checks?workspace=larkspur",
    json: { record: {} },
    expect: api(400),
  },
  { name: "API: bench runs list", method: "GET", path: "/api/v1/bench-runs?workspace=larkspur", expect: api(200) },
  {
    name: "API: start a bench run on an unknown vehicle",
    method: "POST",
    path: "/api/v1/vehicles/no-such-vehicle/bench-runs",
    json: {},
    expect: api(404),
  },
  {
    name: "API: release to an unknown vehicle",
    method: "POST",
    path: "/api/v1/vehicles/no-such-vehicle/releases",
    json: { revisionId: "x" },
    expect: api(404),
  },
  { name: "API: unknown bench run", method: "GET", path: "/api/v1/bench-runs/no-such-run", expect: api(404) },
  {
    name: "API: record a step of an unknown run",
    method: "PUT",
    path: "/api/v1/bench-runs/no-such-run/steps/1",
    json: { status: "pass" },
    expect: api(404),
  },
  { name: "API: review inbox", method: "GET", path: "/api/v1/reviews?workspace=larkspur", expect: api(200) },
  {
    name: "API: diagnose a row of an unknown design",
    method: "POST",
    path: "/api/v1/designs/no-such-design/revisions/1/diagnosis",
    json: { states: {} },
    expect: api(404),
  },
  {
    name: "API: row groups of an unknown design",
    method: "GET",
    path: "/api/v1/designs/no-such-design/revisions/1/groups?set=drive",
    expect: api(404),
  },
  {
    name: "API: why a rule of an unknown design holds",
    method: "GET",
    path: "/api/v1/designs/no-such-design/revisions/1/why?rule=R1",
    expect: api(404),
  },
  {
    name: "API: the OpenAPI document (public)",
    method: "GET",
    path: "/api/v1/openapi.json",
    expect: all(200, { outsider: 200, anonymous: 200 }),
  },
  { name: "API: the API docs page (public)", method: "GET", path: "/api/v1/docs", expect: all(200, { outsider: 200, anonymous: 200 }) },
];

const clients = {} as Record<DemoRole | "outsider" | "anonymous", Client>;

/** A demo design's id, for rows that name one (":demoDesign"); they never change it. */
let demoDesign = "";

beforeAll(async () => {
  for (const role of Object.keys(DEMO) as DemoRole[]) clients[role] = await signIn(DEMO[role]);
  const listed = await clients.admin.fetch("/api/v1/designs?workspace=larkspur");
  demoDesign = ((await listed.json()) as { designs: Array<{ id: string }> }).designs[0]!.id;
  clients.outsider = (await createOutsider()).client;
  clients.anonymous = client();
});

describe("role matrix", () => {
  for (const row of MATRIX) {
    for (const who of ["admin", "engineer", "technician", "reviewer", "outsider", "anonymous"] as const) {
      it(`${row.name}: ${row.method} ${row.path} as ${who} → ${row.expect[who]}`, async () => {
        const init: RequestInit =
          row.json !== undefined
            ? { method: row.method, body: JSON.stringify(row.json), headers: { "content-type": "application/json" } }
            : row.method === "POST"
              ? formBody(row.body ?? {})
              : { method: row.method };
        const res = await clients[who].fetch(row.path.replace(":demoDesign", demoDesign), init);
        expect(res.status).toBe(row.expect[who]);
        if (res.status === 302) expect(res.headers.get("location")).toContain("/sign-in");
        const text = await res.text();
        // Never a stack trace in a response.
        expect(text).not.toMatch(/\n\s+at .+\(.+:\d+:\d+\)/);
      });
    }
  }
});
