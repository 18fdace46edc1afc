// Row groups and blocking reasons over the API (spec section 4): the query strings and the answers,
// written once as zod schemas. The routes validate with them; the endpoint table (endpoints.ts) uses them.
import { z } from "zod";
import { BLOCKING_REASONS } from "~/engine";

/** Groups per answer when ?limit is not given, and the most allowed (groupCount tells the rest). */
export const GROUP_LIMIT_DEFAULT = 1000;
export const GROUP_LIMIT_MAX = 10_000;

const limit = z.coerce
  .number({ message: `limit is a whole number from 1 to ${GROUP_LIMIT_MAX}.` })
  .int(`limit is a whole number from 1 to ${GROUP_LIMIT_MAX}.`)
  .min(1, `limit is a whole number from 1 to ${GROUP_LIMIT_MAX}.`)
  .max(GROUP_LIMIT_MAX, `limit is at most ${GROUP_LIMIT_MAX}.`)
  .default(GROUP_LIMIT_DEFAULT)
  .meta({
    description: `Groups to return (per reason for why), 1 to ${GROUP_LIMIT_MAX}; ${GROUP_LIMIT_DEFAULT} by default. groupCount says how many there are.`,
  });

export const groupsQuerySchema = z.object({
  set: z
    .string({ message: "Name the set: ?set=drive, unsafe:RULE, violating:RULE, demand:RULE, failing:RULE or broken:CONTACT/MODE." })
    .min(1, "Name the set: ?set=drive, unsafe:RULE, violating:RULE, demand:RULE, failing:RULE or broken:CONTACT/MODE.")
    .max(200, "set is at most 200 characters.")
    .meta({ description: "drive, unsafe:RULE, violating:RULE, demand:RULE, failing:RULE or broken:CONTACT/stuck-open|stuck-closed." }),
  limit,
});

export const whyQuerySchema = z.object({
  rule: z
    .string({ message: "Name the rule: ?rule=ID (an inhibit rule that forbids drive)." })
    .min(1, "Name the rule: ?rule=ID (an inhibit rule that forbids drive).")
    .max(64, "a rule id is at most 64 characters.")
    .meta({ description: "An inhibit rule that forbids drive." }),
  limit,
});

export const rowGroupSchema = z
  .object({
    rows: z.number().int().meta({ description: "Rows in the group: the product of its subsets' sizes." }),
    states: z
      .record(z.string(), z.array(z.string()))
      .meta({ description: "Condition id -> its allowed states; a condition left out may be in any state." }),
  })
  .meta({ id: "RowGroup" });

export const groupsDocumentSchema = z
  .object({
    format: z.literal("chainproof/groups@1"),
    set: z.string(),
    rows: z.number().int().meta({ description: "Rows in the set." }),
    groups: z
      .array(rowGroupSchema)
      .meta({ description: "Pairwise disjoint; together exactly the set (the first `limit` when groupCount is larger)." }),
    groupCount: z.number().int().meta({ description: "All groups of the set." }),
  })
  .meta({ id: "RowGroups" });

export const whyDocumentSchema = z
  .object({
    format: z.literal("chainproof/why@1"),
    rule: z.string(),
    unsafeRows: z.number().int(),
    reasons: z.array(
      z.object({
        reason: z.enum(BLOCKING_REASONS),
        rows: z.number().int(),
        groups: z.array(rowGroupSchema),
        groupCount: z.number().int(),
      }),
    ),
  })
  .meta({ id: "WhyRuleHolds" });
