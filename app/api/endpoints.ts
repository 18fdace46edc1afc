// Every endpoint of the JSON API (/api/v1) in one table: its method and path, what it reads (path
// parameters, query, body: the schemas the route validates with) and every answer it can give (the
// schemas of app/api/answers.ts). The route answers through reply(endpoint, status, body), the
// OpenAPI document is this table (app/api/openapi.server.ts), the browser calls through it
// (app/api/client.ts) and the integration tests check each answer against it. No server imports.
import { z } from "zod";
import {
  archivedFilterSchema,
  createDesignBodySchema,
  designFilterSchema,
  designPatchBodySchema,
  proofBodySchema,
  saveDraftBodySchema,
  saveRevisionBodySchema,
} from "~/designs/forms";
import { ONLY, PAGE_MAX } from "~/reviews/truth-table";
import * as A from "./answers";
import { releaseSchema as releaseBodySchema } from "~/vehicles/forms";
import { groupsDocumentSchema, groupsQuerySchema, whyDocumentSchema, whyQuerySchema } from "./row-groups";
import {
  benchRunListQuerySchema,
  controllerCheckBodySchema,
  controllerRecordPutBodySchema,
  controllerRecordQuerySchema,
  diagnosisBodySchema,
  pageQuerySchema,
  stepResultBodySchema,
  vehicleCreateBodySchema,
  vehicleListQuerySchema,
  vehiclePatchBodySchema,
  vehicleRunListQuerySchema,
  workspaceQuerySchema,
} from "./schemas";

export const METHODS = ["get", "post", "put", "patch", "delete"] as const;
export type Method = (typeof METHODS)[number];

/** One answer: what it means and its schema (JSON unless said otherwise). */
export type Reply = { description: string; schema: z.ZodType; media?: "application/json" | "text/csv" };

export type Endpoint = {
  method: Method;
  /** OpenAPI style: /api/v1/designs/{designId}; the same URL as in app/routes.ts. */
  path: `/api/v1/${string}`;
  tag: Tag;
  summary: string;
  /** Who may call it comes first ("Any member of the workspace.", "Engineers."). */
  description: string;
  params?: z.ZodObject;
  query?: z.ZodObject;
  body?: z.ZodType;
  /** No authentication (security: [] in the document). */
  public?: true;
  replies: Record<number, Reply>;
};

type AsNumber<K> = K extends number ? K : K extends `${infer N extends number}` ? N : never;
/** The statuses an endpoint answers with (spread keys of a literal type come out as strings). */
export type StatusOf<E extends Endpoint> = AsNumber<keyof E["replies"]>;
/** The declared answer of an endpoint for a status. */
export type ReplyAt<E extends Endpoint, S extends number> = E["replies"][Extract<keyof E["replies"], S | `${S}`>];

export const TAGS = {
  Designs: "Designs, their proofs and the design list.",
  Drafts: "The working copy of a design.",
  Revisions: "Saved, proven, immutable revisions.",
  "Truth table": "Rows of a revision's truth table, computed on request.",
  Diagnosis: "Why a row has no drive, and what measured readings point to.",
  Vehicles: "Vehicles, their released revisions and needs-attention flags.",
  "Bench runs": "Step-by-step bench tests generated from a vehicle's released revision.",
  Reviews: "Review requests and reviewers' decisions on revisions.",
  "Controller records":
    "What a technician recorded of a vehicle's traction pack and motor-controller settings, every change a version, and its checks against the pack and the released proof. The record is what was entered, not what the controller holds: verify on the vehicle.",
  Local: "Only when running locally.",
  About: "This description.",
} as const;
export type Tag = keyof typeof TAGS;

/** Keeps the literal types of an endpoint (its path and the statuses it answers). */
function endpoint<const E extends Endpoint>(e: E): E {
  return e;
}

