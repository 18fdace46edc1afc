// The app can run as several processes on one machine (node:cluster; scripts/serve.ts). What they
// must share goes through the primary process: a worker tells the others something ("forget the
// cached sessions"), or asks the primary a question whose answer must be one for all ("may this
// client send another API request?"). Outside a cluster every call stays in this process.
import cluster from "node:cluster";

type Envelope =
  | { chainproof: "tell"; topic: string; payload: unknown }
  | { chainproof: "ask"; topic: string; id: number; payload: unknown }
  | { chainproof: "answer"; id: number; result: unknown };

const isEnvelope = (m: unknown): m is Envelope => typeof m === "object" && m !== null && "chainproof" in m;

/** True in a worker of a cluster: shared state then lives in the primary. */
export const inClusterWorker = cluster.isWorker && typeof process.send === "function";

const listeners = new Map<string, Array<(payload: unknown) => void>>();
const pending = new Map<number, (result: unknown) => void>();
let nextId = 1;

if (inClusterWorker) {
  process.on("message", (m: unknown) => {
    if (!isEnvelope(m)) return;
    if (m.chainproof === "tell") for (const fn of listeners.get(m.topic) ?? []) fn(m.payload);
    if (m.chainproof === "answer") {
      pending.get(m.id)?.(m.result);
      pending.delete(m.id);
    }
  });
}

/** Runs `fn` when another process of this cluster tells `topic`. */
export function onToldByOtherInstance(topic: string, fn: (payload: unknown) => void): void {
  listeners.set(topic, [...(listeners.get(topic) ?? []), fn]);
}

/** Tells every other process of this cluster (nothing to do outside one). */
export function tellOtherInstances(topic: string, payload: unknown = null): void {
  // Nobody left to tell once the channel closed (this process is stopping).
  if (inClusterWorker && process.connected)
    process.send!({ chainproof: "tell", topic, payload } satisfies Envelope, undefined, undefined, () => {});
}

/**
 * Asks the primary; the answer comes from the handler it registered for `topic` (serveWorker).
 * With the primary gone (the channel closed while this process stops) or silent for `waitMs`,
 * the answer is `fallback()`, worked out in this process.
 */
export function askPrimary<T>(topic: string, payload: unknown, fallback: () => T, waitMs = 2_000): Promise<T> {
  if (!process.connected) return Promise.resolve(fallback());
  return new Promise((resolve) => {
    const id = nextId++;
    const timer = setTimeout(() => {
      pending.delete(id);
      resolve(fallback());
    }, waitMs);
    pending.set(id, (result) => {
      clearTimeout(timer);
      resolve(result as T);
    });
    process.send!({ chainproof: "ask", topic, id, payload } satisfies Envelope, undefined, undefined, (err) => {
      if (!err) return;
      clearTimeout(timer);
      pending.delete(id);
      resolve(fallback());
    });
  });
}

/**
 * In the primary: relays what one worker tells to all the others, and answers questions with the
 * handlers given (one per topic).
 */
type Reachable = {
  id: number;
  send: (m: Envelope, handle?: undefined, options?: undefined, done?: (err: Error | null) => void) => unknown;
};

/**
 * Sends without ever throwing: a process that has just ended (its channel closed) misses the
 * message instead of crashing the primary with an unhandled 'error'.
 */
const deliver = (to: Reachable, m: Envelope) => to.send(m, undefined, undefined, () => {});

export function serveWorker(
  worker: Reachable & { on: (e: "message", fn: (m: unknown) => void) => unknown },
  others: () => Iterable<Reachable>,
  answers: Record<string, (payload: unknown) => unknown>,
): void {
  worker.on("message", (m: unknown) => {
    if (!isEnvelope(m)) return;
    if (m.chainproof === "tell") {
      for (const w of others()) if (w.id !== worker.id) deliver(w, m);
    } else if (m.chainproof === "ask") {
      const handler = answers[m.topic];
      deliver(worker, { chainproof: "answer", id: m.id, result: handler ? handler(m.payload) : null });
    }
  });
}
