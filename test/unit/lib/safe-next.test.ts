// Where sign-in and sign-up send a user afterwards (issue 11, open redirect): only a path of our own
// origin, never one a browser would read as another host. Browsers drop tab, newline and carriage return
// from URLs and read a backslash as a slash (WHATWG URL Standard, "URL parsing"), so "/\t/evil.example/"
// reaches them as "//evil.example/", another origin.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { safeNext } from "../../../app/lib/safe-next";

const ORIGIN = "https://chainproof.example";

/** What a browser does with the Location header: resolve it against the page's URL. */
const landsOn = (location: string) => new URL(location, `${ORIGIN}/sign-in`);

describe("safeNext", () => {
  it.each([
    "/\t/evil.example/",
    "/\n/evil.example/",
    "/\r\n/evil.example/",
    "//evil.example/",
    "/\\evil.example/",
    "\\\\evil.example/",
    "/.//evil.example/",
    "/%2e//evil.example/",
    " /w/larkspur",
    "/ /evil.example",
    "/\u00a0/evil.example",
    "/\u3000/evil.example",
    "https://evil.example/",
    "javascript:alert(1)",
    "w/larkspur",
    "/w/\u0000x",
    "/w/\u007fx",
    "/w/\u0085x",
  ])("sends %j home", (next) => {
    expect(safeNext(next)).toBe("/");
  });

  it.each([
    ["/w/larkspur", "/w/larkspur"],
    ["/w/larkspur/designs?tab=rules#r1", "/w/larkspur/designs?tab=rules#r1"],
    ["/", "/"],
    ["/w/larkspur/vehicles?q=%E2%9C%93", "/w/larkspur/vehicles?q=%E2%9C%93"],
  ])("keeps the same-origin path %j", (next, kept) => {
    expect(safeNext(next)).toBe(kept);
  });

  it("writes a path with characters beyond Latin-1 percent-encoded, so it can go in a Location header", () => {
    expect(safeNext("/w/фото 📷")).toBe("/");
    expect(safeNext("/w/фото📷")).toBe("/w/%D1%84%D0%BE%D1%82%D0%BE%F0%9F%93%B7");
  });

  it("never leaves our origin and always fits an HTTP header, whatever it is given", { timeout: 60_000 }, () => {
    const pieces = fc.constantFrom(
      "/",
      "//",
      "\\",
      ".",
      "..",
      "%2e",
      "%2f",
      "%5c",
      "\t",
      "\n",
      "\r",
      " ",
      "evil.example",
      "@",
      ":",
      "?",
      "#",
      "é",
      "📷",
      "\u0000",
      "\u2028",
      "http:",
      "w",
    );
    fc.assert(
      fc.property(
        fc.oneof(
          fc.string(),
          fc.array(pieces, { maxLength: 8 }).map((a) => a.join("")),
        ),
        (next) => {
          const out = safeNext(next);
          expect(out.startsWith("/")).toBe(true);
          expect(landsOn(out).origin).toBe(ORIGIN);
          // Printable ASCII only: a Headers object accepts it, and no browser strips or rewrites any of it.
          expect(out).toMatch(/^[\x21-\x7e]+$/);
          expect(() => new Headers({ location: out })).not.toThrow();
        },
      ),
      { numRuns: 1000 },
    );
  });
});
