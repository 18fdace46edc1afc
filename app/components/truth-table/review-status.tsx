// The review status of a revision as a badge: a word and a shape, colour only repeats them.
import { REVIEW_STATUS_LABELS, type ReviewStatus } from "~/reviews/status";
import { Badge } from "~/components/ui/badge";

const TONES = {
  "not-requested": "plain",
  "in-review": "caution",
  "changes-requested": "failing",
  approved: "proven",
} as const satisfies Record<ReviewStatus, string>;
const MARKS: Record<ReviewStatus, string> = { "not-requested": "○", "in-review": "◔", "changes-requested": "✕", approved: "✓" };

export function ReviewStatusBadge({ status, number }: { status: ReviewStatus; number?: number }) {
  return (
    <Badge tone={TONES[status]} data-review-status={status}>
      <span aria-hidden="true">{MARKS[status]}</span>
      {number !== undefined ? `Revision ${number}: ` : ""}
      {REVIEW_STATUS_LABELS[status]}
    </Badge>
  );
}
