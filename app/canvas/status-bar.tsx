// The line under the canvas: the live proof's result, whether this is a proven revision or a
// draft, and the draft's save state.
import { useMemo } from "react";
import { COMMON_CAUSE_TEXT } from "../components/common-cause-note";
import { contentKey } from "./convert";
import type { DraftState } from "./hooks";
import { useDocument } from "./panels/common";
import { useEditor } from "./store";
import { Button } from "../components/ui/button";

export function StatusBar({ draft, readOnly }: { draft: DraftState; readOnly: boolean }) {
  const proof = useEditor((s) => s.proof);
  const revision = useEditor((s) => s.revision);
  const simulating = useEditor((s) => s.simulation !== null);
  const setPanel = useEditor((s) => s.setPanel);
  const doc = useDocument();
  const key = useMemo(() => contentKey(doc), [doc]);
  const isRevision = revision.number > 0 && revision.key === key;
  let proofText = "Checking…";
  let tone = "text-ink-600";
  if (proof.status === "invalid") {
    proofText = `${proof.problems.length} ${proof.problems.length === 1 ? "problem" : "problems"} to fix before proving`;
    tone = "text-brick-700";
  } else if (proof.status === "error") {
    proofText = `Check failed: ${proof.message}`;
    tone = "text-brick-700";
  } else if (proof.status === "done") {
    const failing = proof.verdict.rules.filter((r) => !r.holds).length;
    const rules = proof.verdict.rules.length;
    const failText = `${failing} of ${rules} ${rules === 1 ? "rule fails" : "rules fail"}`;
    // Spec 1.1: a design that never drives proves nothing, even when every rule holds.
    proofText =
      proof.verdict.driveRows === 0
        ? `Never drives: proves nothing${failing ? ` · ${failText}` : ""}`
        : failing === 0
          ? "Proven: every rule holds"
          : failText;
    tone = proof.verdict.ok ? "text-moss-700" : "text-brick-700";
    proofText += ` · ${proof.verdict.rows.toLocaleString("en-US")} rows, ${proof.verdict.driveRows.toLocaleString("en-US")} with drive`;
  }
  const faults = proof.status === "done" ? proof.verdict.singleFaults.length : 0;
  const draftText = readOnly
    ? ""
    : draft.kind === "saving"
      ? "Saving draft…"
      : draft.kind === "pending"
        ? "Unsaved changes"
        : draft.kind === "conflict"
          ? "Autosave paused (saved elsewhere)"
          : draft.kind === "error"
            ? `Draft not saved: ${draft.message}`
            : "Draft saved";
  return (
    <div
      role="status"
      aria-live="polite"
      data-testid="status-bar"
      className="flex flex-wrap items-center gap-x-4 gap-y-1 border-t border-ink-200 bg-white px-3 py-1.5 text-sm"
    >
      <span className={`font-semibold ${tone}`} data-testid="proof-status">
        {proofText}
      </span>
      {faults > 0 ? (
        // A single-fault count, with the way to what it does and does not cover (the Problems panel).
        <Button
          type="button"
          variant="link"
          className="underline-offset-auto"
          title={COMMON_CAUSE_TEXT}
          onClick={() => setPanel("problems")}
        >
          {faults} single {faults === 1 ? "fault defeats" : "faults defeat"} a rule
        </Button>
      ) : null}
      <span className={`font-semibold ${isRevision ? "text-moss-700" : "text-ink-600"}`} data-testid="revision-status">
        {isRevision
          ? `Revision ${revision.number}, proven`
          : `Draft, not proven${revision.number > 0 ? ` (based on revision ${revision.number})` : ""}`}
      </span>
      {simulating ? <span className="font-semibold text-copper-700">Simulating</span> : null}
      {draftText ? <span className="ml-auto text-ink-500">{draftText}</span> : null}
    </div>
  );
}
