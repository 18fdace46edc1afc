// The production server's processes (scripts/serve.ts, node:cluster; decision 090): a server
// process that dies is replaced while the others go on serving, and a server that cannot start
// (its port is taken) stops with an error instead of restarting its processes forever.
import { spawn, type ChildProcess } from "node:child_process";
import { readFileSync, readdirSync } from "node:fs";
import http from "node:http";
import { afterEach, describe, expect, it } from "vitest";
import { BASE_URL } from "../support/http";

const started: ChildProcess[] = [];
afterEach(() => {
  for (const p of started.splice(0)) if (p.exitCode === null) p.kill("SIGKILL");
});

function serve(port: number) {
  const child = spawn(process.execPath, ["--import", "tsx", "scripts/serve.ts"], {
    env: { ...process.env, PORT: String(port), APP_URL: `http://127.0.0.1:${port}`, WEB_CONCURRENCY: "2", NODE_ENV: "production" },
    stdio: ["ignore", "pipe", "pipe"],
  });
  started.push(child);
  let output = "";
  child.stdout!.on("data", (d) => (output += d));
  child.stderr!.on("data", (d) => (output += d));
  const exited = new Promise<number | null>((resolve) => child.on("exit", (code) => resolve(code)));
  return { child, exited, output: () => output };
}

/** The pids whose parent is `pid` (the cluster's server processes). */
function childrenOf(pid: number): number[] {
  return readdirSync("/proc")
    .filter((d) => /^\d+$/.test(d))
    .filter((d) => {
      try {
        return Number(readFileSync(`/proc/${d}/stat`, "utf8").split(") ")[1]!.split(" ")[1]) === pid;
      } catch {
        return false;
      }
    })
    .map(Number);
}

async function until<T>(what: string, probe: () => Promise<T | null> | T | null, ms = 30_000): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const v = await probe();
    if (v !== null && v !== false) return v;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

/** 200 from /healthz on a new connection (a pooled one may belong to the process just killed). */
const healthy = (port: number) =>
  new Promise<true | null>((resolve) => {
    const req = http.get({ host: "127.0.0.1", port, path: "/healthz", agent: false, timeout: 15_000 }, (res) => {
      res.resume();
      resolve(res.statusCode === 200 ? true : null);
    });
    req.on("timeout", () => req.destroy());
    req.on("error", () => resolve(null));
  });

describe("server processes", () => {
  it("replaces a server process that died; the other keeps answering meanwhile", { timeout: 120_000 }, async () => {
    const port = Number(new URL(BASE_URL).port) + 90;
    const server = serve(port);
    // Both processes listening (the first to listen can answer while the second is still loading;
    // killing it then would leave the port without any process for a moment).
    await until("both processes to serve", () =>
      server.output().includes(`serving on http://127.0.0.1:${port} (2 processes)`) ? true : null,
    );
    expect(await healthy(port)).toBe(true);
    const before = childrenOf(server.child.pid!);
    expect(before).toHaveLength(2);
    process.kill(before[0]!, "SIGKILL");
    // Once the primary has seen it go (a connection handed over in that instant can be lost), the
    // other process answers every request while the first is replaced.
    await until("the primary to see the process end", () => (server.output().includes(`server process ${before[0]} ended`) ? true : null));
    for (let i = 0; i < 4; i++) expect(await healthy(port)).toBe(true);
    const after = await until("a new server process", () => {
      const now = childrenOf(server.child.pid!);
      return now.length === 2 && !now.includes(before[0]!) ? now : null;
    });
    expect(after).toContain(before[1]);
    expect(server.output()).toMatch(new RegExp(`server process ${before[0]} ended \\(SIGKILL\\); starting another`));
    server.child.kill("SIGTERM");
    expect(await server.exited).toBe(0);
    expect(childrenOf(server.child.pid!)).toEqual([]);
  });

  it("stops with exit code 1 when its processes cannot serve (the port is taken)", { timeout: 60_000 }, async () => {
    const taken = Number(new URL(BASE_URL).port);
    const server = serve(taken);
    expect(await server.exited).toBe(1);
    expect(server.output()).toContain("ended before serving");
    expect(server.output()).toContain("EADDRINUSE");
    // The app that holds the port is untouched.
    expect(await healthy(taken)).toBe(true);
  });
});
