import { Outlet } from "react-router";
import type { Route } from "./+types/workspace-shell";
import { Shell } from "~/components/shell";
import { WorkspaceErrorBoundary } from "~/components/workspace-error";
import { requireCan, workspacesIn } from "~/auth/context.server";
import { demoAccountsExist } from "~/workspace/workspace.server";
import { env } from "~/env.server";
import { reviewsWaitingFor } from "~/reviews/waiting.server";

export async function loader({ context }: Route.LoaderArgs) {
  const m = requireCan(context, "workspace.view");
  const [demo, reviewsWaiting] = await Promise.all([
    demoAccountsExist(),
    m.role === "reviewer" ? reviewsWaitingFor(m.workspace.id, m.user.id) : Promise.resolve(null),
  ]);
  return {
    workspace: m.workspace,
    workspaces: workspacesIn(context),
    user: m.user,
    role: m.role,
    demo,
    localMail: env.CHAINPROOF_LOCAL === "1",
    reviewsWaiting,
  };
}

export default function WorkspaceShell({ loaderData }: Route.ComponentProps) {
  return (
    <Shell {...loaderData}>
      <Outlet />
    </Shell>
  );
}

/** A failing page of the workspace keeps the workspace's navigation (app/components/workspace-error.tsx). */
export function ErrorBoundary() {
  return <WorkspaceErrorBoundary />;
}
