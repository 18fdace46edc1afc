import type { Route } from "./+types/designs";
import { requireMember } from "~/auth/guard.server";
import { CAN } from "~/lib/roles";
import { PageHeader } from "~/components/page-header";
import { EmptyState } from "~/components/empty-state";

export const meta: Route.MetaFunction = () => [{ title: "Designs · Chainproof" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const m = await requireMember(request, params.ws, CAN.view);
  return { canEdit: (CAN.editDesigns as readonly string[]).includes(m.role) };
}

export default function Designs({ loaderData }: Route.ComponentProps) {
  return (
    <>
      <PageHeader title="Designs" description="A design is one vehicle's drive-inhibit wiring with the safety rules it must keep." />
      <EmptyState title="No designs yet">
        {loaderData.canEdit
          ? "Designs are drawn on the canvas, proven by the truth-table evaluator and saved as numbered revisions."
          : "Engineers draw designs here; you will see them as soon as one is saved."}
      </EmptyState>
    </>
  );
}
