// How many review requests wait for one reviewer: asked, and not yet decided by them (the reviews
// page's "Waiting for your decision"). Counted in one query: the navigation shows it on every page.
import { and, count, eq, notExists, sql } from "drizzle-orm";
import { db, schema } from "~/db/client.server";

const { reviewRequest, reviewDecision } = schema;

export async function reviewsWaitingFor(workspaceId: string, reviewerId: string): Promise<number> {
  const [row] = await db
    .select({ n: count() })
    .from(reviewRequest)
    .where(
      and(
        eq(reviewRequest.workspaceId, workspaceId),
        eq(reviewRequest.reviewerId, reviewerId),
        notExists(
          db
            .select({ one: sql`1` })
            .from(reviewDecision)
            .where(
              and(
                eq(reviewDecision.workspaceId, workspaceId),
                eq(reviewDecision.revisionId, reviewRequest.revisionId),
                eq(reviewDecision.reviewerId, reviewerId),
              ),
            ),
        ),
      ),
    );
  return row?.n ?? 0;
}
