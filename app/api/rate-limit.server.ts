// Per-client request limit of the JSON API (/api/v1): fixed one-minute windows counted in PostgreSQL
// with rate-limiter-flexible, one count for every process and machine (docs/decisions/080, 104).
// Checked before authentication, so a refused request costs one upsert and no session lookup.
import { createHash } from "node:crypto";
import { RateLimiterRes, type RateLimiterAbstract } from "rate-limiter-flexible";
import { sessionCookieOf } from "../auth/session-cache.server";

/** Set by our HTTP server from the socket, or the address the last trusted proxy added (TRUST_PROXY hops); decisions 003, 103. */
const CLIENT_IP_HEADER = "x-chainproof-client-ip";

export type Hit =
  { ok: true; limit: number; remaining: number; resetSeconds: number } | { ok: false; limit: number; retryAfterSeconds: number };
type Refused = Extract<Hit, { ok: false }>;

/** Counts hits per key in fixed windows of `windowMs`; expired windows are swept as time moves on. */
export class FixedWindowCounter {
  private readonly windows = new Map<string, { start: number; count: number }>();
  private lastSweep = 0;

  constructor(
    readonly limit: number,
    readonly windowMs: number,
    private readonly now: () => number = Date.now,
  ) {}

  /** Counts one request for `key`; refused (not counted) once the window's limit is reached. */
  hit(key: string): Hit {
    const w = this.current(key, true)!;
    if (w.count >= this.limit) return { ok: false, limit: this.limit, retryAfterSeconds: this.secondsLeft(w) };
    w.count += 1;
    return { ok: true, limit: this.limit, remaining: this.limit - w.count, resetSeconds: this.secondsLeft(w) };
  }

  /** Seconds until `key` may send again (0: it may now), without counting. */
  blockedFor(key: string): number {
    const w = this.current(key, false);
    return w !== null && w.count >= this.limit ? this.secondsLeft(w) : 0;
  }

  /** Counts one request for `key` even past the limit (for requests already answered). */
  charge(key: string): void {
    this.current(key, true)!.count += 1;
  }

  get size(): number {
    return this.windows.size;
  }

  private current(key: string, create: boolean): { start: number; count: number } | null {
    const t = this.now();
    if (t - this.lastSweep >= this.windowMs) {
      for (const [k, w] of this.windows) if (t - w.start >= this.windowMs) this.windows.delete(k);
      this.lastSweep = t;
    }
    let w = this.windows.get(key);
    if (w && t - w.start >= this.windowMs) w = undefined;
    if (!w) {
      if (!create) return null;
      w = { start: t, count: 0 };
      this.windows.set(key, w);
    }
    return w;
  }

  private secondsLeft(w: { start: number }): number {
    return Math.max(1, Math.ceil((w.start + this.windowMs - this.now()) / 1000));
  }
}

const digest = (s: string) => createHash("sha256").update(s).digest("base64url").slice(0, 22);

/**
 * Whom a request is counted against: its API key or session cookie (as sent; checked later by the
 * guard), else its client address. Credentials are hashed so the map holds no secrets.
 */
export function clientKeyOf(headers: Headers): { key: string; address: string; anonymous: boolean } {
  const address = `addr:${headers.get(CLIENT_IP_HEADER) ?? "local"}`;
  const authorization = headers.get("authorization");
  if (authorization?.toLowerCase().startsWith("bearer ")) {
    return { key: `key:${digest(authorization.slice(7).trim())}`, address, anonymous: false };
  }
  const session = sessionCookieOf(headers.get("cookie"));
  if (session) return { key: `session:${digest(session)}`, address, anonymous: false };
  return { key: address, address, anonymous: true };
}

function limitedResponse(hit: Refused): Response {
  return Response.json(
    {
      error: {
        code: "rate_limited",
        message: `Too many requests: at most ${hit.limit.toLocaleString("en-US")} a minute per API key, session or address. Try again in ${hit.retryAfterSeconds} s.`,
        fields: [],
      },
    },
    {
      status: 429,
      headers: { "retry-after": String(hit.retryAfterSeconds), "ratelimit-limit": String(hit.limit), "ratelimit-remaining": "0" },
    },
  );
}

type Who = ReturnType<typeof clientKeyOf>;

/**
 * Whether one more request from `who` may run, counted. Anonymous requests, and requests whose
 * credentials the guard refused (charged afterwards), count against the client address too, so
 * made-up credentials do not escape the limit.
 */
export function admit(counter: FixedWindowCounter, who: Who): Hit {
  const addressWait = who.anonymous ? 0 : counter.blockedFor(who.address);
  if (addressWait > 0) return { ok: false, limit: counter.limit, retryAfterSeconds: addressWait };
  return counter.hit(who.key);
}

/** Where the counts live: this process (tests), or the shared store (countsInStore: PostgreSQL in production). */
export type Counts = { admit(who: Who): Hit | Promise<Hit>; charge(address: string): void };

export const countsHere = (counter: FixedWindowCounter): Counts => ({
  admit: (who) => admit(counter, who),
  charge: (address) => counter.charge(address),
});

/**
 * The same rules over a rate-limiter-flexible store: fixed windows of `duration` seconds, `points`
 * requests each. Behind a load balancer every instance counts into PostgreSQL, so a client gets the
 * limit once, not once per machine (issue 11; decision 104).
 */
export function countsInStore(limiter: RateLimiterAbstract): Counts {
  const refused = (msBeforeNext: number): Hit => ({
    ok: false,
    limit: limiter.points,
    retryAfterSeconds: Math.max(1, Math.ceil(msBeforeNext / 1000)),
  });
  return {
    async admit(who) {
      if (!who.anonymous) {
        const address = await limiter.get(who.address);
        if (address && address.consumedPoints >= limiter.points) return refused(address.msBeforeNext);
      }
      try {
        const r = await limiter.consume(who.key);
        return {
          ok: true,
          limit: limiter.points,
          remaining: r.remainingPoints,
          resetSeconds: Math.max(1, Math.ceil(r.msBeforeNext / 1000)),
        };
      } catch (err) {
        if (err instanceof RateLimiterRes) return refused(err.msBeforeNext);
        throw err;
      }
    },
    charge(address) {
      limiter.penalty(address, 1).catch(() => {});
    },
  };
}

/** Runs API requests under the limit; every answer says how much of it is left. */
export function createRateLimit(source: FixedWindowCounter | Counts) {
  const counts = source instanceof FixedWindowCounter ? countsHere(source) : source;
  return async function withRateLimit(request: Request, run: () => Promise<Response>): Promise<Response> {
    const who = clientKeyOf(request.headers);
    const hit = await counts.admit(who);
    if (!hit.ok) return limitedResponse(hit);
    const response = await run();
    if (!who.anonymous && response.status === 401) counts.charge(who.address);
    try {
      response.headers.set("ratelimit-limit", String(hit.limit));
      response.headers.set("ratelimit-remaining", String(hit.remaining));
      response.headers.set("ratelimit-reset", String(hit.resetSeconds));
    } catch {
      // A response with immutable headers goes out as it is.
    }
    return response;
  };
}
