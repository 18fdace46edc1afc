// Types and limits shared by the design pages, the design API and the canvas editor.
// No server imports here: the browser bundle imports this module.
import type { Problem, Verdict } from "~/engine";
import type { DraftCheck } from "~/api/answers";

export type { Problem, Verdict };

import { DESIGN_STATUSES, type DesignStatus } from "./statuses";

export { DESIGN_STATUSES, type DesignStatus };

export const STATUS_LABELS: Record<DesignStatus, string> = {
  draft: "Draft",
  proven: "Proven",
};

/** Largest JSON body the design API reads (a draft or a revision with its layout). */
export const DESIGN_BODY_MAX_BYTES = 1_000_000;
/** Largest truth table the server proves in a request (the engine itself accepts 2^24 rows). */
export const SERVER_PROOF_ROW_LIMIT = 2 ** 20;
/** Drafts up to this many rows get a stored check summary ("2 rules fail") when saved. */
export const DRAFT_CHECK_ROW_LIMIT = 2 ** 16;
/** Longest revision message. */
export const REVISION_MESSAGE_MAX = 500;

/** A problem with a request or a document, named by the path of the offending field. */
export type FieldProblem = { path: string; message: string };

export type SaveDraftResult = { ok: true; version: number } | { ok: false; status: 409; currentVersion: number };

export type SaveRevisionResult =
  | { status: 201; revision: { number: number; contentHash: string; verdict: Verdict } }
  | { status: 400; problems: Problem[] }
  | { status: 422; verdict: Verdict }
  | { status: 409; latestRevision: number };

/**
 * What the editor route hands the canvas editor: the document, its versions and the two save calls.
 * The canvas adds its own view options to these (DesignEditorProps in app/canvas/contract.ts).
 * The two callbacks talk to the design API. They resolve with the outcomes above; any other
 * failure (signed out, no permission, network down, server error) rejects with an Error whose
 * message can be shown to the user as it is.
 */
export type EditorDocumentProps = {
  /** The draft document, or the latest revision's when that is newer; may be invalid. */
  initial: unknown;
  /** The draft's version for optimistic concurrency (0 when the design has no draft). */
  draftVersion: number;
  /** The revision the document builds on (0 when none); a save on an older base gets 409. */
  baseRevision: number;
  readOnly: boolean;
  designName: string;
  onSaveDraft: (doc: unknown, version: number) => Promise<SaveDraftResult>;
  onSaveRevision: (doc: unknown, baseRevision: number, message: string) => Promise<SaveRevisionResult>;
};

// The stored summary of a draft's check and a design as listed are API answers: their schemas are
// in app/api/answers.ts, and the types come from there.
export type { DesignSummary, DraftCheck } from "~/api/answers";

/** Short words for a draft check, e.g. "2 of 5 rules fail". */
export function describeDraftCheck(check: DraftCheck): string {
  switch (check.state) {
    case "invalid":
      return check.problems === 1 ? "1 problem in the design" : `${check.problems} problems in the design`;
    case "unchecked":
      return `too large to check on save (${check.rows.toLocaleString("en-US")} rows)`;
    case "checked":
      if (check.ok) return check.rules === 0 ? "no rules yet" : "every rule holds";
      if (check.driveRows === 0)
        return check.failing === 0
          ? "never drives"
          : `never drives; ${check.failing} of ${check.rules} ${check.rules === 1 ? "rule fails" : "rules fail"}`;
      return `${check.failing} of ${check.rules} ${check.rules === 1 ? "rule fails" : "rules fail"}`;
  }
}
