import type { Route } from "./+types/bench-tests";
import { requireMember } from "~/auth/guard.server";
import { CAN } from "~/lib/roles";
import { PageHeader } from "~/components/page-header";
import { EmptyState } from "~/components/empty-state";
import { SafetyNote } from "~/components/safety-note";

export const meta: Route.MetaFunction = () => [{ title: "Bench tests · Chainproof" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const m = await requireMember(request, params.ws, CAN.view);
  return { isTechnician: m.role === "technician" };
}

export default function BenchTests({ loaderData }: Route.ComponentProps) {
  return (
    <>
      <PageHeader title="Bench tests" description="Step-by-step checks generated from a vehicle's released design, run on the bench and kept as signed records." />
      <EmptyState title="No bench-test runs yet">
        {loaderData.isTechnician
          ? "Once a revision is released to a vehicle, start a bench test from the vehicle's page."
          : "Technicians run bench tests on vehicles with a released revision; their records appear here."}
      </EmptyState>
      <SafetyNote className="mt-6" />
    </>
  );
}
