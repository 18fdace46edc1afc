// better-auth's endpoints (sign-in, sign-up, verification, reset, session) as one splat route.
import type { Route } from "./+types/auth";
import { auth } from "~/auth/auth.server";
import { drainBody } from "~/lib/read-body.server";

export async function loader({ request }: Route.LoaderArgs) {
  return auth.handler(request);
}

/** No better-auth request needs more (a name, an address, a password, a token). */
const AUTH_BODY_MAX_BYTES = 64_000;

export async function action({ request }: Route.ActionArgs) {
  if (Number(request.headers.get("content-length") ?? 0) > AUTH_BODY_MAX_BYTES) {
    // Read on (and drop) what is still coming, up to 8 MB, so the client reads the 413 instead of a reset.
    if (request.body) await drainBody(request.body.getReader(), 8_000_000);
    return Response.json(
      { code: "TOO_LARGE", message: `The request body is larger than ${AUTH_BODY_MAX_BYTES.toLocaleString("en-US")} bytes.` },
      { status: 413 },
    );
  }
  return auth.handler(request);
}
