// Heavy proofs run in a pool of worker threads (piscina), so pages stay fast while a large design
// is proved. Where workers cannot load TypeScript (the Vite dev server), proofs run inline.
import { existsSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { pathToFileURL } from "node:url";
import { Piscina } from "piscina";
import { proveDocument, type ProofOutcome } from "~/designs/proof";
import { apiError } from "~/api/http.server";

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

/** A proof running longer than this is stopped (its worker thread ends) with a clear answer. */
export const PROOF_TIME_LIMIT_MS = Math.max(1, Number(process.env.PROOF_TIME_LIMIT_MS ?? 20_000));
/** Proofs one user may have running at once in this process (each holds a worker thread). */
export const PROOFS_PER_USER = 2;

/** A proof refused (too many of the user's at once: 429) or stopped (over the time limit: 422). */
export class ProofLimitError extends Error {
  constructor(
    readonly status: 422 | 429,
    readonly code: "proof_too_long" | "too_many_proofs",
    message: string,
  ) {
    super(message);
  }
}

const runningPerUser = new Map<string, number>();

export async function proveOffThread(document: unknown, opts: { userId?: string } = {}): Promise<ProofOutcome> {
  const user = opts.userId;
  if (user !== undefined) {
    const running = runningPerUser.get(user) ?? 0;
    if (running >= PROOFS_PER_USER) throw new ProofLimitError(429, "too_many_proofs", `You have ${running} proofs running; wait for one to finish.`);
    runningPerUser.set(user, running + 1);
  }
  try {
    const p = getPool();
    if (!p) return proveDocument(document);
    try {
      return (await p.run(document, { signal: AbortSignal.timeout(PROOF_TIME_LIMIT_MS) })) as ProofOutcome;
    } catch (err) {
      if ((err as Error).name !== "AbortError") throw err;
      throw new ProofLimitError(
        422,
        "proof_too_long",
        `The proof took longer than ${PROOF_TIME_LIMIT_MS / 1000} s and was stopped. Prove a design this large with the command line (npm run chainproof -- prove).`,
      );
    }
  } finally {
    if (user !== undefined) {
      const left = (runningPerUser.get(user) ?? 1) - 1;
      if (left > 0) runningPerUser.set(user, left);
      else runningPerUser.delete(user);
    }
  }
}

export function proofPoolSize(): number {
  return getPool()?.threads.length ?? 0;
}

/** For API routes: a refused or stopped proof as the API's error answer (thrown); anything else rethrown. */
export function proofLimitAnswer(err: unknown): never {
  if (err instanceof ProofLimitError) throw apiError(err.status, err.code, err.message);
  throw err;
}
