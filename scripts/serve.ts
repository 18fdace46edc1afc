// The production HTTP server: static assets, the React Router app, and the client-address header
// that rate limits use. Listens on HOST:PORT (127.0.0.1:3000 by default) with WEB_CONCURRENCY
// processes (node:cluster; one per core by default): a primary that forks, restarts and stops them
// and holds what they share (docs/decisions/090), and workers that serve.
import cluster from "node:cluster";
import os from "node:os";
import path from "node:path";
import { randomBytes } from "node:crypto";
import { pathToFileURL } from "node:url";
import express from "express";
import compression from "compression";
import { createRequestHandler } from "@react-router/express";
import { RouterContextProvider } from "react-router";
import { cspNonceContext } from "../app/load-context";
import { authSecretProblem } from "../app/lib/auth-secret";
import { pageBodyRefusal } from "../app/lib/body-limits";

// This is the production server: without NODE_ENV it serves as production, and then never on a
// secret anyone could know (issue 11): it says why and stops before forking or listening.
process.env.NODE_ENV ??= "production";
const secretProblem = authSecretProblem(process.env.AUTH_SECRET, process.env.NODE_ENV === "production");
if (secretProblem) {
  console.error(`chainproof: not starting: ${secretProblem}`);
  process.exit(1);
}

const CLIENT_IP_HEADER = "x-chainproof-client-ip";
const port = Number(process.env.PORT ?? 3000);
const host = process.env.HOST ?? "127.0.0.1";
// How many proxies in front of this server to believe (load balancer, TLS terminator): 0 by default.
// Their X-Forwarded-For entries and X-Forwarded-Proto/Host are used; anything a client wrote before them is not.
const proxyHops = Number(process.env.TRUST_PROXY ?? 0);
if (!Number.isInteger(proxyHops) || proxyHops < 0 || proxyHops > 10) {
  console.error(
    `chainproof: not starting: TRUST_PROXY is the number of proxies in front of this server (0 to 10), not "${process.env.TRUST_PROXY}".`,
  );
  process.exit(1);
}
const buildDir = path.resolve(process.argv[2] ?? "build");

const processes = Math.max(1, Number(process.env.WEB_CONCURRENCY ?? os.availableParallelism()));

if (cluster.isPrimary && processes > 1) await runPrimary();
else await runServer();

async function runPrimary() {
  const { serveWorker } = await import("../app/lib/instances.server");
  // Nothing is asked of the primary today (the API rate limit is counted in PostgreSQL); it relays what workers tell.
  const answers = {};
  // Proof threads are shared out between the processes, so they do not outnumber the cores.
  const proofThreads = process.env.PROOF_THREADS ?? String(Math.max(1, Math.floor(os.availableParallelism() / processes)));
  let stopping = false;
  // Live processes by id, with when they started. cluster.workers may still list a process that
  // ended (until its channel is closed too), so it does not tell when the last one is gone.
  const bornAt = new Map<number, number>();
  const fork = () => {
    const worker = cluster.fork({ PROOF_THREADS: proofThreads });
    bornAt.set(worker.id, Date.now());
    serveWorker(worker, () => Object.values(cluster.workers ?? {}).filter((w) => w !== undefined), answers);
  };
  for (let i = 0; i < processes; i++) fork();
  // `someServed`: a process has listened, so later ends are replaced rather than fatal. The
  // "serving" line waits for every process: until then the port rests on fewer, and if those end
  // before the others listen, it is closed for that moment (node:cluster's shared handle).
  let someServed = false;
  let allListening = false;
  const listening = new Set<number>();
  cluster.on("listening", (worker) => {
    someServed = true;
    listening.add(worker.id);
    if (!allListening && listening.size === processes) {
      allListening = true;
      console.log(`chainproof: serving on http://${host}:${port} (${processes} processes)`);
    }
  });
  // A process that ends is replaced; one that keeps ending at once waits longer each time (1 s,
  // 2 s, ... 30 s), and a process that ends before any could serve (the port is taken, the build
  // is missing) stops the whole server with its error, instead of restarting forever.
  let quickEnds = 0;
  cluster.on("exit", (worker, code, signal) => {
    const lived = Date.now() - (bornAt.get(worker.id) ?? 0);
    bornAt.delete(worker.id);
    listening.delete(worker.id);
    if (stopping) {
      if (bornAt.size === 0) process.exit(exitCode);
      return;
    }
    if (!someServed) {
      console.error(`chainproof: a server process ended before serving (${signal ?? code}); stopping`);
      exitCode = 1;
      stop();
      return;
    }
    quickEnds = lived < 10_000 ? quickEnds + 1 : 0;
    const wait = quickEnds === 0 ? 0 : Math.min(30_000, 1000 * 2 ** (quickEnds - 1));
    console.error(
      `chainproof: server process ${worker.process.pid} ended (${signal ?? code}); starting another${wait ? ` in ${wait / 1000} s` : ""}`,
    );
    setTimeout(() => {
      if (!stopping) fork();
    }, wait);
  });
  let exitCode = 0;
  const stop = () => {
    if (stopping) return;
    stopping = true;
    if (bornAt.size === 0) process.exit(exitCode);
    for (const w of Object.values(cluster.workers ?? {})) if (w && !w.isDead()) w.process.kill("SIGTERM");
    // Requests still running get 10 s to finish.
    setTimeout(() => process.exit(exitCode), 10_000);
  };
  process.on("SIGTERM", stop);
  process.on("SIGINT", stop);
  watchParent(stop);
}

