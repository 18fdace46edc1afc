// What the JSON API (/api/v1) answers, each shape written once as a zod schema. The server's views
// are typed by these (app/api/views.server.ts, reply() in app/api/http.server.ts), the OpenAPI
// document is generated from them (app/api/endpoints.ts), the browser parses answers with them
// (app/api/client.ts) and the integration tests check every answer against them. No server imports.
import { z } from "zod";
import { designSchema, INPUT_FUNCTIONS, LOCKOUTS, VERDICT_FORMAT } from "~/engine";
import { DESIGN_STATUSES } from "~/designs/statuses";
import { STEP_OUTCOMES } from "~/bench-runs/outcomes";
import { REVIEW_STATUSES } from "~/reviews/status";
import { CONTROLLER_CHECK_FORMAT, FINDING_CODES, controllerRecordShape } from "~/controller-record";

// ---------------------------------------------------------------- small pieces

/** A time, as Date.toISOString writes it. */
export const isoTime = z.iso.datetime();
const int = z.number().int();
const named = z.object({ name: z.string() });
const person = z.object({ id: z.string(), name: z.string() });

export const fieldProblemSchema = z
  .object({ path: z.string().meta({ example: "components[3].closedIn[0]" }), message: z.string() })
  .meta({ id: "FieldProblem", description: 'A problem with one field, named by its path ("(root)" for the body itself).' });

const errorShape = {
  error: z.object({
    code: z.string().meta({ description: "Stable, for programs: not_found, forbidden, invalid_body, invalid_query, stale_draft..." }),
    message: z.string().meta({ description: "For people: what went wrong and what to do." }),
    fields: z.array(fieldProblemSchema),
  }),
};

/** Every answer that is not a success. */
export const errorSchema = z.object(errorShape).meta({
  id: "Error",
  description:
    "Every answer that is not a success. A few add a field beside error: currentVersion (409 stale_draft, 409 stale_record), latestRevision (409 stale_revision), verdict (422 rules_fail and never_drives).",
});
export type ErrorAnswer = z.output<typeof errorSchema>;

export const rowStatesSchema = z
  .record(z.string(), z.string())
  .meta({ id: "RowStates", description: "One row named by its conditions' states: { CONDITION_ID: STATE }." });

export const nextCursorSchema = z.string().nullable().meta({ description: "Pass as ?cursor= for the next page; null on the last page." });

// ---------------------------------------------------------------- the engine's documents

/** The engine's verdict (spec section 2: keys may be added, so entries keep what they carry). */
export const verdictSchema = z
  .looseObject({
    format: z.literal(VERDICT_FORMAT),
    ok: z.boolean().meta({ description: "Every rule holds." }),
    rows: int.meta({ description: "Rows of the truth table." }),
    driveRows: int,
    rules: z.array(
      z.union([
        z.looseObject({ id: z.string(), holds: z.boolean(), unsafeRows: int, violatingRows: int, example: rowStatesSchema.optional() }),
        z.looseObject({ id: z.string(), holds: z.boolean(), demandRows: int, failingRows: int, example: rowStatesSchema.optional() }),
        z.looseObject({ id: z.string(), holds: z.boolean(), trace: z.array(rowStatesSchema).optional() }),
      ]),
    ),
    singleFaults: z.array(z.object({ component: z.string(), mode: z.enum(["stuck-open", "stuck-closed"]), defeats: z.array(z.string()) })),
  })
  .meta({
    id: "Verdict",
    description:
      "The engine's proof of a design (chainproof/verdict@1): per rule whether it holds, and the single contact faults that defeat a rule.",
  });

/** A saved design document: the engine's own schema (cross-references are the engine's validation). */
export const designDocumentSchema = designSchema.meta({
  id: "DesignDocument",
  description:
    "A design (chainproof/design@1): conditions, contacts and wires, the controller's inputs, and the rules. Cross-references are checked by the engine.",
});

/** A draft's document: any JSON object (a draft may be unfinished). */
export const draftDocumentSchema = z
  .record(z.string(), z.unknown())
  .meta({ description: "The working copy as saved; it may break the design format." });

const direction = z.enum(["forward", "neutral", "reverse", "conflict"]);
const throttle = z.enum(["released", "applied", "fault"]);

