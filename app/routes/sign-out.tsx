import { redirect } from "react-router";
import type { Route } from "./+types/sign-out";
import { callAuth, cookiesOf } from "~/auth/forms.server";

export async function loader() {
  return redirect("/");
}

export async function action({ request }: Route.ActionArgs) {
  // Anyone may sign out; without a session better-auth simply has nothing to end.
  const response = await callAuth(request, "/sign-out", {});
  return redirect("/sign-in", { headers: cookiesOf(response) });
}
