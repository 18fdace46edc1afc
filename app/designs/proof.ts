// Proving on the server's terms: the engine validates and proves; this module only adds the
// server's size limits and the short summary stored with a draft. Pure (used by the seed too).
import { prove, validateDesign, type Design, type Problem, type Verdict } from "~/engine";
import { DRAFT_CHECK_ROW_LIMIT, SERVER_PROOF_ROW_LIMIT, type DraftCheck } from "./types";

/** Truth-table rows of a valid design: the product of its conditions' state counts (spec 1.1). */
function rowsOf(d: Design): number {
  return d.conditions.reduce((n, c) => n * c.states.length, 1);
}

export type ProofOutcome = { ok: true; design: Design; verdict: Verdict } | { ok: false; problems: Problem[] };

/** Validates and proves a document with the engine; refuses truth tables above the server's limit. */
export function proveDocument(document: unknown): ProofOutcome {
  const valid = validateDesign(document);
  if (!valid.ok) return { ok: false, problems: valid.problems };
  const rows = rowsOf(valid.design);
  if (rows > SERVER_PROOF_ROW_LIMIT) {
    return {
      ok: false,
      problems: [
        {
          path: "conditions",
          message: `the truth table has ${rows.toLocaleString("en-US")} rows; the server proves at most ${SERVER_PROOF_ROW_LIMIT.toLocaleString("en-US")}. Split the design or prove it with the command line.`,
        },
      ],
    };
  }
  return { ok: true, design: valid.design, verdict: prove(valid.design) };
}

/**
 * Why a proven document may not be saved as a revision (spec 1.1), as the API says it: null when
 * every rule holds and the design drives in at least one row. A design that never drives is named
 * first: it satisfies every inhibit rule and proves nothing.
 */
export function revisionRefusal(verdict: Verdict): { code: "never_drives" | "rules_fail"; message: string } | null {
  if (verdict.ok) return null;
  const failing = verdict.rules.filter((r) => !r.holds).map((r) => r.id);
  const fails =
    failing.length === 0
      ? ""
      : `${failing.length} of ${verdict.rules.length} ${verdict.rules.length === 1 ? "rule fails" : "rules fail"} (${failing.join(", ")})`;
  if (verdict.driveRows === 0) {
    return {
      code: "never_drives",
      message: `The design never drives: no row of its truth table has the drive on, so its rules prove nothing${fails ? `; also ${fails}` : ""}. Nothing was saved.`,
    };
  }
  return { code: "rules_fail", message: `${fails}; only proven designs are saved as revisions. Nothing was saved.` };
}

/** The summary stored with a draft: its problems, or which rules fail when the table is small enough. */
export function checkDraft(document: unknown): DraftCheck {
  const valid = validateDesign(document);
  if (!valid.ok) return { state: "invalid", problems: valid.problems.length };
  const rows = rowsOf(valid.design);
  if (rows > DRAFT_CHECK_ROW_LIMIT) return { state: "unchecked", rows };
  const v = prove(valid.design);
  return {
    state: "checked",
    ok: v.ok,
    failing: v.rules.filter((r) => !r.holds).length,
    rules: v.rules.length,
    driveRows: v.driveRows,
    singleFaults: v.singleFaults.length,
    rows: v.rows,
  };
}
