// `npm test`: typecheck, lint, unit tests, integration tests against real PostgreSQL and the running app,
// and end-to-end tests in Debian's Chromium. Prints one closing line "N passed, N failed".
import { randomBytes } from "node:crypto";
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { stripVTControlCharacters } from "node:util";
import { bringUp, run, say } from "./stack";

const results = ".data/test-results";
rmSync(results, { recursive: true, force: true });
mkdirSync(results, { recursive: true });

type Tally = { passed: number; failed: number; skipped: number };
const tally: Tally = { passed: 0, failed: 0, skipped: 0 };
const failures: string[] = [];
// Each failed test with the head of its message, printed again at the very end: CI keeps only the tail of the output.
const failedTests: string[] = [];
const head = (message: string) =>
  stripVTControlCharacters(message)
    .split("\n")
    .filter((line) => !/^\s*at .*(node_modules|node:internal|<anonymous>)/.test(line))
    .slice(0, 20)
    .join("\n    ");

function addVitest(file: string, label: string, exit: number) {
  if (!existsSync(file)) {
    tally.failed += 1;
    failures.push(`${label}: no report (exit ${exit})`);
    return;
  }
  const r = JSON.parse(readFileSync(file, "utf8")) as {
    numPassedTests: number;
    numFailedTests: number;
    numPendingTests: number;
    numTodoTests: number;
    numFailedTestSuites: number;
    testResults: { name: string; message?: string; assertionResults: { fullName: string; status: string; failureMessages: string[] }[] }[];
  };
  for (const suite of r.testResults) {
    const where = suite.name.replace(`${process.cwd()}/`, "");
    const failed = suite.assertionResults.filter((t) => t.status === "failed");
    for (const t of failed) failedTests.push(`${label} · ${where} › ${t.fullName}\n    ${head(t.failureMessages.join("\n"))}`);
    if (failed.length === 0 && suite.message) failedTests.push(`${label} · ${where}\n    ${head(suite.message)}`);
  }
  tally.passed += r.numPassedTests;
  tally.failed += r.numFailedTests + (r.numFailedTests === 0 && exit !== 0 ? 1 : 0);
  tally.skipped += r.numPendingTests + r.numTodoTests;
  if (exit !== 0) failures.push(`${label} (exit ${exit})`);
}

function addPlaywright(file: string, exit: number) {
  if (!existsSync(file)) {
    tally.failed += 1;
    failures.push(`e2e: no report (exit ${exit})`);
    return;
  }
  type Spec = { title: string; file: string; line: number; tests: { status: string; results: { error?: { message?: string } }[] }[] };
  type Suite = { specs?: Spec[]; suites?: Suite[] };
  const r = JSON.parse(readFileSync(file, "utf8")) as {
    stats: { expected: number; unexpected: number; skipped: number; flaky: number };
    suites: Suite[];
  };
  const walk = (suites: Suite[]) => {
    for (const suite of suites) {
      for (const spec of suite.specs ?? []) {
        for (const t of spec.tests.filter((x) => x.status === "unexpected")) {
          const message = t.results.map((x) => x.error?.message ?? "").join("\n");
          failedTests.push(`e2e · ${spec.file}:${spec.line} › ${spec.title}\n    ${head(message)}`);
        }
      }
      walk(suite.suites ?? []);
    }
  };
  walk(r.suites ?? []);
  tally.passed += r.stats.expected + r.stats.flaky;
  tally.failed += r.stats.unexpected + (r.stats.unexpected === 0 && exit !== 0 ? 1 : 0);
  tally.skipped += r.stats.skipped;
  if (exit !== 0) failures.push(`e2e (exit ${exit})`);
}

// `npm test -- FILE...` runs only the suites those files belong to (unit, integration, fault, e2e; "load" for the
// reduced load test), each limited to the files given: a quick loop while working. No argument: everything.
const only = process.argv.slice(2);
const pick = (prefix: string) => only.filter((f) => f.startsWith(prefix));
const wants = (prefixes: string[]) => only.length === 0 || prefixes.some((p) => pick(p).length > 0);
const unitFiles = [...pick("test/unit/"), ...pick("app/")];
const integrationFiles = pick("test/integration/");
const faultFiles = pick("test/fault/");
const e2eFiles = pick("test/e2e/");

const started = Date.now();
if (only.length === 0) {
  say("test", "typecheck");
  const tc = (await run("npx", ["react-router", "typegen"])) || (await run("npx", ["tsc"]));
  if (tc === 0) tally.passed += 1;
  else {
    tally.failed += 1;
    failures.push("typecheck");
  }
  say("test", "lint (ESLint, Prettier)");
  if ((await run("npm", ["run", "--silent", "lint"])) === 0) tally.passed += 1;
  else {
    tally.failed += 1;
    failures.push("lint");
  }
}

if (wants(["test/unit/", "app/"])) {
  say("test", "unit tests");
  addVitest(
    `${results}/unit.json`,
    "unit",
    await run("npx", [
      "vitest",
      "run",
      "--project",
      "unit",
      ...unitFiles,
      "--reporter=default",
      "--reporter=json",
      `--outputFile.json=${results}/unit.json`,
    ]),
  );
}

