// Reviews against the running app and its PostgreSQL: the truth-table API (pages and filter counts
// equal the engine's own countRows / pageRows, CSV stream), who may request, comment and decide,
// approvals bound to one revision, mails and the audit log, and workspace isolation.
import { execFileSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";
import { client, DEMO, formBody, signIn, type Client, sendJson as json } from "../support/http";
import { createOutsider } from "../support/outsider";
import {
  compileDesign,
  countRows,
  csvHeader,
  decodeRow,
  pageRows,
  prove,
  type CompiledDesign,
  type Design,
  type RowFilter,
} from "../../app/engine";

const WS = "larkspur";
const PROVEN = JSON.parse(
  readFileSync(new URL("../../drizzle/demo-designs/haybarn-campus-hauler.json", import.meta.url), "utf8"),
) as Design;
const ENGINE: CompiledDesign = compileDesign(PROVEN);

let db: pg.Pool;
let engineer: Client, technician: Client, reviewer: Client, admin: Client, outsider: Client, anonymous: Client;
let ids: Record<"engineer" | "reviewer", string>;
const created: string[] = [];

/** A new design with revision 1 (the proven Haybarn wiring), saved by the demo engineer. */
async function designWithRevision(name: string): Promise<string> {
  const made = await json(engineer, "POST", `/api/v1/designs?workspace=${WS}`, { name, start: "blank" });
  expect(made.status).toBe(201);
  const id = made.body.design.id as string;
  created.push(id);
  const saved = await json(engineer, "POST", `/api/v1/designs/${id}/revisions`, {
    document: PROVEN,
    baseRevision: 0,
    message: "first wiring",
  });
  expect(saved.status).toBe(201);
  return id;
}

const reviewUrl = (id: string, n: number) => `/w/${WS}/designs/${id}/revisions/${n}/review`;
const act = (c: Client, id: string, n: number, values: Record<string, string>) => c.fetch(reviewUrl(id, n), formBody(values));

function search(filter: RowFilter): string {
  const p = new URLSearchParams();
  if (filter.only) p.set("only", filter.only);
  if (filter.rule) p.set("rule", filter.rule);
  for (const [cond, states] of Object.entries(filter.where ?? {})) for (const s of states) p.append("where", `${cond}:${s}`);
  return p.toString();
}

/** Page HTML without React's text separators (`a<!-- -->b`). */
async function pageText(c: Client, path: string): Promise<string> {
  return (await (await c.fetch(path)).text()).replace(/<!-- -->/g, "");
}

async function statusOnPage(c: Client, id: string, n: number): Promise<string | undefined> {
  const html = await (await c.fetch(reviewUrl(id, n))).text();
  return /data-review-status="([a-z-]+)"/.exec(html)?.[1];
}

beforeAll(async () => {
  db = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 4 });
  [engineer, technician, reviewer, admin] = await Promise.all([
    signIn(DEMO.engineer),
    signIn(DEMO.technician),
    signIn(DEMO.reviewer),
    signIn(DEMO.admin),
  ]);
  outsider = (await createOutsider()).client;
  anonymous = client();
  const users = await db.query<{ id: string; email: string }>('SELECT id, email FROM "user" WHERE email = ANY($1)', [
    [DEMO.engineer, DEMO.reviewer],
  ]);
  const by = (e: string) => users.rows.find((u) => u.email === e)!.id;
  ids = { engineer: by(DEMO.engineer), reviewer: by(DEMO.reviewer) };
});

afterAll(async () => {
  if (created.length) await db.query("DELETE FROM design WHERE id = ANY($1)", [created]);
  await db.end();
});

