// Heavy proofs run in a pool of worker threads (piscina), so pages stay fast while a large design
// is proved. Where workers cannot load TypeScript (the Vite dev server), proofs run inline.
import { existsSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { pathToFileURL } from "node:url";
import { Piscina } from "piscina";
import { proveDocument, type ProofOutcome } from "~/designs/proof";

const WORKER_FILE = path.resolve(process.cwd(), "app/proofs/prove.worker.ts");

let pool: Piscina | null | undefined;

function getPool(): Piscina | null {
  if (pool !== undefined) return pool;
  // Worker threads inherit the process's --import tsx; without it they could not load the engine's source.
  const canLoadTs = process.execArgv.some((a) => a.includes("tsx"));
  pool =
    canLoadTs && existsSync(WORKER_FILE)
      ? new Piscina({
          filename: pathToFileURL(WORKER_FILE).href,
          maxThreads: Math.max(1, Number(process.env.PROOF_THREADS ?? os.availableParallelism())),
          minThreads: 1,
          idleTimeout: 60_000,
        })
      : null;
  return pool;
}

export async function proveOffThread(document: unknown): Promise<ProofOutcome> {
  const p = getPool();
  if (!p) return proveDocument(document);
  return (await p.run(document)) as ProofOutcome;
}

export function proofPoolSize(): number {
  return getPool()?.threads.length ?? 0;
}