async function runServer() {
  const build = await import(pathToFileURL(path.join(buildDir, "server/index.js")).href).catch((err: Error) => {
    // A bad setting is the operator's to fix: its message, without a stack trace.
    if (!err.message.startsWith("Invalid environment")) throw err;
    console.error(`chainproof: not starting: ${err.message}`);
    process.exit(1);
  });

  const app = express();
  app.disable("x-powered-by");
  // Express then takes the client address the last trusted proxy added (counting from this server), and the
  // scheme and host from X-Forwarded-Proto and X-Forwarded-Host, so behind TLS termination request.url is https.
  if (proxyHops > 0) app.set("trust proxy", proxyHops);
  app.use(compression());
  app.use((req, res, next) => {
    // The client address is ours to set: a client-sent value is always replaced.
    req.headers[CLIENT_IP_HEADER] = (proxyHops > 0 ? req.ip : req.socket.remoteAddress) || "unknown";
    // A response sent before the request body was read (too large, wrong type) closes the connection,
    // so a client never reuses a socket that still carries the rest of that body.
    const writeHead = res.writeHead;
    res.writeHead = function (this: typeof res, ...args: Parameters<typeof writeHead>) {
      if (!req.complete) res.setHeader("Connection", "close");
      return writeHead.apply(this, args);
    } as typeof writeHead;
    res.setHeader("X-Content-Type-Options", "nosniff");
    res.setHeader("Referrer-Policy", "same-origin");
    res.setHeader("X-Frame-Options", "DENY");
    res.setHeader("Permissions-Policy", "camera=(self), geolocation=()");
    next();
  });
  // No id, slug or token holds a NUL character (PostgreSQL text cannot): a path with %00 names nothing.
  app.use((req, res, next) => {
    if (!/%00/i.test(req.originalUrl.split("?")[0] ?? "")) return next();
    if (req.path.startsWith("/api/"))
      res.status(404).json({ error: { code: "not_found", message: "Nothing is at this address.", fields: [] } });
    else res.status(404).type("text/plain").send("Not found");
  });
  // A page form too large (or sent without its length) is refused before any of it is read.
  app.use((req, res, next) => {
    const refusal = pageBodyRefusal({
      method: req.method,
      path: req.path,
      contentType: req.headers["content-type"],
      contentLength: req.headers["content-length"],
      transferEncoding: req.headers["transfer-encoding"],
    });
    if (!refusal) return next();
    const answer = () => {
      if (!res.headersSent) res.status(refusal.status).type("text/plain").send(refusal.message);
    };
    // Read on (and drop) what is still coming, up to 32 MB, so the client reads the refusal instead of a reset.
    let seen = 0;
    req.on("data", (chunk: Buffer) => {
      seen += chunk.length;
      if (seen > 32 * 1024 * 1024) {
        answer();
        req.destroy();
      }
    });
    req.on("end", answer);
    req.on("error", () => {});
  });
  app.use("/assets", express.static(path.join(buildDir, "client/assets"), { immutable: true, maxAge: "1y" }));
  app.use(express.static(path.join(buildDir, "client"), { maxAge: "1h" }));
  app.all(
    "*",
    createRequestHandler({
      build,
      mode: process.env.NODE_ENV ?? "production",
      getLoadContext: () => new RouterContextProvider(new Map([[cspNonceContext, randomBytes(16).toString("base64")]])),
    }),
  );

  const server = app.listen(port, host, () => {
    if (!cluster.isWorker) console.log(`chainproof: serving on http://${host}:${port}`);
  });
  // Longer than clients' idle pools, so a reused keep-alive connection is not closed under a request.
  server.keepAliveTimeout = 65_000;
  server.headersTimeout = 66_000;
  const stop = () => server.close(() => process.exit(0));
  process.on("SIGTERM", stop);
  if (cluster.isWorker) {
    // Ctrl-C reaches every process of the terminal's group: the primary decides, and stops the workers.
    process.on("SIGINT", () => {});
    // A worker leaves with its primary, however the primary ended.
    process.on("disconnect", stop);
  } else {
    process.on("SIGINT", stop);
    watchParent(stop);
  }
}

/** Started by the start/test scripts: leave with them, even if they were killed without a word. */
function watchParent(stop: () => void) {
  const parent = Number(process.env.CHAINPROOF_PARENT_PID ?? 0);
  if (!parent) return;
  setInterval(() => {
    try {
      process.kill(parent, 0);
    } catch {
      stop();
    }
  }, 2000).unref();
}
