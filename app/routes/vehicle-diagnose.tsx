// "Why won't it drive?" for one vehicle, on the revision released to it. The engine runs in the
// browser, so every tap answers at once; the server only hands over the released document.
import { Link } from "react-router";
import type { Route } from "./+types/vehicle-diagnose";
import { requireCan } from "~/auth/context.server";
import { currentRelease, getVehicle } from "~/vehicles/vehicles.server";
import { WhyNotPanel } from "~/components/diagnosis/why-not-panel";
import { EmptyState } from "~/components/empty-state";
import { SafetyNote } from "~/components/safety-note";
import { vehicleControllerStatus } from "~/vehicles/controller-records.server";
import { differenceInWords, proofDoesNotHold } from "~/vehicles/controller-status";
import { ProofMark } from "~/components/controller-record/proof-mark";

export async function loader({ params, context }: Route.LoaderArgs) {
  const m = requireCan(context, "workspace.view");
  const v = await getVehicle(m.workspace.id, params.vehicleId);
  if (!v) throw new Response("Not found", { status: 404 });
  const [release, controller] = await Promise.all([currentRelease(m.workspace.id, v.id), vehicleControllerStatus(m.workspace.id, v.id)]);
  return {
    controllerDifferences: proofDoesNotHold(controller.status) ? differenceInWords(controller.status) : [],
    slug: m.workspace.slug,
    vehicle: { id: v.id, name: v.name },
    release: release
      ? {
          designId: release.designId,
          designName: release.designName,
          number: release.number,
          contentHash: release.contentHash,
          document: release.document,
        }
      : null,
  };
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Why won't it drive? ${data?.vehicle.name ?? ""} · Chainproof` }];

export default function VehicleDiagnose({ loaderData }: Route.ComponentProps) {
  const { slug, vehicle, release } = loaderData;
  return (
    <div className="mx-auto max-w-3xl">
      <p className="text-base">
        <Link to={`/w/${slug}/vehicles/${vehicle.id}`} className="inline-flex min-h-11 items-center text-copper-700 underline">
          ← {vehicle.name}
        </Link>
      </p>
      <h1 className="mt-1 text-2xl font-semibold tracking-tight">Why won't it drive?</h1>
      {release ? (
        <p className="mt-1 text-sm text-ink-600">
          Checked against revision {release.number} of{" "}
          <Link to={`/w/${slug}/designs/${release.designId}`} className="underline">
            {release.designName}
          </Link>{" "}
          <span className="font-mono text-xs">({release.contentHash.slice(0, 12)})</span>, released to this vehicle.
        </p>
      ) : null}
      {loaderData.controllerDifferences.length > 0 ? (
        <div className="mt-4">
          <ProofMark differences={loaderData.controllerDifferences} to={`/w/${slug}/vehicles/${vehicle.id}/controller`} />
          <p className="mt-2 text-sm text-ink-700">
            The answers below follow the released design; where the controller is set differently, the vehicle may behave differently from
            them.
          </p>
        </div>
      ) : null}
      <SafetyNote className="my-4" />
      {release ? (
        <WhyNotPanel document={release.document} vehicleName={vehicle.name} />
      ) : (
        <EmptyState title="No revision is released to this vehicle">
          The check needs the design the vehicle is wired to. An engineer releases an approved revision from the vehicle's page.
        </EmptyState>
      )}
    </div>
  );
}
