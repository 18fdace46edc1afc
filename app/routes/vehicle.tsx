import { Link } from "react-router";
import type { Route } from "./+types/vehicle";
import { requireMember } from "~/auth/guard.server";
import { CAN } from "~/lib/roles";
import { getVehicle } from "~/vehicles/vehicles.server";
import { PageHeader } from "~/components/page-header";
import { SafetyNote } from "~/components/safety-note";

export async function loader({ request, params }: Route.LoaderArgs) {
  const m = await requireMember(request, params.ws, CAN.view);
  const v = await getVehicle(m.workspace.id, params.vehicleId);
  if (!v) throw new Response("Not found", { status: 404 });
  return { vehicle: { id: v.id, name: v.name, serial: v.serial, model: v.model, controllerDescription: v.controllerDescription, notes: v.notes } };
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.vehicle.name ?? "Vehicle"} · Chainproof` }];

export default function Vehicle({ loaderData }: Route.ComponentProps) {
  const v = loaderData.vehicle;
  return (
    <>
      <p className="mb-2 text-sm">
        <Link to=".." relative="path" className="text-copper-700 underline">All vehicles</Link>
      </p>
      <PageHeader title={v.name} description={[v.model, v.serial].filter(Boolean).join(" · ")} />
      <dl className="grid max-w-2xl gap-4 rounded-lg border border-ink-200 bg-white p-5 sm:grid-cols-2">
        <div>
          <dt className="text-xs font-medium uppercase tracking-wide text-ink-500">Serial or VIN</dt>
          <dd className="mt-1">{v.serial || "—"}</dd>
        </div>
        <div>
          <dt className="text-xs font-medium uppercase tracking-wide text-ink-500">Model</dt>
          <dd className="mt-1">{v.model || "—"}</dd>
        </div>
        <div className="sm:col-span-2">
          <dt className="text-xs font-medium uppercase tracking-wide text-ink-500">Motor controller</dt>
          <dd className="mt-1 whitespace-pre-wrap">{v.controllerDescription || "—"}</dd>
        </div>
        <div className="sm:col-span-2">
          <dt className="text-xs font-medium uppercase tracking-wide text-ink-500">Notes</dt>
          <dd className="mt-1 whitespace-pre-wrap">{v.notes || "—"}</dd>
        </div>
      </dl>
      <SafetyNote className="mt-6 max-w-2xl" />
    </>
  );
}
