// The primary's side of a cluster: what one worker tells reaches every other worker, and a question
// is answered to the worker that asked, with its own id.
import { EventEmitter } from "node:events";
import { describe, expect, it } from "vitest";
import { askPrimary, serveWorker } from "../../../app/lib/instances.server";

function fakeWorker(id: number) {
  const events = new EventEmitter();
  const sent: unknown[] = [];
  return {
    id,
    sent,
    send: (m: unknown) => sent.push(m),
    on: (e: "message", fn: (m: unknown) => void) => events.on(e, fn),
    receive: (m: unknown) => events.emit("message", m),
  };
}

describe("serveWorker", () => {
  it("relays a worker's news to the other workers only, and answers questions by topic", () => {
    const workers = [fakeWorker(1), fakeWorker(2), fakeWorker(3)];
    let asked: unknown = null;
    for (const w of workers) serveWorker(w, () => workers, { double: (p) => ((asked = p), (p as number) * 2) });

    workers[0]!.receive({ chainproof: "tell", topic: "forget-sessions", payload: null });
    expect(workers[0]!.sent).toEqual([]);
    expect(workers[1]!.sent).toEqual([{ chainproof: "tell", topic: "forget-sessions", payload: null }]);
    expect(workers[2]!.sent).toEqual([{ chainproof: "tell", topic: "forget-sessions", payload: null }]);

    workers[2]!.receive({ chainproof: "ask", topic: "double", id: 7, payload: 21 });
    expect(asked).toBe(21);
    expect(workers[2]!.sent.at(-1)).toEqual({ chainproof: "answer", id: 7, result: 42 });
    // A topic nobody answers still gets an answer, so the asker never waits forever.
    workers[1]!.receive({ chainproof: "ask", topic: "unknown", id: 8, payload: 1 });
    expect(workers[1]!.sent.at(-1)).toEqual({ chainproof: "answer", id: 8, result: null });
    // Messages that are not ours (other libraries use the same channel) are left alone.
    workers[0]!.receive({ cmd: "NODE_CLUSTER" });
    workers[0]!.receive("hello");
    expect(workers[1]!.sent).toHaveLength(2);
  });

  it("answers a question in this process when no primary answers (none there, or gone)", async () => {
    // Under vitest this process may have a channel to vitest itself, which never answers ours.
    await expect(askPrimary("api-rate-limit", { op: "admit" }, () => "counted here", 50)).resolves.toBe("counted here");
  });

  it("never throws for a worker that has just ended: the message is dropped, the others still get it", () => {
    const live = fakeWorker(1);
    const other = fakeWorker(2);
    // Like a ChildProcess whose channel closed: the error goes to the callback, or is thrown
    // (emitted unhandled) when there is none.
    const gone = {
      id: 3,
      send: (_m: unknown, _h?: unknown, _o?: unknown, done?: (err: Error | null) => void) => {
        if (!done) throw new Error("ERR_IPC_CHANNEL_CLOSED");
        done(new Error("ERR_IPC_CHANNEL_CLOSED"));
      },
    };
    serveWorker(live, () => [live, gone, other], {});
    expect(() => live.receive({ chainproof: "tell", topic: "forget-sessions", payload: null })).not.toThrow();
    expect(other.sent).toHaveLength(1);
  });
});