export const tableRowSchema = z
  .object({
    index: int,
    states: z.array(z.string()),
    contacts: z.array(z.boolean()),
    inputs: z.array(z.boolean()),
    powered: z.boolean(),
    enabled: z.boolean(),
    direction,
    braking: z.boolean(),
    throttle,
    drive: z.boolean(),
    rules: z.array(z.enum(["-", "unsafe", "violating", "demand", "failing"])),
  })
  .meta({
    id: "TableRow",
    description:
      "One truth-table row, values in column order (conditions, contacts, inputs, rules). rules: one cell per inhibit or require-drive rule in design order; unsafe/violating for an inhibit rule, demand/failing (demand without drive) for a require-drive rule, - where its when does not hold.",
  });
export type TableRow = z.output<typeof tableRowSchema>;

const contactToClose = z.object({ contact: z.string(), label: z.string(), condition: z.string(), closeIn: z.array(z.string()) });

export const diagnosisSchema = z
  .object({
    row: int,
    states: rowStatesSchema,
    controller: z.object({ powered: z.boolean(), enabled: z.boolean(), direction, braking: z.boolean(), throttle }),
    steadyDrive: z.boolean(),
    drive: z.boolean(),
    latched: z.boolean(),
    inputs: z.array(
      z.object({
        input: z.string(),
        label: z.string(),
        function: z.enum(INPUT_FUNCTIONS),
        energized: z.boolean(),
        fixes: z
          .array(z.array(contactToClose))
          .meta({ description: "For a dead input: each smallest set of open contacts whose closing would energize it." }),
        unreachable: z.boolean(),
        truncated: z.boolean(),
      }),
    ),
    reasons: z.array(
      z.object({
        code: z.enum([
          "unpowered",
          "not-enabled",
          "neutral",
          "direction-conflict",
          "braking",
          "throttle-released",
          "throttle-fault",
          "lockout-latched",
        ]),
        message: z.string(),
        input: z.string().optional(),
        lockouts: z.array(z.enum(LOCKOUTS)).optional(),
      }),
    ),
  })
  .meta({ id: "Diagnosis", description: "The engine's diagnose: why there is or is no drive in a row." });

export const readingsSchema = z
  .object({
    consistent: z.boolean().meta({ description: "The fault-free design gives these readings in this row." }),
    explanations: z.array(
      z.object({ component: z.string(), mode: z.enum(["stuck-open", "stuck-closed"]), otherInputsChanged: z.array(z.string()) }),
    ),
  })
  .meta({
    id: "ReadingsExplanation",
    description: "The engine's explainReadings: single contact faults that reproduce every reading, most likely first.",
  });

// ---------------------------------------------------------------- designs, drafts, revisions

export const draftCheckSchema = z
  .union([
    z.object({ state: z.literal("invalid"), problems: int }),
    z.object({
      state: z.literal("checked"),
      ok: z.boolean(),
      failing: int,
      rules: int,
      singleFaults: int,
      rows: int,
      driveRows: int.optional().meta({ description: "Absent from checks stored before spec 1.1." }),
    }),
    z.object({ state: z.literal("unchecked"), rows: int }),
  ])
  .meta({ id: "DraftCheck", description: "The summary stored with a draft when it is saved." });
export type DraftCheck = z.output<typeof draftCheckSchema>;

const draftState = z.object({
  version: int,
  baseRevision: int,
  updatedAt: isoTime,
  changed: z.boolean().meta({ description: "The draft differs from the latest revision (or there is no revision)." }),
  check: draftCheckSchema,
});

/** Who archived a design and when; null while it is in use (docs/decisions/167). */
export const archivedSchema = z.object({ at: isoTime, by: person }).nullable().meta({
  description:
    "Set when the design is archived: kept for audit, left out of lists, no new drafts, revisions or releases; its revisions stay readable.",
});

export const designSummarySchema = z
  .object({
    id: z.string(),
    name: z.string(),
    vehicleId: z.string().nullable(),
    vehicleName: z.string().nullable(),
    status: z.enum(DESIGN_STATUSES),
    createdAt: isoTime,
    archived: archivedSchema,
    latestRevision: z
      .object({ number: int, contentHash: z.string(), createdAt: isoTime, authorName: z.string(), rules: int, singleFaults: int })
      .nullable(),
    draft: draftState.nullable(),
  })
  .meta({ id: "DesignSummary", description: "One design as listed." });
export type DesignSummary = z.output<typeof designSummarySchema>;

const designHead = z.object({ id: z.string(), name: z.string(), vehicleId: z.string().nullable(), status: z.enum(DESIGN_STATUSES) });

