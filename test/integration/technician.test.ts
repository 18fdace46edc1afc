// The technician's side against the running app: releasing only approved revisions, who may run
// and view bench tests, results saved per tap, a failed step flagging the vehicle and mailing the
// revision's author, photos on a step, the signed record, and nothing visible across workspaces.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";
import { DEMO, formBody, signIn, type Client } from "../support/http";
import { createOutsider } from "../support/outsider";

// A 1×1 PNG (PNG signature per ISO/IEC 15948:2004, 5.2).
const PNG = Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAQAAAC1HAwCAAAAC0lEQVR42mNkYAAAAAYAAjCB0C8AAAAASUVORK5CYII=", "base64");

let db: pg.Client;
let workspaceId: string;
let hauler: { id: string; name: string };
let mower: { id: string; revisionId: string };
let technician: Client;
let engineer: Client;
let reviewer: Client;

const vehiclePath = (id: string) => `/w/larkspur/vehicles/${id}`;
const runPath = (id: string) => `/w/larkspur/bench-tests/${id}`;

/** Starts a run on the hauler as the technician; returns its id. */
async function startRun(): Promise<string> {
  const res = await technician.fetch(vehiclePath(hauler.id), formBody({ intent: "start-bench-run" }));
  expect(res.status).toBe(302);
  const id = (res.headers.get("location") ?? "").split("/bench-tests/")[1];
  expect(id).toMatch(/^[0-9a-f-]{36}$/);
  return id;
}

async function record(c: Client, runId: string, values: Record<string, string>) {
  return c.fetch(runPath(runId), formBody(values));
}

async function stepsOf(runId: string) {
  const r = await db.query("SELECT n, outcome, note FROM bench_step_result WHERE run_id = $1 ORDER BY n", [runId]);
  return r.rows as Array<{ n: number; outcome: string | null; note: string }>;
}

/** Waits for the SMTP sink to store a mail to `address` whose subject contains `subject`. */
async function mailTo(address: string, subject: string, since: Date): Promise<{ subject: string; text_body: string; attachments: string }> {
  for (let i = 0; i < 50; i++) {
    const r = await db.query(
      "SELECT subject, text_body, attachments FROM mail_message WHERE recipients LIKE $1 AND subject LIKE $2 AND received_at >= $3 ORDER BY received_at DESC LIMIT 1",
      [`%${address}%`, `%${subject}%`, since],
    );
    if (r.rows[0]) return r.rows[0];
    await new Promise((res) => setTimeout(res, 100));
  }
  throw new Error(`no mail to ${address} about ${subject}`);
}

beforeAll(async () => {
  db = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await db.connect();
  const ws = await db.query("SELECT id FROM workspace WHERE slug = 'larkspur'");
  workspaceId = ws.rows[0].id;
  const v = await db.query("SELECT id, name FROM vehicle WHERE workspace_id = $1 AND name = 'Haybarn campus hauler #3'", [workspaceId]);
  hauler = v.rows[0];
  // The demo seed approves revision 1 of the hauler's design and releases it to the hauler.
  const rel = await db.query("SELECT count(*)::int AS n FROM vehicle_release WHERE vehicle_id = $1", [hauler.id]);
  expect(rel.rows[0].n, "the demo seed releases a revision to the hauler").toBeGreaterThan(0);
  // A revision of this workspace that no reviewer approved, to try releasing to the mower.
  const m = await db.query(
    `SELECT v.id, r.id AS revision_id FROM vehicle v, design_revision r
     WHERE v.workspace_id = $1 AND v.name = 'Meadowline deck mower M-11' AND r.workspace_id = $1
       AND NOT EXISTS (SELECT 1 FROM review_decision d WHERE d.revision_id = r.id AND d.verdict = 'approved')
     ORDER BY r.created_at LIMIT 1`,
    [workspaceId],
  );
  mower = { id: m.rows[0].id, revisionId: m.rows[0].revision_id };
  [technician, engineer, reviewer] = await Promise.all([signIn(DEMO.technician), signIn(DEMO.engineer), signIn(DEMO.reviewer)]);
});

afterAll(async () => {
  await db.end();
});

