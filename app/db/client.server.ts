// The one connection pool and Drizzle instance of the app.
import { drizzle } from "drizzle-orm/node-postgres";
import pg from "pg";
import { env } from "~/env.server";
import * as schema from "./schema.server";
import { databaseDownResponse, isDatabaseDown } from "./unavailable.server";

const globalForDb = globalThis as unknown as { chainproofPool?: pg.Pool };

export const pool =
  globalForDb.chainproofPool ??
  new pg.Pool({ connectionString: env.DATABASE_URL, max: 20, connectionTimeoutMillis: 5_000 });
globalForDb.chainproofPool = pool;
// A dropped connection must not crash the process; the next query reconnects.
pool.on("error", () => {});

// Any query that fails because the database is unreachable throws a 503 Response, wherever it runs:
// a loader or action then answers "cannot reach its database" instead of a 500.
if (!(pool as { chainproofGuarded?: boolean }).chainproofGuarded) {
  (pool as { chainproofGuarded?: boolean }).chainproofGuarded = true;
  const rethrow = (err: unknown) => {
    throw isDatabaseDown(err) ? databaseDownResponse("page") : err;
  };
  const query = pool.query.bind(pool) as (...args: unknown[]) => unknown;
  pool.query = ((...args: unknown[]) => {
    const out = query(...args);
    return out instanceof Promise ? out.catch(rethrow) : out;
  }) as typeof pool.query;
  const connect = pool.connect.bind(pool) as (...args: unknown[]) => unknown;
  pool.connect = ((...args: unknown[]) => {
    const out = connect(...args);
    return out instanceof Promise ? out.catch(rethrow) : out;
  }) as typeof pool.connect;
}

export const db = drizzle(pool, { schema });
export type Db = typeof db;
export { schema };
