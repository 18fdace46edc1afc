// PostgreSQL stopped and started under traffic: while it is down every request fails cleanly (503 with
// a message, never a 500 or a stack trace); afterwards the same app serves again without a restart,
// and nothing was half-written.
import { afterAll, describe, expect, it } from "vitest";
import pg from "pg";
import { startPostgres } from "../../scripts/services";
import { DEMO, signIn, type Client } from "../support/http";

const PG_DIR = process.env.CHAINPROOF_PG_DIR ?? ".data/test/postgres";
const PG_PORT = Number(process.env.CHAINPROOF_PG_PORT ?? 54339);

async function revisionCount(): Promise<number> {
  const db = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await db.connect();
  try {
    return (await db.query("SELECT count(*)::int AS n FROM design_revision")).rows[0].n as number;
  } finally {
    await db.end();
  }
}

async function firstDesign(c: Client): Promise<{ id: string; document: unknown; latestRevision: number }> {
  const list = (await (await c.fetch("/api/v1/designs?workspace=larkspur")).json()) as { designs: Array<{ id: string }> };
  for (const d of list.designs) {
    const one = (await (await c.fetch(`/api/v1/designs/${d.id}`)).json()) as { document: unknown; latestRevision: number | null };
    if (one.latestRevision) return { id: d.id, document: one.document, latestRevision: one.latestRevision };
  }
  throw new Error("no design with a revision in the demo data");
}

let handle: ReturnType<typeof startPostgres> | null = null;
afterAll(() => {
  // Whatever happened, leave the database running for the suites after this one.
  handle ??= startPostgres({ dir: PG_DIR, port: PG_PORT });
});

describe("database outage", () => {
  it("answers 503 while PostgreSQL is down and recovers without restarting the app", async () => {
    const engineer = await signIn(DEMO.engineer);
    const design = await firstDesign(engineer);
    const before = await revisionCount();
    expect((await engineer.fetch("/w/larkspur/designs")).status).toBe(200);

    handle = startPostgres({ dir: PG_DIR, port: PG_PORT });
    handle.stop();

    const save = () =>
      engineer.fetch(`/api/v1/designs/${design.id}/revisions`, {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ document: design.document, baseRevision: design.latestRevision, message: "during the outage" }),
      });
    const requests = [
      ...Array.from({ length: 8 }, () => engineer.fetch("/w/larkspur/designs")),
      ...Array.from({ length: 8 }, () => engineer.fetch("/api/v1/designs?workspace=larkspur")),
      ...Array.from({ length: 4 }, save),
      engineer.fetch("/healthz"),
    ];
    const responses = await Promise.all(requests);
    for (const res of responses) {
      expect(res.status).toBe(503);
      const text = await res.text();
      expect(text).toMatch(/cannot reach its database|not reachable/);
      expect(text).not.toMatch(/\n\s+at .+:\d+:\d+/);
    }

    handle = startPostgres({ dir: PG_DIR, port: PG_PORT });
    let healthy = false;
    for (let i = 0; i < 60 && !healthy; i++) {
      healthy = (await engineer.fetch("/healthz")).status === 200;
      if (!healthy) await new Promise((r) => setTimeout(r, 250));
    }
    expect(healthy).toBe(true);
    // The same session still works, and nothing was saved while the database was down.
    expect((await engineer.fetch("/w/larkspur/designs")).status).toBe(200);
    expect(await revisionCount()).toBe(before);
    const after = await save();
    expect([201, 409]).toContain(after.status);
  });
});
