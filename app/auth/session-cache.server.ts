// Sessions confirmed in the last few seconds, held in this process so that a page whose loaders each
// ask "who is this?" (the shell and the page run side by side) and a user clicking quickly cost one
// session lookup, not one per loader per click (docs/decisions/090).
//
// Keyed by the signed session cookie's value, so only a cookie better-auth has accepted can hit.
// Every session deletion or user update empties the cache of every process of this machine's
// cluster; an instance on another machine notices a revoked session within SESSION_CACHE_TTL_MS.
import { LRUCache } from "lru-cache";
import { onToldByOtherInstance, tellOtherInstances } from "../lib/instances.server";

export const SESSION_CACHE_TTL_MS = 10_000;

const SESSION_COOKIE = /(?:^|;\s*)(?:__Secure-)?better-auth\.session_token=([^;]+)/;

export type CachedSession = { user: { id: string; email: string; name: string }; sessionId: string };

const cache = new LRUCache<string, CachedSession>({ max: 20_000, ttl: SESSION_CACHE_TTL_MS });

/**
 * The signed value of a request's session cookie (plain or, over https, __Secure- named), or null
 * when it carries none: this cache's key, and what the API rate limit counts a session by.
 */
export function sessionCookieOf(cookieHeader: string | null): string | null {
  return cookieHeader?.match(SESSION_COOKIE)?.[1] ?? null;
}

export function cachedSession(key: string): CachedSession | undefined {
  return cache.get(key);
}

/** Remembers a confirmed session, never past its own expiry. */
export function rememberSession(key: string, session: CachedSession, expiresAt: Date): void {
  const left = expiresAt.getTime() - Date.now();
  if (left <= 0) return;
  cache.set(key, session, { ttl: Math.min(SESSION_CACHE_TTL_MS, left) });
}

/** Called when any session ends or any user changes: the next request asks the database again. */
export function forgetSessions(): void {
  cache.clear();
  tellOtherInstances(FORGET_TOPIC);
}

const FORGET_TOPIC = "forget-sessions";
onToldByOtherInstance(FORGET_TOPIC, () => cache.clear());
