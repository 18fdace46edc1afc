// Whether a vehicle's released proof holds for its controller settings record: the record's findings
// against the released revision's design (controller-record.md section 4). Pure; shared by the pages.
import { checkRecord, hasErrors, parseRecord, type DerivedValues, type Finding } from "../controller-record";
import type { Design, Problem } from "../engine";

/** The mark a vehicle carries when any error finding stands between its record and its released proof. */
export const PROOF_DOES_NOT_HOLD = "The proof does not hold for this controller's settings";

export type ControllerState =
  /** No record has been entered. */
  | "no-record"
  /** A record, but no revision is released to the vehicle: nothing to hold or not. */
  | "no-release"
  /** The released revision's assumptions and the record agree (warnings may remain). */
  | "holds"
  /** At least one error finding: the proof does not hold for these settings. */
  | "does-not-hold"
  /** The stored record no longer passes the record's checks; the proof cannot be taken to hold. */
  | "record-invalid";

export type ControllerStatus = {
  state: ControllerState;
  errors: Finding[];
  warnings: Finding[];
  problems: Problem[];
  derived: DerivedValues | null;
};

/** The design part the record is checked against, if the stored document has one. */
function controllerOf(design: unknown): Pick<Design, "controller"> | null {
  if (typeof design !== "object" || design === null) return null;
  const c = (design as { controller?: unknown }).controller;
  if (typeof c !== "object" || c === null || typeof (c as { throttle?: unknown }).throttle !== "object") return null;
  return { controller: c as Design["controller"] };
}

/** The status of a record (the stored document, or null) against the released design document (or null). */
export function controllerStatus(record: unknown | null, releasedDesign: unknown | null): ControllerStatus {
  if (record === null || record === undefined) return { state: "no-record", errors: [], warnings: [], problems: [], derived: null };
  const parsed = parseRecord(record);
  if (!parsed.ok) {
    return { state: releasedDesign ? "record-invalid" : "no-release", errors: [], warnings: [], problems: parsed.problems, derived: null };
  }
  const design = releasedDesign ? controllerOf(releasedDesign) : null;
  const check = checkRecord(parsed.record, design ?? undefined, parsed.derived);
  const errors = check.findings.filter((f) => f.severity === "error");
  const warnings = check.findings.filter((f) => f.severity === "warning");
  const state: ControllerState = !releasedDesign ? "no-release" : hasErrors(check.findings) ? "does-not-hold" : "holds";
  return { state, errors, warnings, problems: [], derived: check.derived };
}

/** Whether the vehicle carries the mark. */
export const proofDoesNotHold = (s: Pick<ControllerStatus, "state">) => s.state === "does-not-hold" || s.state === "record-invalid";

/** The difference in words: every error finding's message (or the stored record's problems). */
export function differenceInWords(s: ControllerStatus): string[] {
  if (s.state === "record-invalid")
    return s.problems.map((p) => `The stored record no longer passes its checks: ${p.path || "(root)"} ${p.message}.`);
  return s.errors.map((f) => f.message);
}