describe("releases", () => {
  it("refuses to release a revision no reviewer approved, and keeps no release row", async () => {
    const approved = await db.query("SELECT count(*)::int AS n FROM review_decision WHERE revision_id = $1 AND verdict = 'approved'", [
      mower.revisionId,
    ]);
    expect(approved.rows[0].n).toBe(0);
    const before = await db.query("SELECT count(*)::int AS n FROM vehicle_release WHERE vehicle_id = $1", [mower.id]);
    const res = await engineer.fetch(vehiclePath(mower.id), formBody({ intent: "release", revisionId: mower.revisionId, note: "" }));
    expect(res.status).toBe(409);
    expect(await res.text()).toContain("has not been approved by a reviewer; only an approved revision can be released");
    const after = await db.query("SELECT count(*)::int AS n FROM vehicle_release WHERE vehicle_id = $1", [mower.id]);
    expect(after.rows[0].n).toBe(before.rows[0].n);
  });

  it("releases an approved revision and keeps the history of releases", async () => {
    const rev = await db.query("SELECT revision_id FROM vehicle_release WHERE vehicle_id = $1 ORDER BY at DESC LIMIT 1", [hauler.id]);
    const before = await db.query("SELECT count(*)::int AS n FROM vehicle_release WHERE vehicle_id = $1", [hauler.id]);
    const res = await engineer.fetch(
      vehiclePath(hauler.id),
      formBody({ intent: "release", revisionId: rev.rows[0].revision_id, note: "re-released after loom check" }),
    );
    expect(res.status).toBe(200);
    const rows = await db.query("SELECT note FROM vehicle_release WHERE vehicle_id = $1 ORDER BY at DESC", [hauler.id]);
    expect(rows.rows.length).toBe(before.rows[0].n + 1);
    expect(rows.rows[0].note).toBe("re-released after loom check");
  });

  it("names the missing revision field, and only engineers and admins may release", async () => {
    const empty = await engineer.fetch(vehiclePath(hauler.id), formBody({ intent: "release", revisionId: "" }));
    expect(empty.status).toBe(400);
    expect(await empty.text()).toContain("Choose a revision to release.");
    expect((await technician.fetch(vehiclePath(hauler.id), formBody({ intent: "release", revisionId: mower.revisionId }))).status).toBe(
      403,
    );
    expect((await reviewer.fetch(vehiclePath(hauler.id), formBody({ intent: "release", revisionId: mower.revisionId }))).status).toBe(403);
  });

  it("the database refuses to rewrite a release", async () => {
    await expect(db.query("UPDATE vehicle_release SET note = 'rewritten' WHERE vehicle_id = $1", [hauler.id])).rejects.toThrow(/history/);
  });
});

describe("vehicle details", () => {
  it("a technician edits the details; a blank name is refused with the field named", async () => {
    const bad = await technician.fetch(vehiclePath(hauler.id), formBody({ intent: "edit", name: " ", serial: "x" }));
    expect(bad.status).toBe(400);
    expect(await bad.text()).toContain("Enter a name.");
    const current = await db.query("SELECT name, serial, model, controller_description, notes FROM vehicle WHERE id = $1", [hauler.id]);
    const c = current.rows[0];
    const notes = `${c.notes.replace(/ \[checked .*\]$/, "")} [checked ${Date.now()}]`;
    const ok = await technician.fetch(
      vehiclePath(hauler.id),
      formBody({ intent: "edit", name: c.name, serial: c.serial, model: c.model, controllerDescription: c.controller_description, notes }),
    );
    expect(ok.status).toBe(200);
    expect((await db.query("SELECT notes FROM vehicle WHERE id = $1", [hauler.id])).rows[0].notes).toBe(notes);
    expect((await reviewer.fetch(vehiclePath(hauler.id), formBody({ intent: "edit", name: "Renamed" }))).status).toBe(403);
  });
});

