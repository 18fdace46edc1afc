// Issue 11, across instances and behind a proxy. Two server processes on one database, as two machines
// behind a load balancer would be: the API and sign-in limits are counted once for both (PostgreSQL).
// A TLS-terminating proxy in front of a server: page forms work, and the sign-in limit counts the
// address the proxy saw, not what the client wrote into X-Forwarded-For.
import { spawn, type ChildProcess } from "node:child_process";
import { readFileSync } from "node:fs";
import http from "node:http";
import { afterAll, describe, expect, it } from "vitest";
import { BASE_URL, DEMO, DEMO_PASSWORD, signIn } from "../support/http";

const started: ChildProcess[] = [];
const closers: Array<() => void> = [];
afterAll(() => {
  for (const p of started) if (p.exitCode === null) p.kill("SIGTERM");
  for (const close of closers) close();
});

const base = Number(new URL(BASE_URL).port);

/** One more production server on `port`, on the test database, with its own settings. */
async function serve(port: number, env: Record<string, string>): Promise<string> {
  const child = spawn(process.execPath, ["--import", "tsx", "scripts/serve.ts"], {
    env: { ...process.env, PORT: String(port), APP_URL: `http://127.0.0.1:${port}`, WEB_CONCURRENCY: "1", NODE_ENV: "production", ...env },
    stdio: "ignore",
  });
  started.push(child);
  const url = `http://127.0.0.1:${port}`;
  for (let i = 0; i < 600; i++) {
    if (child.exitCode !== null) throw new Error(`the server on ${port} exited (${child.exitCode})`);
    const ok = await fetch(`${url}/healthz`).then(
      (r) => r.ok,
      () => false,
    );
    if (ok) return url;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`the server on ${port} did not answer`);
}

describe("two server processes on one database", () => {
  it("count one API limit and one sign-in limit between them", { timeout: 240_000 }, async () => {
    const [a, b] = await Promise.all([
      serve(base + 92, { API_RATE_LIMIT: "8", SIGNIN_RATE_LIMIT: "4" }),
      serve(base + 93, { API_RATE_LIMIT: "8", SIGNIN_RATE_LIMIT: "4" }),
    ]);
    const reader = await signIn(DEMO.reviewer);
    const statuses: number[] = [];
    for (let i = 0; i < 12; i++) {
      const res = await fetch(`${i % 2 ? b : a}/api/v1/designs?workspace=larkspur`, {
        headers: { cookie: reader.cookie, "x-forwarded-for": reader.ip },
      });
      statuses.push(res.status);
    }
    expect(statuses.slice(0, 8)).toEqual([200, 200, 200, 200, 200, 200, 200, 200]);
    expect(statuses.slice(8)).toEqual([429, 429, 429, 429]);

    const signInStatuses: number[] = [];
    for (let i = 0; i < 6; i++) {
      const res = await fetch(`${i % 2 ? b : a}/api/auth/sign-in/email`, {
        method: "POST",
        headers: { "content-type": "application/json", origin: i % 2 ? b : a, "x-forwarded-for": "198.51.100.203" },
        body: JSON.stringify({ email: DEMO.admin, password: "not-the-password" }),
      });
      signInStatuses.push(res.status);
    }
    expect(signInStatuses.slice(0, 4).every((s) => s === 401)).toBe(true);
    expect(signInStatuses.slice(4)).toEqual([429, 429]);
  });
});

