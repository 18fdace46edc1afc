// The workspace's design activity in plain words: revisions saved, reviews asked for, comments,
// decisions, fault dispositions and releases, newest first. For admins, engineers and reviewers.
import { Link } from "react-router";
import type { Route } from "./+types/activity";
import { requireCan } from "~/auth/context.server";
import { designEvents } from "~/audit/audit.server";
import { describeDesignEvent } from "~/audit/design-events";
import { PageHeader } from "~/components/page-header";
import { EmptyState } from "~/components/empty-state";
import { When } from "~/designs/design-bits";
import { cardVariants } from "~/components/ui/card";

export const meta: Route.MetaFunction = () => [{ title: "Design activity · Chainproof" }];

export async function loader({ context }: Route.LoaderArgs) {
  const m = requireCan(context, "design-events.read");
  const events = await designEvents(m.workspace.id, 100);
  return {
    events: events.flatMap((e) => {
      const words = describeDesignEvent(e, m.workspace.slug);
      return words ? [{ id: e.id, at: e.at.toISOString(), ...words }] : [];
    }),
  };
}

export default function Activity({ loaderData }: Route.ComponentProps) {
  const { events } = loaderData;
  return (
    <>
      <PageHeader
        title="Design activity"
        description="Who saved, asked for a review, commented, decided, dealt with a fault or released, newest first (the last 100)."
      />
      {events.length === 0 ? (
        <EmptyState title="No design activity yet">Saving a revision, asking for a review and every decision on it appear here.</EmptyState>
      ) : (
        <ol className={cardVariants({ padding: "none", className: "divide-y divide-ink-100" })} aria-label="Design activity">
          {events.map((e) => (
            <li
              key={e.id}
              className="flex flex-col gap-1 px-4 py-3 text-sm sm:flex-row sm:items-baseline sm:gap-4"
              data-testid="design-event"
            >
              <span className="flex-none text-xs text-ink-500 sm:w-40">
                <When iso={e.at} />
              </span>
              <span className="min-w-0 [overflow-wrap:anywhere]">
                {e.text}{" "}
                {e.href ? (
                  <Link to={e.href} className="whitespace-nowrap font-semibold text-copper-700 underline">
                    Open
                  </Link>
                ) : null}
              </span>
            </li>
          ))}
        </ol>
      )}
    </>
  );
}
