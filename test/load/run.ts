// Load and fault figures (docs/decisions/091). Signed-in users load pages, read the API, prove designs
// and save drafts at once (autocannon on loopback, one connection per user); then PostgreSQL is
// stopped and started under that load.
//   npm run loadtest              full run on its own stack (prints JSON figures for the README)
//   tsx test/load/run.ts --quick  a few seconds against CHAINPROOF_URL (npm test): checks correctness only
//
// The user model: each user acts once every 1/rate seconds (an action, then a pause until the next
// one), the users starting at staggered moments as people do. "Saturation" drops the pauses: every
// user sends its next request as soon as the last is answered, which shows the most the machine
// serves, not what people would see.
import { randomBytes } from "node:crypto";
import autocannon from "autocannon";
import { bringUp, run, type Stack } from "../../scripts/stack";
import { startPostgres } from "../../scripts/services";

const quick = process.argv.includes("--quick");
const seconds = quick ? 3 : 20;
const warmupSeconds = quick ? 0 : 5;
const users = quick ? 10 : 50;
const proofUsers = quick ? 2 : 5;
const saveUsers = quick ? 2 : 5;

type Session = { cookie: string; ip: string };
type MixName = "pagesAndReads" | "proofs" | "saves";
type Recorder = { latencies: number[]; statuses: Record<string, number>; failures: number };
type Figures = {
  requests: number;
  throughputPerSec: number;
  p50ms: number;
  p90ms: number;
  p99ms: number;
  maxMs: number;
  errors: number;
  statuses: Record<string, number>;
};

async function signIn(base: string, email: string, ip: string): Promise<Session> {
  const res = await fetch(`${base}/api/auth/sign-in/email`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: base, "x-forwarded-for": ip },
    body: JSON.stringify({ email, password: "chainproof-demo" }),
  });
  if (!res.ok) throw new Error(`sign-in of ${email} failed: ${res.status}`);
  return {
    cookie: res.headers
      .getSetCookie()
      .map((c) => c.split(";")[0])
      .join("; "),
    ip,
  };
}

const recorder = (): Recorder => ({ latencies: [], statuses: {}, failures: 0 });

/**
 * One user: one connection that sends its requests in turn, at most `rate` a second (0: no pause).
 * A late answer is also counted as the answers the user would have waited for meanwhile
 * (coordinated omission, as HdrHistogram's recordValueWithExpectedInterval corrects it).
 */
function user(
  base: string,
  s: Session,
  requests: autocannon.Request[],
  rate: number,
  duration: number,
  rec: Recorder,
  startAfterMs: number,
) {
  const interval = rate > 0 ? 1000 / rate : 0;
  return new Promise<void>((resolve) => {
    setTimeout(() => {
      const instance = autocannon(
        {
          url: base,
          connections: 1,
          duration,
          ...(rate > 0 ? { connectionRate: rate } : {}),
          // As a browser sends them: compressed answers cost the server what they cost it for people.
          headers: {
            cookie: s.cookie,
            "x-forwarded-for": s.ip,
            origin: base,
            "content-type": "application/json",
            "accept-encoding": "gzip, deflate, br",
          },
          requests,
        },
        () => resolve(),
      );
      instance.on("response", (_client: unknown, status: number, _bytes: number, ms: number) => {
        rec.statuses[status] = (rec.statuses[status] ?? 0) + 1;
        rec.latencies.push(ms);
        if (interval > 0) for (let missed = ms - interval; missed > 0; missed -= interval) rec.latencies.push(missed);
      });
      instance.on("reqError", () => (rec.failures += 1));
    }, startAfterMs);
  });
}

function figures(rec: Recorder, okStatuses: number[], duration: number): Figures {
  const sorted = [...rec.latencies].sort((a, b) => a - b);
  const at = (q: number) => (sorted.length ? Math.round(sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))]!) : 0);
  const answered = Object.values(rec.statuses).reduce((n, c) => n + c, 0);
  const bad = Object.entries(rec.statuses)
    .filter(([code]) => !okStatuses.includes(Number(code)))
    .reduce((n, [, c]) => n + c, 0);
  return {
    requests: answered,
    throughputPerSec: Math.round((answered / duration) * 10) / 10,
    p50ms: at(0.5),
    p90ms: at(0.9),
    p99ms: at(0.99),
    maxMs: Math.round(sorted.at(-1) ?? 0),
    errors: bad + rec.failures,
    statuses: rec.statuses,
  };
}

