// The JSON API's per-client rate limit against the running app: one session sends more than the
// limit (API_RATE_LIMIT a minute, read from the RateLimit-Limit header) and gets 429 in the error
// shape with Retry-After, on every /api/v1 endpoint; another session and the pages go on working.
import { beforeAll, describe, expect, it } from "vitest";
import { DEMO, signIn, type Client } from "../support/http";

// The limit is far above normal use (docs/decisions/080); refuse to run thousands of requests for
// a limit nobody would set in a test stack.
const MOST_REQUESTS = 25_000;
const PARALLEL = 16;

let limited: Client, other: Client;

beforeAll(async () => {
  [limited, other] = await Promise.all([signIn(DEMO.engineer), signIn(DEMO.engineer)]);
});

describe("API rate limit", () => {
  it("answers 429 rate_limited with Retry-After once a session passed its limit, for that session only", { timeout: 180_000 }, async () => {
    // A request that needs no database: the method check answers 405 under the limit.
    const cheap = () => limited.fetch("/api/v1/designs?workspace=larkspur", { method: "PATCH" });
    const probe = await cheap();
    expect(probe.status).toBe(405);
    const limit = Number(probe.headers.get("ratelimit-limit"));
    expect(Number.isInteger(limit) && limit > 0).toBe(true);
    expect(limit).toBeLessThanOrEqual(MOST_REQUESTS);
    expect(Number(probe.headers.get("ratelimit-remaining"))).toBe(limit - 1);

    let answered = 1;
    let first429: Response | null = null;
    while (!first429 && answered < 2 * limit + PARALLEL) {
      const batch = await Promise.all(Array.from({ length: PARALLEL }, cheap));
      for (const r of batch) {
        if (r.status === 429) first429 ??= r;
        else {
          expect(r.status).toBe(405);
          answered += 1;
        }
        if (r !== first429) await r.body?.cancel();
      }
    }
    expect(first429).not.toBeNull();
    // Not before the limit (more only if a new minute began during the run).
    expect(answered).toBeGreaterThanOrEqual(limit);
    const retryAfter = Number(first429!.headers.get("retry-after"));
    expect(retryAfter).toBeGreaterThanOrEqual(1);
    expect(retryAfter).toBeLessThanOrEqual(60);
    expect(first429!.headers.get("content-type")).toMatch(/application\/json/);
    const body = (await first429!.json()) as { error: { code: string; message: string; fields: unknown[] } };
    expect(body.error.code).toBe("rate_limited");
    expect(body.error.message).toMatch(/a minute/);
    expect(body.error.fields).toEqual([]);

    // Every /api/v1 endpoint shares the session's budget: reading a list is refused too.
    const list = await limited.fetch("/api/v1/designs?workspace=larkspur");
    expect(list.status).toBe(429);
    expect(((await list.json()) as { error: { code: string } }).error.code).toBe("rate_limited");

    // Another session of the same person is counted on its own; pages are not limited.
    const otherList = await other.fetch("/api/v1/designs?workspace=larkspur");
    expect(otherList.status).toBe(200);
    expect(Number(otherList.headers.get("ratelimit-remaining"))).toBe(limit - 1);
    expect((await limited.fetch("/w/larkspur/designs")).status).toBe(200);
  });
});
