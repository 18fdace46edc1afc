// Schemas of the design pages and API bodies, shared by the browser (immediate feedback) and the
// server (the authority).
import { z } from "zod";
import { textProblem } from "../lib/text";
import { DESIGN_STATUSES, REVISION_MESSAGE_MAX } from "./types";

/** How a new design starts: blank, or a copy of one of the demo designs. */
export const STARTS = [
  {
    key: "blank",
    label: "Blank",
    description: "A supply, an unwired enable input, a throttle and one “must drive when” rule to complete.",
  },
  { key: "haybarn", label: "Haybarn campus hauler", description: "Key, seat, charge inlet and park brake; every rule holds." },
  { key: "meadowline", label: "Meadowline deck mower", description: "Seat switch without its lockout; the no-restart rule fails." },
  { key: "scree", label: "Scree trail bike", description: "Side-stand switch bridged by a button; the side-stand rule fails." },
] as const;
export type StartKey = (typeof STARTS)[number]["key"];
const startKeys = STARTS.map((s) => s.key) as [StartKey, ...StartKey[]];

// PostgreSQL text refuses the NUL character, an unpaired surrogate has no UTF-8 form, and direction
// overrides disguise text (lib/text.ts).
const storableText = (s: string) => textProblem(s) === null;
const UNSTORABLE_MESSAGE = "Remove the NUL character, the broken surrogate pair or the text-direction override.";
/** The largest number a PostgreSQL integer column (versions, revision numbers) holds. */
const PG_INT_MAX = 2_147_483_647;

export const designNameSchema = z
  .string()
  .trim()
  .min(1, "Enter a name.")
  .max(120, "Use at most 120 characters.")
  .refine(storableText, UNSTORABLE_MESSAGE);

/** The create form (vehicleId "" means no vehicle). */
export const createDesignSchema = z.object({
  name: designNameSchema,
  vehicleId: z
    .string()
    .trim()
    .max(100, "Choose a vehicle from the list.")
    .refine(storableText, "Choose a vehicle from the list.")
    .optional()
    .transform((v) => (v ? v : null)),
  start: z.enum(startKeys, { message: "Choose how the design starts." }).default("blank"),
});
export type CreateDesignInput = z.output<typeof createDesignSchema>;

/** The same, as a JSON body of POST /api/v1/designs (vehicleId may be null). */
export const createDesignBodySchema = z.object({
  name: designNameSchema,
  vehicleId: z
    .string()
    .trim()
    .max(100)
    .refine(storableText, UNSTORABLE_MESSAGE)
    .nullable()
    .optional()
    .transform((v) => (v ? v : null)),
  start: z.enum(startKeys, { message: `start is one of ${startKeys.join(", ")}` }).default("blank"),
});

/** Which designs a list shows besides those in use: archived ones too, or only them (docs/decisions/167). */
export const ARCHIVED_FILTERS = ["include", "only"] as const;
export const archivedFilterSchema = z.enum(ARCHIVED_FILTERS, { message: `archived is one of ${ARCHIVED_FILTERS.join(", ")}` }).optional();

/** Filters of the design list, from the query string; a value that makes no sense is ignored. */
export const designFilterSchema = z.object({
  vehicle: z.string().trim().min(1).max(100).refine(storableText).optional().catch(undefined),
  status: z.enum(DESIGN_STATUSES).optional().catch(undefined),
  archived: archivedFilterSchema.catch(undefined),
});

/** PATCH /api/v1/designs/:id: archive (true) or bring back (false); an unknown key is refused, not ignored. */
export const designPatchBodySchema = z.strictObject({
  archived: z.boolean({ message: "archived is true (archive the design) or false (bring it back)." }),
});

/** The design page's archive and restore buttons (intent names which). */
export const archiveFormSchema = z.object({
  intent: z.enum(["archive", "restore"], { message: "intent is archive or restore." }),
});
export type DesignFilter = z.output<typeof designFilterSchema>;
/** The vehicle filter value for designs that belong to no vehicle. */
export const NO_VEHICLE = "none";

export const saveRevisionBodySchema = z.object({
  document: z.unknown().refine((v) => v !== undefined, { message: "Send the design document." }),
  baseRevision: z
    .number({ message: "baseRevision is the number of the revision this change starts from (0 when none)." })
    .int("baseRevision is a whole number.")
    .min(0, "baseRevision is 0 or more.")
    .max(PG_INT_MAX, `baseRevision is at most ${PG_INT_MAX}.`),
  message: z
    .string()
    .trim()
    .max(REVISION_MESSAGE_MAX, `Use at most ${REVISION_MESSAGE_MAX} characters.`)
    .refine(storableText, UNSTORABLE_MESSAGE)
    .optional()
    .default(""),
});

export const saveDraftBodySchema = z.object({
  document: z.record(z.string(), z.unknown(), { message: "The draft document is a JSON object." }),
  version: z
    .number({ message: "version is the draft version you last loaded or saved (0 when there is no draft)." })
    .int("version is a whole number.")
    .min(0, "version is 0 or more.")
    .max(PG_INT_MAX, `version is at most ${PG_INT_MAX}.`),
  baseRevision: z
    .number()
    .int("baseRevision is a whole number.")
    .min(0, "baseRevision is 0 or more.")
    .max(PG_INT_MAX, `baseRevision is at most ${PG_INT_MAX}.`)
    .optional(),
});

export const proofBodySchema = z.object({
  document: z.unknown().refine((v) => v !== undefined, { message: "Send the design document." }),
});

/** A JSON body must be an object before its fields are checked. */
export const jsonObjectSchema = z.record(z.string(), z.unknown(), { message: "The request body is a JSON object." });
