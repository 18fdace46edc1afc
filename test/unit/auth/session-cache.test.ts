// The few-seconds cache of confirmed sessions: what it is keyed by, that it never outlives a
// session, and that ending any session empties it.
import { describe, expect, it } from "vitest";
import { cachedSession, forgetSessions, rememberSession, sessionCookieOf } from "../../../app/auth/session-cache.server";

const someone = { user: { id: "u1", email: "a@example.org", name: "A" }, sessionId: "s1" };
const inAnHour = () => new Date(Date.now() + 3_600_000);

describe("session cache", () => {
  it("is keyed by the whole signed session cookie value, secure-prefixed or not, and by nothing else", () => {
    expect(sessionCookieOf("theme=dark; better-auth.session_token=abc.sig%2B1; other=1")).toBe("abc.sig%2B1");
    expect(sessionCookieOf("__Secure-better-auth.session_token=abc.sig")).toBe("abc.sig");
    expect(sessionCookieOf("my-better-auth.session_token=abc.sig")).toBeNull();
    expect(sessionCookieOf("theme=dark")).toBeNull();
    expect(sessionCookieOf(null)).toBeNull();
  });

  it("remembers a confirmed session, but not one that has already expired", () => {
    forgetSessions();
    rememberSession("k1", someone, inAnHour());
    expect(cachedSession("k1")).toEqual(someone);
    expect(cachedSession("k1 tampered")).toBeUndefined();
    rememberSession("k2", someone, new Date(Date.now() - 1));
    expect(cachedSession("k2")).toBeUndefined();
  });

  it("forgets every session when any session ends", () => {
    rememberSession("k1", someone, inAnHour());
    rememberSession("k3", { ...someone, sessionId: "s3" }, inAnHour());
    forgetSessions();
    expect(cachedSession("k1")).toBeUndefined();
    expect(cachedSession("k3")).toBeUndefined();
  });
});
