// Whether a stored revision passes the design format as it is now (version 1.1). Revisions saved
// before 1.1 may hold a rule whose situation matches no row, or a design that never drives: they
// stay readable, every page that shows one marks it, and it cannot be released (decision 111).
// Pure: the engine decides (validateStoredDesign, the stored verdict); pages and the server share it.
import { validateStoredDesign, type Verdict } from "~/engine";
import { REFUSED_MARK } from "./standing-words";

export { REFUSED_MARK };

export type Standing = { passes: true } | { passes: false; reasons: string[] };

/**
 * Why format 1.1 would refuse this revision (every reason, in words), or `passes`. The rules that
 * match no row come from the engine's check of the stored document; "never drives" and failing
 * rules from the verdict stored with it (the engine's, computed when it was saved).
 */
export function revisionStanding(document: unknown, verdict: Verdict): Standing {
  const reasons: string[] = [];
  const valid = validateStoredDesign(document);
  if (!valid.ok)
    reasons.push(
      `the stored design breaks the format: ${valid.problems[0]?.path || "(document)"} ${valid.problems[0]?.message ?? ""}`.trim(),
    );
  else {
    for (const p of valid.rulesMatchingNoRow) {
      const i = Number(/^rules\[(\d+)\]/.exec(p.path)?.[1] ?? -1);
      const id = valid.design.rules[i]?.id ?? p.path;
      reasons.push(`rule ${id} matches no row of its truth table (${p.path}), so it checks nothing`);
    }
  }
  if (verdict.driveRows === 0)
    reasons.push("the design never drives: no row of its truth table has the drive on, so its rules prove nothing");
  const failing = verdict.rules.filter((r) => !r.holds).map((r) => r.id);
  if (failing.length > 0)
    reasons.push(`${failing.length === 1 ? "rule" : "rules"} ${failing.join(", ")} ${failing.length === 1 ? "fails" : "fail"}`);
  return reasons.length === 0 ? { passes: true } : { passes: false, reasons };
}

/** The reasons as one sentence, for a refusal message. */
export function standingSentence(s: Standing): string {
  return s.passes ? "" : `${REFUSED_MARK}: ${s.reasons.join("; ")}.`;
}

const cache = new Map<string, Standing>();
const MAX = 256;

/** A standing already worked out for this revision id, or undefined. */
export function knownStanding(revisionId: string): Standing | undefined {
  return cache.get(revisionId);
}

/** `revisionStanding`, remembered by revision id (revisions never change; safe to miss). */
export function standingOf(revisionId: string, document: unknown, verdict: Verdict): Standing {
  const hit = cache.get(revisionId);
  if (hit) return hit;
  const s = revisionStanding(document, verdict);
  cache.set(revisionId, s);
  while (cache.size > MAX) cache.delete(cache.keys().next().value!);
  return s;
}
