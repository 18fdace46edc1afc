// What a single-fault result does not say, shown wherever one appears: the engine sticks one
// contact at a time, so causes that act on several contacts at once are not covered, and no
// category or performance level follows from it. Source: ISO 13849-1:2006, 7.2 (a common cause
// counts as one fault) and Annex F (measures against common-cause failure), an edition superseded
// by 2015 and 2023; see shared/spec/check-values.md.
import type { ReactNode } from "react";

export const COMMON_CAUSE_TEXT =
  "Single-fault results consider one contact stuck open or stuck closed at a time. They do not cover common-cause failures, where one cause acts on several contacts at once (two contacts worked by one actuator, one connector or one cable; ISO 13849-1:2006, Annex F, an edition since superseded). They are not a category or performance-level claim.";

export function CommonCauseNote({ className = "" }: { className?: string }) {
  return (
    <p className={`text-xs text-ink-600 ${className}`} data-testid="common-cause-note">
      <strong className="font-semibold">Not covered:</strong> {COMMON_CAUSE_TEXT}
    </p>
  );
}

/**
 * Single-fault results with the note under them: every place that lists or counts single faults is
 * wrapped in this, so none shows them without the caution (`data-single-faults` marks it for tests).
 */
export function SingleFaultResults({
  children,
  className = "",
  note = "mt-1",
}: {
  children: ReactNode;
  className?: string;
  note?: string;
}) {
  return (
    <div className={className} data-single-faults="">
      {children}
      <CommonCauseNote className={note} />
    </div>
  );
}
