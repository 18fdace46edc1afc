// Form schemas of the review page, shared by the page and the action (the authority).
import { z } from "zod";
import { ID_MAX, storable } from "../lib/text";

const comment = (what: string) => storable(z.string().trim().min(1, `Write ${what}.`).max(4000, "Use at most 4000 characters."));

export const requestReviewSchema = z.object({
  intent: z.literal("request"),
  reviewers: z
    .array(storable(z.string().min(1).max(ID_MAX, "Choose reviewers from the list.")))
    .max(50, "Choose at most 50 reviewers.")
    .min(1, "Choose at least one reviewer."),
  note: storable(z.string().trim().max(2000, "Use at most 2000 characters.")).default(""),
});

export const commentSchema = z.discriminatedUnion("anchor", [
  z.object({ intent: z.literal("comment"), anchor: z.literal("revision"), body: comment("a comment") }),
  z.object({
    intent: z.literal("comment"),
    anchor: z.literal("row"),
    row: z.coerce.number({ message: "Enter a row number." }).int("Enter a whole row number.").min(0, "Rows start at 0."),
    body: comment("a comment"),
  }),
  z.object({
    intent: z.literal("comment"),
    anchor: z.literal("component"),
    component: storable(z.string().trim().min(1, "Choose a component.").max(ID_MAX, "Choose a component.")),
    body: comment("a comment"),
  }),
]);

export const decisionSchema = z.object({
  intent: z.literal("decide"),
  verdict: z.enum(["approved", "changes-requested"], { message: "Choose approve or request changes." }),
  comment: comment("a comment with your decision"),
});

/** FormData to a plain object; `reviewers` may repeat. */
export function reviewFormObject(form: FormData): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [k, v] of form) {
    if (typeof v !== "string") continue;
    if (k !== "reviewers") out[k] = v;
    else if (Array.isArray(out.reviewers)) out.reviewers.push(v);
    else out.reviewers = [v];
  }
  return out;
}

/** A revision number in a query (`compare=`, `revision=`); an empty value is no value. */
const revisionInQuery = (what: string) =>
  z.preprocess(
    (v) => (v === "" ? undefined : v),
    z.coerce
      .number({ message: `${what}: give a revision number.` })
      .int(`${what}: give a whole revision number.`)
      .min(1, `${what}: revisions are numbered from 1.`)
      .max(999_999_999, `${what}: no design has that many revisions.`)
      .optional(),
  );

/** The report's query (page and PDF): the paper, and the revision to compare with when the reviewer chose one. */
export const reportQuerySchema = z.object({
  size: z.enum(["a4", "letter"], { message: "size: choose a4 or letter." }).default("a4"),
  compare: revisionInQuery("compare"),
});

/** The review page's query: the revision to compare with and, from its chooser, the revision to review. */
export const reviewQuerySchema = z.object({ compare: revisionInQuery("compare"), revision: revisionInQuery("revision") });
