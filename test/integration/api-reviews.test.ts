// GET /api/v1/reviews: the review inbox over JSON, the same items the reviews page shows (a reviewer
// gets the requests addressed to them, waiting ones first on the page; others get every request of
// the workspace), members only, and what a bad query or method gets.
import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";
import { client, DEMO, formBody, signIn, type Client } from "../support/http";
import { createOutsider } from "../support/outsider";
import type { Design } from "../../app/engine";

const WS = "larkspur";
const PROVEN = JSON.parse(
  readFileSync(new URL("../../drizzle/demo-designs/haybarn-campus-hauler.json", import.meta.url), "utf8"),
) as Design;

type Item = {
  requestId: string;
  designId: string;
  designName: string;
  number: number;
  reviewerId: string;
  note: string;
  status: string;
  requestedAt: string;
  reviewerDecision: { verdict: string; decidedAt: string } | null;
};
type Inbox = { slug: string; isReviewer: boolean; items: Item[] };

let db: pg.Pool;
let engineer: Client, reviewer: Client, technician: Client, outsider: Client, anonymous: Client;
let reviewerId: string;
const created: string[] = [];
let waitingId: string, decidedId: string;

async function inbox(
  c: Client,
  query = `workspace=${WS}`,
): Promise<{ status: number; body: Inbox & { error?: { code: string; fields: Array<{ path: string }> } } }> {
  const res = await c.fetch(`/api/v1/reviews?${query}`);
  expect(res.headers.get("content-type")).toContain("application/json");
  return { status: res.status, body: await res.json() };
}

/** The review links of the reviews page, in the order shown. */
async function pageLinks(c: Client): Promise<string[]> {
  const html = (await (await c.fetch(`/w/${WS}/reviews`)).text()).replace(/<!-- -->/g, "");
  const items = html.split('data-testid="review-item"').slice(1);
  return items.map((chunk) => /href="(\/w\/[^"]+\/review)"/.exec(chunk)?.[1] ?? "(no link)");
}

const link = (i: Item) => `/w/${WS}/designs/${i.designId}/revisions/${i.number}/review`;

async function designWithRequest(name: string, note: string): Promise<string> {
  const made = await engineer.fetch(`/api/v1/designs?workspace=${WS}`, {
    method: "POST",
    body: JSON.stringify({ name, start: "blank" }),
    headers: { "content-type": "application/json" },
  });
  expect(made.status).toBe(201);
  const id = ((await made.json()) as { design: { id: string } }).design.id;
  created.push(id);
  const saved = await engineer.fetch(`/api/v1/designs/${id}/revisions`, {
    method: "POST",
    body: JSON.stringify({ document: PROVEN, baseRevision: 0, message: "first wiring" }),
    headers: { "content-type": "application/json" },
  });
  expect(saved.status).toBe(201);
  const asked = await engineer.fetch(
    `/w/${WS}/designs/${id}/revisions/1/review`,
    formBody({ intent: "request", reviewers: reviewerId, note }),
  );
  expect(asked.status).toBe(200);
  return id;
}

beforeAll(async () => {
  db = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 });
  [engineer, reviewer, technician] = await Promise.all([signIn(DEMO.engineer), signIn(DEMO.reviewer), signIn(DEMO.technician)]);
  outsider = (await createOutsider()).client;
  anonymous = client();
  reviewerId = (await db.query<{ id: string }>('SELECT id FROM "user" WHERE email = $1', [DEMO.reviewer])).rows[0]!.id;
  waitingId = await designWithRequest(`Test: inbox API waiting ${Date.now()}`, "please look at the seat switch");
  decidedId = await designWithRequest(`Test: inbox API decided ${Date.now()}`, "");
  const decided = await reviewer.fetch(
    `/w/${WS}/designs/${decidedId}/revisions/1/review`,
    formBody({ intent: "decide", verdict: "changes-requested", comment: "Label the park brake contact." }),
  );
  expect(decided.status).toBe(200);
});

afterAll(async () => {
  if (created.length) await db.query("DELETE FROM design WHERE id = ANY($1)", [created]);
  await db.end();
});

describe("GET /api/v1/reviews", () => {
  it("gives a reviewer the same items as their reviews page, in the page's order (waiting first)", async () => {
    const { status, body } = await inbox(reviewer);
    expect(status).toBe(200);
    expect(body.isReviewer).toBe(true);
    expect(body.slug).toBe(WS);
    const waiting = body.items.filter((i) => !i.reviewerDecision);
    const decided = body.items.filter((i) => i.reviewerDecision);
    expect(await pageLinks(reviewer)).toEqual([...waiting, ...decided].map(link));
    // Only the requests addressed to this reviewer, each one once.
    expect(body.items.every((i) => i.reviewerId === reviewerId)).toBe(true);
    const inDb = await db.query<{ id: string }>(
      "SELECT r.id FROM review_request r JOIN workspace w ON w.id = r.workspace_id WHERE w.slug = $1 AND r.reviewer_id = $2 ORDER BY r.requested_at DESC LIMIT 200",
      [WS, reviewerId],
    );
    expect(body.items.map((i) => i.requestId)).toEqual(inDb.rows.map((r) => r.id));
  });

  it("shows the new request as waiting with its note, and the decided one with the reviewer's verdict and status", async () => {
    const { body } = await inbox(reviewer);
    const waiting = body.items.find((i) => i.designId === waitingId)!;
    expect(waiting.reviewerDecision).toBeNull();
    expect(waiting.status).toBe("in-review");
    expect(waiting.note).toBe("please look at the seat switch");
    expect(Number.isNaN(Date.parse(waiting.requestedAt))).toBe(false);
    const decided = body.items.find((i) => i.designId === decidedId)!;
    expect(decided.reviewerDecision?.verdict).toBe("changes-requested");
    expect(decided.status).toBe("changes-requested");
  });

  it("gives other roles every request of the workspace, as their page lists them", async () => {
    for (const c of [engineer, technician]) {
      const { status, body } = await inbox(c);
      expect(status).toBe(200);
      expect(body.isReviewer).toBe(false);
      expect(body.items.map((i) => i.designId)).toEqual(expect.arrayContaining([waitingId, decidedId]));
      expect(await pageLinks(c)).toEqual(body.items.map(link));
    }
  });

  it("is for members only: 401 signed out, 404 for another workspace or an unknown one", async () => {
    expect((await inbox(anonymous)).status).toBe(401);
    const foreign = await inbox(outsider);
    expect(foreign.status).toBe(404);
    expect(foreign.body.error?.code).toBe("not_found");
    expect(JSON.stringify(foreign.body)).not.toContain(waitingId);
    expect((await inbox(reviewer, "workspace=no-such-workspace")).status).toBe(404);
  });

  it("a missing workspace is 400 naming the parameter; writing is 405", async () => {
    const bad = await inbox(reviewer, "");
    expect(bad.status).toBe(400);
    expect(bad.body.error?.fields.map((f) => f.path)).toEqual(["workspace"]);
    const post = await reviewer.fetch(`/api/v1/reviews?workspace=${WS}`, {
      method: "POST",
      body: "{}",
      headers: { "content-type": "application/json" },
    });
    expect(post.status).toBe(405);
  });
});