const ok = <S extends z.ZodType>(description: string, schema: S) => ({ description, schema });
const fail = <S extends z.ZodType = typeof A.errorSchema>(description: string, schema?: S) => ({
  description,
  schema: (schema ?? A.errorSchema) as S,
});

/** Answers any endpoint can give. */
const always = {
  429: fail(
    "Too many requests from this key, session or address (rate_limited), or two proofs of yours still running (too_many_proofs); wait and retry (Retry-After).",
  ),
  500: fail("Something unexpected; nothing was saved."),
  503: fail("The database cannot be reached; nothing was changed. Retry after Retry-After seconds."),
};
/** Answers of an endpoint that needs a signed-in member. */
const reading = {
  401: fail("Signed out, or the API key is not valid."),
  404: fail("No such thing, or it belongs to a workspace you are not a member of."),
  ...always,
};
/** Answers of an endpoint that takes a body or changes something. */
const writing = {
  ...reading,
  400: fail("A field is missing or not valid; fields names each one."),
  403: fail("Your role may not do this, or a signed-in browser request came from another site."),
  413: fail("The body is too large."),
  415: fail("The body is not Content-Type: application/json."),
};
const badQuery = { 400: fail("A bad query parameter; fields names it.") };
const MEMBER = "Any member of the workspace.";

// Path parameters.
const designId = z.object({ designId: z.string().meta({ description: "The design's id." }) });
const revisionParams = designId.extend({
  number: z
    .string()
    .regex(/^[1-9][0-9]*$/)
    .meta({ description: "The revision number, from 1." }),
});
const vehicleId = z.object({ vehicleId: z.string().meta({ description: "The vehicle's id." }) });
const runId = z.object({ runId: z.string().meta({ description: "The bench run's id." }) });

// The truth-table filter (parsed by app/reviews/truth-table.ts, which names the parameter in its errors).
const rowFilterQuery = z.object({
  only: z
    .enum(ONLY)
    .optional()
    .meta({ description: "unsafe, violating, drive, demand or failing rows only (demand and failing: of require-drive rules)." }),
  rule: z
    .string()
    .optional()
    .meta({ description: "With only=unsafe|violating: that inhibit rule's rows; with only=demand|failing: that require-drive rule's." }),
  where: z.string().optional().meta({ description: "COND:STATE; repeat it; states of one condition are alternatives." }),
});