if (wants(["test/integration/", "test/fault/", "load", "test/e2e/"])) await withStack();

async function withStack() {
  // Several checkouts on one machine (worktrees) can each run the suite: CHAINPROOF_PORT_OFFSET moves every port.
  const offset = Number(process.env.CHAINPROOF_PORT_OFFSET ?? 0);
  const stack = await bringUp({
    name: "test",
    dataDir: ".data/test",
    pgPort: Number(process.env.CHAINPROOF_TEST_PG_PORT ?? 54339 + offset),
    database: "chainproof_test",
    freshDatabase: true,
    smtpPort: 2535 + offset,
    s3Port: 4579 + offset,
    appPort: 3100 + offset,
    demo: true,
    // Every run signs with a secret of its own, as an install started by `npm start` does.
    authSecret: randomBytes(48).toString("base64url"),
    // Tests stand in for many clients: each sends its own X-Forwarded-For, so rate limits apply per test.
    // A lower API limit than the default keeps the test that reaches it short.
    extraEnv: { TRUST_PROXY: "1", NODE_ENV: "production", API_RATE_LIMIT: "600" },
  });

  try {
    say("test", "building the app");
    if ((await run("npx", ["react-router", "build"], { NODE_ENV: "production" })) !== 0) throw new Error("the build failed");
    await stack.startApp();
    const testEnv = { ...stack.env, CHAINPROOF_URL: stack.appUrl, BASE_URL: stack.appUrl, NODE_ENV: "test" };
    const pgEnv = { ...testEnv, CHAINPROOF_PG_DIR: ".data/test/postgres", CHAINPROOF_PG_PORT: String(stack.pg.port) };

    if (wants(["test/integration/"])) {
      say("test", "integration tests");
      const out = `--outputFile.json=${results}/integration.json`;
      addVitest(
        `${results}/integration.json`,
        "integration",
        await run(
          "npx",
          ["vitest", "run", "--project", "integration", ...integrationFiles, "--reporter=default", "--reporter=json", out],
          testEnv,
        ),
      );
    }

    if (wants(["test/fault/"])) {
      say("test", "fault tests (the database stopped and started under traffic)");
      const out = `--outputFile.json=${results}/fault.json`;
      addVitest(
        `${results}/fault.json`,
        "fault",
        await run("npx", ["vitest", "run", "--project", "fault", ...faultFiles, "--reporter=default", "--reporter=json", out], pgEnv, {
          ownGroup: true,
        }),
      );
    }

    if (wants(["load"])) {
      say("test", "load and outage, reduced (correctness only; figures come from npm run loadtest)");
      const loadExit = await run("npx", ["tsx", "test/load/run.ts", "--quick"], pgEnv, { ownGroup: true });
      if (loadExit === 0) tally.passed += 1;
      else {
        tally.failed += 1;
        failures.push("load (reduced)");
      }
    }

    if (wants(["test/e2e/"])) {
      say("test", "end-to-end tests (Chromium)");
      addPlaywright(
        `${results}/e2e.json`,
        await run("npx", ["playwright", "test", ...e2eFiles], { ...testEnv, PLAYWRIGHT_JSON_OUTPUT_NAME: `${results}/e2e.json` }),
      );
    }
  } catch (err) {
    tally.failed += 1;
    failures.push((err as Error).message);
  } finally {
    await stack.stop();
  }
}

// How much of the API's contract the integration and fault tests saw: each endpoint's declared statuses.
if (existsSync(`${results}/api-answers-seen.txt`)) {
  const { ENDPOINTS } = await import("../app/api/endpoints");
  const seen = new Set(readFileSync(`${results}/api-answers-seen.txt`, "utf8").split("\n").filter(Boolean));
  const declared = ENDPOINTS.flatMap((e) => Object.keys(e.replies).map((status) => `${e.method.toUpperCase()} ${e.path} ${status}`));
  const unseen = declared.filter((a) => !seen.has(a));
  writeFileSync(`${results}/api-answers-unseen.txt`, unseen.map((a) => `${a}\n`).join(""));
  console.log(
    `\nAPI answers the tests saw and checked against their schemas: ${declared.length - unseen.length} of ${declared.length} declared ` +
      `(endpoint × status, ${ENDPOINTS.length} endpoints); the others are listed in ${results}/api-answers-unseen.txt.`,
  );
}

const seconds = Math.round((Date.now() - started) / 1000);
if (failedTests.length) console.log(`\nFailed tests:\n${failedTests.map((t) => `  ${t}`).join("\n")}`);
if (failures.length) console.log(`\nFailed: ${failures.join("; ")}`);
console.log(`\nAll suites finished in ${seconds} s.`);
console.log(`${tally.passed} passed, ${tally.failed} failed, ${tally.skipped} skipped`);
process.exit(tally.failed > 0 ? 1 : 0);
