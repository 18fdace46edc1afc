import { Link } from "react-router";
import type { Route } from "./+types/workspace-home";
import { requireCan } from "~/auth/context.server";
import { can, ROLE_DUTIES, ROLE_LABELS } from "~/lib/roles";
import { countVehicles } from "~/vehicles/vehicles.server";
import { PageHeader } from "~/components/page-header";
import { SafetyNote } from "~/components/safety-note";
import { fleetControllerStatus } from "~/vehicles/controller-records.server";
import { differenceInWords, proofDoesNotHold } from "~/vehicles/controller-status";
import { ProofMark } from "~/components/controller-record/proof-mark";
import { failedStepsFor } from "~/bench-runs/bench-runs.server";
import { changeRequestsFor } from "~/reviews/reviews.server";
import { When } from "~/designs/design-bits";
import { cardVariants } from "~/components/ui/card";
import { reviewsWaitingFor } from "~/reviews/waiting.server";

export const meta: Route.MetaFunction = () => [{ title: "Overview · Chainproof" }];

export async function loader({ context }: Route.LoaderArgs) {
  const m = requireCan(context, "workspace.view");
  const [vehicleCount, fleet, failedSteps, changeRequests, reviewsWaiting] = await Promise.all([
    countVehicles(m.workspace.id),
    fleetControllerStatus(m.workspace.id),
    failedStepsFor(m.workspace.id, m.user.id),
    changeRequestsFor(m.workspace.id, m.user.id),
    m.role === "reviewer" ? reviewsWaitingFor(m.workspace.id, m.user.id) : Promise.resolve(null),
  ]);
  const marked = [...fleet.values()]
    .filter((f) => proofDoesNotHold(f.status))
    .map((f) => ({ id: f.vehicleId, name: f.vehicleName, differences: differenceInWords(f.status) }))
    .sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
  return {
    workspace: m.workspace,
    role: m.role,
    vehicleCount,
    marked,
    failedSteps: failedSteps.map((f) => ({ ...f, failedAt: f.failedAt?.toISOString() ?? null })),
    changeRequests: changeRequests.map((c) => ({ ...c, decidedAt: c.decidedAt?.toISOString() ?? null })),
    reviewsWaiting,
    readsActivity: can(m.role, "design-events.read"),
  };
}

const NEXT_STEP: Record<string, { text: string; to: string; label: string }> = {
  admin: {
    text: "Invite your engineers, technicians and reviewers, each with the role they need.",
    to: "settings",
    label: "Manage members",
  },
  engineer: { text: "Draw a vehicle's interlock chain and let Chainproof prove its rules.", to: "designs", label: "Open designs" },
  technician: { text: "Pick a vehicle to find what blocks drive, or run a bench test.", to: "vehicles", label: "Open vehicles" },
  reviewer: { text: "Read the truth table of a revision waiting for you and sign it off.", to: "reviews", label: "Open reviews" },
};

