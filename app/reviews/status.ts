// Where a revision's review stands, computed from its requests and decisions (nothing is stored).
// Shared by the server and the pages (no server imports). See docs/decisions/060.

export const REVIEW_STATUSES = ["not-requested", "in-review", "changes-requested", "approved"] as const;
export type ReviewStatus = (typeof REVIEW_STATUSES)[number];

export const REVIEW_STATUS_LABELS: Record<ReviewStatus, string> = {
  "not-requested": "Not reviewed",
  "in-review": "In review",
  "changes-requested": "Changes requested",
  approved: "Approved",
};

export type ReviewVerdict = "approved" | "changes-requested";

export const VERDICT_LABELS: Record<ReviewVerdict, string> = {
  approved: "Approved",
  "changes-requested": "Changes requested",
};

type DecisionLike = { reviewerId: string; verdict: ReviewVerdict; decidedAt: Date | string; contentHash: string };

/**
 * Each reviewer's latest decision on the revision counts, and only when it signed the revision's
 * own content hash. Any "changes requested" among them wins; else any approval approves; else a
 * request makes it "in review".
 */
export function reviewStatus(revisionHash: string, requestCount: number, decisions: readonly DecisionLike[]): ReviewStatus {
  const latest = new Map<string, DecisionLike>();
  for (const d of decisions) {
    if (d.contentHash !== revisionHash) continue;
    const seen = latest.get(d.reviewerId);
    if (!seen || new Date(d.decidedAt).getTime() >= new Date(seen.decidedAt).getTime()) latest.set(d.reviewerId, d);
  }
  const verdicts = [...latest.values()].map((d) => d.verdict);
  if (verdicts.includes("changes-requested")) return "changes-requested";
  if (verdicts.includes("approved")) return "approved";
  return requestCount > 0 || decisions.length > 0 ? "in-review" : "not-requested";
}
