// The API rate limit's counting (fixed windows on an injected clock) and whom a request counts against.
import { describe, expect, it } from "vitest";
import { RateLimiterMemory } from "rate-limiter-flexible";
import { clientKeyOf, countsInStore, createRateLimit, FixedWindowCounter } from "../../../app/api/rate-limit.server";

function clock(start = 1_000_000) {
  let t = start;
  return { now: () => t, advance: (ms: number) => (t += ms) };
}

describe("FixedWindowCounter", () => {
  it("allows `limit` hits a window, refuses the next with the seconds left, and starts afresh after the window", () => {
    const c = clock();
    const counter = new FixedWindowCounter(3, 60_000, c.now);
    expect([1, 2, 3].map(() => counter.hit("a"))).toEqual([
      { ok: true, limit: 3, remaining: 2, resetSeconds: 60 },
      { ok: true, limit: 3, remaining: 1, resetSeconds: 60 },
      { ok: true, limit: 3, remaining: 0, resetSeconds: 60 },
    ]);
    c.advance(15_500);
    expect(counter.hit("a")).toEqual({ ok: false, limit: 3, retryAfterSeconds: 45 });
    expect(counter.blockedFor("a")).toBe(45);
    // Other clients have their own windows.
    expect(counter.hit("b")).toMatchObject({ ok: true, remaining: 2 });
    c.advance(44_500);
    expect(counter.blockedFor("a")).toBe(0);
    expect(counter.hit("a")).toMatchObject({ ok: true, remaining: 2, resetSeconds: 60 });
  });

  it("never answers Retry-After 0 in the last moments of a window", () => {
    const c = clock();
    const counter = new FixedWindowCounter(1, 60_000, c.now);
    counter.hit("a");
    c.advance(59_999);
    expect(counter.hit("a")).toEqual({ ok: false, limit: 1, retryAfterSeconds: 1 });
  });

  it("charges requests already answered past the limit, and peeking does not count", () => {
    const c = clock();
    const counter = new FixedWindowCounter(2, 60_000, c.now);
    expect(counter.blockedFor("addr")).toBe(0);
    counter.charge("addr");
    counter.charge("addr");
    counter.charge("addr");
    expect(counter.blockedFor("addr")).toBe(60);
    expect(counter.hit("addr").ok).toBe(false);
  });

  it("forgets clients whose window has passed, so the map does not grow without bound", () => {
    const c = clock();
    const counter = new FixedWindowCounter(5, 60_000, c.now);
    for (let i = 0; i < 1000; i++) counter.hit(`client-${i}`);
    expect(counter.size).toBe(1000);
    c.advance(60_000);
    counter.hit("late");
    expect(counter.size).toBe(1);
  });
});

describe("clientKeyOf", () => {
  const headers = (h: Record<string, string>) => new Headers(h);

  it("counts an API key, else the session cookie, else the client address; secrets are hashed", () => {
    const key = clientKeyOf(
      headers({
        authorization: "Bearer cpk_secret-value",
        cookie: "better-auth.session_token=abc.def",
        "x-chainproof-client-ip": "198.51.100.4",
      }),
    );
    expect(key).toMatchObject({ anonymous: false, address: "addr:198.51.100.4" });
    expect(key.key).toMatch(/^key:[\w-]{22}$/);
    expect(key.key).not.toContain("secret");

    const session = clientKeyOf(
      headers({ cookie: "theme=dark; better-auth.session_token=abc.def; other=1", "x-chainproof-client-ip": "198.51.100.4" }),
    );
    expect(session.key).toMatch(/^session:[\w-]{22}$/);
    expect(session.key).not.toBe(key.key);
    // The secure-cookie name (https) is the same session.
    expect(clientKeyOf(headers({ cookie: "__Secure-better-auth.session_token=abc.def" })).key).toBe(session.key);

    expect(clientKeyOf(headers({ cookie: "theme=dark", "x-chainproof-client-ip": "198.51.100.4" }))).toEqual({
      key: "addr:198.51.100.4",
      address: "addr:198.51.100.4",
      anonymous: true,
    });
    // Without our server in front (the dev server), every anonymous client shares one address.
    expect(clientKeyOf(headers({})).key).toBe("addr:local");
  });

  it("tells sessions apart, and does not throw on malformed cookies", () => {
    const a = clientKeyOf(headers({ cookie: "better-auth.session_token=one" })).key;
    const b = clientKeyOf(headers({ cookie: "better-auth.session_token=two" })).key;
    expect(a).not.toBe(b);
    expect(clientKeyOf(headers({ cookie: "better-auth.session_token=%E0%A4%A" })).anonymous).toBe(false);
    expect(clientKeyOf(headers({ cookie: ";;;=;better-auth.session_token=" })).anonymous).toBe(true);
  });
});

