// The whole check of a record (command line `check-controller` and the API alike):
// chainproof/controller-check@1 = derived values and sorted findings, optionally against a design.
import type { Design, Problem } from "../engine/index";
import { deriveValues, type DerivedValues } from "./derive";
import { designFindings, recordFindings, sortFindings, type Finding } from "./findings";
import { validateRecord, type ControllerRecord } from "./schema";

export const CONTROLLER_CHECK_FORMAT = "chainproof/controller-check@1";

export type ControllerCheck = {
  format: typeof CONTROLLER_CHECK_FORMAT;
  derived: DerivedValues;
  findings: Finding[];
};

export type ParsedRecord = { ok: true; record: ControllerRecord; derived: DerivedValues } | { ok: false; problems: Problem[] };

/** Validates a record and derives its values. */
export function parseRecord(input: unknown): ParsedRecord {
  const v = validateRecord(input);
  if (!v.ok) return v;
  return { ok: true, record: v.record, derived: deriveValues(v.record) };
}

/** Derived values and findings of a valid record, against a design when one is given. */
export function checkRecord(
  record: ControllerRecord,
  design?: Pick<Design, "controller">,
  derived = deriveValues(record),
): ControllerCheck {
  const findings = recordFindings(record, derived);
  if (design) findings.push(...designFindings(record, derived, design));
  return { format: CONTROLLER_CHECK_FORMAT, derived, findings: sortFindings(findings) };
}

/** Whether any finding is an error (the command line exits 1; a vehicle's proof does not hold). */
export const hasErrors = (findings: Finding[]) => findings.some((f) => f.severity === "error");
