// Inputs of the JSON API (/api/v1) that are not a page form's: query strings, JSON bodies and
// pagination. The routes validate with these and the OpenAPI document is generated from the same
// schemas (the endpoint table, app/api/endpoints.ts), so the description cannot drift from what is checked.
import { z } from "zod";
import { storable } from "../lib/text";
import { vehicleSchema } from "~/lib/forms";
import { STEP_OUTCOMES } from "~/bench-runs/outcomes";
import { controllerRecordSchema } from "~/controller-record";
import { designSchema } from "~/engine";

/** Items per page when ?limit is not given (lists that page by default), and the most allowed. */
export const PAGE_LIMIT_DEFAULT = 50;
export const PAGE_LIMIT_MAX = 100;

/** ?limit=N&cursor=OPAQUE (docs/decisions/085). */
export const pageQuerySchema = z.object({
  limit: z.coerce
    .number({ message: `limit is a whole number from 1 to ${PAGE_LIMIT_MAX}.` })
    .int(`limit is a whole number from 1 to ${PAGE_LIMIT_MAX}.`)
    .min(1, `limit is a whole number from 1 to ${PAGE_LIMIT_MAX}.`)
    .max(PAGE_LIMIT_MAX, `limit is at most ${PAGE_LIMIT_MAX}.`)
    .optional()
    .meta({ description: `Items per page, 1 to ${PAGE_LIMIT_MAX}.` }),
  cursor: z
    .string()
    .min(1, "cursor is the nextCursor of the previous page.")
    .max(512, "cursor is the nextCursor of the previous page.")
    .optional()
    .meta({ description: "The nextCursor of the previous page; opaque." }),
});
export type PageQuery = z.output<typeof pageQuerySchema>;

export const workspaceQuerySchema = z.object({
  workspace: z
    .string({ message: "Name the workspace: ?workspace=SLUG." })
    .min(1, "Name the workspace: ?workspace=SLUG.")
    // eslint-disable-next-line no-control-regex -- finding control characters is what this pattern is for
    .regex(/^[^\u0000]*$/, "a workspace slug")
    .meta({
      description: "The workspace's slug, as in /w/SLUG.",
    }),
});

export const vehicleListQuerySchema = workspaceQuerySchema.extend(pageQuerySchema.shape);

export const BENCH_RUN_STATUSES = ["in-progress", "completed", "failures"] as const;

const runFilterShape = {
  status: z
    .enum(BENCH_RUN_STATUSES, { message: `status is one of ${BENCH_RUN_STATUSES.join(", ")}.` })
    .optional()
    .meta({ description: '"failures": runs with at least one failed step.' }),
  ...pageQuerySchema.shape,
};

/** GET /api/v1/bench-runs?workspace=SLUG[&vehicle=ID][&status=] */
export const benchRunListQuerySchema = workspaceQuerySchema.extend({
  vehicle: z
    .string()
    .min(1)
    .max(100)
    // eslint-disable-next-line no-control-regex -- finding control characters is what this pattern is for
    .regex(/^[^\u0000]*$/, "a vehicle id")
    .optional()
    .meta({ description: "Only the runs of this vehicle." }),
  ...runFilterShape,
});

/** GET /api/v1/vehicles/:vehicleId/bench-runs */
export const vehicleRunListQuerySchema = z.object(runFilterShape);

/** POST /api/v1/vehicles?workspace=SLUG: the same fields and rules as the vehicle form. */
export const vehicleCreateBodySchema = vehicleSchema;

const v = vehicleSchema.shape;
/** PATCH /api/v1/vehicles/:vehicleId: any of the form's fields; the rest keep their values. */
export const vehiclePatchBodySchema = z
  .object({
    name: v.name.optional(),
    serial: v.serial.unwrap().optional(),
    model: v.model.unwrap().optional(),
    controllerDescription: v.controllerDescription.unwrap().optional(),
    notes: v.notes.unwrap().optional(),
  })
  .refine((b) => Object.values(b).some((x) => x !== undefined), {
    message: "Send at least one of name, serial, model, controllerDescription, notes.",
  });

/** PUT /api/v1/bench-runs/:runId/steps/:n */
export const stepResultBodySchema = z.object({
  status: z.enum(STEP_OUTCOMES, { message: `status is one of ${STEP_OUTCOMES.join(", ")}.` }),
  note: storable(z.string({ message: "note is text." }).max(2000, "Use at most 2000 characters.")).optional(),
});

const rowStatesSchema = z.record(z.string(), z.string({ message: "a state name is text" }), {
  message: "states names every condition's state: { CONDITION_ID: STATE }.",
});

/** POST /api/v1/designs/:designId/revisions/:number/diagnosis */
export const diagnosisBodySchema = z.object({
  states: rowStatesSchema.meta({ description: "Every condition's state in the row to diagnose: { CONDITION_ID: STATE }." }),
  measured: z
    .record(z.string(), z.boolean({ message: "a reading is true (live) or false (dead)" }), {
      message: "measured maps input ids to readings: { INPUT_ID: true | false }.",
    })
    .optional()
    .meta({ description: "Input readings taken on the vehicle (true: live); the answer names single contact faults that explain them." }),
  history: z
    .array(rowStatesSchema)
    .max(100, "At most 100 earlier rows.")
    .optional()
    .meta({ description: "Earlier rows, oldest first: the row is replayed after them from power-up, so a latched lockout shows." }),
});

/** The record as a request body: every rule of the record (the orders, the limits) is checked. */
const recordBody = controllerRecordSchema.meta({
  id: "ControllerRecordInput",
  description:
    "A controller settings record (chainproof/controller-record@1). Every impossible value is refused with its path; unknown keys are kept.",
});

/** GET /api/v1/vehicles/:vehicleId/controller-record[?version=N] */
export const controllerRecordQuerySchema = z.object({
  version: z.coerce
    .number({ message: "version is a whole number from 1." })
    .int("version is a whole number from 1.")
    .min(1, "version is a whole number from 1.")
    .optional()
    .meta({ description: "An earlier version; the newest without it." }),
});

/** PUT /api/v1/vehicles/:vehicleId/controller-record */
export const controllerRecordPutBodySchema = z.object({
  version: z
    .number({ message: "version is the record's newest version as you read it (0 when it has none)." })
    .int("version is a whole number.")
    .min(0, "version is 0 or more.")
    .meta({
      description:
        "The version this change was made on: the newest as you read it, 0 when the vehicle has none. Another version saved since answers 409.",
    }),
  record: recordBody,
});

/** POST /api/v1/controller-checks?workspace=SLUG */
export const controllerCheckBodySchema = z.object({
  record: recordBody,
  design: designSchema.optional().meta({
    description: "A design (chainproof/design@1) whose proof's assumptions the record is checked against (section 4 of the record's spec).",
  }),
});
