// `npm start`: the product with demo data on http://127.0.0.1:3000 (PORT overrides). Ctrl-C stops everything.
import { bringUp, run, say } from "./stack";
import { ensureAuthSecret } from "./auth-secret";
import { DEMO_PASSWORD, DEMO_USERS } from "../drizzle/seed";

const port = Number(process.env.PORT ?? 3000);
const stack = await bringUp({
  name: "start",
  dataDir: ".data",
  pgPort: Number(process.env.CHAINPROOF_PG_PORT ?? 54329),
  database: "chainproof",
  freshDatabase: false,
  smtpPort: Number(process.env.CHAINPROOF_SMTP_PORT ?? 2525),
  s3Port: Number(process.env.CHAINPROOF_S3_PORT ?? 4569),
  appPort: port,
  demo: process.env.CHAINPROOF_DEMO !== "0",
  // A secret given in the environment wins; otherwise this install's own, made on the first start.
  authSecret: process.env.AUTH_SECRET || ensureAuthSecret(".data", (line) => say("start", line)),
});

let stopping = false;
const shutdown = async (code: number) => {
  if (stopping) return;
  stopping = true;
  await stack.stop();
  process.exit(code);
};
process.on("SIGINT", () => void shutdown(0));
process.on("SIGTERM", () => void shutdown(0));

try {
  say("start", "building the app");
  if ((await run("npx", ["react-router", "build"], { NODE_ENV: "production" })) !== 0) throw new Error("the build failed");
  await stack.startApp();
} catch (err) {
  console.error(`[start] ${(err as Error).message}`);
  await shutdown(1);
}

console.log(`
  Chainproof is running on ${stack.appUrl}
  ${process.env.CHAINPROOF_DEMO === "0" ? "Demo data is off (CHAINPROOF_DEMO=0)." : `Demo sign-ins (password ${DEMO_PASSWORD}):\n${DEMO_USERS.map((u) => `    ${u.email.padEnd(24)} ${u.role}`).join("\n")}`}
  Mail sent by the app: ${stack.appUrl}/outbox
  Press Ctrl-C to stop the app and the database.
`);