describe("withRateLimit", () => {
  const ok = async () => Response.json({ ok: true });
  const refused = async () => Response.json({ error: { code: "unauthenticated", message: "no", fields: [] } }, { status: 401 });
  const req = (h: Record<string, string>) => new Request("http://chainproof.test/api/v1/designs?workspace=larkspur", { headers: h });
  const limiter = (limit: number) => createRateLimit(new FixedWindowCounter(limit, 60_000, clock().now));

  it("answers 429 in the error shape with Retry-After once a session used its limit; other sessions go on", async () => {
    const limited = limiter(2);
    const alice = { cookie: "better-auth.session_token=alice", "x-chainproof-client-ip": "203.0.113.5" };
    const first = await limited(req(alice), ok);
    expect(first.status).toBe(200);
    expect(first.headers.get("ratelimit-limit")).toBe("2");
    expect(first.headers.get("ratelimit-remaining")).toBe("1");
    expect((await limited(req(alice), ok)).status).toBe(200);
    let ran = false;
    const third = await limited(req(alice), async () => ((ran = true), Response.json({})));
    expect(ran).toBe(false);
    expect(third.status).toBe(429);
    expect(third.headers.get("retry-after")).toBe("60");
    const body = (await third.json()) as { error: { code: string; message: string; fields: unknown[] } };
    expect(body.error).toMatchObject({ code: "rate_limited", fields: [] });
    expect(body.error.message).toMatch(/at most 2 a minute/);
    // Same address, another session: its own budget.
    expect((await limited(req({ ...alice, cookie: "better-auth.session_token=bob" }), ok)).status).toBe(200);
  });

  it("counts anonymous requests per address, and refused credentials against their address too", async () => {
    const limited = limiter(2);
    const from = (ip: string, h: Record<string, string> = {}) => req({ "x-chainproof-client-ip": ip, ...h });
    expect((await limited(from("192.0.2.1"), refused)).status).toBe(401);
    expect((await limited(from("192.0.2.1"), refused)).status).toBe(401);
    expect((await limited(from("192.0.2.1"), refused)).status).toBe(429);
    expect((await limited(from("192.0.2.2"), refused)).status).toBe(401);

    // Made-up bearer keys, a new one each time, still run into their address's limit.
    const forged = (n: number) => from("192.0.2.9", { authorization: `Bearer made-up-${n}` });
    expect((await limited(forged(1), refused)).status).toBe(401);
    expect((await limited(forged(2), refused)).status).toBe(401);
    expect((await limited(forged(3), refused)).status).toBe(429);
  });

  it("counts the same through rate-limiter-flexible's store (the memory store standing in for PostgreSQL's)", async () => {
    // Two instances with one store: what each counts, the other sees.
    const store = countsInStore(new RateLimiterMemory({ points: 2, duration: 60 }));
    const [instanceA, instanceB] = [createRateLimit(store), createRateLimit(store)];
    const alice = { cookie: "better-auth.session_token=alice", "x-chainproof-client-ip": "203.0.113.5" };
    expect((await instanceA(req(alice), ok)).status).toBe(200);
    expect((await instanceB(req(alice), ok)).headers.get("ratelimit-remaining")).toBe("0");
    expect((await instanceA(req(alice), ok)).status).toBe(429);
    const refusedAgain = await instanceB(req(alice), ok);
    expect(refusedAgain.status).toBe(429);
    expect(Number(refusedAgain.headers.get("retry-after"))).toBeGreaterThanOrEqual(1);
    // Refused credentials are charged to their address in the store too.
    const forged = (n: number) => req({ "x-chainproof-client-ip": "192.0.2.9", authorization: `Bearer made-up-${n}` });
    expect((await instanceA(forged(1), refused)).status).toBe(401);
    expect((await instanceB(forged(2), refused)).status).toBe(401);
    await new Promise((r) => setTimeout(r, 10)); // the charge is written in the background
    expect((await instanceA(forged(3), refused)).status).toBe(429);
  });
});
