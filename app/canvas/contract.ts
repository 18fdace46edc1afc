// The props contract with the route that mounts the editor (types owned by app/designs/types.ts).
import type { EditorDocumentProps } from "../designs/types";

export type DesignEditorProps = EditorDocumentProps & {
  /** The `row` query parameter as given (a truth-table row index to simulate on open), or null. */
  row?: string | null;
  /** False when `initial` differs from revision `baseRevision` (a changed draft); the status bar then says "Draft". */
  initialIsRevision?: boolean;
};
export type { SaveDraftResult, SaveRevisionResult } from "../designs/types";
