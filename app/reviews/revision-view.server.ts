// What the review page and the report show about one revision, computed from its stored document
// and verdict with the engine: labels, replayed counterexamples, and the comparison with the last
// approved revision of the same design.
import { compareOutcomes, replayTrace, type CompiledDesign, type Design, type OutcomeComparison, type Verdict } from "~/engine";
import { getRevision } from "~/designs/designs.server";
import { standingOf } from "~/designs/standing";
import type { TraceStepView } from "~/components/truth-table/verdict-summary";
import { compiledFor } from "./compiled.server";
import { structuralDiff, type StructuralDiff } from "./diff";
import { lastApprovedBefore } from "./reviews.server";

export function labelsOf(design: Design) {
  const rules: Record<string, string> = {};
  const components: Record<string, string> = {};
  for (const r of design.rules) rules[r.id] = r.label || r.id;
  for (const c of design.components) components[c.id] = ("label" in c && c.label) || c.id;
  return { rules, components };
}

/** The counterexample of each failing no-restart rule, replayed step by step by the engine. */
export function tracesOf(c: CompiledDesign, verdict: Verdict): Record<string, TraceStepView[]> {
  const out: Record<string, TraceStepView[]> = {};
  for (const r of verdict.rules) {
    if ("trace" in r && r.trace) {
      out[r.id] = replayTrace(c, r.trace).map((s) => ({
        step: s.step,
        states: s.row.states,
        drive: s.drive,
        restart: s.restart,
        armed: s.armed,
      }));
    }
  }
  return out;
}

/** A full revision (document, verdict, author) with its compiled design and its standing under format 1.1. */
export async function loadRevision(workspaceId: string, designId: string, number: number) {
  const rev = await getRevision(workspaceId, designId, number);
  if (!rev) return null;
  const compiled = compiledFor(rev.id, rev.document);
  const standing = standingOf(rev.id, rev.document, rev.verdict);
  return { rev, compiled, design: compiled.design, verdict: rev.verdict, standing, refused: standing.passes ? null : standing.reasons };
}

export type Comparison =
  | { baseline: null }
  | {
      baseline: { number: number; approved: boolean; chosen: boolean };
      structural: StructuralDiff;
      /** Rows whose drive or rule outcome changed, as groups (engine's compareOutcomes). */
      outcomes: OutcomeComparison;
      verdict: { before: Verdict; after: Verdict };
    };

const comparisons = new Map<string, Comparison>();
const MAX_COMPARISONS = 16;

/**
 * The diff against the newest approved revision numbered below this one or, when none is approved,
 * against the previous revision (what the last review asked to change). Cached: revisions never change.
 */
export async function compareWithLastApproved(
  workspaceId: string,
  designId: string,
  number: number,
  current: CompiledDesign,
  currentVerdict: Verdict,
  against?: number | null,
): Promise<Comparison> {
  const chosen = against && against !== number ? await getRevision(workspaceId, designId, against) : null;
  const approved = chosen ? null : await lastApprovedBefore(workspaceId, designId, number);
  const previous = chosen || approved ? null : number > 1 ? await getRevision(workspaceId, designId, number - 1) : null;
  const base = chosen
    ? { id: chosen.id, number: chosen.number }
    : (approved ?? (previous ? { id: previous.id, number: previous.number } : null));
  if (!base) return { baseline: null };
  const key = `${base.id}:${designId}:${number}:${chosen ? "chosen" : "default"}`;
  const hit = comparisons.get(key);
  if (hit) return hit;
  const before = await loadRevision(workspaceId, designId, base.number);
  if (!before) return { baseline: null };
  // Plain JSON: the engine's group states have no prototype.
  const result: Comparison = JSON.parse(
    JSON.stringify({
      baseline: { number: base.number, approved: approved !== null, chosen: chosen !== null },
      structural: structuralDiff(before.design, current.design),
      outcomes: compareOutcomes(before.compiled, current, { limit: 12 }),
      verdict: { before: before.verdict, after: currentVerdict },
    } satisfies Comparison),
  );
  comparisons.set(key, result);
  while (comparisons.size > MAX_COMPARISONS) comparisons.delete(comparisons.keys().next().value!);
  return result;
}
