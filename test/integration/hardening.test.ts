// Issue 11: what a careful outside tester tried against a default install, each answered with a clean
// refusal. One describe per finding; each test failed before its fix.
import { describe, expect, it } from "vitest";
import { client, DEMO, DEMO_PASSWORD, formBody, signIn } from "../support/http";

describe("open redirect after sign-in", () => {
  const hostile = ["/%09/evil.example/", "/%0a/evil.example/", "/%0d%0a/evil.example/", "/%5cevil.example/", "/.//evil.example/", "/%E2%80%8A/evil.example/"];

  it.each(hostile)("a signed-in user sent to /sign-in?next=%s stays on our site", async (next) => {
    const c = await signIn(DEMO.reviewer);
    const res = await c.fetch(`/sign-in?next=${next}`);
    expect(res.status).toBe(302);
    expect(res.headers.get("location")).toBe("/");
  });

  it("signing in with a hostile next goes home; a path of ours is kept", async () => {
    const hostileRes = await client().fetch("/sign-in", formBody({ email: DEMO.reviewer, password: DEMO_PASSWORD, next: "/\t/evil.example/" }));
    expect(hostileRes.status).toBe(302);
    expect(hostileRes.headers.get("location")).toBe("/");
    const kept = await client().fetch("/sign-in", formBody({ email: DEMO.reviewer, password: DEMO_PASSWORD, next: "/w/larkspur/reviews" }));
    expect(kept.headers.get("location")).toBe("/w/larkspur/reviews");
  });

  it.each(["/%0a", "/%0d%0aSet-Cookie:%20x=1", "/w/%D1%84%D0%BE%D1%82%D0%BE", "/w/%F0%9F%93%B7", "/%00"])("next=%s answers a redirect, never a 500", async (next) => {
    const c = await signIn(DEMO.reviewer);
    const res = await c.fetch(`/sign-in?next=${next}`);
    expect(res.status).toBe(302);
    const location = res.headers.get("location")!;
    expect(new URL(location, "http://x.invalid").origin).toBe("http://x.invalid");
    expect(res.headers.get("set-cookie") ?? "").not.toContain("x=1");
    // The sign-in page itself (signed out) renders.
    expect((await client().fetch(`/sign-in?next=${next}`)).status).toBe(200);
  });
});
