// Issue 11: text no form or API field may store (NUL, an unpaired surrogate, 1 MB, right-to-left
// override) posted into every text field of every form action and API write. Every answer is 4xx naming
// the field (never a 5xx), and the database is exactly as before. Path ids with %00 answer 404.
// Which writes exist is read from the app itself (app/routes.ts, each action's intents, the API's
// endpoint table), so a new form or endpoint without a target here fails the coverage test below.
import { readFileSync } from "node:fs";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import routes from "../../app/routes";
import { ENDPOINTS, endpointOf } from "../../app/api/endpoints";
import { recordToForm, validateRecord } from "../../app/controller-record";
import { compileDesign, decodeRow, type Design } from "../../app/engine";
import { exampleRecord } from "../unit/controller-record/fixtures";
import { client, DEMO, signIn, type Client } from "../support/http";

const HOSTILE: Array<[string, string]> = [
  ["NUL", "before\u0000after"],
  ["an unpaired surrogate", "before\ud800after"],
  ["a 1 MB string", "x".repeat(1_000_000)],
  // Over every field's own limit but under the API's 64 KB body limit, so the field is named (1 MB gets 413).
  ["10,000 characters", "y".repeat(10_000)],
  ["a right-to-left override", "invoice\u202Efdp.exe"],
];
const ONE_MB = HOSTILE[2]![1];

// A 1×1 PNG (PNG signature per ISO/IEC 15948:2004, 5.2).
const PNG = Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAQAAAC1HAwCAAAAC0lEQVR42mNkYAAAAAYAAjCB0C8AAAAASUVORK5CYII=", "base64");

let db: pg.Client;
let admin: Client, engineer: Client, technician: Client, reviewer: Client;
const ids: Record<string, string> = {};
let fault: { component: string; mode: string };
// The Haybarn demo design's first row, for the diagnosis request (the seed saves this file as revision 1).
const HAYBARN = JSON.parse(
  readFileSync(new URL("../../drizzle/demo-designs/haybarn-campus-hauler.json", import.meta.url), "utf8"),
) as Design;
const diagnosisStates = decodeRow(compileDesign(HAYBARN), 0);
let revisionDocument: Design;
let latestNumber: number;
let recordVersion: number;

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
  /** multipart: a photo upload; the field "filename" is the uploaded file's name. */
  kind: "form" | "json" | "multipart";
  base: () => Record<string, unknown>;
  /** A dotted field sets a nested key of a JSON body (record.controller.description). */
  fields: string[];
  /**
   * Where the answer names a field that has no control of its own marked invalid (hidden ids, a
   * file's name, better-auth's message): the text that says it. Otherwise a page answer must mark the
   * control named after the field aria-invalid, and an API answer must list the field in error.fields.
   */
  shows?: Record<string, RegExp>;
  /** Fields a refusal never names, each with the reason (the answer is still 4xx and nothing changes). */
  unnamed?: Record<string, string>;
};

const form = (
  name: string,
  as: () => Client,
  path: () => string,
  base: () => Record<string, unknown>,
  fields: string[],
  shows?: Record<string, RegExp>,
  unnamed?: Record<string, string>,
): Target => ({ name, as, method: "POST", path, kind: "form", base, fields, shows, unnamed });
const json = (
  name: string,
  method: string,
  as: () => Client,
  path: () => string,
  base: () => Record<string, unknown>,
  fields: string[],
  shows?: Record<string, RegExp>,
): Target => ({ name, as, method, path, kind: "json", base, fields, shows });
const upload = (
  name: string,
  as: () => Client,
  path: () => string,
  base: () => Record<string, unknown>,
  fields: string[],
  shows?: Record<string, RegExp>,
): Target => ({ name, as, method: "POST", path, kind: "multipart", base, fields, shows });

