// The workspace's design events in plain words for the people who review and draw designs: who saved,
// archived or brought back a design, asked for a review, commented, approved, disposed of a fault or
// released, on which revision. Pure (no server imports): the activity page and its tests both use it. Events that are not about
// designs (sign-ins, members, keys) are not design events and are never described here.
import { DISPOSITION_LABELS, type Disposition } from "~/reviews/dispositions";
import { designPath } from "~/designs/paths";
import { reviewPath } from "~/reviews/paths";

export const DESIGN_EVENT_ACTIONS = [
  "design.created",
  "design.revision-saved",
  "design.archived",
  "design.unarchived",
  "review.requested",
  "review.commented",
  "review.approved",
  "review.changes-requested",
  "review.fault-disposed",
  "vehicle.revision-released",
] as const;
export type DesignEventAction = (typeof DESIGN_EVENT_ACTIONS)[number];

export type DesignEvent = { action: string; subject: string | null; detail: Record<string, unknown> | null; actorName: string | null };
/** A sentence (actor first), and where to read more when there is a page for it. */
export type EventWords = { text: string; href: string | null };

const str = (v: unknown): string | null => (typeof v === "string" && v.length > 0 ? v : null);
const num = (v: unknown): number | null => (typeof v === "number" && Number.isInteger(v) ? v : null);
const quoted = (s: string | null, fallback: string) => (s ? `“${s}”` : fallback);
const MODES: Record<string, string> = { "stuck-closed": "stuck closed", "stuck-open": "stuck open" };

/** The most of a justification an activity line quotes; the review page and the report give it whole. */
export const JUSTIFICATION_CHARS = 120;

/** A justification on one line, cut at a word before JUSTIFICATION_CHARS (then ending "…"). */
export function shortJustification(text: string): string {
  const flat = text.replace(/\s+/g, " ").trim();
  if (flat.length <= JUSTIFICATION_CHARS) return flat;
  const head = flat.slice(0, JUSTIFICATION_CHARS - 1);
  const space = head.lastIndexOf(" ");
  // A single word longer than a third of the room is cut inside the word.
  return `${(space > JUSTIFICATION_CHARS / 3 ? head.slice(0, space) : head).replace(/[\s,;:.–—-]+$/, "")}…`;
}

export function isDesignEvent(action: string): action is DesignEventAction {
  return (DESIGN_EVENT_ACTIONS as readonly string[]).includes(action);
}

/** The event in words, or null for an event that is not about designs. */
export function describeDesignEvent(e: DesignEvent, slug: string): EventWords | null {
  if (!isDesignEvent(e.action)) return null;
  const who = e.actorName || "Someone";
  const d = e.detail ?? {};
  const designId = str(d.designId);
  const number = num(d.number);
  const review = designId && number !== null ? reviewPath(slug, designId, number) : null;
  // "Haybarn hauler revision 3" is how the review events name their revision.
  const revision = quoted(e.subject, "a revision");
  switch (e.action) {
    case "design.created":
      return {
        text: `${who} created the design ${quoted(e.subject, "")}`.trimEnd() + ".",
        href: designId ? designPath(slug, designId) : null,
      };
    case "design.revision-saved":
      return {
        text: `${who} saved ${number !== null ? `revision ${number}` : "a revision"} of ${quoted(e.subject, "a design")}.`,
        href: review,
      };
    case "design.archived":
      return {
        text: `${who} archived the design ${quoted(e.subject, "")}`.trimEnd() + "; its revisions stay readable.",
        href: designId ? designPath(slug, designId) : null,
      };
    case "design.unarchived":
      return {
        text: `${who} brought back the design ${quoted(e.subject, "")}`.trimEnd() + " from the archive.",
        href: designId ? designPath(slug, designId) : null,
      };
    case "review.requested": {
      const n = Array.isArray(d.reviewers) ? d.reviewers.length : 0;
      const whom = n === 1 ? "a reviewer" : n > 1 ? `${n} reviewers` : "reviewers";
      return { text: `${who} asked ${whom} to review ${revision}.`, href: review };
    }
    case "review.commented": {
      const row = num(d.row);
      const component = str(d.component);
      const on =
        d.anchor === "row" && row !== null
          ? ` (on truth-table row ${row})`
          : d.anchor === "component" && component
            ? ` (on part ${component})`
            : "";
      // Comments name their revision only through the subject; link the review when the number is known.
      const commented = designId ? reviewFromSubject(slug, designId, e.subject) : null;
      return { text: `${who} commented on ${revision}${on}.`, href: commented };
    }
    case "review.approved":
      return { text: `${who} approved ${revision}.`, href: review };
    case "review.changes-requested":
      return { text: `${who} asked for changes to ${revision}.`, href: review };
    case "review.fault-disposed": {
      const [component, mode] = (str(d.fault) ?? "").split("/");
      const fault = component ? `${component} ${MODES[mode ?? ""] ?? "stuck"}` : "a single fault";
      const label = DISPOSITION_LABELS[d.disposition as Disposition] ?? str(d.dispositionLabel);
      const why = str(d.justification) ? shortJustification(str(d.justification)!) : "";
      return {
        text: `${who} recorded how ${fault} in ${revision} is dealt with${label ? `: ${label.toLowerCase()}` : ""}${why ? `. Justification: “${why}”` : "."}`,
        href: review,
      };
    }
    case "vehicle.revision-released": {
      const vehicleId = str(d.vehicleId);
      const design = str(d.design);
      const rev = number !== null ? `revision ${number}` : "a revision";
      const what = design ? `“${design}” ${rev}` : rev;
      const where = e.subject ? `the vehicle “${e.subject}”` : "a vehicle";
      const override = d.controllerOverride ? ", against the vehicle's recorded controller settings (with a stated reason)" : "";
      return { text: `${who} put ${what} on ${where}${override}.`, href: vehicleId ? `/w/${slug}/vehicles/${vehicleId}` : null };
    }
  }
}

/** Comment events carry the revision only in their subject ("Name revision N"). */
function reviewFromSubject(slug: string, designId: string, subject: string | null): string | null {
  const m = subject ? /revision (\d{1,9})$/.exec(subject) : null;
  return m ? reviewPath(slug, designId, Number(m[1])) : null;
}
