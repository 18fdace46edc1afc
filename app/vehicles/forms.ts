// Forms of the vehicle page, shared by the page (instant feedback) and its action.
import { z } from "zod";
import { ID_MAX, storable } from "../lib/text";

export const releaseSchema = z.object({
  revisionId: storable(z.string().trim().min(1, "Choose a revision to release.").max(ID_MAX, "Choose a revision to release.")),
  note: storable(z.string().trim().max(1000, "Use at most 1000 characters.")).default(""),
  /** Only asked for when the controller settings record contradicts the revision. */
  override: storable(z.string().trim().max(1000, "Use at most 1000 characters.")).default(""),
});

export const clearAttentionSchema = z.object({
  note: storable(z.string().trim().min(1, "Say what was done about it.").max(1000, "Use at most 1000 characters.")),
});
