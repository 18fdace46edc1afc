// The workspace shell's error boundary. A page of the workspace that fails (a 404 for a missing
// design, a thrown error) is shown inside the shell, so the workspace's navigation stays; only when
// the workspace itself cannot be shown (not found, not a member) is the error a page alone.
import { Link, useRouteError, useRouteLoaderData } from "react-router";
import { Shell, type ShellProps } from "./shell";
import { PageError, SectionError } from "./error-boundary";

/** The route id of the workspace shell (app/routes.ts). */
export const WORKSPACE_SHELL_ID = "routes/workspace-shell";

export function WorkspaceErrorBoundary() {
  const shell = useRouteLoaderData<Omit<ShellProps, "children">>(WORKSPACE_SHELL_ID);
  const error = useRouteError();
  if (!shell) return <PageError error={error} />;
  return (
    <Shell {...shell}>
      <SectionError
        back={
          <Link to={`/w/${shell.workspace.slug}`} className="font-semibold text-action-ink underline">
            Back to {shell.workspace.name}
          </Link>
        }
      />
    </Shell>
  );
}
