// The review inbox: for a reviewer, the revisions they were asked to review; for everyone else,
// every review request of the workspace. Each with its revision's status and a link to the review.
// Live: the list is read again from GET /api/v1/reviews every 10 s and when the tab regains focus.
import { useEffect } from "react";
import { Link } from "react-router";
import useSWR from "swr";
import type { Route } from "./+types/reviews";
import { requireCan } from "~/auth/context.server";
import { inboxFor } from "~/reviews/inbox.server";
import { reviewPath } from "~/reviews/paths";
import { VERDICT_LABELS } from "~/reviews/status";
import { PageHeader } from "~/components/page-header";
import { EmptyState } from "~/components/empty-state";
import { HashPrefix, When } from "~/designs/design-bits";
import { ReviewStatusBadge } from "~/components/truth-table/review-status";
import { api } from "~/api/endpoints";
import { apiFetcher, apiUrl } from "~/api/client";
import { Notice } from "~/components/ui/form";
import { cardVariants } from "~/components/ui/card";

export const meta: Route.MetaFunction = () => [{ title: "Reviews · Chainproof" }];

export async function loader({ context }: Route.LoaderArgs) {
  const m = requireCan(context, "workspace.view");
  return inboxFor(m);
}

const fetchInbox = apiFetcher(api.reviewInbox);

export default function Reviews({ loaderData }: Route.ComponentProps) {
  const key = apiUrl(api.reviewInbox, undefined, { workspace: loaderData.slug });
  // The loader's answer is fresh: no refetch on mount; it also replaces an older cached answer.
  const { data, error, mutate } = useSWR(key, fetchInbox, {
    fallbackData: loaderData,
    revalidateOnMount: false,
    revalidateOnFocus: true,
    refreshInterval: 10_000,
  });
  useEffect(() => {
    void mutate(loaderData, { revalidate: false });
  }, [loaderData, mutate]);
  const { slug, isReviewer, items } = data ?? loaderData;
  const waiting = isReviewer ? items.filter((i) => !i.reviewerDecision) : [];
  const rest = isReviewer ? items.filter((i) => i.reviewerDecision) : items;
  return (
    <>
      <PageHeader
        title="Reviews"
        description={
          isReviewer
            ? "Revisions you were asked to review: the ones waiting for your decision first."
            : "Every review request of this workspace, newest first, with where each revision stands."
        }
      />
      {error ? (
        <div className="mb-4">
          <Notice tone="warning">
            Could not refresh the list ({error instanceof Error ? error.message : "network error"}); showing what was loaded last.
          </Notice>
        </div>
      ) : null}
      {items.length === 0 ? (
        <EmptyState title="Nothing to review">
          {isReviewer
            ? "When an engineer asks you to review a revision, it appears here and you get an e-mail."
            : "An engineer asks reviewers to sign off a proven revision from its review page; the requests and decisions appear here."}
        </EmptyState>
      ) : (
        <div className="space-y-6">
          {isReviewer ? (
            <section aria-labelledby="waiting">
              <h2 id="waiting" className="mb-2 font-semibold">
                Waiting for your decision ({waiting.length})
              </h2>
              {waiting.length === 0 ? (
                <p className="text-sm text-ink-600">Nothing is waiting for you.</p>
              ) : (
                <Items slug={slug} items={waiting} showReviewer={false} />
              )}
            </section>
          ) : null}
          {rest.length > 0 ? (
            <section aria-labelledby="others">
              <h2 id="others" className="mb-2 font-semibold">
                {isReviewer ? "Decided" : "Requests"}
              </h2>
              <Items slug={slug} items={rest} showReviewer={!isReviewer} />
            </section>
          ) : null}
        </div>
      )}
    </>
  );
}

function Items({ slug, items, showReviewer }: { slug: string; items: Route.ComponentProps["loaderData"]["items"]; showReviewer: boolean }) {
  return (
    <ul className="space-y-2" aria-label="Review requests">
      {items.map((i) => (
        <li key={i.requestId} className={cardVariants({ padding: "md" })} data-testid="review-item">
          <div className="flex flex-wrap items-start justify-between gap-2">
            <div className="min-w-0">
              <Link
                to={reviewPath(slug, i.designId, i.number)}
                className="font-semibold text-ink-900 hover:text-copper-700 hover:underline"
              >
                {i.designName}, revision {i.number}
              </Link>
              <p className="text-sm text-ink-600">
                Asked by {i.requestedByName}
                {showReviewer ? ` of ${i.reviewerName}` : ""}, <When iso={i.requestedAt} /> · <HashPrefix hash={i.contentHash} />
              </p>
              {i.note ? <p className="mt-1 text-sm text-ink-700">“{i.note}”</p> : null}
            </div>
            <div className="flex flex-col items-end gap-1">
              <ReviewStatusBadge status={i.status} />
              {i.reviewerDecision ? (
                <span className="text-xs text-ink-600">
                  {showReviewer ? `${i.reviewerName}: ` : "You: "}
                  {VERDICT_LABELS[i.reviewerDecision.verdict]}
                </span>
              ) : null}
            </div>
          </div>
        </li>
      ))}
    </ul>
  );
}