export default function WorkspaceHome({ loaderData }: Route.ComponentProps) {
  const next = NEXT_STEP[loaderData.role]!;
  return (
    <>
      <PageHeader
        title={loaderData.workspace.name}
        description={`You are ${ROLE_LABELS[loaderData.role].toLowerCase()} here: you ${ROLE_DUTIES[loaderData.role]}.`}
      />
      {loaderData.failedSteps.length > 0 || loaderData.changeRequests.length > 0 ? (
        <section
          className="mb-6 rounded-lg border-2 border-brick-600/60 bg-white p-5"
          aria-labelledby="yours-h"
          data-testid="your-attention"
        >
          <h2 id="yours-h" className="font-semibold">
            Waiting for you
          </h2>
          {loaderData.failedSteps.length > 0 ? (
            <>
              <h3 className="mt-3 text-sm font-semibold text-ink-700">Failed bench steps on revisions you saved</h3>
              <ul className="mt-2 space-y-3" data-testid="failed-steps">
                {loaderData.failedSteps.map((f) => (
                  <li key={`${f.runId}-${f.n}`} data-run={f.runId} data-step={f.n}>
                    <Link
                      to={`bench-tests/${f.runId}#step-${f.n}`}
                      className="inline-flex min-h-11 items-center font-semibold text-copper-700 underline"
                    >
                      {f.vehicleName}: step {f.n} failed
                    </Link>
                    <p className="text-sm text-ink-700">
                      Revision {f.number} of {f.designName}
                      {f.failedAt ? (
                        <>
                          {" "}
                          · <When iso={f.failedAt} />
                        </>
                      ) : null}
                    </p>
                    <p className="text-sm text-ink-600">{f.instruction}</p>
                    {f.note ? <p className="text-sm italic text-ink-700">“{f.note}”</p> : null}
                  </li>
                ))}
              </ul>
            </>
          ) : null}
          {loaderData.changeRequests.length > 0 ? (
            <>
              <h3 className="mt-4 text-sm font-semibold text-ink-700">Changes requested on your revisions</h3>
              <ul className="mt-2 space-y-3" data-testid="change-requests">
                {loaderData.changeRequests.map((c) => (
                  <li key={c.revisionId}>
                    <Link
                      to={`designs/${c.designId}/revisions/${c.number}/review`}
                      className="inline-flex min-h-11 items-center font-semibold text-copper-700 underline"
                    >
                      {c.designName}, revision {c.number}
                    </Link>
                    <p className="text-sm text-ink-700">
                      {c.reviewerName ? `${c.reviewerName} asked for changes` : "Changes were asked for"}
                      {c.decidedAt ? (
                        <>
                          {" "}
                          · <When iso={c.decidedAt} />
                        </>
                      ) : null}
                    </p>
                    {c.comment ? <p className="text-sm italic text-ink-700">“{c.comment}”</p> : null}
                  </li>
                ))}
              </ul>
            </>
          ) : null}
        </section>
      ) : null}
      {loaderData.marked.length > 0 ? (
        <section className={cardVariants({ padding: "lg", className: "mb-6" })} aria-labelledby="marked-h">
          <h2 id="marked-h" className="font-semibold">
            Controller settings that break a released proof
          </h2>
          <ul className="mt-3 space-y-4">
            {loaderData.marked.map((v) => (
              <li key={v.id}>
                <Link to={`vehicles/${v.id}`} className="font-semibold text-copper-700 underline">
                  {v.name}
                </Link>
                <ProofMark differences={v.differences} to={`vehicles/${v.id}/controller`} compact />
              </li>
            ))}
          </ul>
        </section>
      ) : null}
      <div className="grid gap-4 sm:grid-cols-2">
        {loaderData.reviewsWaiting !== null ? (
          <section className={cardVariants({ padding: "lg" })} aria-labelledby="waiting-h" data-testid="reviews-waiting">
            <h2 id="waiting-h" className="font-semibold">
              Reviews waiting for you
            </h2>
            <p className="mt-2 text-3xl font-semibold tabular-nums">{loaderData.reviewsWaiting}</p>
            <p className="text-sm text-ink-700">
              {loaderData.reviewsWaiting === 0
                ? "Nothing waits for your decision."
                : `revision${loaderData.reviewsWaiting === 1 ? "" : "s"} you were asked to review and have not decided on yet.`}
            </p>
            <Link to="reviews" className="mt-4 inline-block font-semibold text-copper-700 underline">
              Open reviews
            </Link>
          </section>
        ) : null}
        <section className={cardVariants({ padding: "lg" })}>
          <h2 className="font-semibold">Your next step</h2>
          <p className="mt-2 text-sm text-ink-700">{next.text}</p>
          <Link to={next.to} className="mt-4 inline-block font-semibold text-copper-700 underline">
            {next.label}
          </Link>
        </section>
        <section className={cardVariants({ padding: "lg" })}>
          <h2 className="font-semibold">Fleet</h2>
          <p className="mt-2 text-sm text-ink-700">
            {loaderData.vehicleCount === 0
              ? "No vehicles yet."
              : `${loaderData.vehicleCount} vehicle${loaderData.vehicleCount === 1 ? "" : "s"} in this workspace.`}
          </p>
          <Link to="vehicles" className="mt-4 inline-block font-semibold text-copper-700 underline">
            See vehicles
          </Link>
        </section>
        {loaderData.readsActivity ? (
          <section className={cardVariants({ padding: "lg" })}>
            <h2 className="font-semibold">Design activity</h2>
            <p className="mt-2 text-sm text-ink-700">Revisions saved, reviews asked for, comments, decisions and releases, in words.</p>
            <Link to="activity" className="mt-4 inline-block font-semibold text-copper-700 underline">
              Read design activity
            </Link>
          </section>
        ) : null}
      </div>
      <SafetyNote className="mt-6" />
    </>
  );
}
