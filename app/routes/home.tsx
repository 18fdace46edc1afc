import { redirect } from "react-router";
import type { Route } from "./+types/home";
import { requireUser, workspacesOf } from "~/auth/guard.server";

// "/" sends a signed-in user to their first workspace, or to create one.
export async function loader({ request }: Route.LoaderArgs) {
  const { user } = await requireUser(request);
  const spaces = await workspacesOf(user.id);
  throw redirect(spaces[0] ? `/w/${spaces[0].slug}` : "/welcome");
}
