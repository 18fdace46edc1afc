// The one connection pool and Drizzle instance of the app.
import { drizzle } from "drizzle-orm/node-postgres";
import pg from "pg";
import { env } from "~/env.server";
import * as schema from "./schema.server";

const globalForDb = globalThis as unknown as { chainproofPool?: pg.Pool };

export const pool =
  globalForDb.chainproofPool ?? new pg.Pool({ connectionString: env.DATABASE_URL, max: 20, connectionTimeoutMillis: 5_000 });
globalForDb.chainproofPool = pool;
// A dropped connection must not crash the process; the next query reconnects.
pool.on("error", () => {});

export const db = drizzle(pool, { schema });
export type Db = typeof db;
export { schema };