const vehicleFields = ["name", "serial", "model", "controllerDescription", "notes"];
const vehicleBase = () => ({ name: "Spare tug", serial: "T-1", model: "Tug", controllerDescription: "48 V", notes: "kept in bay 2" });
const reviewPath = () => `/w/larkspur/designs/${ids.design}/revisions/1/review`;
const faultReviewPath = () => `/w/larkspur/designs/${ids.faultDesign}/revisions/${ids.faultNumber}/review`;
const runPath = () => `/w/larkspur/bench-tests/${ids.run}`;
const vehiclePath = () => `/w/larkspur/vehicles/${ids.vehicle}`;
/** What the pages say when a text field refuses a value (app/lib/text.ts, and each field's length limit). */
const TEXT_REFUSED = /Remove the NUL character|Remove the broken character|Remove the text-direction override|at most [\d,]+ characters/;
/** The bench-run page answers with its message beside the step (or above the steps). */
const benchShows = { step: /Name the step|Steps start at 1|There is no step/, intent: /Unknown action/, note: TEXT_REFUSED };
const UNKNOWN_ACTION = /Unknown action/;

// The controller settings form: every field it shows but the lockout checkboxes (see NOT_TEXT), read from
// the form's own flattening so a field added to the form is probed too.
const recordFormFields = (): Record<string, string> => {
  const valid = validateRecord(exampleRecord());
  if (!valid.ok) throw new Error("the example record is not valid");
  const out = recordToForm(valid.record);
  for (const k of Object.keys(out)) if (k.startsWith("settings.lockouts.")) delete out[k];
  return out;
};
const recordForm = (): Record<string, string> => ({ ...recordFormFields(), baseVersion: String(recordVersion) });
const RECORD_FORM_FIELDS = ["baseVersion", ...Object.keys(recordFormFields())];
// The record as JSON: its text fields. Keys the record does not know are kept as sent, like a design
// document's text: NUL and unpaired surrogates are refused there too (storableJsonProblem), the rest is the body's 64 KB.
const RECORD_JSON_FIELDS = ["record.controller.description", "record.pack.chemistry", "record.settings.throttle.sensor"];

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
    undefined,
    { next: "where to go after signing in: anything but a same-origin path becomes / (issue 11), so it never refuses a sign-in" },
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
    { token: /reset link is no longer valid/ },
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
    { id: /No such key/ },
  ),
  form(
    "invite",
    () => admin,
    () => "/w/larkspur/settings",
    () => ({ intent: "invite", email: "invitee@example.org", role: "engineer" }),
    ["email", "role", "intent"],
    { intent: UNKNOWN_ACTION },
  ),
  form(
    "change role",
    () => admin,
    () => "/w/larkspur/settings",
    () => ({ intent: "change-role", memberId: ids.reviewerMember, role: "reviewer" }),
    ["memberId", "role"],
    { memberId: /No such member/, role: /Choose a role/ },
  ),
  form(
    "remove member",
    () => admin,
    () => "/w/larkspur/settings",
    () => ({ intent: "remove", id: "none" }),
    ["id"],
    { id: /No such member/ },
  ),
  form(
    "withdraw invitation",
    () => admin,
    () => "/w/larkspur/settings",
    () => ({ intent: "revoke", id: "none" }),
    ["id"],
    { id: /No such open invitation/ },
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
    vehiclePath,
    () => ({ intent: "edit", ...vehicleBase() }),
    [...vehicleFields, "intent"],
    {
      intent: UNKNOWN_ACTION,
    },
  ),
  form(
    "release",
    () => admin,
    vehiclePath,
    () => ({ intent: "release", revisionId: ids.revision, note: "ok", override: "" }),
    ["revisionId", "note", "override"],
  ),
  form(
    "clear attention",
    () => admin,
    vehiclePath,
    () => ({ intent: "clear-attention", note: "fixed" }),
    ["note"],
  ),
  upload(
    "vehicle photo",
    () => technician,
    vehiclePath,
    () => ({ intent: "upload-photo", filename: "stand-switch.png" }),
    ["filename", "intent"],
    { filename: /Rename the file/, intent: UNKNOWN_ACTION },
  ),
  form(
    "controller settings",
    () => technician,
    () => `${vehiclePath()}/controller`,
    recordForm,
    RECORD_FORM_FIELDS,
    // Radio buttons: the message stands under the group.
    { baseVersion: /reload the page/, "settings.brakeCutsDrive": /Must be true or false/ },
  ),
  form(
    "new design",
    () => engineer,
    () => "/w/larkspur/designs/new",
    () => ({ name: "Fresh design", vehicleId: "", start: "blank" }),
    ["name", "vehicleId", "start"],
    { start: /Choose how the design starts/ },
  ),
  form(
    "review request",
    () => engineer,
    reviewPath,
    () => ({ intent: "request", reviewers: ids.reviewerUser, note: "please" }),
    ["reviewers", "note"],
    // Checkboxes: the message stands under the group.
    { reviewers: /id="reviewers-error"/ },
  ),
  form(
    "review comment",
    () => reviewer,
    reviewPath,
    () => ({ intent: "comment", anchor: "component", component: "SS", body: "looks fine" }),
    ["anchor", "component", "body", "intent"],
    { intent: UNKNOWN_ACTION },
  ),
  form(
    "review decision",
    () => reviewer,
    reviewPath,
    () => ({ intent: "decide", verdict: "changes-requested", comment: "see notes" }),
    ["verdict", "comment"],
    { verdict: /Choose approve or request changes/ },
  ),
  form(
    "fault disposition",
    () => engineer,
    faultReviewPath,
    () => ({
      intent: "dispose",
      component: fault.component,
      mode: fault.mode,
      disposition: "accepted",
      justification: "Two-channel part, monitored by the controller.",
    }),
    ["component", "mode", "disposition", "justification"],
    // Hidden fields of the fault's own form: a fault the page does not list is named above the page.
    { component: /Contact of the fault: /, mode: /Fault mode: / },
  ),
  form(
    "bench outcome",
    () => technician,
    runPath,
    () => ({ intent: "outcome", step: "1", outcome: "pass" }),
    ["step", "outcome"],
    {
      ...benchShows,
      outcome: /Choose pass, fail or skip/,
    },
  ),
  form(
    "bench note",
    () => technician,
    runPath,
    () => ({ intent: "note", step: "1", note: "checked" }),
    ["step", "note", "intent"],
    benchShows,
  ),
  form(
    "bench mail step",
    () => technician,
    runPath,
    () => ({ intent: "mail-step", step: "1" }),
    ["step"],
    benchShows,
  ),
  upload(
    "bench step photo",
    () => technician,
    runPath,
    () => ({ intent: "photo", step: "1", filename: "step-1.png" }),
    ["filename", "step"],
    { filename: /Rename the file/, ...benchShows },
  ),
  json(
    "better-auth: sign-up",
    "POST",
    () => client(),
    () => "/api/auth/sign-up/email",
    () => ({ name: "New Person", email: `new-${Date.now()}@example.org`, password: "long-enough-password" }),
    ["name"],
    { name: /"message":"name: / },
  ),
  json(
    "better-auth: update user",
    "POST",
    () => technician,
    () => "/api/auth/update-user",
    () => ({ name: "Tess Technician" }),
    ["name"],
    { name: /"message":"name: / },
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
    "API: release",
    "POST",
    () => admin,
    () => `/api/v1/vehicles/${ids.vehicle}/releases`,
    () => ({ revisionId: ids.revision, note: "ok", override: "" }),
    ["revisionId", "note", "override"],
  ),
  json(
    "API: controller record",
    "PUT",
    () => technician,
    () => `/api/v1/vehicles/${ids.vehicle}/controller-record`,
    () => ({ version: recordVersion, record: exampleRecord() }),
    RECORD_JSON_FIELDS,
  ),
  json(
    "API: controller check",
    "POST",
    () => technician,
    () => "/api/v1/controller-checks?workspace=larkspur",
    () => ({ record: exampleRecord() }),
    RECORD_JSON_FIELDS,
  ),
  json(
    "API: bench step",
    "PUT",
    () => technician,
    () => `/api/v1/bench-runs/${ids.run}/steps/1`,
    () => ({ status: "pass", note: "ok" }),
    ["status", "note"],
  ),
  json(
    "API: create design",
    "POST",
    () => engineer,
    () => "/api/v1/designs?workspace=larkspur",
    () => ({ name: "Via API", start: "blank" }),
    ["name", "vehicleId", "start"],
  ),
  json(
    "API: save revision",
    "POST",
    () => engineer,
    () => `/api/v1/designs/${ids.design}/revisions`,
    () => ({ document: revisionDocument, baseRevision: latestNumber, message: "probe" }),
    ["message"],
  ),
  json(
    "API: diagnosis",
    "POST",
    () => technician,
    () => `/api/v1/designs/${ids.haybarn}/revisions/1/diagnosis`,
    () => ({ states: diagnosisStates }),
    ["states", `states.${Object.keys(diagnosisStates)[0]}`],
  ),
];

/**
 * Writes that take no text of their own, or whose text is checked elsewhere, each with the reason.
 * Keys as the coverage test below writes them: "METHOD /api/v1/path" or "routes/file.tsx intent".
 */
const NOT_TEXT: Record<string, string> = {
  "routes/sign-out.tsx": "no fields: it ends the session whatever is posted",
  "routes/invite.tsx": "no fields: the invitation's token is in the path (a %00 path answers 404, below)",
  "routes/vehicle.tsx start-bench-run": "nothing but the intent (a hostile intent: the edit vehicle target)",
  "routes/bench-run.tsx complete": "nothing but the intent (a hostile intent: the bench note target)",
  "POST /api/v1/vehicles/{vehicleId}/bench-runs": "no body: the vehicle id is in the path (a %00 path answers 404, below)",
  "PUT /api/v1/designs/{designId}/draft":
    "a design document: the engine's validation and storableJsonProblem, fuzzed in fuzz-api.test.ts (decision 101)",
  "POST /api/v1/proofs": "a design document, proved and never stored: fuzzed in fuzz-api.test.ts (decision 101)",
  "routes/design.tsx archive":
    "nothing but the intent (archive or restore); any other intent answers 400 naming it (archiving.test.ts, decision 167)",
  "PATCH /api/v1/designs/{designId}":
    "a boolean archived and no other key: a string or an extra key answers 400 naming it (archiving.test.ts, decision 167)",
};
// The controller form's lockout checkboxes are left out of its fields: a checkbox's value is not kept, only whether it was sent.

/** Every page URL of app/routes.ts with the module that serves it. */
type RouteEntry = { file: string; path?: string; index?: boolean; children?: RouteEntry[] };
function pageRoutes(entries: RouteEntry[], prefix = ""): Array<{ pattern: RegExp; file: string; statics: number }> {
  const out: Array<{ pattern: RegExp; file: string; statics: number }> = [];
  for (const e of entries) {
    const full = e.path ? `${prefix}/${e.path}` : prefix;
    const source = full
      .split("/")
      .map((seg) => (seg.startsWith(":") ? "[^/]+" : seg === "*" ? ".*" : seg.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")))
      .join("/");
    out.push({
      pattern: new RegExp(`^${source || "/"}$`),
      file: e.file,
      statics: full.split("/").filter((s) => s && !s.startsWith(":")).length,
    });
    if (e.children) out.push(...pageRoutes(e.children, full));
  }
  return out;
}
const ROUTES = pageRoutes(routes as RouteEntry[]);
const sourceOf = (file: string) => readFileSync(new URL(`../../app/${file}`, import.meta.url), "utf8");

/** The body of a module's action, or null: the intents it tells apart are its `intent === "x"` and `case "x":`. */
function actionIntents(file: string): string[] | null {
  const src = sourceOf(file);
  const at = src.search(/export (async )?function action\b/);
  if (at < 0) return null;
  const end = src.indexOf("\n}\n", at);
  const body = src.slice(at, end < 0 ? undefined : end);
  const intents = new Set<string>();
  for (const m of body.matchAll(/intent"?\)?\s*[!=]==\s*"([\w-]+)"/g)) intents.add(m[1]!);
  for (const m of body.matchAll(/case "([\w-]+)":/g)) intents.add(m[1]!);
  return [...intents].sort();
}

/** What the target writes, in the keys of the coverage test. */
function coverageKey(t: Target): string {
  const url = new URL(t.path(), "http://x");
  if (url.pathname.startsWith("/api/v1/")) {
    const e = endpointOf(t.method, url.pathname);
    if (!e) throw new Error(`${t.name}: no endpoint serves ${t.method} ${url.pathname}`);
    return `${e.method.toUpperCase()} ${e.path}`;
  }
  const route = ROUTES.filter((r) => r.pattern.test(url.pathname)).sort((a, b) => b.statics - a.statics)[0];
  if (!route) throw new Error(`${t.name}: no route serves ${url.pathname}`);
  const intent = t.base().intent;
  return typeof intent === "string" ? `${route.file} ${intent}` : route.file;
}

/** Every write the app has: page actions by intent, other resource routes, and the API's non-GET endpoints. */
function everyWrite(): string[] {
  const out = new Set<string>();
  for (const { file } of ROUTES) {
    if (file.startsWith("routes/api/v1/")) continue; // the endpoint table describes these
    const intents = actionIntents(file);
    if (intents === null) continue;
    if (intents.length === 0) out.add(file);
    for (const i of intents) out.add(`${file} ${i}`);
  }
  for (const e of ENDPOINTS) if (e.method !== "get") out.add(`${e.method.toUpperCase()} ${e.path}`);
  return [...out].sort();
}

function setField(values: Record<string, unknown>, field: string, value: string): Record<string, unknown> {
  const copy = structuredClone(values);
  const keys = field.split(".");
  let at = copy;
  for (const k of keys.slice(0, -1)) at = at[k] as Record<string, unknown>;
  at[keys[keys.length - 1]!] = value;
  return copy;
}

async function send(t: Target, field: string, value: string): Promise<Response> {
  const c = t.as();
  const base = t.base();
  if (t.kind === "json") {
    const body = t.path().startsWith("/api/auth/") ? { ...base, [field]: value } : setField(base, field, value);
    return c.fetch(t.path(), { method: t.method, headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
  }
  const values = { ...(base as Record<string, string>), [field]: value };
  if (t.kind === "multipart") {
    const body = new FormData();
    for (const [k, v] of Object.entries(values)) if (k !== "filename") body.set(k, v);
    body.set("file", new File([PNG], values.filename!, { type: "image/png" }));
    return c.fetch(t.path(), { method: t.method, body });
  }
  return c.fetch(t.path(), {
    method: t.method,
    headers: { "content-type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams(values),
  });
}

/** Whether the answer names the field: its message, its control marked invalid, or its path in error.fields. */
function namesField(t: Target, field: string, answer: string): boolean {
  if (t.unnamed?.[field]) return true;
  // What the page shows, not the action data it carries for hydration.
  const body = t.kind === "json" ? answer : answer.replace(/<script\b[\s\S]*?<\/script>/g, "");
  const shown = t.shows?.[field];
  if (shown) return shown.test(body);
  if (t.kind === "json") {
    const fields = (JSON.parse(body) as { error?: { fields?: Array<{ path: string }> } }).error?.fields ?? [];
    return fields.some((f) => f.path === field || field.startsWith(`${f.path}.`));
  }
  const escaped = field.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
  const controls = body.match(new RegExp(`<(?:input|textarea|select)\\b[^>]*\\bname="${escaped}"[^>]*>`, "g")) ?? [];
  return controls.some((c) => /\baria-invalid="true"/.test(c));
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
      "SELECT r.id, r.design_id, r.document FROM design_revision r JOIN design d ON d.id = r.design_id WHERE d.workspace_id = $1 AND r.number = 1 ORDER BY d.name LIMIT 1",
      [ws],
    )
  ).rows[0];
  ids.revision = rev.id;
  ids.design = rev.design_id;
  const haybarn = (
    await db.query(
      "SELECT r.design_id, r.document FROM design_revision r JOIN design d ON d.id = r.design_id WHERE d.workspace_id = $1 AND d.name = 'Haybarn hauler #3, drive inhibit' AND r.number = 1",
      [ws],
    )
  ).rows[0];
  ids.haybarn = haybarn.design_id;
  expect(decodeRow(compileDesign(haybarn.document as Design), 0)).toEqual(diagnosisStates);
  const latest = (
    await db.query("SELECT number, document FROM design_revision WHERE design_id = $1 ORDER BY number DESC LIMIT 1", [ids.design])
  ).rows[0];
  latestNumber = latest.number;
  revisionDocument = latest.document as Design;
  // A revision with a single fault that defeats a rule, for the disposition form.
  const faulty = (
    await db.query(
      `SELECT r.design_id, r.number, r.verdict->'singleFaults'->0 AS fault FROM design_revision r JOIN design d ON d.id = r.design_id
        WHERE d.workspace_id = $1 AND jsonb_array_length(coalesce(r.verdict->'singleFaults', '[]'::jsonb)) > 0 ORDER BY d.name, r.number LIMIT 1`,
      [ws],
    )
  ).rows[0];
  expect(faulty, "a demo revision with a single fault that defeats a rule").toBeDefined();
  ids.faultDesign = faulty.design_id;
  ids.faultNumber = String(faulty.number);
  fault = { component: faulty.fault.component, mode: faulty.fault.mode };
  recordVersion = (await db.query("SELECT coalesce(max(version), 0)::int AS v FROM controller_record WHERE vehicle_id = $1", [ids.vehicle]))
    .rows[0].v;
  const member = await db.query(
    `SELECT m.id, u.id AS user_id FROM member m JOIN "user" u ON u.id = m.user_id WHERE m.workspace_id = $1 AND u.email = $2`,
    [ws, DEMO.reviewer],
  );
  ids.reviewerMember = member.rows[0].id;
  ids.reviewerUser = member.rows[0].user_id;
  const started = await technician.fetch(vehiclePath(), {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams({ intent: "start-bench-run" }),
  });
  ids.run = (started.headers.get("location") ?? "").split("/bench-tests/")[1] ?? "";
  expect(ids.run).toMatch(/^[0-9a-f-]{36}$/);
  // A failed step flags the vehicle, so its page shows the form that clears the flag.
  const failed = await technician.fetch(`/api/v1/bench-runs/${ids.run}/steps/1`, {
    method: "PUT",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({ status: "fail", note: "stand switch open" }),
  });
  expect(failed.status).toBe(200);
});
afterAll(async () => {
  await db.end();
});

describe("which writes the hostile text reaches", () => {
  it("every page action (by intent), resource route and API write has a target or a reason it takes no text", () => {
    const covered = new Set(TARGETS.map(coverageKey));
    const writes = everyWrite();
    const missing = writes.filter((w) => !covered.has(w) && !(w in NOT_TEXT));
    expect(missing, "writes without a hostile-text target: add one, or a reason to NOT_TEXT").toEqual([]);
    // The lists stay true: no reason for a write that is gone or that has a target after all.
    expect(Object.keys(NOT_TEXT).filter((k) => !writes.includes(k) || covered.has(k))).toEqual([]);
    expect([...covered].filter((k) => !writes.includes(k))).toEqual([]);
  });

  it("finds the intents of the page actions it knows", () => {
    expect(actionIntents("routes/review.tsx")).toEqual(["comment", "decide", "dispose", "request"]);
    expect(actionIntents("routes/vehicle.tsx")).toEqual(["clear-attention", "edit", "release", "start-bench-run", "upload-photo"]);
    expect(actionIntents("routes/bench-run.tsx")).toEqual(["complete", "mail-step", "note", "outcome", "photo"]);
    expect(actionIntents("routes/sign-in.tsx")).toEqual([]);
    expect(actionIntents("routes/designs.tsx")).toBeNull();
  });
});

describe("hostile text in every form action and API write", () => {
  for (const t of TARGETS) {
    it(`${t.name}: ${t.fields.join(", ")}`, { timeout: 240_000 }, async () => {
      for (const field of t.fields) {
        for (const [what, value] of HOSTILE) {
          const before = await snapshot();
          const res = await send(t, field, value);
          const body = await res.text();
          const where = `${t.name}, ${field} = ${what}: ${res.status} ${body.slice(0, 300)}`;
          expect.soft(res.status >= 400 && res.status < 500, where).toBe(true);
          // Only a JSON body over its limit may be refused whole (413) without naming the field.
          const whole = t.kind === "json" && res.status === 413 && value === ONE_MB;
          if (!whole) expect.soft(namesField(t, field, body), `the answer names ${field}: ${where}`).toBe(true);
          expect.soft(await snapshot(), where).toBe(before);
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