export const designListAnswer = z.object({ designs: z.array(designSummarySchema), nextCursor: nextCursorSchema });
export const designCreatedAnswer = z.object({
  design: designHead.extend({ status: z.literal("draft") }),
  draft: z.object({ version: int }),
});
export const designAnswer = z.object({
  design: designHead.extend({ archived: archivedSchema }),
  latestRevision: int.nullable(),
  contentHash: z.string().nullable(),
  document: designDocumentSchema.nullable().meta({ description: "The latest revision's document (null before the first revision)." }),
  verdict: verdictSchema.nullable(),
  draft: draftState.nullable(),
});
export const draftAnswer = z.object({
  draft: z
    .object({
      version: int,
      baseRevision: int,
      updatedAt: isoTime,
      updatedBy: person,
      contentHash: z.string(),
      check: draftCheckSchema,
      document: draftDocumentSchema,
    })
    .nullable(),
});
export const draftSavedAnswer = z.object({ version: int });
/** 409 design_archived: the design takes no new drafts, revisions or releases while archived. */
export const designArchivedError = errorSchema.extend({ archived: archivedSchema });
export const designPatchedAnswer = z.object({
  design: designHead.extend({ archived: archivedSchema }),
  changed: z.boolean().meta({ description: "False when the design already was in the state asked for (nothing was written)." }),
});
export const staleDraftError = errorSchema.extend({ currentVersion: int.meta({ description: "The draft's version now." }) });

export const revisionListAnswer = z.object({
  revisions: z.array(
    z.object({ number: int, contentHash: z.string(), message: z.string(), author: person, createdAt: isoTime, singleFaults: int }),
  ),
  nextCursor: nextCursorSchema,
});
export const revisionSavedAnswer = z.object({ revision: z.object({ number: int, contentHash: z.string(), verdict: verdictSchema }) });
export const staleRevisionError = errorSchema.extend({ latestRevision: int.meta({ description: "The latest revision's number." }) });
export const rulesFailError = errorSchema.extend({ verdict: verdictSchema });
export const revisionAnswer = z.object({
  revision: z.object({
    number: int,
    contentHash: z.string(),
    message: z.string(),
    author: person,
    createdAt: isoTime,
    document: designDocumentSchema,
    verdict: verdictSchema,
    refusedByFormat11: z.array(z.string()).meta({
      description:
        "Why design format 1.1 would refuse this revision, saved before 1.1 (a rule matching no row, a design that never drives); empty when it passes. Such a revision stays readable and cannot be released.",
    }),
  }),
});
export const proofAnswer = z.object({ verdict: verdictSchema });

export const rowsPageAnswer = z.object({
  total: int.meta({ description: "Rows matching the filter." }),
  from: int,
  rows: z.array(tableRowSchema),
});
export type RowsPage = z.output<typeof rowsPageAnswer>;
export const rowAnswer = z.object({ row: tableRowSchema, energizedTerminals: z.array(z.string()), diagnosis: diagnosisSchema });
export type RowDetail = z.output<typeof rowAnswer>;
export const diagnosisAnswer = z.object({ diagnosis: diagnosisSchema, readings: readingsSchema.nullable() });

// ---------------------------------------------------------------- vehicles

export const releaseSchema = z
  .object({
    id: z.string(),
    revisionId: z.string(),
    designId: z.string(),
    designName: z.string(),
    number: int,
    contentHash: z.string(),
    at: isoTime,
    note: z.string(),
    releasedBy: named,
  })
  .meta({ id: "Release", description: "A revision released to a vehicle." });

export const vehicleSummarySchema = z
  .object({
    id: z.string(),
    name: z.string(),
    serial: z.string(),
    model: z.string(),
    needsAttention: z.boolean(),
    release: releaseSchema.nullable().meta({ description: "The revision released to the vehicle now." }),
  })
  .meta({ id: "VehicleSummary" });

export const vehicleSchema = z
  .object({
    id: z.string(),
    name: z.string(),
    serial: z.string(),
    model: z.string(),
    controllerDescription: z.string(),
    notes: z.string(),
    createdAt: isoTime,
    updatedAt: isoTime,
    needsAttention: z.boolean(),
    release: releaseSchema.nullable(),
    releases: z.array(releaseSchema).meta({ description: "Every release, newest first." }),
    attention: z
      .array(
        z.object({
          id: z.string(),
          reason: z.string(),
          benchRunId: z.string().nullable(),
          step: int.nullable(),
          raisedAt: isoTime,
          raisedBy: named.nullable(),
        }),
      )
      .meta({ description: "Open needs-attention flags." }),
  })
  .meta({ id: "Vehicle" });