describe("behind a TLS-terminating proxy", () => {
  it("page forms work over https, and the sign-in limit counts the address the proxy saw", { timeout: 240_000 }, async () => {
    const proxyPort = base + 95;
    const publicUrl = `https://127.0.0.1:${proxyPort}`;
    const app = new URL(await serve(base + 94, { APP_URL: publicUrl, TRUST_PROXY: "1" }));
    // The proxy: terminates "TLS" (says https), appends the peer's address to X-Forwarded-For, keeps Host.
    const proxy = http.createServer((req, res) => {
      const forwarded = [req.headers["x-forwarded-for"], req.socket.remoteAddress].filter(Boolean).join(", ");
      const upstream = http.request(
        {
          host: app.hostname,
          port: app.port,
          path: req.url,
          method: req.method,
          headers: { ...req.headers, "x-forwarded-for": forwarded, "x-forwarded-proto": "https" },
        },
        (up) => {
          res.writeHead(up.statusCode ?? 502, up.headers);
          up.pipe(res);
        },
      );
      upstream.on("error", () => res.destroy());
      req.pipe(upstream);
    });
    await new Promise<void>((r) => proxy.listen(proxyPort, "127.0.0.1", r));
    closers.push(() => proxy.close());

    const form = (password: string, spoofed: string) =>
      fetch(`http://127.0.0.1:${proxyPort}/sign-in`, {
        method: "POST",
        redirect: "manual",
        headers: { "content-type": "application/x-www-form-urlencoded", origin: publicUrl, "x-forwarded-for": spoofed },
        body: new URLSearchParams({ email: DEMO.engineer, password, next: "/w/larkspur" }),
      });
    const signedIn = await form(DEMO_PASSWORD, "203.0.113.1");
    expect(signedIn.status).toBe(302);
    expect(signedIn.headers.get("location")).toBe("/w/larkspur");
    expect(signedIn.headers.getSetCookie().some((c) => c.startsWith("__Secure-better-auth.session_token=") && /;\s*Secure/i.test(c))).toBe(
      true,
    );

    // Each attempt claims another client address; the proxy's own entry says they all come from one.
    const statuses: number[] = [];
    for (let i = 2; i <= 7; i++) statuses.push((await form("not-the-password", `203.0.113.${i}`)).status);
    expect(statuses).toContain(429);
    expect(statuses.indexOf(429)).toBeLessThanOrEqual(4);
  });
});

describe("proof limits", () => {
  /** The demo hauler with `extra` two-state conditions nobody wires: 192 × 2^extra rows to prove. */
  const bigDesign = (extra: number) => {
    const d = JSON.parse(readFileSync(new URL("../../drizzle/demo-designs/haybarn-campus-hauler.json", import.meta.url), "utf8"));
    for (let i = 0; i < extra; i++) d.conditions.push({ id: `spare${i}`, label: `Spare ${i}`, states: ["off", "on"] });
    return d;
  };

  it(
    "a proof over the stated time is stopped with a clear answer; one user runs two at once, eight wait, more are refused",
    { timeout: 240_000 },
    async () => {
      const [quick, normal] = await Promise.all([serve(base + 96, { PROOF_TIME_LIMIT_MS: "1" }), serve(base + 97, {})]);
      const engineer = await signIn(DEMO.engineer);
      const prove = (server: string, document: unknown) =>
        fetch(`${server}/api/v1/proofs?workspace=larkspur`, {
          method: "POST",
          headers: { "content-type": "application/json", cookie: engineer.cookie, origin: server, "x-forwarded-for": engineer.ip },
          body: JSON.stringify({ document }),
        });
      const stopped = await prove(quick, bigDesign(12));
      expect(stopped.status).toBe(422);
      const error = ((await stopped.json()) as { error: { code: string; message: string } }).error;
      expect(error.code).toBe("proof_too_long");
      expect(error.message).toMatch(/longer than 0\.001 s and was stopped/);

      // Two run, eight wait their turn, and the rest of twelve sent at once are refused.
      const answers = await Promise.all(Array.from({ length: 12 }, () => prove(normal, bigDesign(12))));
      const statuses = answers.map((r) => r.status).sort();
      expect(statuses.filter((s) => s === 200).length).toBeGreaterThanOrEqual(10);
      expect(statuses).toContain(429);
      expect(statuses.every((s) => s === 200 || s === 429)).toBe(true);
    },
  );
});
