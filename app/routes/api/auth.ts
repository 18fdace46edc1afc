// better-auth's endpoints (sign-in, sign-up, verification, reset, session) as one splat route.
import type { Route } from "./+types/auth";
import { auth } from "~/auth/auth.server";

export async function loader({ request }: Route.LoaderArgs) {
  return auth.handler(request);
}

export async function action({ request }: Route.ActionArgs) {
  return auth.handler(request);
}