export const vehicleListAnswer = z.object({ vehicles: z.array(vehicleSummarySchema), nextCursor: nextCursorSchema });
export const vehicleAnswer = z.object({ vehicle: vehicleSchema });

// ---------------------------------------------------------------- bench runs

const runStatus = z.enum(["in-progress", "completed"]);
const benchExpect = z.object({ drive: z.boolean(), inputs: z.record(z.string(), z.boolean()), latched: z.boolean().optional() });

export const runSummarySchema = z
  .object({
    id: z.string(),
    status: runStatus,
    vehicle: z.object({ id: z.string(), name: z.string() }),
    designName: z.string(),
    revision: int,
    startedAt: isoTime,
    startedBy: named,
    completedAt: isoTime.nullable(),
    steps: z.object({ total: int, done: int, failed: int, skipped: int }),
  })
  .meta({ id: "BenchRunSummary" });

export const runStepSchema = z
  .object({
    n: int,
    kind: z.enum(["row", "sequence"]),
    instruction: z.string(),
    caution: z.string().nullable(),
    set: rowStatesSchema,
    expect: benchExpect,
    covers: z.array(z.string()),
    status: z.enum(STEP_OUTCOMES).nullable().meta({ description: "null until recorded." }),
    note: z.string(),
    updatedAt: isoTime.nullable(),
    updatedBy: named.nullable(),
    failureMailedAt: isoTime.nullable().meta({
      description:
        "When this step's failure was mailed to the revision's author (once per step; sent when the next step is recorded, on request, or in the digest at completion).",
    }),
    photos: z.array(z.object({ id: z.string(), filename: z.string(), contentType: z.string(), url: z.string() })),
  })
  .meta({ id: "BenchStep" });
export type RunStepJson = z.output<typeof runStepSchema>;

export const runSchema = z
  .object({
    id: z.string(),
    status: runStatus,
    vehicle: z.object({ id: z.string(), name: z.string(), serial: z.string() }),
    design: z.object({ id: z.string(), name: z.string() }),
    revision: z.object({ id: z.string(), number: int, contentHash: z.string() }),
    startedAt: isoTime,
    startedBy: named,
    completedAt: isoTime.nullable(),
    completedBy: named.nullable(),
    resultsHash: z.string().nullable().meta({ description: "Hash of the signed record of a completed run." }),
    intact: z.boolean().nullable().meta({ description: "The stored record still matches its hash (null while in progress)." }),
    start: z.object({ set: rowStatesSchema, expect: benchExpect, instruction: z.string() }),
    uncovered: z.array(z.object({ item: z.string(), reason: z.string() })),
    steps: z.array(runStepSchema),
  })
  .meta({ id: "BenchRun" });
export type RunJson = z.output<typeof runSchema>;

export const runListAnswer = z.object({ runs: z.array(runSummarySchema), nextCursor: nextCursorSchema });
export const runAnswer = z.object({ run: runSchema });
export const stepSavedAnswer = z.object({
  step: runStepSchema,
  mailed: z.boolean().meta({
    description:
      "The author was mailed about failed steps recorded earlier in this run (a failed step is mailed once, when the technician moves on to another step).",
  }),
});

// ---------------------------------------------------------------- controller settings records

/** A stored record (chainproof/controller-record@1), unknown keys included. */
export const controllerRecordDocumentSchema = controllerRecordShape.meta({
  id: "ControllerRecord",
  description:
    "A vehicle's controller settings record (chainproof/controller-record@1): the pack, the controller's ratings and its settings, as a technician entered them. Unknown keys are kept.",
});

const throttleClass = z.enum(["released", "applied", "fault", "dead-band"]);
const fixed = z.number();

export const findingSchema = z
  .object({
    code: z.enum(Object.keys(FINDING_CODES) as [keyof typeof FINDING_CODES, ...(keyof typeof FINDING_CODES)[]]),
    severity: z.enum(["error", "warning"]),
    path: z.string().meta({ description: "The record's field the finding is about.", example: "settings.lockouts" }),
    message: z.string().meta({ description: "The difference in words." }),
  })
  .meta({ id: "ControllerFinding" });

