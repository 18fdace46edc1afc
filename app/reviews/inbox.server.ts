// The review inbox as plain JSON, shared by the reviews page's loader and GET /api/v1/reviews so the
// page and the API answer the same thing: for a reviewer, the requests addressed to them; for
// everyone else, every review request of the workspace (newest first).
import type { Membership } from "~/auth/guard.server";
import { can } from "~/lib/roles";
import type { ReviewInbox } from "~/api/answers";
import { reviewInbox } from "./reviews.server";

export async function inboxFor(m: Membership): Promise<ReviewInbox> {
  const isReviewer = can(m.role, "review.decide");
  const items = await reviewInbox(m.workspace.id, isReviewer ? m.user.id : undefined);
  return {
    slug: m.workspace.slug,
    isReviewer,
    items: items.map((i) => ({
      ...i,
      requestedAt: i.requestedAt.toISOString(),
      reviewerDecision: i.reviewerDecision ? { ...i.reviewerDecision, decidedAt: i.reviewerDecision.decidedAt.toISOString() } : null,
    })),
  };
}