describe("truth-table API", () => {
  let id: string;
  beforeAll(async () => {
    id = await designWithRevision("Test: truth-table API");
  });

  const filters: RowFilter[] = [
    {},
    { only: "unsafe" },
    { only: "violating" },
    { only: "drive" },
    { only: "unsafe", rule: "neutral" },
    { where: { seat: ["occupied"] } },
    { only: "unsafe", where: { lever: ["neutral", "reverse"], key: ["on"] } },
  ];

  for (const filter of filters) {
    it(`total for ${JSON.stringify(filter)} equals the engine's countRows, and the pages list the engine's rows`, async () => {
      const want = countRows(ENGINE, filter);
      const seen: number[] = [];
      for (let from = 0; ; from += 50) {
        const r = await json(reviewer, "GET", `/api/v1/designs/${id}/revisions/1/rows?${search(filter)}&from=${from}&count=50`);
        expect(r.status).toBe(200);
        expect(r.body.total).toBe(want);
        seen.push(...(r.body.rows as Array<{ index: number }>).map((x) => x.index));
        if (r.body.rows.length < 50) break;
      }
      expect(seen).toEqual(pageRows(ENGINE, { filter, from: 0, count: want }).rows.map((v) => v.index));
    });
  }

  it("a row carries the engine's values in column order", async () => {
    const r = await json(technician, "GET", `/api/v1/designs/${id}/revisions/1/rows?from=157&count=1`);
    const view = pageRows(ENGINE, { from: 157, count: 1 }).rows[0]!;
    const row = r.body.rows[0];
    expect(row.index).toBe(157);
    expect(row.states).toEqual(ENGINE.conditions.map((c) => view.states[c.id]));
    expect(row.drive).toBe(view.drive);
    expect(row.inputs).toEqual(ENGINE.inputs.map((x) => view.inputs[x.id]));
  });

  it("one row comes with the engine's diagnosis; a row outside the table is 404", async () => {
    const r = await json(reviewer, "GET", `/api/v1/designs/${id}/revisions/1/rows/5`);
    expect(r.status).toBe(200);
    expect(r.body.diagnosis.row).toBe(5);
    expect(r.body.diagnosis.states).toEqual(decodeRow(ENGINE, 5));
    expect(r.body.diagnosis.reasons.length).toBeGreaterThan(0);
    expect((await json(reviewer, "GET", `/api/v1/designs/${id}/revisions/1/rows/${ENGINE.rows}`)).status).toBe(404);
  });

  it("bad filters are 400 naming the parameter", async () => {
    const cases: Array<[string, string]> = [
      ["only=sometimes", "only"],
      ["where=seat", "where"],
      ["where=seat:standing", "where"],
      ["where=nosuch:on", "where"],
      ["only=unsafe&rule=nosuch", "rule"],
      ["count=100000", "count"],
      ["from=-1", "from"],
    ];
    for (const [q, field] of cases) {
      const r = await json(reviewer, "GET", `/api/v1/designs/${id}/revisions/1/rows?${q}`);
      expect(r.status, q).toBe(400);
      expect(
        r.body.error.fields.map((f: { path: string }) => f.path),
        q,
      ).toContain(field);
    }
  });

  it("streams the CSV with the filter: the engine's header, then one line per matching row", async () => {
    const filter: RowFilter = { only: "unsafe", rule: "driver", where: { key: ["on"] } };
    const res = await reviewer.fetch(`/api/v1/designs/${id}/revisions/1/table.csv?${search(filter)}`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toContain("text/csv");
    // RFC 6266 allows the name as a token or a quoted string (the content-disposition package picks).
    expect(res.headers.get("content-disposition")).toMatch(/attachment; filename="?.+-r1-unsafe-filtered\.csv"?/);
    const lines = (await res.text()).trimEnd().split("\n");
    expect(lines[0]).toBe(csvHeader(ENGINE).join(","));
    expect(lines.length - 1).toBe(countRows(ENGINE, filter));
    expect(lines.length - 1).toBeGreaterThan(0);
    const whole = await (await reviewer.fetch(`/api/v1/designs/${id}/revisions/1/table.csv`)).text();
    expect(whole.trimEnd().split("\n").length - 1).toBe(ENGINE.rows);
  });

  it("is for members only: 401 signed out, 404 for another workspace or an unknown revision", async () => {
    for (const path of ["rows", "rows/3", "table.csv"]) {
      expect((await anonymous.fetch(`/api/v1/designs/${id}/revisions/1/${path}`)).status).toBe(401);
      expect((await outsider.fetch(`/api/v1/designs/${id}/revisions/1/${path}`)).status).toBe(404);
      expect((await reviewer.fetch(`/api/v1/designs/${id}/revisions/9/${path}`)).status).toBe(404);
    }
  });
});

describe("review and sign-off", () => {
  let id: string;
  beforeAll(async () => {
    id = await designWithRevision("Test: review flow");
  });

  it("an engineer requests a review; the reviewer is e-mailed a link to the review page", async () => {
    const before = new Date();
    const res = await act(engineer, id, 1, { intent: "request", reviewers: ids.reviewer, note: "first wiring of the hauler" });
    expect(res.status).toBe(200);
    const mail = await db.query<{ subject: string; text_body: string; recipients: string }>(
      "SELECT subject, text_body, recipients FROM mail_message WHERE received_at >= $1 AND recipients LIKE $2 ORDER BY received_at DESC",
      [new Date(before.getTime() - 2000), `%${DEMO.reviewer}%`],
    );
    const ours = mail.rows.find((m) => m.text_body.includes(reviewUrl(id, 1)));
    expect(ours?.subject).toContain("Review requested");
    expect(await statusOnPage(reviewer, id, 1)).toBe("in-review");
  });

  it("only engineers request reviews, and only from members with the reviewer role", async () => {
    for (const c of [technician, reviewer, admin]) {
      expect((await act(c, id, 1, { intent: "request", reviewers: ids.reviewer })).status).toBe(403);
    }
    expect((await act(engineer, id, 1, { intent: "request", reviewers: ids.engineer })).status).toBe(400);
    expect((await act(engineer, id, 1, { intent: "request" })).status).toBe(400);
  });

  it("comments pin to the revision, a row (index and states) or a component; bad anchors are 400", async () => {
    expect((await act(reviewer, id, 1, { intent: "comment", anchor: "row", row: "157", body: "Why does this row drive?" })).status).toBe(
      200,
    );
    expect(
      (await act(engineer, id, 1, { intent: "comment", anchor: "component", component: "SEAT", body: "Seat switch part number?" })).status,
    ).toBe(200);
    expect((await act(technician, id, 1, { intent: "comment", anchor: "revision", body: "Loom matches." })).status).toBe(200);
    expect((await act(reviewer, id, 1, { intent: "comment", anchor: "row", row: String(ENGINE.rows), body: "x" })).status).toBe(400);
    expect((await act(reviewer, id, 1, { intent: "comment", anchor: "component", component: "NOPE", body: "x" })).status).toBe(400);
    expect((await act(reviewer, id, 1, { intent: "comment", anchor: "revision", body: "   " })).status).toBe(400);
    const rows = await db.query<{
      anchor: string;
      row_index: number | null;
      row_states: Record<string, string> | null;
      component_id: string | null;
    }>(
      "SELECT c.anchor, c.row_index, c.row_states, c.component_id FROM review_comment c JOIN design_revision r ON r.id = c.revision_id WHERE r.design_id = $1 ORDER BY c.created_at",
      [id],
    );
    expect(rows.rows.map((r) => r.anchor)).toEqual(["row", "component", "revision"]);
    expect(rows.rows[0]!.row_index).toBe(157);
    expect(rows.rows[0]!.row_states).toEqual(decodeRow(ENGINE, 157));
    expect(rows.rows[1]!.component_id).toBe("SEAT");
  });

  it("only reviewers decide: engineers, technicians and admins get 403; a decision needs a comment", async () => {
    for (const c of [engineer, technician, admin]) {
      expect((await act(c, id, 1, { intent: "decide", verdict: "approved", comment: "fine" })).status).toBe(403);
    }
    expect((await act(reviewer, id, 1, { intent: "decide", verdict: "approved", comment: "" })).status).toBe(400);
    expect((await act(reviewer, id, 1, { intent: "decide", verdict: "maybe", comment: "hmm" })).status).toBe(400);
    expect(await statusOnPage(reviewer, id, 1)).toBe("in-review");
  });

  it("approval is refused while a single fault that defeats a rule has no disposition, with a message naming each open fault", async () => {
    const faults = prove(ENGINE).singleFaults;
    expect(faults.length).toBeGreaterThan(1);
    const refused = await act(reviewer, id, 1, { intent: "decide", verdict: "approved", comment: "Looks right." });
    expect(refused.status).toBe(409);
    const text = (await refused.text()).replace(/<!-- -->/g, "");
    expect(text).toContain(`these ${faults.length} single faults have no disposition yet`);
    for (const f of faults) expect(text).toContain(`${f.component} ${f.mode.replace("-", " ")} (defeats ${f.defeats.join(", ")})`);
    // Technicians and admins record no dispositions; a fault the verdict does not list needs none; a justification is required.
    for (const c of [technician, admin]) {
      expect(
        (
          await act(c, id, 1, {
            intent: "dispose",
            component: faults[0]!.component,
            mode: faults[0]!.mode,
            disposition: "accepted",
            justification: "Monitored by the controller.",
          })
        ).status,
      ).toBe(403);
    }
    expect(
      (
        await act(engineer, id, 1, {
          intent: "dispose",
          component: "SEAT",
          mode: "stuck-open",
          disposition: "accepted",
          justification: "Not a defeating fault at all.",
        })
      ).status,
    ).toBe(400);
    expect(
      (
        await act(engineer, id, 1, {
          intent: "dispose",
          component: faults[0]!.component,
          mode: faults[0]!.mode,
          disposition: "accepted",
          justification: "",
        })
      ).status,
    ).toBe(400);
    // All but the last: still refused, naming only the last.
    for (const [k, f] of faults.slice(0, -1).entries()) {
      const who = k % 2 === 0 ? engineer : reviewer;
      const res = await act(who, id, 1, {
        intent: "dispose",
        component: f.component,
        mode: f.mode,
        disposition: k % 3 === 0 ? "fix-next-revision" : "accepted",
        justification: `Two-channel part, monitored by the controller (${k}).`,
      });
      expect(res.status).toBe(200);
    }
    const last = faults.at(-1)!;
    const again = await act(reviewer, id, 1, { intent: "decide", verdict: "approved", comment: "Looks right." });
    expect(again.status).toBe(409);
    const againText = (await again.text()).replace(/<!-- -->/g, "");
    expect(againText).toContain(`this single fault has no disposition yet: ${last.component} ${last.mode.replace("-", " ")}`);
    expect(await statusOnPage(reviewer, id, 1)).toBe("in-review");
    expect(
      (
        await act(reviewer, id, 1, {
          intent: "dispose",
          component: last.component,
          mode: last.mode,
          disposition: "ruled-out",
          justification: "Forced-guided contacts: cannot weld closed.",
        })
      ).status,
    ).toBe(200);
    // Recorded with author, content hash and audit.
    const rows = await db.query<{ component: string; mode: string; author_id: string; content_hash: string }>(
      "SELECT f.component, f.mode, f.author_id, f.content_hash FROM fault_disposition f JOIN design_revision r ON r.id = f.revision_id WHERE r.design_id = $1 ORDER BY f.created_at",
      [id],
    );
    const hash = await db.query<{ content_hash: string }>("SELECT content_hash FROM design_revision WHERE design_id = $1 AND number = 1", [
      id,
    ]);
    expect(rows.rows.map((r) => `${r.component}/${r.mode}`)).toEqual(faults.map((f) => `${f.component}/${f.mode}`));
    expect(new Set(rows.rows.map((r) => r.content_hash))).toEqual(new Set([hash.rows[0]!.content_hash]));
    expect(rows.rows[0]!.author_id).toBe(ids.engineer);
    expect(rows.rows.at(-1)!.author_id).toBe(ids.reviewer);
    const audit = await db.query<{ n: number }>(
      "SELECT count(*)::int AS n FROM audit_event WHERE action = 'review.fault-disposed' AND detail->>'designId' = $1",
      [id],
    );
    expect(audit.rows[0]!.n).toBe(faults.length);
    const page = await pageText(reviewer, reviewUrl(id, 1));
    expect(page).toContain("every fault has a disposition");
    expect(page).toContain("Forced-guided contacts: cannot weld closed.");
  });

  it("changes requested, then approval: the decision records reviewer, time and the content hash; the author is e-mailed", async () => {
    expect(
      (await act(reviewer, id, 1, { intent: "decide", verdict: "changes-requested", comment: "Label the inlet switch." })).status,
    ).toBe(200);
    expect(await statusOnPage(engineer, id, 1)).toBe("changes-requested");
    // The author's home page lists the request with the reviewer's words until it is settled.
    const home = await pageText(engineer, "/w/larkspur");
    expect(home).toContain('data-testid="change-requests"');
    expect(home).toContain(`/w/larkspur/designs/${id}/revisions/1/review`);
    expect(home).toContain("Label the inlet switch.");
    expect(await pageText(reviewer, "/w/larkspur")).not.toContain(`/designs/${id}/revisions/1/review`);
    const before = new Date(Date.now() - 2000);
    expect((await act(reviewer, id, 1, { intent: "decide", verdict: "approved", comment: "Checked against the loom." })).status).toBe(200);
    expect(await statusOnPage(engineer, id, 1)).toBe("approved");
    expect(await pageText(engineer, "/w/larkspur")).not.toContain(`/w/larkspur/designs/${id}/revisions/1/review`);
    const rev = await db.query<{ content_hash: string }>("SELECT content_hash FROM design_revision WHERE design_id = $1 AND number = 1", [
      id,
    ]);
    const dec = await db.query<{ reviewer_id: string; verdict: string; content_hash: string; decided_at: Date }>(
      "SELECT d.reviewer_id, d.verdict, d.content_hash, d.decided_at FROM review_decision d JOIN design_revision r ON r.id = d.revision_id WHERE r.design_id = $1 ORDER BY d.decided_at",
      [id],
    );
    expect(dec.rows.map((d) => d.verdict)).toEqual(["changes-requested", "approved"]);
    expect(dec.rows[1]!.reviewer_id).toBe(ids.reviewer);
    expect(dec.rows[1]!.content_hash).toBe(rev.rows[0]!.content_hash);
    const mail = await db.query<{ subject: string }>(
      "SELECT subject FROM mail_message WHERE received_at >= $1 AND recipients LIKE $2 AND text_body LIKE $3",
      [before, `%${DEMO.engineer}%`, `%${reviewUrl(id, 1)}%`],
    );
    expect(mail.rows.map((m) => m.subject)).toContain("Approved: Test: review flow, revision 1");
  });

  it("a decision is immutable in the database", async () => {
    await expect(
      db.query(
        "UPDATE review_decision SET verdict = 'approved' WHERE revision_id IN (SELECT id FROM design_revision WHERE design_id = $1)",
        [id],
      ),
    ).rejects.toThrow(/immutable/);
  });

  it("a new revision does not inherit the approval, and its review shows the diff against the approved one", async () => {
    const changed = structuredClone(PROVEN) as Design & { components: Array<Record<string, unknown>> };
    const seat = changed.components.find((c) => c.id === "SEAT")!;
    seat.label = "Seat switch, sealed";
    const saved = await json(engineer, "POST", `/api/v1/designs/${id}/revisions`, {
      document: changed,
      baseRevision: 1,
      message: "sealed seat switch",
    });
    expect(saved.status).toBe(201);
    expect(await statusOnPage(reviewer, id, 2)).toBe("not-requested");
    expect(await statusOnPage(reviewer, id, 1)).toBe("approved");
    const html = await pageText(reviewer, reviewUrl(id, 2));
    expect(html).toContain("Compared with revision 1, the last approved one.");
    expect(html).toMatch(/changed<\/span> SEAT: label/);
    expect(html).toContain("No row changed its drive or the rules it violates");
    const same = await json(engineer, "POST", `/api/v1/designs/${id}/revisions`, {
      document: PROVEN,
      baseRevision: 2,
      message: "back to the approved wiring",
    });
    expect(same.status).toBe(201);
    // Same content hash as the approved revision 1, still a new revision without approval.
    expect(await statusOnPage(reviewer, id, 3)).toBe("not-requested");
  });

  it("a reviewer cannot decide on a revision they authored", async () => {
    const r1 = await db.query<{ document: unknown; verdict: unknown; content_hash: string }>(
      "SELECT document, verdict, content_hash FROM design_revision WHERE design_id = $1 AND number = 1",
      [id],
    );
    const ws = await db.query<{ id: string }>("SELECT id FROM workspace WHERE slug = $1", [WS]);
    // A revision authored by someone who is a reviewer now (roles change; the API saves only for engineers).
    await db.query(
      "INSERT INTO design_revision (id, design_id, workspace_id, number, document, verdict, content_hash, message, author_id) VALUES ($1, $2, $3, 4, $4, $5, $6, 'by the reviewer', $7)",
      [crypto.randomUUID(), id, ws.rows[0]!.id, r1.rows[0]!.document, r1.rows[0]!.verdict, r1.rows[0]!.content_hash, ids.reviewer],
    );
    expect((await act(reviewer, id, 4, { intent: "decide", verdict: "approved", comment: "mine" })).status).toBe(403);
    expect(await statusOnPage(reviewer, id, 4)).toBe("not-requested");
  });

  it("records requests, comments and decisions in the workspace's audit log", async () => {
    const audit = await db.query<{ action: string }>("SELECT action FROM audit_event WHERE detail->>'designId' = $1 ORDER BY at", [id]);
    const actions = audit.rows.map((r) => r.action);
    for (const a of ["review.requested", "review.commented", "review.changes-requested", "review.approved"]) expect(actions).toContain(a);
  });

  it("another workspace sees none of it: 404 for pages, actions, report and PDF", async () => {
    expect((await outsider.fetch(reviewUrl(id, 1))).status).toBe(404);
    expect((await act(outsider, id, 1, { intent: "comment", anchor: "revision", body: "hello" })).status).toBe(404);
    for (const page of ["table", "report", "report.pdf"]) {
      expect((await outsider.fetch(`/w/${WS}/designs/${id}/revisions/1/${page}`)).status).toBe(404);
    }
    expect((await anonymous.fetch(`/w/${WS}/designs/${id}/revisions/1/report.pdf`)).status).toBe(302);
  });

  it("the designs list and the inbox show the review status", async () => {
    const list = await pageText(engineer, `/w/${WS}/designs`);
    expect(list).toContain('data-review-status="not-requested"');
    const inbox = await pageText(reviewer, `/w/${WS}/reviews`);
    expect(inbox).toContain("Test: review flow, revision 1");
  });

  it("the report shows the sign-off with the signed content hash", async () => {
    const html = await pageText(technician, `/w/${WS}/designs/${id}/revisions/1/report?size=letter`);
    expect(html).toContain("size: Letter");
    expect(html).toMatch(/data-testid="report-status"[^>]*>Approved</);
    expect(html).toContain("Checked against the loom.");
    // Haybarn's drawing is too wide for readable labels on paper: the wiring list stands for it (decision 165).
    expect(html).toContain('data-testid="diagram-left-out"');
    expect(html).toContain('data-testid="wiring-list"');
    // Groups, rules with reasons, dispositions, comments; the 192-row table fits its page budget.
    expect(html).toContain("What the table says, in groups");
    expect(html).toContain("Rules with their reasons");
    expect(html).toContain("Forced-guided contacts: cannot weld closed.");
    expect(html).not.toContain("No disposition recorded.");
    expect(html).toContain("Seat switch part number?");
    expect(html).toContain('data-testid="truth-table"');
    expect(html).not.toContain('data-testid="report-csv-url"');
  });

  it("compares any two revisions: every changed field before and after, and the verdict's differences", async () => {
    const html = await pageText(reviewer, `${reviewUrl(id, 3)}?compare=2`);
    expect(html).toContain("Compared with revision 2.");
    expect(html).toContain("&quot;Seat switch, sealed&quot;</code> → <code");
    expect(html).toContain("The verdict is the same.");
    const report = await pageText(reviewer, `/w/${WS}/designs/${id}/revisions/2/report`);
    expect(report).toContain("Changes since revision 1");
    expect(report).toMatch(/Component SEAT, label: &quot;[^&]+&quot; → &quot;Seat switch, sealed&quot;/);
  });

  it("the report compares with the revision the reviewer chose: its links, the page and the PDF say which", async () => {
    // Revisions of this design: 1 approved (the Haybarn wiring), 2 relabels SEAT, 3 is the wiring of 1 again.
    const seatLabel = (PROVEN.components.find((c) => c.id === "SEAT") as { label: string }).label;
    const quote = (s: string) => s.replace(/"/g, "&quot;");
    const review = await pageText(reviewer, `${reviewUrl(id, 3)}?compare=2`);
    // The review page's report link carries the choice; without a choice it carries none.
    expect(review).toContain(`/revisions/3/report?compare=2"`);
    expect(await pageText(reviewer, reviewUrl(id, 3))).toMatch(/\/revisions\/3\/report"/);
    const chosen = await pageText(reviewer, `/w/${WS}/designs/${id}/revisions/3/report?compare=2`);
    expect(chosen).toContain("Changes since revision 2");
    expect(chosen).toContain("Compared with revision 2. The reviewer chose this revision on the review page.");
    // Revision 3 undoes 2's relabelling: the change printed is 2's label back to 1's.
    expect(chosen).toContain(
      `Component SEAT, label: ${quote(JSON.stringify("Seat switch, sealed"))} → ${quote(JSON.stringify(seatLabel))}`,
    );
    // Its toolbar keeps the choice: the other paper, the PDF and the way back to the review.
    expect(chosen).toContain(`/revisions/3/report?size=letter&amp;compare=2"`);
    expect(chosen).toContain(`/revisions/3/report.pdf?size=a4&amp;compare=2"`);
    expect(chosen).toContain(`/revisions/3/review?compare=2"`);
    // Without a choice the report compares with the last approved revision, whose wiring 3 repeats.
    const plain = await pageText(reviewer, `/w/${WS}/designs/${id}/revisions/3/report`);
    expect(plain).toContain("Compared with revision 1, the last approved one.");
    expect(plain).not.toContain("Seat switch, sealed");
    // A later revision can be chosen too.
    const later = await pageText(reviewer, `/w/${WS}/designs/${id}/revisions/2/report?compare=3`);
    expect(later).toContain("Changes compared with revision 3");
    // The choice is checked, for the page and the PDF alike: 400 naming the field, never another comparison.
    for (const [query, says] of [
      ["compare=two", "compare: give a revision number."],
      ["compare=1.5", "compare: give a whole revision number."],
      ["compare=0", "compare: revisions are numbered from 1."],
      ["compare=3", "compare: choose a revision other than 3"],
      ["compare=99", "compare: this design has no revision 99."],
      ["size=a3", "size: choose a4 or letter."],
    ]) {
      for (const page of ["report", "report.pdf"]) {
        const res = await reviewer.fetch(`/w/${WS}/designs/${id}/revisions/3/${page}?${query}`);
        expect(res.status, `${page}?${query}`).toBe(400);
        expect((await res.text()).replace(/<!-- -->/g, ""), `${page}?${query}`).toContain(says);
      }
    }
    // The PDF prints the chosen comparison (read back with poppler's pdftotext, not our code).
    const pdf = await reviewer.fetch(`/w/${WS}/designs/${id}/revisions/3/report.pdf?compare=2`);
    expect(pdf.status).toBe(200);
    expect(pdf.headers.get("content-disposition")).toContain("-r3-vs-r2-report-a4.pdf");
    const text = execFileSync("pdftotext", ["-", "-"], { input: Buffer.from(await pdf.arrayBuffer()), encoding: "utf8" }).replace(
      /\s+/g,
      " ",
    );
    expect(text).toContain("Changes since revision 2");
    expect(text).toContain("Compared with revision 2. The reviewer chose this revision on the review page.");
  }, 60_000);

  it("the reviewer chooses both revisions on the review page: another revision to review opens its own page", async () => {
    const html = await pageText(reviewer, reviewUrl(id, 3));
    expect(html).toMatch(/<select[^>]*name="revision"/);
    expect(html).toMatch(/<select[^>]*name="compare"/);
    const res = await reviewer.fetch(`${reviewUrl(id, 3)}?revision=2&compare=3`);
    expect(res.status).toBe(302);
    expect(res.headers.get("location")).toBe(`${reviewUrl(id, 2)}?compare=3`);
    const page = await pageText(reviewer, `${reviewUrl(id, 2)}?compare=3`);
    expect(page).toContain("Review of revision 2");
    expect(page).toContain("Compared with revision 3.");
    // The revision in the URL chosen again is this page, with the comparison chosen.
    const same = await reviewer.fetch(`${reviewUrl(id, 3)}?revision=3&compare=2`);
    expect(same.status).toBe(200);
    expect((await same.text()).replace(/<!-- -->/g, "")).toContain("Compared with revision 2.");
    // A revision the design does not have is no redirect.
    expect((await reviewer.fetch(`${reviewUrl(id, 3)}?revision=99`)).status).toBe(200);
  });
});
