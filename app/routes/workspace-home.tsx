import { Link } from "react-router";
import type { Route } from "./+types/workspace-home";
import { requireMember } from "~/auth/guard.server";
import { CAN, ROLE_DUTIES, ROLE_LABELS } from "~/lib/roles";
import { countVehicles } from "~/vehicles/vehicles.server";
import { PageHeader } from "~/components/page-header";
import { SafetyNote } from "~/components/safety-note";
import { fleetControllerStatus } from "~/vehicles/controller-records.server";
import { differenceInWords, proofDoesNotHold } from "~/vehicles/controller-status";
import { ProofMark } from "~/components/controller-record/proof-mark";

export const meta: Route.MetaFunction = () => [{ title: "Overview · Chainproof" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const m = await requireMember(request, params.ws, CAN.view);
  const [vehicleCount, fleet] = await Promise.all([countVehicles(m.workspace.id), fleetControllerStatus(m.workspace.id)]);
  const marked = [...fleet.values()]
    .filter((f) => proofDoesNotHold(f.status))
    .map((f) => ({ id: f.vehicleId, name: f.vehicleName, differences: differenceInWords(f.status) }))
    .sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
  return { workspace: m.workspace, role: m.role, vehicleCount, marked };
}

const NEXT_STEP: Record<string, { text: string; to: string; label: string }> = {
  admin: { text: "Invite your engineers, technicians and reviewers, each with the role they need.", to: "settings", label: "Manage members" },
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
      {loaderData.marked.length > 0 ? (
        <section className="mb-6 rounded-lg border border-ink-200 bg-white p-5" aria-labelledby="marked-h">
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
        <section className="rounded-lg border border-ink-200 bg-white p-5">
          <h2 className="font-semibold">Your next step</h2>
          <p className="mt-2 text-sm text-ink-700">{next.text}</p>
          <Link to={next.to} className="mt-4 inline-block font-semibold text-copper-700 underline">
            {next.label}
          </Link>
        </section>
        <section className="rounded-lg border border-ink-200 bg-white p-5">
          <h2 className="font-semibold">Fleet</h2>
          <p className="mt-2 text-sm text-ink-700">
            {loaderData.vehicleCount === 0 ? "No vehicles yet." : `${loaderData.vehicleCount} vehicle${loaderData.vehicleCount === 1 ? "" : "s"} in this workspace.`}
          </p>
          <Link to="vehicles" className="mt-4 inline-block font-semibold text-copper-700 underline">
            See vehicles
          </Link>
        </section>
      </div>
      <SafetyNote className="mt-6" />
    </>
  );
}
