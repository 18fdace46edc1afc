import { Outlet } from "react-router";
import type { Route } from "./+types/workspace-shell";
import { Shell } from "~/components/shell";
import { WorkspaceErrorBoundary } from "~/components/workspace-error";
import { requireMember, workspacesFor } from "~/auth/guard.server";
import { CAN } from "~/lib/roles";
import { demoAccountsExist } from "~/workspace/workspace.server";
import { env } from "~/env.server";

export async function loader({ request, params }: Route.LoaderArgs) {
  const m = await requireMember(request, params.ws, CAN.view);
  const [workspaces, demo] = await Promise.all([workspacesFor(request, m.user.id), demoAccountsExist()]);
  return { workspace: m.workspace, workspaces, user: m.user, role: m.role, demo, localMail: env.CHAINPROOF_LOCAL === "1" };
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