describe("bench runs", () => {
  let runId: string;

  beforeAll(async () => {
    runId = await startRun();
  });

  it("only technicians start and record runs; engineers and reviewers may view them", async () => {
    expect((await engineer.fetch(vehiclePath(hauler.id), formBody({ intent: "start-bench-run" }))).status).toBe(403);
    expect((await reviewer.fetch(vehiclePath(hauler.id), formBody({ intent: "start-bench-run" }))).status).toBe(403);
    expect((await record(engineer, runId, { intent: "outcome", step: "1", outcome: "pass" })).status).toBe(403);
    for (const c of [engineer, reviewer, technician]) {
      const page = await c.fetch(runPath(runId));
      expect(page.status).toBe(200);
      expect(await page.text()).toContain('data-step="1"');
    }
  });

  it("each tap is saved at once: a reload shows the same outcomes and notes", async () => {
    expect((await record(technician, runId, { intent: "outcome", step: "1", outcome: "pass" })).status).toBe(200);
    expect((await record(technician, runId, { intent: "outcome", step: "3", outcome: "skip" })).status).toBe(200);
    expect(
      (await record(technician, runId, { intent: "note", step: "3", note: "Pedal switch not reachable with the seat fitted" })).status,
    ).toBe(200);
    const steps = await stepsOf(runId);
    expect(steps[0]).toMatchObject({ n: 1, outcome: "pass" });
    expect(steps[2]).toMatchObject({ n: 3, outcome: "skip", note: "Pedal switch not reachable with the seat fitted" });
    const html = await (await technician.fetch(runPath(runId))).text();
    expect(html).toMatch(/data-step="1" data-outcome="pass"/);
    expect(html).toMatch(/data-step="3" data-outcome="skip"/);
    expect(html).toContain("Pedal switch not reachable with the seat fitted");
    // Tapping the same outcome again clears it (an empty outcome).
    expect((await record(technician, runId, { intent: "outcome", step: "3", outcome: "" })).status).toBe(200);
    expect((await stepsOf(runId))[2].outcome).toBeNull();
  });

  it("refuses an unknown step or outcome with the field named", async () => {
    const noStep = await record(technician, runId, { intent: "outcome", step: "999", outcome: "pass" });
    expect(noStep.status).toBe(400);
    expect(await noStep.text()).toContain("There is no step 999 in this run");
    const badOutcome = await record(technician, runId, { intent: "outcome", step: "1", outcome: "maybe" });
    expect(badOutcome.status).toBe(400);
    expect(await badOutcome.text()).toContain("Choose pass, fail or skip.");
  });

  it("a failed step flags the vehicle and, once the technician moves on, mails the revision's author a link to the run", async () => {
    const since = new Date(Date.now() - 1000);
    expect((await record(technician, runId, { intent: "outcome", step: "2", outcome: "fail" })).status).toBe(200);
    expect((await record(technician, runId, { intent: "outcome", step: "4", outcome: "pass" })).status).toBe(200);
    const flags = await db.query("SELECT reason, step_number FROM vehicle_attention WHERE bench_run_id = $1 AND cleared_at IS NULL", [
      runId,
    ]);
    expect(flags.rows).toEqual([{ reason: "Bench step 2 failed", step_number: 2 }]);
    const author = await db.query(
      `SELECT u.email FROM bench_run b JOIN design_revision r ON r.id = b.revision_id JOIN "user" u ON u.id = r.author_id WHERE b.id = $1`,
      [runId],
    );
    const mail = await mailTo(author.rows[0].email, `Bench step 2 failed on ${hauler.name}`, since);
    expect(mail.text_body).toContain(`/w/larkspur/bench-tests/${runId}#step-2`);
    const page = await (await engineer.fetch(vehiclePath(hauler.id))).text();
    expect(page).toContain('data-testid="needs-attention"');
    // The same step failing again does not raise a second flag.
    await record(technician, runId, { intent: "outcome", step: "2", outcome: "pass" });
    await record(technician, runId, { intent: "outcome", step: "2", outcome: "fail" });
    const again = await db.query("SELECT count(*)::int AS n FROM vehicle_attention WHERE bench_run_id = $1 AND cleared_at IS NULL", [
      runId,
    ]);
    expect(again.rows[0].n).toBe(1);
  });

  it("stores a photo on a step and shows it with the step", async () => {
    const form = new FormData();
    form.set("intent", "photo");
    form.set("step", "2");
    form.set("file", new File([PNG as BlobPart], "brake-switch.png", { type: "image/png" }));
    const res = await technician.fetch(runPath(runId), { method: "POST", body: form });
    expect(res.status).toBe(200);
    const row = await db.query(
      `SELECT u.id, u.subject_kind FROM upload u JOIN bench_step_result s ON s.id = u.subject_id WHERE s.run_id = $1 AND s.n = 2`,
      [runId],
    );
    expect(row.rows).toHaveLength(1);
    expect(row.rows[0].subject_kind).toBe("bench-step");
    expect(await (await technician.fetch(runPath(runId))).text()).toContain(`/w/larkspur/files/${row.rows[0].id}`);
    const file = await engineer.fetch(`/w/larkspur/files/${row.rows[0].id}`);
    expect(file.status).toBe(200);
    expect(Buffer.from(await file.arrayBuffer()).equals(PNG)).toBe(true);
    // Not a photo: refused by content.
    const bad = new FormData();
    bad.set("intent", "photo");
    bad.set("step", "2");
    bad.set("file", new File([Buffer.from("not a photo")], "x.png", { type: "image/png" }));
    expect((await technician.fetch(runPath(runId), { method: "POST", body: bad })).status).toBe(415);
  });

  it("completes only when every step has a result, then signs and freezes the record", async () => {
    const early = await record(technician, runId, { intent: "complete" });
    expect(early.status).toBe(409);
    expect(await early.text()).toContain("Mark every step before completing");
    const steps = await stepsOf(runId);
    for (const s of steps) if (!s.outcome) await record(technician, runId, { intent: "outcome", step: String(s.n), outcome: "pass" });
    const done = await record(technician, runId, { intent: "complete" });
    expect(done.status).toBe(200);
    const run = await db.query("SELECT status, completed_by, results_hash, revision_hash FROM bench_run WHERE id = $1", [runId]);
    expect(run.rows[0].status).toBe("completed");
    expect(run.rows[0].results_hash).toMatch(/^[0-9a-f]{64}$/);
    const html = await (await engineer.fetch(runPath(runId))).text();
    expect(html).toContain(run.rows[0].results_hash);
    expect(html).toContain(run.rows[0].revision_hash);
    expect(html).toContain("the record is intact");
    // Frozen: the app refuses, and so does the database.
    const late = await record(technician, runId, { intent: "outcome", step: "1", outcome: "fail" });
    expect(late.status).toBe(409);
    await expect(db.query("UPDATE bench_step_result SET note = 'edited' WHERE run_id = $1 AND n = 1", [runId])).rejects.toThrow(
      /completed/,
    );
    // The list shows it as completed, with its failure.
    const list = await (await engineer.fetch("/w/larkspur/bench-tests?status=failures")).text();
    expect(list).toContain(`/w/larkspur/bench-tests/${runId}`);
  });

  it("clearing the flag needs a note and then takes the vehicle off the attention list", async () => {
    const noNote = await technician.fetch(vehiclePath(hauler.id), formBody({ intent: "clear-attention", note: "" }));
    expect(noNote.status).toBe(400);
    expect(await noNote.text()).toContain("Say what was done about it.");
    expect(
      (await technician.fetch(vehiclePath(hauler.id), formBody({ intent: "clear-attention", note: "Brake switch replaced" }))).status,
    ).toBe(200);
    const open = await db.query("SELECT count(*)::int AS n FROM vehicle_attention WHERE vehicle_id = $1 AND cleared_at IS NULL", [
      hauler.id,
    ]);
    expect(open.rows[0].n).toBe(0);
  });
});