export const api = {
  listDesigns: endpoint({
    method: "get",
    path: "/api/v1/designs",
    tag: "Designs",
    summary: "List designs",
    description: `${MEMBER} Without limit or cursor every design, ordered as on the designs page; with them, pages ordered by name then id. Archived designs are left out unless archived=include (all) or archived=only.`,
    query: workspaceQuerySchema
      .extend(designFilterSchema.shape)
      .extend({ archived: archivedFilterSchema.meta({ description: "include: archived designs too; only: archived designs alone." }) })
      .extend(pageQuerySchema.shape),
    replies: { 200: ok("The designs.", A.designListAnswer), ...badQuery, ...reading },
  }),
  createDesign: endpoint({
    method: "post",
    path: "/api/v1/designs",
    tag: "Designs",
    summary: "Create a design",
    description: "Engineers. Starts blank or from a demo design; its draft is version 1.",
    query: workspaceQuerySchema,
    body: createDesignBodySchema,
    replies: { 201: ok("Created.", A.designCreatedAnswer), ...writing },
  }),
  getDesign: endpoint({
    method: "get",
    path: "/api/v1/designs/{designId}",
    tag: "Designs",
    summary: "Get a design",
    description: `${MEMBER} The latest revision's document and verdict, and the draft's state.`,
    params: designId,
    replies: { 200: ok("The design.", A.designAnswer), ...reading },
  }),
  patchDesign: endpoint({
    method: "patch",
    path: "/api/v1/designs/{designId}",
    tag: "Designs",
    summary: "Archive a design or bring it back",
    description:
      "Admins and engineers. archived: true keeps the design for audit but leaves it out of lists and refuses new drafts, revisions and releases; its revisions, reviews, reports and releases stay readable. archived: false brings it back. Asking for the state it is already in changes nothing (changed: false).",
    params: designId,
    body: designPatchBodySchema,
    replies: { 200: ok("The design as it is now.", A.designPatchedAnswer), ...writing },
  }),
  getDraft: endpoint({
    method: "get",
    path: "/api/v1/designs/{designId}/draft",
    tag: "Drafts",
    summary: "Get the draft",
    description: `${MEMBER} The working copy, which may be invalid.`,
    params: designId,
    replies: { 200: ok("The draft, or null.", A.draftAnswer), ...reading },
  }),
  saveDraft: endpoint({
    method: "put",
    path: "/api/v1/designs/{designId}/draft",
    tag: "Drafts",
    summary: "Save the draft",
    description:
      "Engineers. Optimistic concurrency: send the version you loaded; a newer draft answers 409 stale_draft with currentVersion.",
    params: designId,
    body: saveDraftBodySchema,
    replies: {
      200: ok("Saved.", A.draftSavedAnswer),
      409: fail(
        "The draft was saved elsewhere (stale_draft; currentVersion beside error), or the design is archived (design_archived; archived beside error).",
        z.union([A.staleDraftError, A.designArchivedError]),
      ),
      ...writing,
    },
  }),
  listRevisions: endpoint({
    method: "get",
    path: "/api/v1/designs/{designId}/revisions",
    tag: "Revisions",
    summary: "List revisions",
    description: `${MEMBER} Newest first; every revision without limit or cursor.`,
    params: designId,
    query: pageQuerySchema,
    replies: { 200: ok("The revisions.", A.revisionListAnswer), ...badQuery, ...reading },
  }),
  saveRevision: endpoint({
    method: "post",
    path: "/api/v1/designs/{designId}/revisions",
    tag: "Revisions",
    summary: "Save a revision",
    description: "Engineers. The engine validates and proves the document; only a design whose every rule holds is saved.",
    params: designId,
    body: saveRevisionBodySchema,
    replies: {
      201: ok("Saved.", A.revisionSavedAnswer),
      409: fail(
        "The change starts from an older revision (stale_revision; latestRevision beside error), or the design is archived (design_archived; archived beside error).",
        z.union([A.staleRevisionError, A.designArchivedError]),
      ),
      422: fail(
        "The design never drives (never_drives) or some rule fails (rules_fail); the verdict is beside error. Nothing was saved.",
        A.rulesFailError,
      ),
      ...writing,
    },
  }),
  getRevision: endpoint({
    method: "get",
    path: "/api/v1/designs/{designId}/revisions/{number}",
    tag: "Revisions",
    summary: "Get a revision",
    description: `${MEMBER} Its document and verdict; revisions never change.`,
    params: revisionParams,
    replies: { 200: ok("The revision.", A.revisionAnswer), ...reading },
  }),
  revisionRows: endpoint({
    method: "get",
    path: "/api/v1/designs/{designId}/revisions/{number}/rows",
    tag: "Truth table",
    summary: "Page of truth-table rows",
    description: `${MEMBER} Rows are computed by the engine, never stored.`,
    params: revisionParams,
    query: rowFilterQuery.extend({
      from: z
        .string()
        .regex(/^[0-9]+$/)
        .optional()
        .meta({ description: "Position in the filtered rows, from 0." }),
      count: z
        .string()
        .regex(/^[0-9]+$/)
        .optional()
        .meta({ description: `Rows in the page, at most ${PAGE_MAX} (100 by default).` }),
    }),
    replies: { 200: ok("The page.", A.rowsPageAnswer), 400: fail("A bad filter, from or count."), ...reading },
  }),
  revisionRow: endpoint({
    method: "get",
    path: "/api/v1/designs/{designId}/revisions/{number}/rows/{index}",
    tag: "Truth table",
    summary: "One row with its diagnosis",
    description: MEMBER,
    params: revisionParams.extend({
      index: z
        .string()
        .regex(/^[0-9]+$/)
        .meta({ description: "The row's index, from 0." }),
    }),
    replies: { 200: ok("The row.", A.rowAnswer), ...reading },
  }),
  revisionTableCsv: endpoint({
    method: "get",
    path: "/api/v1/designs/{designId}/revisions/{number}/table.csv",
    tag: "Truth table",
    summary: "The truth table as CSV",
    description: `${MEMBER} Streamed: a header line, then the matching rows.`,
    params: revisionParams,
    query: rowFilterQuery,
    replies: { 200: { description: "CSV text.", schema: z.string(), media: "text/csv" }, 400: fail("A bad filter."), ...reading },
  }),
  revisionGroups: endpoint({
    method: "get",
    path: "/api/v1/designs/{designId}/revisions/{number}/groups",
    tag: "Truth table",
    summary: "Rows of a set as row groups",
    description: `${MEMBER} chainproof/groups@1: the set's rows as disjoint groups (spec section 4), with groupCount.`,
    params: revisionParams,
    query: groupsQuerySchema,
    replies: {
      200: ok("The groups.", groupsDocumentSchema),
      400: fail(
        "A set that names an unknown rule, a rule of the other type, an unknown component, a component that is not a contact or an unknown mode; or a bad limit.",
      ),
      ...reading,
    },
  }),
  revisionWhy: endpoint({
    method: "get",
    path: "/api/v1/designs/{designId}/revisions/{number}/why",
    tag: "Truth table",
    summary: "Why an inhibit rule holds",
    description: `${MEMBER} chainproof/why@1: the rule's unsafe rows without drive, split by blocking reason, each part as groups.`,
    params: revisionParams,
    query: whyQuerySchema,
    replies: {
      200: ok("The reasons.", whyDocumentSchema),
      400: fail("An unknown rule, or a rule that is not an inhibit rule forbidding drive; or a bad limit."),
      ...reading,
    },
  }),
  diagnoseRow: endpoint({
    method: "post",
    path: "/api/v1/designs/{designId}/revisions/{number}/diagnosis",
    tag: "Diagnosis",
    summary: "Diagnose a row",
    description: `${MEMBER} The engine's diagnose of the row (why there is no drive, which contacts to close), and with measured readings its explainReadings.`,
    params: revisionParams,
    body: diagnosisBodySchema,
    replies: { 200: ok("The diagnosis.", A.diagnosisAnswer), ...writing },
  }),
  prove: endpoint({
    method: "post",
    path: "/api/v1/proofs",
    tag: "Designs",
    summary: "Prove a design without saving",
    description: MEMBER,
    query: workspaceQuerySchema,
    body: proofBodySchema.extend({ document: A.designDocumentSchema }),
    replies: {
      200: ok("The verdict.", A.proofAnswer),
      422: fail("The proof took longer than the server's limit (PROOF_TIME_LIMIT_MS) and was stopped (proof_too_long)."),
      ...writing,
    },
  }),
  listVehicles: endpoint({
    method: "get",
    path: "/api/v1/vehicles",
    tag: "Vehicles",
    summary: "List vehicles",
    description: `${MEMBER} Ordered by name, then id.`,
    query: vehicleListQuerySchema,
    replies: { 200: ok("A page of vehicles.", A.vehicleListAnswer), ...badQuery, ...reading },
  }),
  createVehicle: endpoint({
    method: "post",
    path: "/api/v1/vehicles",
    tag: "Vehicles",
    summary: "Add a vehicle",
    description: "Admins, engineers and technicians.",
    query: workspaceQuerySchema,
    body: vehicleCreateBodySchema,
    replies: { 201: ok("Added.", A.vehicleAnswer), ...writing },
  }),
  getVehicle: endpoint({
    method: "get",
    path: "/api/v1/vehicles/{vehicleId}",
    tag: "Vehicles",
    summary: "Get a vehicle",
    description: `${MEMBER} With the revision released to it, the release history and open needs-attention flags.`,
    params: vehicleId,
    replies: { 200: ok("The vehicle.", A.vehicleAnswer), ...reading },
  }),
  changeVehicle: endpoint({
    method: "patch",
    path: "/api/v1/vehicles/{vehicleId}",
    tag: "Vehicles",
    summary: "Change a vehicle's details",
    description: "Admins, engineers and technicians. Fields not sent keep their values.",
    params: vehicleId,
    body: vehiclePatchBodySchema,
    replies: { 200: ok("Saved.", A.vehicleAnswer), ...writing },
  }),
  releaseToVehicle: endpoint({
    method: "post",
    path: "/api/v1/vehicles/{vehicleId}/releases",
    tag: "Vehicles",
    summary: "Release a revision to a vehicle",
    description:
      "Admins and engineers. Only a revision of this workspace that a reviewer approved and that passes design format 1.1 (a revision saved before 1.1 with a rule matching no row, or one that never drives, is refused with the reasons). When the vehicle's controller settings record contradicts the revision, only with an override reason (kept in the audit log). The release history is append-only.",
    params: vehicleId,
    body: releaseBodySchema,
    replies: {
      201: ok("Released; the vehicle with its new current release.", A.vehicleAnswer),
      409: fail(
        "The revision cannot be released (release_refused): not approved, refused by format 1.1, its design archived, or contradicted by the controller record without an override reason; fields name why.",
      ),
      ...writing,
    },
  }),
  listVehicleRuns: endpoint({
    method: "get",
    path: "/api/v1/vehicles/{vehicleId}/bench-runs",
    tag: "Bench runs",
    summary: "List a vehicle's bench runs",
    description: `${MEMBER} Newest first.`,
    params: vehicleId,
    query: vehicleRunListQuerySchema,
    replies: { 200: ok("A page of runs.", A.runListAnswer), ...badQuery, ...reading },
  }),
  startRun: endpoint({
    method: "post",
    path: "/api/v1/vehicles/{vehicleId}/bench-runs",
    tag: "Bench runs",
    summary: "Start a bench run",
    description: "Technicians. The procedure is generated from the revision released to the vehicle now and frozen into the run.",
    params: vehicleId,
    replies: {
      201: ok("Started.", A.runAnswer),
      409: fail("No revision is released to the vehicle, or it gives no steps (cannot_start)."),
      ...writing,
    },
  }),
  listRuns: endpoint({
    method: "get",
    path: "/api/v1/bench-runs",
    tag: "Bench runs",
    summary: "List bench runs",
    description: `${MEMBER} Newest first.`,
    query: benchRunListQuerySchema,
    replies: { 200: ok("A page of runs.", A.runListAnswer), ...badQuery, ...reading },
  }),
  getRun: endpoint({
    method: "get",
    path: "/api/v1/bench-runs/{runId}",
    tag: "Bench runs",
    summary: "Get a bench run",
    description: `${MEMBER} Every step with its result, notes and photos.`,
    params: runId,
    replies: { 200: ok("The run.", A.runAnswer), ...reading },
  }),
  recordStep: endpoint({
    method: "put",
    path: "/api/v1/bench-runs/{runId}/steps/{n}",
    tag: "Bench runs",
    summary: "Record a step's result",
    description: "Technicians. A step turning to fail flags the vehicle and mails the revision's author.",
    params: runId.extend({
      n: z
        .string()
        .regex(/^[1-9][0-9]*$/)
        .meta({ description: "The step number, from 1." }),
    }),
    body: stepResultBodySchema,
    replies: { 200: ok("Saved.", A.stepSavedAnswer), 409: fail("The run is completed and signed (run_completed)."), ...writing },
  }),
  getControllerRecord: endpoint({
    method: "get",
    path: "/api/v1/vehicles/{vehicleId}/controller-record",
    tag: "Controller records",
    summary: "Get a vehicle's controller settings record",
    description: `${MEMBER} The newest version (or ?version=N) with its check against the revision released to the vehicle, every version's who and when, and whether the released proof holds for the newest record.`,
    params: vehicleId,
    query: controllerRecordQuerySchema,
    replies: { 200: ok("The record.", A.controllerRecordAnswer), ...badQuery, ...reading },
  }),
  putControllerRecord: endpoint({
    method: "put",
    path: "/api/v1/vehicles/{vehicleId}/controller-record",
    tag: "Controller records",
    summary: "Record a new version of the controller settings",
    description:
      "Technicians and engineers. Saved as a new version with who and when; nothing is overwritten. Send the version you read: another version saved since answers 409 stale_record with currentVersion. An impossible value answers 400 invalid_record naming each field (record.settings.throttle.restV); nothing is saved.",
    params: vehicleId,
    body: controllerRecordPutBodySchema,
    replies: {
      200: ok("Saved; the record as GET answers it.", A.controllerRecordAnswer),
      409: fail("Another version was saved since the one sent (stale_record; currentVersion beside error).", A.staleRecordError),
      ...writing,
    },
  }),
  checkControllerRecord: endpoint({
    method: "post",
    path: "/api/v1/controller-checks",
    tag: "Controller records",
    summary: "Check a controller settings record without saving",
    description: `${MEMBER} The record's derived values and findings (chainproof/controller-check@1), against the design when one is sent. Stateless: nothing is read or saved.`,
    query: workspaceQuerySchema,
    body: controllerCheckBodySchema,
    replies: { 200: ok("The check.", A.controllerCheckAnswer), ...writing },
  }),
  reviewInbox: endpoint({
    method: "get",
    path: "/api/v1/reviews",
    tag: "Reviews",
    summary: "The review inbox",
    description: `${MEMBER} As on the reviews page: a reviewer gets the requests addressed to them, anyone else every review request of the workspace; newest first, at most 200.`,
    query: workspaceQuerySchema,
    replies: { 200: ok("The inbox.", A.reviewInboxAnswer), 400: fail("No workspace named."), ...reading },
  }),
  outbox: endpoint({
    method: "get",
    path: "/api/v1/outbox",
    tag: "Local",
    summary: "Local outbox",
    description: "Mail the app sent while running locally (public in local mode; 404 otherwise). No authentication.",
    public: true,
    replies: { 200: ok("Recent mail, newest first.", A.outboxAnswer), 404: fail("Not in local mode."), ...always },
  }),
  openapi: endpoint({
    method: "get",
    path: "/api/v1/openapi.json",
    tag: "About",
    summary: "This description",
    description: "The OpenAPI 3.1 document of /api/v1. Public.",
    public: true,
    replies: { 200: ok("The document.", A.openApiAnswer), ...always },
  }),
} satisfies Record<string, Endpoint>;

export type Api = typeof api;
export const ENDPOINTS: readonly Endpoint[] = Object.values(api);

/** The endpoint a request's method and path name, if any (path without the query). */
export function endpointOf(method: string, pathname: string): Endpoint | undefined {
  const m = method.toLowerCase();
  return ENDPOINTS.find((e) => e.method === m && pathPattern(e.path).test(pathname));
}

/** Whether some endpoint serves this path, with any method (so another method gets 405). */
export function servesPath(pathname: string): boolean {
  return ENDPOINTS.some((e) => pathPattern(e.path).test(pathname));
}

const patterns = new Map<string, RegExp>();
function pathPattern(path: string): RegExp {
  let re = patterns.get(path);
  if (!re) {
    const source = path
      .split(/\{[A-Za-z]+\}/)
      .map((part) => part.replace(/[.*+?^${}()|[\]\\]/g, "\\$&"))
      .join("[^/]+");
    re = new RegExp(`^${source}$`);
    patterns.set(path, re);
  }
  return re;
}
