// The review status of a revision as a badge: a word and a shape, colour only repeats them.
import { REVIEW_STATUS_LABELS, type ReviewStatus } from "~/reviews/status";

const TONES: Record<ReviewStatus, string> = {
  "not-requested": "border-ink-300 bg-white text-ink-700",
  "in-review": "border-copper-500/50 bg-copper-50 text-copper-700",
  "changes-requested": "border-brick-600/50 bg-brick-50 text-brick-700",
  approved: "border-moss-600/50 bg-moss-50 text-moss-700",
};
const MARKS: Record<ReviewStatus, string> = { "not-requested": "○", "in-review": "◔", "changes-requested": "✕", approved: "✓" };

export function ReviewStatusBadge({ status, number }: { status: ReviewStatus; number?: number }) {
  return (
    <span className={`inline-flex items-center gap-1 rounded-full border px-2 py-0.5 text-xs font-semibold ${TONES[status]}`} data-review-status={status}>
      <span aria-hidden="true">{MARKS[status]}</span>
      {number !== undefined ? `Revision ${number}: ` : ""}
      {REVIEW_STATUS_LABELS[status]}
    </span>
  );
}
