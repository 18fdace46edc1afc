// Which role may load or act on which route: one table, iterated for every demo role and an outsider.
import { beforeAll, describe, expect, it } from "vitest";
import { client, DEMO, formBody, signIn, type Client, type DemoRole } from "../support/http";
import { createOutsider } from "../support/outsider";

type Expect = 200 | 302 | 400 | 403 | 404;
type Row = {
  name: string;
  method: "GET" | "POST";
  path: string;
  body?: Record<string, string>;
  // Status for each role; "outsider" is a signed-in user of another workspace; "anonymous" has no session.
  expect: Record<DemoRole | "outsider" | "anonymous", Expect>;
};

const all = (s: Expect, over: Partial<Row["expect"]> = {}): Row["expect"] => ({
  admin: s, engineer: s, technician: s, reviewer: s, outsider: 404, anonymous: 302, ...over,
});

export const MATRIX: Row[] = [
  { name: "workspace overview", method: "GET", path: "/w/larkspur", expect: all(200) },
  { name: "vehicles list", method: "GET", path: "/w/larkspur/vehicles", expect: all(200) },
  {
    name: "add a vehicle (invalid body: authorised roles get 400, others 403)",
    method: "POST", path: "/w/larkspur/vehicles", body: { name: "" },
    expect: all(400, { reviewer: 403 }),
  },
  { name: "designs list", method: "GET", path: "/w/larkspur/designs", expect: all(200) },
  { name: "reviews", method: "GET", path: "/w/larkspur/reviews", expect: all(200) },
  // Review actions on a revision that does not exist: the role is checked first (403), then the revision (404).
  {
    name: "decide on a review (unknown design: reviewers get 404, others 403)",
    method: "POST", path: "/w/larkspur/designs/no-such-design/revisions/1/review", body: { intent: "decide", verdict: "approved", comment: "ok" },
    expect: all(403, { reviewer: 404 }),
  },
  {
    name: "request a review (unknown design: engineers get 404, others 403)",
    method: "POST", path: "/w/larkspur/designs/no-such-design/revisions/1/review", body: { intent: "request", reviewers: "nobody" },
    expect: all(403, { engineer: 404 }),
  },
  { name: "review page of an unknown design", method: "GET", path: "/w/larkspur/designs/no-such-design/revisions/1/review", expect: all(404) },
  { name: "truth-table page of an unknown design", method: "GET", path: "/w/larkspur/designs/no-such-design/revisions/1/table", expect: all(404) },
  { name: "bench tests", method: "GET", path: "/w/larkspur/bench-tests", expect: all(200) },
  { name: "bench tests with failures", method: "GET", path: "/w/larkspur/bench-tests?status=failures", expect: all(200) },
  { name: "why won't it drive (no such vehicle)", method: "GET", path: "/w/larkspur/vehicles/no-such-vehicle/why", expect: all(404) },
  {
    name: "release to a vehicle (no such vehicle: engineers and admins get 404, others 403)",
    method: "POST", path: "/w/larkspur/vehicles/no-such-vehicle", body: { intent: "release", revisionId: "x" },
    expect: all(403, { admin: 404, engineer: 404 }),
  },
  {
    name: "start a bench test (no such vehicle: technicians get 404, others 403)",
    method: "POST", path: "/w/larkspur/vehicles/no-such-vehicle", body: { intent: "start-bench-run" },
    expect: all(403, { technician: 404 }),
  },
  {
    name: "record a bench step (no such run: technicians get 404, others 403)",
    method: "POST", path: "/w/larkspur/bench-tests/no-such-run", body: { intent: "outcome", step: "1", outcome: "pass" },
    expect: all(403, { technician: 404 }),
  },
  { name: "settings", method: "GET", path: "/w/larkspur/settings", expect: all(200) },
  {
    name: "invite a member (invalid e-mail: admin gets 400, others 403)",
    method: "POST", path: "/w/larkspur/settings", body: { intent: "invite", email: "not-an-address", role: "engineer" },
    expect: all(403, { admin: 400 }),
  },
  {
    name: "change a role (unknown member: admin gets 400, others 403)",
    method: "POST", path: "/w/larkspur/settings", body: { intent: "change-role", memberId: "nobody", role: "engineer" },
    expect: all(403, { admin: 400 }),
  },
  { name: "welcome (signed-in users only)", method: "GET", path: "/welcome", expect: all(200, { outsider: 200 }) },
  { name: "local outbox (open in local mode)", method: "GET", path: "/outbox", expect: all(200, { outsider: 200, anonymous: 200 }) },
  { name: "health", method: "GET", path: "/healthz", expect: all(200, { outsider: 200, anonymous: 200 }) },
];

const clients = {} as Record<DemoRole | "outsider" | "anonymous", Client>;

beforeAll(async () => {
  for (const role of Object.keys(DEMO) as DemoRole[]) clients[role] = await signIn(DEMO[role]);
  clients.outsider = (await createOutsider()).client;
  clients.anonymous = client();
});

describe("role matrix", () => {
  for (const row of MATRIX) {
    for (const who of ["admin", "engineer", "technician", "reviewer", "outsider", "anonymous"] as const) {
      it(`${row.name}: ${row.method} ${row.path} as ${who} → ${row.expect[who]}`, async () => {
        const res = await clients[who].fetch(row.path, row.method === "POST" ? formBody(row.body ?? {}) : {});
        expect(res.status).toBe(row.expect[who]);
        if (res.status === 302) expect(res.headers.get("location")).toContain("/sign-in");
        const text = await res.text();
        // Never a stack trace in a response.
        expect(text).not.toMatch(/\n\s+at .+\(.+:\d+:\d+\)/);
      });
    }
  }
});
