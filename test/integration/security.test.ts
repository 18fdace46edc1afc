// Response headers every page carries.
import { describe, expect, it } from "vitest";
import { client, DEMO, signIn } from "../support/http";

describe("security headers", () => {
  it("pages carry a CSP whose nonce is on every script, and no inline script without it", async () => {
    const res = await client().fetch("/sign-in");
    const csp = res.headers.get("content-security-policy") ?? "";
    const nonce = csp.match(/'nonce-([^']+)'/)?.[1];
    expect(nonce).toBeTruthy();
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).toContain("object-src 'none'");
    expect(csp).not.toContain("unsafe-eval");
    expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/);
    const html = await res.text();
    const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
    expect(scripts.length).toBeGreaterThan(0);
    for (const tag of scripts) expect(tag).toContain(`nonce="${nonce}"`);
  });

  it("each response gets its own nonce", async () => {
    const a = (await client().fetch("/sign-in")).headers.get("content-security-policy");
    const b = (await client().fetch("/sign-in")).headers.get("content-security-policy");
    expect(a).not.toBe(b);
  });

  it("sets the usual hardening headers and hides the framework", async () => {
    const c = await signIn(DEMO.engineer);
    const res = await c.fetch("/w/larkspur");
    expect(res.headers.get("x-content-type-options")).toBe("nosniff");
    expect(res.headers.get("x-frame-options")).toBe("DENY");
    expect(res.headers.get("referrer-policy")).toBe("same-origin");
    expect(res.headers.get("x-powered-by")).toBeNull();
  });
});
