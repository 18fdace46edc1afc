import { Form, Link, useSubmit } from "react-router";
import { Badge } from "~/components/ui/badge";
import type { Route } from "./+types/designs";
import { requireCan } from "~/auth/context.server";
import { can } from "~/lib/roles";
import { countArchivedDesigns, listDesigns } from "~/designs/designs.server";
import { vehicleNames } from "~/vehicles/vehicles.server";
import { designFilterSchema, NO_VEHICLE } from "~/designs/forms";
import { DESIGN_STATUSES, STATUS_LABELS, type DesignSummary } from "~/designs/types";
import { HashPrefix, NotProven, StatusBadge, When } from "~/designs/design-bits";
import { designPath, editorPath } from "~/designs/paths";
import { PageHeader } from "~/components/page-header";
import { SingleFaultResults } from "~/components/common-cause-note";
import { EmptyState } from "~/components/empty-state";
import { reviewStatusOf } from "~/reviews/reviews.server";
import { ReviewStatusBadge } from "~/components/truth-table/review-status";
import type { ReviewStatus } from "~/reviews/status";
import { cardVariants } from "~/components/ui/card";
import { Button } from "~/components/ui/button";
import { ButtonLink } from "~/components/ui/link";

export const meta: Route.MetaFunction = () => [{ title: "Designs · Chainproof" }];

export async function loader({ request, context }: Route.LoaderArgs) {
  const m = requireCan(context, "workspace.view");
  const filter = designFilterSchema.parse(Object.fromEntries(new URL(request.url).searchParams));
  const [designs, vehicles, reviews] = await Promise.all([
    listDesigns(m.workspace.id, filter),
    vehicleNames(m.workspace.id),
    reviewStatusOf(m.workspace.id),
  ]);
  // Review status of the latest revision, and the newest approved one when that is older.
  const review: Record<string, { latest: ReviewStatus | null; approved: number | null }> = {};
  for (const [id, r] of reviews) review[id] = { latest: r.latest?.status ?? null, approved: r.lastApproved?.number ?? null };
  // An empty list with archived designs behind it says so, instead of "no designs yet".
  const hidden = designs.length === 0 && filter.archived === undefined ? await countArchivedDesigns(m.workspace.id) : 0;
  return {
    review,
    hidden,
    canEdit: can(m.role, "design.edit"),
    slug: m.workspace.slug,
    filter,
    designs,
    vehicles,
  };
}

const selectClass =
  "mt-1 block w-full rounded-md border border-ink-300 bg-white px-3 py-2 text-base sm:text-sm focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-500/40";

