// The props contract between the design editor and the route that mounts it.
// SaveRevisionResult and SaveDraftResult mirror app/designs/types.ts (owned by the designs side);
// they are declared here until that module exists, with exactly the agreed shapes.
import type { Problem, Verdict } from "../engine";

export type SaveDraftResult = { ok: true; version: number } | { ok: false; status: 409; currentVersion: number };

export type SaveRevisionResult =
  | { status: 201; revision: { number: number; contentHash: string; verdict: Verdict } }
  | { status: 400; problems: Problem[] }
  | { status: 422; verdict: Verdict }
  | { status: 409; latestRevision: number };

export type DesignEditorProps = {
  /** A design document, possibly invalid or empty. */
  initial: unknown;
  draftVersion: number;
  /** The revision this working copy is based on; 0 when none. */
  baseRevision: number;
  readOnly: boolean;
  designName: string;
  onSaveDraft: (doc: unknown, version: number) => Promise<SaveDraftResult>;
  onSaveRevision: (doc: unknown, baseRevision: number, message: string) => Promise<SaveRevisionResult>;
};
