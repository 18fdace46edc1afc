// Load and fault figures: many signed-in users loading pages, reading the API, proving and saving
// drafts at once (autocannon on loopback); then PostgreSQL stopped and started under that load.
//   npm run loadtest              full run on its own stack (prints JSON figures for the README)
//   tsx test/load/run.ts --quick  a few seconds against CHAINPROOF_URL (npm test): checks correctness only
import autocannon from "autocannon";
import { bringUp, run, type Stack } from "../../scripts/stack";
import { startPostgres } from "../../scripts/services";

const quick = process.argv.includes("--quick");
const seconds = quick ? 3 : 20;
const users = quick ? 10 : 50;

type Session = { cookie: string; ip: string };
type Figures = { requests: number; throughputPerSec: number; p50ms: number; p99ms: number; maxMs: number; errors: number; statuses: Record<string, number> };

async function signIn(base: string, email: string, ip: string): Promise<Session> {
  const res = await fetch(`${base}/api/auth/sign-in/email`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: base, "x-forwarded-for": ip },
    body: JSON.stringify({ email, password: "chainproof-demo" }),
  });
  if (!res.ok) throw new Error(`sign-in of ${email} failed: ${res.status}`);
  return { cookie: res.headers.getSetCookie().map((c) => c.split(";")[0]).join("; "), ip };
}

function figures(r: autocannon.Result, okStatuses: number[]): Figures {
  const statuses: Record<string, number> = {};
  for (const [code, v] of Object.entries(r.statusCodeStats ?? {})) statuses[code] = (v as { count: number }).count;
  const bad = Object.entries(statuses).filter(([code]) => !okStatuses.includes(Number(code))).reduce((n, [, c]) => n + c, 0);
  return {
    requests: r.requests.total,
    throughputPerSec: Math.round(r.requests.average),
    p50ms: r.latency.p50,
    p99ms: r.latency.p99,
    maxMs: r.latency.max,
    errors: bad + r.errors + r.timeouts,
    statuses,
  };
}

function load(base: string, sessions: Session[], requests: autocannon.Request[], connections: number, duration: number) {
  let next = 0;
  // Each connection acts as one signed-in user: its context keeps the session it was given.
  const withSession: autocannon.Request[] = requests.map((r) => ({
    ...r,
    setupRequest: (req: autocannon.Request, context: object) => {
      const ctx = context as { session?: Session };
      const s = (ctx.session ??= sessions[next++ % sessions.length]!);
      return { ...req, headers: { ...req.headers, cookie: s.cookie, "x-forwarded-for": s.ip, origin: base, "content-type": "application/json" } } as autocannon.Request;
    },
  }));
  return autocannon({ url: base, connections, duration, requests: withSession });
}

async function main() {
  let stack: Stack | null = null;
  let base = process.env.CHAINPROOF_URL ?? "";
  let pgDir = process.env.CHAINPROOF_PG_DIR ?? ".data/test/postgres";
  let pgPort = Number(process.env.CHAINPROOF_PG_PORT ?? 54339);
  if (!quick || !base) {
    stack = await bringUp({
      name: "load", dataDir: ".data/load", pgPort: 54349, database: "chainproof_load", freshDatabase: true,
      smtpPort: 2545, s3Port: 4589, appPort: 3200, demo: true,
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
    const engineers = sessions.filter((_, n) => n % 4 === 0);

    const designs = (await (await fetch(`${base}/api/v1/designs?workspace=larkspur`, { headers: { cookie: engineers[0]!.cookie } })).json()) as { designs: Array<{ id: string }> };
    const details = await Promise.all(
      designs.designs.map(async (d) => (await (await fetch(`${base}/api/v1/designs/${d.id}`, { headers: { cookie: engineers[0]!.cookie } })).json()) as { design: { id: string }; document: unknown; latestRevision: number | null }),
    );
    const proven = details.find((d) => d.latestRevision) ?? details[0]!;
    const target = details[0]!;
    const draftRes = (await (await fetch(`${base}/api/v1/designs/${target.design.id}/draft`, { headers: { cookie: engineers[0]!.cookie } })).json()) as { draft: { version: number; document: unknown } | null };
    const draftVersion = draftRes.draft?.version ?? 0;

    const pagesAndReads: autocannon.Request[] = [
      { method: "GET", path: "/w/larkspur" },
      { method: "GET", path: "/w/larkspur/designs" },
      { method: "GET", path: `/w/larkspur/designs/${proven.design.id}` },
      { method: "GET", path: "/w/larkspur/vehicles" },
      { method: "GET", path: "/api/v1/designs?workspace=larkspur" },
      { method: "GET", path: `/api/v1/designs/${proven.design.id}` },
    ];
    const proofs: autocannon.Request[] = details.map((d) => ({ method: "POST", path: "/api/v1/proofs?workspace=larkspur", body: JSON.stringify({ document: d.document }) }));
    // Saves race on one working copy: one wins per version, the rest get 409, as they should.
    const saves: autocannon.Request[] = [{ method: "PUT", path: `/api/v1/designs/${target.design.id}/draft`, body: JSON.stringify({ document: draftRes.draft?.document ?? target.document, version: draftVersion }) }];

    const [readsResult, proofsResult, savesResult] = await Promise.all([
      load(base, sessions, pagesAndReads, users, seconds),
      load(base, sessions, proofs, Math.max(2, users / 10), seconds),
      load(base, engineers, saves, Math.max(2, users / 10), seconds),
    ]);
    const steady = {
      pagesAndReads: figures(readsResult, [200]),
      proofs: figures(proofsResult, [200, 400]),
      saves: figures(savesResult, [200, 409]),
    };

    // Faults: stop the database a third of the way in, start it again at two thirds.
    const pg = () => startPostgres({ dir: pgDir, port: pgPort });
    const faultRun = load(base, sessions, pagesAndReads, users, seconds);
    await new Promise((r) => setTimeout(r, (seconds * 1000) / 3));
    pg().stop();
    await new Promise((r) => setTimeout(r, (seconds * 1000) / 3));
    pg();
    const faultResult = await faultRun;
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
    const outage = { ...figures(faultResult, [200, 503]), recoveredAfterMs };

    const report = { users, seconds, steady, outage };
    console.log(JSON.stringify(report, null, 2));
    const failures: string[] = [];
    for (const [name, f] of Object.entries(steady)) if (f.errors > 0) failures.push(`${name}: ${f.errors} errors`);
    if (outage.errors > 0) failures.push(`outage: ${outage.errors} responses other than 200/503`);
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
