// Shape of the design and verdict documents (spec: chainproof/design@1, chainproof/verdict@1).
// Cross-reference rules (unknown ids, states, terminals...) live in validate.ts.
import { z } from "zod";

import { DESIGN_FORMAT, ID_PATTERN, INPUT_FUNCTIONS, LOCKOUTS, VERDICT_FORMAT, type InputFunction, type Lockout } from "./vocabulary";

export {
  DESIGN_FORMAT,
  VERDICT_FORMAT,
  INPUT_FUNCTIONS,
  LOCKOUTS,
  ID_PATTERN,
  TERMINALS,
  type InputFunction,
  type Lockout,
} from "./vocabulary";

// ---------------------------------------------------------------- types

export type Condition = { id: string; label?: string; states: string[] };

export type SupplyComponent = { id: string; type: "supply"; label?: string };
export type ContactComponent = {
  id: string;
  type: "contact";
  label?: string;
  condition: string;
  closedIn: string[];
  part?: string;
};
export type JunctionComponent = { id: string; type: "junction"; label?: string };
export type InputComponent = { id: string; type: "input"; label?: string; function: InputFunction };
export type Component = SupplyComponent | ContactComponent | JunctionComponent | InputComponent;

export type Wire = { from: string; to: string };

export type ThrottleMapping = {
  condition: string;
  released: string[];
  applied: string[];
  fault?: string[];
};

export type Controller = {
  throttle: ThrottleMapping;
  brakeCutsDrive?: boolean;
  lockouts?: Lockout[];
};

export type Predicate =
  { cond: string; in: string[] } | { all: Predicate[] } | { any: Predicate[] } | { not: Predicate } | { always: true };

export type InhibitRule = {
  id: string;
  label?: string;
  type: "inhibit";
  when: Predicate;
  forbid: "drive" | { energized: string };
};
/** In every row where `when` holds (a demand row), steady drive is true (spec 1.6, version 1.1). */
export type RequireDriveRule = { id: string; label?: string; type: "require-drive"; when: Predicate };
export type NoRestartRule = { id: string; label?: string; type: "no-restart" };
export type Rule = InhibitRule | RequireDriveRule | NoRestartRule;
export const RULE_TYPES = ["inhibit", "require-drive", "no-restart"] as const;

export type Design = {
  format: typeof DESIGN_FORMAT;
  name: string;
  conditions: Condition[];
  components: Component[];
  wires: Wire[];
  controller: Controller;
  rules: Rule[];
  layout?: Record<string, unknown>;
  [extra: string]: unknown;
};

/** One row named by its conditions' states (condition id -> state). */
export type RowStates = Record<string, string>;

export type InhibitVerdict = {
  id: string;
  holds: boolean;
  unsafeRows: number;
  violatingRows: number;
  example?: RowStates;
};
export type RequireDriveVerdict = {
  id: string;
  holds: boolean;
  demandRows: number;
  failingRows: number;
  example?: RowStates;
};
export type NoRestartVerdict = { id: string; holds: boolean; trace?: RowStates[] };
export type RuleVerdict = InhibitVerdict | RequireDriveVerdict | NoRestartVerdict;

export type FaultMode = "stuck-open" | "stuck-closed";
export type SingleFault = { component: string; mode: FaultMode; defeats: string[] };

export type Verdict = {
  format: typeof VERDICT_FORMAT;
  ok: boolean;
  rows: number;
  driveRows: number;
  rules: RuleVerdict[];
  singleFaults: SingleFault[];
};

/** A validation problem: `path` names the offending field ("" for the document itself). */
export type Problem = { path: string; message: string };

// ---------------------------------------------------------------- zod schema (shape only)

const id = z.string().regex(ID_PATTERN, { message: "an id is 1-64 characters from A-Z a-z 0-9 _ - ." });
const stateName = z.string().min(1, { message: "a state name must not be empty" }).max(64);
const label = z.string().optional();

const conditionSchema = z.looseObject({
  id,
  label,
  states: z.array(stateName),
});

const componentSchema = z.discriminatedUnion("type", [
  z.looseObject({ id, type: z.literal("supply"), label }),
  z.looseObject({
    id,
    type: z.literal("contact"),
    label,
    condition: id,
    closedIn: z.array(stateName).min(1, { message: "a contact must close in at least one state" }),
    part: z.string().optional(),
  }),
  z.looseObject({ id, type: z.literal("junction"), label }),
  z.looseObject({ id, type: z.literal("input"), label, function: z.enum(INPUT_FUNCTIONS) }),
]);

const wireSchema = z.looseObject({ from: z.string(), to: z.string() });

// Predicates are checked as one object with optional keys plus an "exactly one form" refinement,
// so every problem gets a precise path instead of a vague union failure.
const predicateSchema: z.ZodType<Predicate> = z.lazy(() =>
  z
    .looseObject({
      cond: id.optional(),
      in: z.array(stateName).optional(),
      all: z.array(predicateSchema).optional(),
      any: z.array(predicateSchema).optional(),
      not: predicateSchema.optional(),
      always: z.literal(true).optional(),
    })
    .superRefine((p, ctx) => {
      const forms = ["cond", "all", "any", "not", "always"].filter((k) => (p as Record<string, unknown>)[k] !== undefined);
      if (forms.length !== 1) {
        ctx.addIssue({
          code: "custom",
          message:
            forms.length === 0
              ? 'a predicate is one of {"cond","in"}, {"all"}, {"any"}, {"not"}, {"always": true}'
              : `a predicate has exactly one form; this one mixes ${forms.join(", ")}`,
        });
        return;
      }
      if (forms[0] === "cond" && p.in === undefined) {
        ctx.addIssue({ code: "custom", path: ["in"], message: 'a condition test needs "in": a list of states' });
      }
    }),
) as unknown as z.ZodType<Predicate>;

const ruleSchema = z.discriminatedUnion("type", [
  z.looseObject({
    id,
    label,
    type: z.literal("inhibit"),
    when: predicateSchema,
    forbid: z.union([z.literal("drive"), z.looseObject({ energized: id })], {
      error: 'forbid is "drive" or {"energized": INPUT_ID}',
    }),
  }),
  z.looseObject({ id, label, type: z.literal("require-drive"), when: predicateSchema }),
  z.looseObject({ id, label, type: z.literal("no-restart") }),
]);

const controllerSchema = z.looseObject({
  throttle: z.looseObject({
    condition: id,
    released: z.array(stateName),
    applied: z.array(stateName),
    fault: z.array(stateName).optional(),
  }),
  brakeCutsDrive: z.boolean().optional(),
  lockouts: z.array(z.enum(LOCKOUTS)).optional(),
});

export const designSchema: z.ZodType<Design> = z.looseObject({
  format: z.literal(DESIGN_FORMAT, { error: `format must be "${DESIGN_FORMAT}"` }),
  name: z.string(),
  conditions: z.array(conditionSchema),
  components: z.array(componentSchema),
  wires: z.array(wireSchema),
  controller: controllerSchema,
  rules: z.array(ruleSchema),
  layout: z.record(z.string(), z.unknown()).optional(),
}) as unknown as z.ZodType<Design>;
