// Request counts of the JSON API's rate limit, in the shape rate-limiter-flexible's PostgreSQL store
// reads and writes (key, points, expire in ms since the epoch); one table for every instance (decision 104).
import { bigint, integer, pgTable, varchar } from "drizzle-orm/pg-core";

export const rateLimitCounter = pgTable("rate_limit_counter", {
  key: varchar("key", { length: 255 }).primaryKey(),
  points: integer("points").notNull().default(0),
  expire: bigint("expire", { mode: "number" }),
});
