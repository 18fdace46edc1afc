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
/** Proofs one user may have running at once in this process (each holds a worker thread); more wait their turn. */
export const PROOFS_PER_USER = 2;
/** Proofs of one user that may wait for a turn; one more is refused (429). */
export const PROOFS_WAITING_PER_USER = 8;

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

/** Per user: how many proofs run, and who waits for a turn (first come, first served). */
const perUser = new Map<string, { running: number; waiting: Array<() => void> }>();

async function takeTurn(user: string): Promise<void> {
  const slot = perUser.get(user) ?? { running: 0, waiting: [] };
  perUser.set(user, slot);
  if (slot.running < PROOFS_PER_USER) {
    slot.running += 1;
    return;
  }
  if (slot.waiting.length >= PROOFS_WAITING_PER_USER) {
    throw new ProofLimitError(
      429,
      "too_many_proofs",
      `You have ${slot.running} proofs running and ${slot.waiting.length} waiting; wait for them to finish.`,
    );
  }
  await new Promise<void>((resolve) => slot.waiting.push(resolve));
}

function giveTurn(user: string): void {
  const slot = perUser.get(user);
  if (!slot) return;
  const next = slot.waiting.shift();
  if (next)
    next(); // the turn passes on: running stays the same
  else if (--slot.running <= 0) perUser.delete(user);
}

export async function proveOffThread(document: unknown, opts: { userId?: string } = {}): Promise<ProofOutcome> {
  const user = opts.userId;
  if (user !== undefined) await takeTurn(user);
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
    if (user !== undefined) giveTurn(user);
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
