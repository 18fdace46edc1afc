// Telling "the database is down" apart from other failures, so users get a clear 503, not a 500.
const CONNECTION_CODES = new Set([
  "ECONNREFUSED",
  "ECONNRESET",
  "ETIMEDOUT",
  "EPIPE",
  "57P01",
  "57P02",
  "57P03",
  "08000",
  "08001",
  "08003",
  "08006",
]);

export function isDatabaseDown(err: unknown): boolean {
  for (let e: unknown = err, depth = 0; e && depth < 5; depth++) {
    if (e instanceof Response) return e.status === 503;
    const { code, message } = e as { code?: string; message?: string };
    if (code && CONNECTION_CODES.has(code)) return true;
    if (
      typeof message === "string" &&
      /Connection terminated|timeout exceeded when trying to connect|connect ECONNREFUSED|the database system is (starting up|shutting down)/i.test(
        message,
      )
    )
      return true;
    e = (e as { cause?: unknown }).cause;
  }
  return false;
}

export const DATABASE_DOWN_MESSAGE = "Chainproof cannot reach its database right now. Nothing was changed; try again in a minute.";

export function databaseDownResponse(kind: "page" | "api"): Response {
  if (kind === "api") {
    return Response.json(
      { error: { code: "database_unavailable", message: DATABASE_DOWN_MESSAGE, fields: [] } },
      { status: 503, headers: { "retry-after": "30" } },
    );
  }
  return new Response(DATABASE_DOWN_MESSAGE, { status: 503, statusText: "Service unavailable", headers: { "retry-after": "30" } });
}
