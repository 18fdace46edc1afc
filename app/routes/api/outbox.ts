// GET /api/v1/outbox: the local mail catcher's messages as JSON, for the live outbox page.
import type { Route } from "./+types/outbox";
import { env } from "~/env.server";
import { recentMail } from "~/mail/outbox.server";
import { withRateLimit } from "~/api/rate-limit.server";

export async function loader({ request }: Route.LoaderArgs) {
  return withRateLimit(request, async () => outbox());
}

async function outbox(): Promise<Response> {
  // Public in local mode by design (docs/decisions/001); absent otherwise.
  if (env.CHAINPROOF_LOCAL !== "1") {
    return Response.json({ error: { code: "not_found", message: "There is no outbox outside local mode.", fields: [] } }, { status: 404 });
  }
  const mail = await recentMail();
  return Response.json({ mail: mail.map((m) => ({ ...m, receivedAt: m.receivedAt.toISOString() })) });
}