describe("the failure e-mail", () => {
  // One mail per failed step, sent when the technician moves on (so it carries the note and photos),
  // never twice for a step; what is still unreported at completion goes in one digest (decision 136).
  it("five Fail/Pass toggles give one mail, with the note, the photo and the isolation caution; the rest come in the digest", async () => {
    const runId = await startRun();
    const since = new Date(Date.now() - 1000);
    const author = (
      await db.query(
        `SELECT u.email FROM bench_run b JOIN design_revision r ON r.id = b.revision_id JOIN "user" u ON u.id = r.author_id WHERE b.id = $1`,
        [runId],
      )
    ).rows[0].email as string;
    const mailsOfRun = async () =>
      (
        await db.query(
          "SELECT subject, text_body, attachments FROM mail_message WHERE recipients LIKE $1 AND received_at >= $2 AND text_body LIKE $3 ORDER BY received_at",
          [`%${author}%`, since, `%${runId}%`],
        )
      ).rows as Array<{ subject: string; text_body: string; attachments: string }>;
    for (const outcome of ["fail", "pass", "fail", "pass", "fail"]) {
      expect((await record(technician, runId, { intent: "outcome", step: "2", outcome })).status).toBe(200);
    }
    expect((await record(technician, runId, { intent: "note", step: "2", note: "Drive ran with the key off" })).status).toBe(200);
    const form = new FormData();
    form.set("intent", "photo");
    form.set("step", "2");
    form.set("file", new File([PNG as BlobPart], "key-switch.png", { type: "image/png" }));
    expect((await technician.fetch(runPath(runId), { method: "POST", body: form })).status).toBe(200);
    // Moving on sends it.
    expect((await record(technician, runId, { intent: "outcome", step: "1", outcome: "pass" })).status).toBe(200);
    const mail = await mailTo(author, `Bench step 2 failed on ${hauler.name}`, since);
    // The author's home page lists the failed step, not the technician's.
    const home = await (await engineer.fetch("/w/larkspur")).text();
    expect(home).toContain('data-testid="failed-steps"');
    expect(home).toContain(`/w/larkspur/bench-tests/${runId}#step-2`);
    expect(await (await technician.fetch("/w/larkspur")).text()).not.toContain(`/bench-tests/${runId}#step-2`);
    expect(mail.text_body).toContain("The technician's note: Drive ran with the key off");
    expect(mail.text_body).toContain("Isolate the traction pack first");
    expect(mail.attachments).toMatch(/^key-switch\.png \(image\/png, \d+ bytes\)$/);
    // More toggles and more steps: the step is never mailed again.
    await record(technician, runId, { intent: "outcome", step: "2", outcome: "pass" });
    await record(technician, runId, { intent: "outcome", step: "2", outcome: "fail" });
    await record(technician, runId, { intent: "outcome", step: "3", outcome: "pass" });
    expect((await record(technician, runId, { intent: "mail-step", step: "2" })).status).toBe(200);
    // A step failed last goes in the digest at completion.
    const steps = await stepsOf(runId);
    const last = steps[steps.length - 1].n;
    for (const st of steps)
      if (!st.outcome) await record(technician, runId, { intent: "outcome", step: String(st.n), outcome: st.n === last ? "fail" : "pass" });
    expect((await record(technician, runId, { intent: "complete" })).status).toBe(200);
    const digest = await mailTo(author, `Bench test of ${hauler.name} completed: 1 failed step not yet reported`, since);
    expect(digest.text_body).toContain(`Step ${last}`);
    expect(digest.text_body).not.toContain("Step 2:");
    expect(digest.text_body).toContain("Isolate the traction pack first");
    // The digest went after the rest, so every mail of this run is in by now.
    const all = await mailsOfRun();
    expect(all.filter((m) => m.subject.startsWith("Bench step 2 failed"))).toHaveLength(1);
    expect(all).toHaveLength(2);
    const mailed = await db.query("SELECT n FROM bench_step_result WHERE run_id = $1 AND failure_mailed_at IS NOT NULL ORDER BY n", [
      runId,
    ]);
    expect(mailed.rows.map((r) => r.n)).toEqual([2, last]);
  });

  it("the bench CSV starts with the isolation caution and lists every step with its result", async () => {
    const runId = await startRun();
    await record(technician, runId, { intent: "outcome", step: "1", outcome: "fail" });
    await record(technician, runId, { intent: "note", step: "1", note: "=cmd|' /C calc'!A0" });
    const res = await engineer.fetch(`${runPath(runId)}/results.csv`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toContain("text/csv");
    const text = await res.text();
    const lines = text.split("\n");
    expect(lines[0]).toMatch(/^Caution,"?Isolate the traction pack first/);
    expect(lines[2]).toBe(
      "step,kind,instruction,conditions,expected drive,expected live,expected dead,result,note,photos,recorded by,recorded at",
    );
    expect(lines[3]).toMatch(/^1,/);
    expect(lines[3]).toContain(",fail,");
    // OWASP CSV Injection: a note that starts a formula is written as text.
    expect(lines[3]).toContain(`"'=cmd|' /C calc'!A0"`);
    const outsider = await createOutsider();
    expect((await outsider.client.fetch(`${runPath(runId)}/results.csv`)).status).toBe(404);
  });
});

describe("across workspaces", () => {
  it("another workspace's member gets 404 for the vehicle, its diagnosis and its runs", async () => {
    const runId = await startRun();
    const outsider = await createOutsider();
    for (const path of [vehiclePath(hauler.id), `${vehiclePath(hauler.id)}/why`, runPath(runId)]) {
      expect((await outsider.client.fetch(path)).status).toBe(404);
      expect((await outsider.client.fetch(path.replace("/w/larkspur/", `/w/${outsider.slug}/`))).status).toBe(404);
    }
    // The outsider is an admin of their own workspace: no bench-test role there, and the run is not theirs either way.
    const post = await outsider.client.fetch(
      runPath(runId).replace("/w/larkspur/", `/w/${outsider.slug}/`),
      formBody({ intent: "outcome", step: "1", outcome: "fail" }),
    );
    expect([403, 404]).toContain(post.status);
    expect((await stepsOf(runId))[0].outcome).toBeNull();
  });
});