async function main() {
  let stack: Stack | null = null;
  let base = process.env.CHAINPROOF_URL ?? "";
  let pgDir = process.env.CHAINPROOF_PG_DIR ?? ".data/test/postgres";
  let pgPort = Number(process.env.CHAINPROOF_PG_PORT ?? 54339);
  if (!quick || !base) {
    stack = await bringUp({
      name: "load",
      dataDir: ".data/load",
      pgPort: 54349,
      database: "chainproof_load",
      freshDatabase: true,
      smtpPort: 2545,
      s3Port: 4589,
      appPort: 3200,
      demo: true,
      authSecret: randomBytes(48).toString("base64url"),
      extraEnv: { TRUST_PROXY: "1", NODE_ENV: "production" },
    });
    if ((await run("npx", ["react-router", "build"], { NODE_ENV: "production" })) !== 0) throw new Error("the build failed");
    await stack.startApp();
    base = stack.appUrl;
    pgDir = ".data/load/postgres";
    pgPort = 54349;
  }
  try {
    const roles = ["engineer", "technician", "reviewer", "admin"];
    const sessions: Session[] = [];
    for (let n = 0; n < users; n++) sessions.push(await signIn(base, `${roles[n % 4]}@example.com`, `198.18.200.${n + 1}`));
    const engineer = sessions[0]!;
    const get = async <T>(path: string) => (await (await fetch(`${base}${path}`, { headers: { cookie: engineer.cookie } })).json()) as T;

    const { designs } = await get<{ designs: Array<{ id: string }> }>("/api/v1/designs?workspace=larkspur");
    const details = await Promise.all(
      designs.map((d) => get<{ design: { id: string }; document: unknown; latestRevision: number | null }>(`/api/v1/designs/${d.id}`)),
    );
    const withDocument = details.filter((d) => d.document);
    const proven = details.find((d) => d.latestRevision) ?? details[0]!;
    const drafts = await Promise.all(
      withDocument.map(async (d) => ({
        id: d.design.id,
        ...((await get<{ draft: { version: number; document: unknown } | null }>(`/api/v1/designs/${d.design.id}/draft`)).draft ?? {
          version: 0,
          document: d.document,
        }),
      })),
    );

    const reads: autocannon.Request[] = [
      { method: "GET", path: "/w/larkspur" },
      { method: "GET", path: "/w/larkspur/designs" },
      { method: "GET", path: `/w/larkspur/designs/${proven.design.id}` },
      { method: "GET", path: "/w/larkspur/vehicles" },
      { method: "GET", path: "/api/v1/designs?workspace=larkspur" },
      { method: "GET", path: `/api/v1/designs/${proven.design.id}` },
    ];
    const proofs: autocannon.Request[] = withDocument.map((d) => ({
      method: "POST",
      path: "/api/v1/proofs?workspace=larkspur",
      body: JSON.stringify({ document: d.document }),
    }));
    // A saving user keeps editing one working copy, shared with other saving users: each save
    // names the version it read; 409 (someone saved first) hands over the current version.
    const saving = (n: number): autocannon.Request[] => {
      const draft = drafts[savers.indexOf(n) % drafts.length]!;
      const state = { version: draft.version };
      return [
        {
          method: "PUT",
          path: `/api/v1/designs/${draft.id}/draft`,
          // The answer is read (its version), and autocannon hands it over undecoded.
          headers: { "accept-encoding": "identity" },
          setupRequest: (req) => ({ ...req, body: JSON.stringify({ document: draft.document, version: state.version }) }),
          onResponse: (status, body) => {
            try {
              const answer = JSON.parse(body) as { version?: number; currentVersion?: number };
              state.version = (status === 200 ? answer.version : answer.currentVersion) ?? state.version;
            } catch {
              // An answer that is not JSON is counted as an error by its status.
            }
          },
        },
      ];
    };
    // Who does what: saving users are engineers (sessions 0, 4, 8, ...: they may edit), proving
    // users the first others; everyone else loads pages and reads the API.
    const savers = sessions
      .map((_, n) => n)
      .filter((n) => n % 4 === 0)
      .slice(0, saveUsers);
    const provers = sessions
      .map((_, n) => n)
      .filter((n) => n % 4 !== 0)
      .slice(0, proofUsers);
    const mixOf = (n: number): MixName => (savers.includes(n) ? "saves" : provers.includes(n) ? "proofs" : "pagesAndReads");
    // The requests of user n, starting at a different place in the list for each user.
    const rotate = <T>(list: T[], n: number) => list.map((_, i) => list[(i + n) % list.length]!);

    /** Everyone at once for `duration` seconds at `rate` actions a second each (0: no pauses). */
    async function phase(rate: number, duration: number) {
      const recs: Record<MixName, Recorder> = { pagesAndReads: recorder(), proofs: recorder(), saves: recorder() };
      const stagger = (n: number) => (rate > 0 ? (n * 1000) / rate / users : 0);
      await Promise.all(
        sessions.map((s, n) => {
          const mix = mixOf(n);
          if (mix === "saves") return user(base, s, saving(n), rate, duration, recs.saves, stagger(n));
          if (mix === "proofs") return user(base, s, rotate(proofs, n), rate, duration, recs.proofs, stagger(n));
          return user(base, s, rotate(reads, n), rate, duration, recs.pagesAndReads, stagger(n));
        }),
      );
      return {
        usersPerMix: { pagesAndReads: users - proofUsers - saveUsers, proofs: proofUsers, saves: saveUsers },
        actionsPerUserPerSec: rate || "no pause",
        pagesAndReads: figures(recs.pagesAndReads, [200], duration),
        proofs: figures(recs.proofs, [200], duration),
        saves: figures(recs.saves, [200, 409], duration),
      };
    }

    // The server's code is compiled as it first runs: warm it up, unmeasured, before measuring.
    if (warmupSeconds) await phase(1, warmupSeconds);
    const steady = await phase(1, seconds);
    const capacity = quick ? [] : [await phase(2, seconds), await phase(3, seconds), await phase(0, seconds)];

    // Faults: stop the database a third of the way in, start it again at two thirds.
    const pg = () => startPostgres({ dir: pgDir, port: pgPort });
    const outageRec = recorder();
    const faultRun = Promise.all(sessions.map((s, n) => user(base, s, rotate(reads, n), 2, seconds, outageRec, (n * 500) / users)));
    await new Promise((r) => setTimeout(r, (seconds * 1000) / 3));
    pg().stop();
    await new Promise((r) => setTimeout(r, (seconds * 1000) / 3));
    pg();
    await faultRun;
    let recoveredAfterMs = -1;
    const t0 = Date.now();
    for (let i = 0; i < 120; i++) {
      const r = await fetch(`${base}/w/larkspur/designs`, { headers: { cookie: sessions[0]!.cookie } });
      if (r.status === 200) {
        recoveredAfterMs = Date.now() - t0;
        break;
      }
      await new Promise((res) => setTimeout(res, 250));
    }
    const outage = { ...figures(outageRec, [200, 503], seconds), recoveredAfterMs };

    const report = { users, seconds, warmupSeconds, steady, capacity, outage };
    console.log(JSON.stringify(report, null, 2));
    const failures: string[] = [];
    for (const p of [steady, ...capacity])
      for (const mix of ["pagesAndReads", "proofs", "saves"] as const)
        if (p[mix].errors > 0) failures.push(`${mix} at ${p.actionsPerUserPerSec}/s: ${p[mix].errors} errors`);
    if (steady.saves.statuses["200"] === undefined) failures.push("no draft save succeeded");
    if (outage.errors > 0) failures.push(`outage: ${outage.errors} responses other than 200/503`);
    if (!outage.statuses["503"]) failures.push("the outage produced no 503: was the database stopped?");
    if (recoveredAfterMs < 0) failures.push("the app did not recover after the database came back");
    if (failures.length) {
      console.log(`load: ${failures.join("; ")}`);
      process.exitCode = 1;
    }
  } finally {
    if (stack) await stack.stop();
  }
}

await main();
