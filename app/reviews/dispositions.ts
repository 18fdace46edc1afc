// Fault dispositions: how each single stuck contact that defeats a rule is dealt with, recorded before
// a revision may be approved. Shared by the server (the authority) and the pages (no server imports).
import { z } from "zod";
import { storable } from "../lib/text";

export const DISPOSITIONS = ["accepted", "fix-next-revision", "ruled-out"] as const;
export type Disposition = (typeof DISPOSITIONS)[number];

export const DISPOSITION_LABELS: Record<Disposition, string> = {
  accepted: "Accepted",
  "fix-next-revision": "To be fixed in the next revision",
  "ruled-out": "Ruled out for this part",
};

/** What each choice asks the justification to say. */
export const DISPOSITION_HINTS: Record<Disposition, string> = {
  accepted: "Why the vehicle stays safe with this fault, e.g. a two-channel contact monitored by the controller.",
  "fix-next-revision": "What will change, and what protects the vehicle until then.",
  "ruled-out": "Why this part cannot fail this way (its construction, its datasheet).",
};

export const FAULT_MODES = ["stuck-open", "stuck-closed"] as const;
export type FaultModeName = (typeof FAULT_MODES)[number];

export const faultKey = (f: { component: string; mode: string }) => `${f.component}/${f.mode}`;
export const faultWords = (f: { component: string; mode: string }) =>
  `${f.component} ${f.mode === "stuck-open" ? "stuck open" : "stuck closed"}`;

export const dispositionSchema = z.object({
  intent: z.literal("dispose"),
  component: storable(z.string().trim().min(1, "Name the contact.").max(64, "Name the contact by its id.")),
  mode: z.enum(FAULT_MODES, { message: "Choose stuck-open or stuck-closed." }),
  disposition: z.enum(DISPOSITIONS, { message: "Choose how this fault is dealt with." }),
  justification: storable(
    z
      .string()
      .trim()
      .min(10, "Justify the disposition in a sentence or more (at least 10 characters).")
      .max(2000, "Use at most 2000 characters."),
  ),
});
export type DispositionInput = z.output<typeof dispositionSchema>;
