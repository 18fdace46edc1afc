// Text a user can type into any field, checked the same way on every way in (forms, the JSON API,
// better-auth's own endpoints). PostgreSQL text cannot hold NUL; an unpaired surrogate has no UTF-8
// form; the bidirectional embedding, override and isolate controls (Unicode Standard Annex #9,
// section 2) make a name or note display as something other than what it says.
import type { z } from "zod";

// eslint-disable-next-line no-control-regex -- finding control characters is what this pattern is for
const NUL = /\u0000/;
const LONE_SURROGATE = /[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/;
// What a form body's decoder makes of a lone surrogate or other broken UTF-8: nobody types it on purpose.
const REPLACEMENT = /\ufffd/;
const BIDI_CONTROL = /[\u202a-\u202e\u2066-\u2069]/;

/** Why `s` cannot be stored as typed, or null. */
export function textProblem(s: string): string | null {
  if (NUL.test(s)) return "Remove the NUL character.";
  if (LONE_SURROGATE.test(s) || REPLACEMENT.test(s))
    return "Remove the broken character (an unpaired surrogate, or U+FFFD where text was damaged).";
  if (BIDI_CONTROL.test(s)) return "Remove the text-direction override characters (U+202A–U+202E, U+2066–U+2069).";
  return null;
}

/** The same check on a zod string, field errors in the schema's usual shape. */
export function storable<T extends z.ZodString>(schema: T): T {
  return schema.superRefine((s, ctx) => {
    const problem = textProblem(s);
    if (problem) ctx.addIssue({ code: "custom", message: problem });
  });
}

/** An id sent in a form or body (a member, key, invitation, revision): short, storable. */
export const ID_MAX = 100;
