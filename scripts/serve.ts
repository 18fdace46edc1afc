// The production HTTP server: static assets, the React Router app, and the client-address header
// that rate limits use. Listens on HOST:PORT (127.0.0.1:3000 by default).
import path from "node:path";
import { randomBytes } from "node:crypto";
import { pathToFileURL } from "node:url";
import express from "express";
import compression from "compression";
import { createRequestHandler } from "@react-router/express";

const CLIENT_IP_HEADER = "x-chainproof-client-ip";
const port = Number(process.env.PORT ?? 3000);
const host = process.env.HOST ?? "127.0.0.1";
const trustProxy = process.env.TRUST_PROXY === "1";
const buildDir = path.resolve(process.argv[2] ?? "build");

const build = await import(pathToFileURL(path.join(buildDir, "server/index.js")).href);

const app = express();
app.disable("x-powered-by");
app.use(compression());
app.use((req, res, next) => {
  // The client address is ours to set: a client-sent value is always replaced.
  const forwarded = trustProxy ? String(req.headers["x-forwarded-for"] ?? "").split(",")[0]?.trim() : "";
  req.headers[CLIENT_IP_HEADER] = forwarded || req.socket.remoteAddress || "unknown";
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
app.use("/assets", express.static(path.join(buildDir, "client/assets"), { immutable: true, maxAge: "1y" }));
app.use(express.static(path.join(buildDir, "client"), { maxAge: "1h" }));
app.all(
  "*",
  createRequestHandler({
    build,
    mode: process.env.NODE_ENV ?? "production",
    getLoadContext: () => ({ cspNonce: randomBytes(16).toString("base64") }),
  }),
);

const server = app.listen(port, host, () => {
  console.log(`chainproof: serving on http://${host}:${port}`);
});
// Longer than clients' idle pools, so a reused keep-alive connection is not closed under a request.
server.keepAliveTimeout = 65_000;
server.headersTimeout = 66_000;
const stop = () => server.close(() => process.exit(0));
process.on("SIGTERM", stop);
// Started by the start/test scripts: leave with them, even if they were killed without a word.
const parent = Number(process.env.CHAINPROOF_PARENT_PID ?? 0);
if (parent) {
  setInterval(() => {
    try {
      process.kill(parent, 0);
    } catch {
      stop();
    }
  }, 2000).unref();
}
process.on("SIGINT", stop);
