// Brings up the whole local stack (database, mail sink, file store, app) for `npm start` and `npm test`.
import { spawn, type ChildProcess } from "node:child_process";
import { ensureDatabase, startFileStore, startMailSink, startPostgres, type PostgresHandle } from "./services";
import { runMigrations } from "./migrate";
import { seed } from "../drizzle/seed";

export type StackConfig = {
  name: string; // "start" or "test": prefixes log lines
  dataDir: string;
  pgPort: number;
  database: string;
  freshDatabase: boolean;
  smtpPort: number;
  s3Port: number;
  appPort: number;
  demo: boolean;
  /** Signs sessions and e-mail tokens: start keeps one in .data/auth-secret, tests make a new one per run. */
  authSecret: string;
  extraEnv?: Record<string, string>;
};

export type Stack = {
  env: Record<string, string>;
  appUrl: string;
  pg: PostgresHandle;
  startApp: () => Promise<void>;
  stopApp: () => Promise<void>;
  stop: () => Promise<void>;
};

export function say(name: string, line: string) {
  console.log(`[${name}] ${line}`);
}

/** Runs a command to completion without blocking the event loop: the mail sink and file store
 *  live in this process and must keep answering while tests run. */
export function run(cmd: string, args: string[], env: Record<string, string> = {}, opts: { ownGroup?: boolean } = {}): Promise<number> {
  return new Promise((resolve) => {
    // ownGroup: steps that stop and start PostgreSQL run in a process group of their own, so whatever
    // signals that group on the way out cannot reach this script.
    const child = spawn(cmd, args, { stdio: "inherit", env: { ...process.env, ...env }, detached: opts.ownGroup ?? false });
    child.once("error", () => resolve(1));
    child.once("exit", (code) => resolve(code ?? 1));
  });
}

async function waitForHealth(url: string, child: ChildProcess, timeoutMs = 180_000) {
  // Generous: on a machine shared by several test runs the server can take minutes to come up.
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (child.exitCode !== null) throw new Error("the app exited during start-up");
    try {
      const r = await fetch(`${url}/healthz`);
      if (r.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`the app did not answer on ${url} within ${timeoutMs / 1000} s`);
}

export async function bringUp(cfg: StackConfig): Promise<Stack> {
  const log = (s: string) => say(cfg.name, s);
  const pg = startPostgres({ dir: `${cfg.dataDir}/postgres`, port: cfg.pgPort, log });
  await ensureDatabase(pg, cfg.database, { fresh: cfg.freshDatabase });
  const databaseUrl = pg.url(cfg.database);
  await runMigrations(databaseUrl);
  log("migrations applied");
  if (cfg.demo) await seed(databaseUrl, log);
  const mail = await startMailSink({ port: cfg.smtpPort, databaseUrl });
  log(`mail sink on smtp://127.0.0.1:${cfg.smtpPort}`);
  const files = await startFileStore({ port: cfg.s3Port, dir: `${cfg.dataDir}/files`, bucket: "chainproof-uploads" });
  log(`file store on http://127.0.0.1:${cfg.s3Port}`);

  const appUrl = `http://127.0.0.1:${cfg.appPort}`;
  const env: Record<string, string> = {
    NODE_ENV: "production",
    DATABASE_URL: databaseUrl,
    APP_URL: appUrl,
    PORT: String(cfg.appPort),
    HOST: "127.0.0.1",
    SMTP_HOST: "127.0.0.1",
    SMTP_PORT: String(cfg.smtpPort),
    S3_ENDPOINT: `http://127.0.0.1:${cfg.s3Port}`,
    S3_BUCKET: "chainproof-uploads",
    CHAINPROOF_LOCAL: "1",
    CHAINPROOF_DEMO: cfg.demo ? "1" : "0",
    AUTH_SECRET: cfg.authSecret,
    ...cfg.extraEnv,
  };

  let app: ChildProcess | null = null;
  const startApp = async () => {
    app = spawn(process.execPath, ["--import", "tsx", "scripts/serve.ts"], {
      stdio: "inherit",
      env: { ...process.env, ...env, CHAINPROOF_PARENT_PID: String(process.pid) },
    });
    await waitForHealth(appUrl, app);
  };
  const stopApp = async () => {
    const child = app;
    app = null;
    if (!child || child.exitCode !== null) return;
    await new Promise<void>((resolve) => {
      child.once("exit", () => resolve());
      child.kill("SIGTERM");
      setTimeout(() => child.kill("SIGKILL"), 5_000).unref();
    });
  };
  const stop = async () => {
    await stopApp();
    await mail.stop().catch(() => {});
    await files.stop().catch(() => {});
    pg.stop();
    log("stopped");
  };
  return { env, appUrl, pg, startApp, stopApp, stop };
}
