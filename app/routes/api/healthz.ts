// Liveness and database reachability, for the start script and load balancers. Public by design.
import { sql } from "drizzle-orm";
import { db } from "~/db/client.server";

export async function loader() {
  try {
    await db.execute(sql`select 1`);
    return Response.json({ ok: true });
  } catch {
    return Response.json(
      { ok: false, error: { code: "database_unavailable", message: "The database is not reachable." } },
      { status: 503 },
    );
  }
}
