// Messages between the editor and the proof worker.
import { prove, validateDesign, type Problem, type Verdict } from "../engine";

export type ProofRequest = { id: number; doc: unknown };
export type ProofReply =
  | { id: number; kind: "invalid"; problems: Problem[]; ms: number }
  | { id: number; kind: "verdict"; verdict: Verdict; ms: number }
  | { id: number; kind: "error"; message: string; ms: number };

/** The same work the worker does, for environments without Web Workers (tests, old browsers). */
export function proveHere({ id, doc }: ProofRequest): ProofReply {
  const started = performance.now();
  try {
    const v = validateDesign(doc);
    if (!v.ok) return { id, kind: "invalid", problems: v.problems, ms: performance.now() - started };
    return { id, kind: "verdict", verdict: prove(v.design), ms: performance.now() - started };
  } catch (e) {
    return { id, kind: "error", message: e instanceof Error ? e.message : String(e), ms: performance.now() - started };
  }
}
