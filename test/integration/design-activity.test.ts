// Reviews waiting and the design activity, against the running app: a reviewer's home page and the
// navigation count the requests still waiting for their decision (the same number the review inbox
// API lists without a decision), other roles see no count; admins, engineers and reviewers read the
// workspace's design events in words (no action codes, no addresses), technicians are refused.
import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";
import { DEMO, formBody, signIn, type Client } from "../support/http";
import type { Design } from "../../app/engine";

const WS = "larkspur";
const PROVEN = JSON.parse(
  readFileSync(new URL("../../drizzle/demo-designs/haybarn-campus-hauler.json", import.meta.url), "utf8"),
) as Design;
let db: pg.Pool;
let engineer: Client, technician: Client, reviewer: Client, admin: Client;
let reviewerId: string;
const created: string[] = [];

/** Page HTML without React's text separators (`a<!-- -->b`). */
async function pageText(c: Client, path: string): Promise<{ status: number; html: string }> {
  const res = await c.fetch(path);
  return { status: res.status, html: (await res.text()).replace(/<!-- -->/g, "") };
}

/** The count on the home page's "Reviews waiting for you" card, or null when there is none. */
async function homeCount(c: Client): Promise<number | null> {
  const { html } = await pageText(c, `/w/${WS}`);
  const card = /data-testid="reviews-waiting"[\s\S]*?<p[^>]*>(\d+)<\/p>/.exec(html);
  return card ? Number(card[1]) : null;
}

/** The count on the navigation's Reviews link (0 when no badge is shown). */
async function badgeCount(c: Client): Promise<number> {
  const { html } = await pageText(c, `/w/${WS}/designs`);
  const badge = /data-testid="reviews-waiting-badge"[^>]*><span aria-hidden="true">(\d+)<\/span>/.exec(html);
  return badge ? Number(badge[1]) : 0;
}

/** From the inbox API: the reviewer's requests without a decision of theirs. */
async function inboxWaiting(c: Client): Promise<number> {
  const res = await c.fetch(`/api/v1/reviews?workspace=${WS}`);
  const body = (await res.json()) as { items: Array<{ reviewerDecision: unknown }> };
  return body.items.filter((i) => !i.reviewerDecision).length;
}

beforeAll(async () => {
  db = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 });
  [engineer, technician, reviewer, admin] = await Promise.all([
    signIn(DEMO.engineer),
    signIn(DEMO.technician),
    signIn(DEMO.reviewer),
    signIn(DEMO.admin),
  ]);
  reviewerId = (await db.query<{ id: string }>('SELECT id FROM "user" WHERE email = $1', [DEMO.reviewer])).rows[0]!.id;
});

afterAll(async () => {
  if (created.length) await db.query("DELETE FROM design WHERE id = ANY($1)", [created]);
  await db.end();
});

describe("reviews waiting and design activity", () => {
  it("counts a new request on the reviewer's home page and navigation, and stops counting it once they decide", async () => {
    const before = await homeCount(reviewer);
    expect(before).not.toBeNull();
    expect(before).toBe(await inboxWaiting(reviewer));
    expect(await badgeCount(reviewer)).toBe(before);

    const name = `Activity check ${Date.now()}`;
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
      body: JSON.stringify({ document: PROVEN, baseRevision: 0, message: "for the activity test" }),
      headers: { "content-type": "application/json" },
    });
    expect(saved.status).toBe(201);
    const review = `/w/${WS}/designs/${id}/revisions/1/review`;
    expect((await engineer.fetch(review, formBody({ intent: "request", reviewers: reviewerId, note: "please" }))).status).toBe(200);

    expect(await homeCount(reviewer)).toBe(before! + 1);
    expect(await badgeCount(reviewer)).toBe(before! + 1);
    expect(await inboxWaiting(reviewer)).toBe(before! + 1);

    expect(
      (await reviewer.fetch(review, formBody({ intent: "comment", anchor: "row", row: "3", body: "Row 3 reads right." }))).status,
    ).toBe(200);
    expect(
      (await reviewer.fetch(review, formBody({ intent: "decide", verdict: "changes-requested", comment: "Label the plug." }))).status,
    ).toBe(200);
    expect(await homeCount(reviewer)).toBe(before);
    expect(await badgeCount(reviewer)).toBe(before);

    // Other roles have no count of their own.
    for (const c of [engineer, admin, technician]) {
      expect(await homeCount(c)).toBeNull();
      expect(await badgeCount(c)).toBe(0);
    }

    // The reviewer reads what happened, in words.
    const { status, html } = await pageText(reviewer, `/w/${WS}/activity`);
    expect(status).toBe(200);
    const events = [...html.matchAll(/data-testid="design-event"[\s\S]*?<\/li>/g)].map((m) =>
      m[0]
        .replace(/<[^>]+>/g, " ")
        .replace(/\s+/g, " ")
        .replace(/&quot;/g, '"'),
    );
    const about = events.filter((e) => e.includes(name));
    expect(about.some((e) => e.includes(`saved revision 1 of “${name}”.`))).toBe(true);
    expect(about.some((e) => e.includes(`asked a reviewer to review “${name} revision 1”.`))).toBe(true);
    expect(about.some((e) => e.includes(`commented on “${name} revision 1” (on truth-table row 3).`))).toBe(true);
    expect(about.some((e) => e.includes(`asked for changes to “${name} revision 1”.`))).toBe(true);
    expect(about.some((e) => e.includes(`created the design “${name}”.`))).toBe(true);
    // No action codes and no member addresses on the page.
    for (const code of ["design.revision-saved", "review.requested", "review.commented", "review.changes-requested", "design.created"])
      expect(html).not.toContain(code);
    // (the page's own account menu shows the reader's address; nobody else's appears)
    expect(html).not.toContain(DEMO.engineer);
    for (const e of events) expect(e).not.toContain("@");
    // Events that are not about designs (sign-ins, members) are not listed.
    expect(events.some((e) => /signed in|sign-in|invited/i.test(e))).toBe(false);
    // Newest first: the decision comes before the request.
    expect(about.findIndex((e) => e.includes("asked for changes"))).toBeLessThan(about.findIndex((e) => e.includes("asked a reviewer")));
  });

  it("lets admins, engineers and reviewers read the design activity, and refuses technicians", async () => {
    for (const c of [admin, engineer, reviewer]) expect((await c.fetch(`/w/${WS}/activity`)).status).toBe(200);
    expect((await technician.fetch(`/w/${WS}/activity`)).status).toBe(403);
    // The navigation offers it only to those who may read it.
    expect((await pageText(reviewer, `/w/${WS}/designs`)).html).toContain(`href="/w/${WS}/activity"`);
    expect((await pageText(technician, `/w/${WS}/designs`)).html).not.toContain(`href="/w/${WS}/activity"`);
  });
});