export default function Designs({ loaderData }: Route.ComponentProps) {
  const { canEdit, filter, designs, vehicles, slug, review, hidden } = loaderData;
  const submit = useSubmit();
  // Showing archived designs too widens the list; it is not a filter that can leave it empty.
  const filtered = filter.vehicle !== undefined || filter.status !== undefined || filter.archived === "only";
  return (
    <>
      <PageHeader
        title="Designs"
        description="A design is one vehicle's drive-inhibit wiring with the safety rules it must keep. Only proven designs are saved as revisions."
        actions={
          canEdit ? (
            <ButtonLink to="new" variant="action">
              New design
            </ButtonLink>
          ) : null
        }
      />

      <Form
        method="get"
        className="mb-5 flex flex-wrap items-end gap-3"
        onChange={(e) => submit(e.currentTarget)}
        aria-label="Filter designs"
      >
        <div className="min-w-48">
          <label htmlFor="filter-vehicle" className="block text-sm font-medium text-ink-700">
            Vehicle
          </label>
          <select
            id="filter-vehicle"
            name="vehicle"
            defaultValue={filter.vehicle ?? ""}
            className={selectClass}
            key={`v-${filter.vehicle ?? ""}`}
          >
            <option value="">All vehicles</option>
            {vehicles.map((v) => (
              <option key={v.id} value={v.id}>
                {v.name}
              </option>
            ))}
            <option value={NO_VEHICLE}>No vehicle</option>
          </select>
        </div>
        <div className="min-w-36">
          <label htmlFor="filter-status" className="block text-sm font-medium text-ink-700">
            Status
          </label>
          <select
            id="filter-status"
            name="status"
            defaultValue={filter.status ?? ""}
            className={selectClass}
            key={`s-${filter.status ?? ""}`}
          >
            <option value="">Any status</option>
            {DESIGN_STATUSES.map((s) => (
              <option key={s} value={s}>
                {STATUS_LABELS[s]}
              </option>
            ))}
          </select>
        </div>
        <label className="flex min-h-10 items-center gap-2 text-sm font-medium text-ink-700">
          <input
            type="checkbox"
            name="archived"
            value="include"
            defaultChecked={filter.archived === "include"}
            key={`a-${filter.archived ?? ""}`}
            className="h-4 w-4"
          />
          Show archived
        </label>
        <noscript>
          <Button type="submit" variant="secondary">
            Apply
          </Button>
        </noscript>
        {filtered || filter.archived ? (
          <Link to="." className="min-h-10 py-2 text-sm font-semibold text-copper-700 underline">
            Clear filters
          </Link>
        ) : null}
      </Form>

      {designs.length === 0 ? (
        filtered ? (
          <EmptyState title="No design matches these filters">Choose another vehicle or status, or clear the filters.</EmptyState>
        ) : hidden > 0 ? (
          <EmptyState
            title={hidden === 1 ? "The one design is archived" : `All ${hidden} designs are archived`}
            action={
              <ButtonLink to="?archived=include" variant="secondary">
                Show archived
              </ButtonLink>
            }
          >
            Archived designs are kept for audit and left out of this list.
            {canEdit ? " Start a new design, or bring one back from the archive on its page." : ""}
          </EmptyState>
        ) : (
          <EmptyState
            title="No designs yet"
            action={
              canEdit ? (
                <ButtonLink to="new" variant="action">
                  Start a design
                </ButtonLink>
              ) : null
            }
          >
            {canEdit
              ? "Draw the wiring on the canvas, prove it with the truth-table engine and save it as revision 1."
              : "Engineers draw designs here; you will see them as soon as one is started."}
          </EmptyState>
        )
      ) : (
        <SingleFaultResults note="mt-4">
          <ul className="space-y-3" aria-label="Designs">
            {designs.map((d) => (
              <DesignRow key={d.id} d={d} canEdit={canEdit} slug={slug} review={review[d.id]} />
            ))}
          </ul>
          {/* The rows count single faults: the note under the list says once what such a count does not cover. */}
        </SingleFaultResults>
      )}
    </>
  );
}

function DesignRow({
  d,
  canEdit,
  slug,
  review,
}: {
  d: DesignSummary;
  canEdit: boolean;
  slug: string;
  review?: { latest: ReviewStatus | null; approved: number | null };
}) {
  const rev = d.latestRevision;
  // An archived design takes no edits: its row opens the canvas read-only (decision 167).
  const editable = canEdit && !d.archived;
  return (
    <li className={cardVariants({ padding: "md" })} data-archived={d.archived ? "true" : undefined}>
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div className="min-w-0">
          <Link to={designPath(slug, d.id)} className="text-base font-semibold text-ink-900 hover:text-copper-700 hover:underline">
            {d.name}
          </Link>
          <p className="text-sm text-ink-600">{d.vehicleName ?? "No vehicle"}</p>
        </div>
        <div className="flex items-center gap-2">
          {d.archived ? (
            <Badge tone="caution" title={`Archived by ${d.archived.by.name}`}>
              Archived
            </Badge>
          ) : null}
          <StatusBadge status={d.status} />
          {review?.latest ? <ReviewStatusBadge status={review.latest} /> : null}
          <ButtonLink to={editorPath(slug, d.id)} variant="secondary" size="dense">
            {editable ? "Edit" : "View canvas"}
          </ButtonLink>
        </div>
      </div>
      <div className="mt-3 flex flex-wrap items-center gap-x-5 gap-y-2 text-sm">
        {rev ? (
          <span className="text-ink-700">
            <span className="font-semibold">Revision {rev.number}</span> ·{" "}
            <span className="text-moss-700">
              proven, {rev.rules === 0 ? "no rules yet" : rev.rules === 1 ? "1 rule holds" : `${rev.rules} rules hold`}
            </span>
            {rev.singleFaults > 0
              ? ` · ${rev.singleFaults} single ${rev.singleFaults === 1 ? "fault defeats a rule" : "faults defeat rules"}`
              : " · no single fault defeats a rule"}{" "}
            · <HashPrefix hash={rev.contentHash} /> · <When iso={rev.createdAt} />
          </span>
        ) : (
          <span className="text-ink-600">No revision yet</span>
        )}
        {review?.approved && review.latest !== "approved" ? (
          <span className="text-moss-700">Revision {review.approved} is approved</span>
        ) : null}
        {d.draft?.changed ? <NotProven check={d.draft.check} /> : null}
      </div>
    </li>
  );
}
