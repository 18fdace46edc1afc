// Step outcomes and the forms of a bench run, shared by the run page (instant feedback) and its action.
import { z } from "zod";
import { storable } from "../lib/text";

export const STEP_OUTCOMES = ["pass", "fail", "skip"] as const;
export type StepOutcome = (typeof STEP_OUTCOMES)[number];

export const OUTCOME_LABELS: Record<StepOutcome, string> = { pass: "Pass", fail: "Fail", skip: "Skip" };

const step = z.coerce.number({ message: "Name the step." }).int("Name the step by its number.").min(1, "Steps start at 1.");

export const outcomeSchema = z.object({
  intent: z.literal("outcome"),
  step,
  // An empty outcome clears the step.
  outcome: z.enum([...STEP_OUTCOMES, ""], { message: "Choose pass, fail or skip." }),
});

export const noteSchema = z.object({
  intent: z.literal("note"),
  step,
  note: storable(z.string().max(2000, "Use at most 2000 characters.")),
});

export const mailStepSchema = z.object({ intent: z.literal("mail-step"), step });

export const runFormSchema = z.discriminatedUnion(
  "intent",
  [outcomeSchema, noteSchema, mailStepSchema, z.object({ intent: z.literal("complete") })],
  {
    message: "Unknown action.",
  },
);
