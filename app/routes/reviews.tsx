import type { Route } from "./+types/reviews";
import { requireMember } from "~/auth/guard.server";
import { CAN } from "~/lib/roles";
import { PageHeader } from "~/components/page-header";
import { EmptyState } from "~/components/empty-state";

export const meta: Route.MetaFunction = () => [{ title: "Reviews · Chainproof" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const m = await requireMember(request, params.ws, CAN.view);
  return { isReviewer: m.role === "reviewer" };
}

export default function Reviews({ loaderData }: Route.ComponentProps) {
  return (
    <>
      <PageHeader title="Reviews" description="Revisions waiting for a reviewer's decision, and the decisions already taken." />
      <EmptyState title="Nothing to review">
        {loaderData.isReviewer
          ? "When an engineer asks you to review a revision, it appears here and you get an e-mail."
          : "An engineer asks reviewers to sign off a proven revision; the requests and decisions appear here."}
      </EmptyState>
    </>
  );
}