export const controllerCheckSchema = z
  .object({
    format: z.literal(CONTROLLER_CHECK_FORMAT),
    derived: z.object({
      pack: z.object({ minV: fixed, nominalV: fixed, maxV: fixed }).meta({ description: "Volts, to 0.01 V." }),
      batteryCurrentA: fixed,
      motorCurrentA: fixed,
      packContinuousA: fixed.optional(),
      precharge: z
        .object({ tauMs: fixed, t95Ms: fixed, t99Ms: fixed, inrushA: fixed, energyJ: fixed, reachedAtDelay: fixed })
        .optional()
        .meta({ description: "At the pack's maximum voltage; absent without a precharge." }),
      throttle: z.object({ rest: throttleClass, full: throttleClass, openSignal: throttleClass, openGround: throttleClass.optional() }),
    }),
    findings: z.array(findingSchema).meta({ description: "Errors first, then by code, then by path." }),
  })
  .meta({
    id: "ControllerCheck",
    description: "The derived values and findings of a record (chainproof/controller-check@1), against a design when one is given.",
  });

export const PROOF_STATES = ["no-record", "no-release", "holds", "does-not-hold", "record-invalid"] as const;

export const controllerRecordVersionSchema = z
  .object({
    version: int.meta({ description: "From 1; every change is a new version." }),
    recordedAt: isoTime,
    recordedBy: person,
  })
  .meta({ id: "ControllerRecordVersion" });

export const controllerRecordAnswer = z.object({
  record: controllerRecordVersionSchema
    .extend({
      document: controllerRecordDocumentSchema,
      check: controllerCheckSchema.meta({ description: "This version's check, against the vehicle's released revision when it has one." }),
    })
    .nullable()
    .meta({ description: "The newest version (or the one asked for with ?version=); null when nothing is recorded." }),
  versions: z.array(controllerRecordVersionSchema).meta({ description: "Every version, newest first." }),
  proof: z
    .object({
      state: z.enum(PROOF_STATES),
      holds: z
        .boolean()
        .nullable()
        .meta({ description: "Whether the released proof holds for the newest record; null without a record or a release." }),
      differences: z.array(z.string()).meta({ description: "Every error finding's message: why the proof does not hold." }),
    })
    .meta({ description: "The vehicle's released revision against its newest record." }),
  caution: z.string().meta({ description: "The record is what was entered, not what the controller holds." }),
});
export type ControllerRecordAnswer = z.output<typeof controllerRecordAnswer>;

export const staleRecordError = errorSchema.extend({
  currentVersion: int.meta({ description: "The record's newest version now (0: none)." }),
});
export const controllerCheckAnswer = z.object({ check: controllerCheckSchema });

// ---------------------------------------------------------------- reviews, mail, the description

export const reviewInboxItemSchema = z
  .object({
    requestId: z.string(),
    revisionId: z.string(),
    designId: z.string(),
    designName: z.string(),
    number: int.meta({ description: "The revision number." }),
    contentHash: z.string().meta({ description: "The revision's content hash (SHA-256)." }),
    reviewerId: z.string(),
    reviewerName: z.string(),
    note: z.string().meta({ description: "What the engineer wrote when asking (may be empty)." }),
    requestedAt: isoTime,
    requestedBy: z.string().meta({ description: "The asking engineer's user id." }),
    requestedByName: z.string(),
    status: z.enum(REVIEW_STATUSES).meta({ description: "Where the revision's review stands, from every reviewer's latest decision." }),
    reviewerDecision: z
      .object({ verdict: z.enum(["approved", "changes-requested"]), decidedAt: isoTime })
      .nullable()
      .meta({ description: "This request's reviewer's latest decision on the revision; null while waiting." }),
  })
  .meta({ id: "ReviewInboxItem" });

export const reviewInboxAnswer = z.object({
  slug: z.string(),
  isReviewer: z.boolean().meta({ description: "The caller is a reviewer: items are the requests addressed to them." }),
  items: z.array(reviewInboxItemSchema),
});
export type ReviewInbox = z.output<typeof reviewInboxAnswer>;

export const outboxAnswer = z.object({
  mail: z.array(
    z.object({
      id: z.string(),
      recipients: z.string(),
      subject: z.string(),
      textBody: z.string(),
      attachments: z.string().meta({ description: "Attachments as name (type, size), one per line." }),
      receivedAt: isoTime,
    }),
  ),
});
export type OutboxAnswer = z.output<typeof outboxAnswer>;

export const openApiAnswer = z.object({
  openapi: z.string(),
  info: z.object({ title: z.string() }),
  paths: z.record(z.string(), z.unknown()),
});
