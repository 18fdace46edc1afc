// The JSON API's rate limit as the app runs it: rate-limit.server.ts's rules over rate-limiter-flexible's
// PostgreSQL store, so every process on every machine counts into one table (decision 104).
import { RateLimiterMemory, RateLimiterPostgres } from "rate-limiter-flexible";
import { pool } from "~/db/client.server";
import { env } from "~/env.server";
import { countsInStore, createRateLimit } from "./rate-limit.server";

/**
 * The limit every /api/v1 request goes through (handleApi): API_RATE_LIMIT a minute per client, counted
 * in PostgreSQL (table rate_limit_counter) for every process and machine at once. Should PostgreSQL not
 * answer, each process counts on its own meanwhile (the store's insurance limiter) instead of failing.
 */
export const withRateLimit = createRateLimit(
  countsInStore(
    new RateLimiterPostgres({
      storeClient: pool,
      tableName: "rate_limit_counter",
      tableCreated: true, // the migration makes it (app/db/schema/rate-limit.server.ts)
      keyPrefix: "api",
      points: env.API_RATE_LIMIT,
      duration: 60,
      insuranceLimiter: new RateLimiterMemory({ keyPrefix: "api", points: env.API_RATE_LIMIT, duration: 60 }),
    }),
  ),
);
