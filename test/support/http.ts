import { DEMO, DEMO_PASSWORD, type DemoRole } from "./demo";
// HTTP helpers for integration tests against the running app (BASE_URL, set by scripts/test.ts).
// CHAINPROOF_URL, since Vite reserves BASE_URL for its own base path ("/").
const fromEnv = process.env.CHAINPROOF_URL ?? (process.env.BASE_URL?.startsWith("http") ? process.env.BASE_URL : undefined);
export const BASE_URL = fromEnv ?? "http://127.0.0.1:3100";
export { DEMO, DEMO_PASSWORD, type DemoRole };

let clientCounter = 0;
/** A distinct client address per call: the test server trusts X-Forwarded-For for rate limits. */
export function clientAddress(): string {
  clientCounter += 1;
  return `198.18.${(process.pid + clientCounter) % 250}.${clientCounter % 250}`;
}

export type Client = { cookie: string; ip: string; fetch: (path: string, init?: RequestInit) => Promise<Response> };

export function client(cookie = "", ip = clientAddress()): Client {
  return {
    cookie,
    ip,
    fetch: (path, init = {}) => {
      const headers = new Headers(init.headers);
      if (cookie) headers.set("cookie", cookie);
      headers.set("x-forwarded-for", ip);
      if (!headers.has("origin")) headers.set("origin", BASE_URL);
      return fetch(new URL(path, BASE_URL), { redirect: "manual", ...init, headers });
    },
  };
}

/** Signs in through better-auth's endpoint and returns a client carrying the session cookie. */
export async function signIn(email: string, password = DEMO_PASSWORD): Promise<Client> {
  const ip = clientAddress();
  const res = await fetch(new URL("/api/auth/sign-in/email", BASE_URL), {
    method: "POST",
    headers: { "content-type": "application/json", origin: BASE_URL, "x-forwarded-for": ip },
    body: JSON.stringify({ email, password }),
  });
  if (!res.ok) throw new Error(`sign-in of ${email} failed: ${res.status} ${await res.text()}`);
  const cookie = res.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
  return client(cookie, ip);
}

export function formBody(values: Record<string, string>): RequestInit {
  return { method: "POST", body: new URLSearchParams(values), headers: { "content-type": "application/x-www-form-urlencoded" } };
}

/** Sends `body` as JSON (none when undefined) and reads the answer: parsed JSON, or `{ text }` when it is not JSON. */
export async function sendJson(
  c: Client,
  method: string,
  path: string,
  body?: unknown,
): Promise<{ status: number; body: Record<string, any> }> {
  const res = await c.fetch(path, {
    method,
    ...(body === undefined ? {} : { body: JSON.stringify(body), headers: { "content-type": "application/json" } }),
  });
  const text = await res.text();
  try {
    return { status: res.status, body: JSON.parse(text) };
  } catch {
    return { status: res.status, body: { text } };
  }
}
