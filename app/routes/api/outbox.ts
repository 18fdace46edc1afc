// GET /api/v1/outbox: the local mail catcher's messages as JSON, for the live outbox page.
import type { Route } from "./+types/outbox";
import { env } from "~/env.server";
import { recentMail } from "~/mail/outbox.server";
import { apiError, handleApi, reply } from "~/api/http.server";
import { api } from "~/api/endpoints";

export async function loader({ request }: Route.LoaderArgs) {
  return handleApi(request, outbox);
}

async function outbox(): Promise<Response> {
  // Public in local mode by design (docs/decisions/001); absent otherwise.
  if (env.CHAINPROOF_LOCAL !== "1") {
    return apiError(404, "not_found", "There is no outbox outside local mode.");
  }
  const mail = await recentMail();
  return reply(api.outbox, 200, { mail: mail.map((m) => ({ ...m, receivedAt: m.receivedAt.toISOString() })) });
}
