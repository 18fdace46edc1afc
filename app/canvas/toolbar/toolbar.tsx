// The editor's toolbar: editing tools, file tools (import, export) and saving a revision, each
// its own piece.
import type { DesignEditorProps } from "../contract";
import { EditTools } from "./edit-tools";
import { FileTools } from "./file-tools";
import { SaveRevision } from "./save-revision";

export function Toolbar({
  readOnly,
  baseRevision,
  onSaveRevision,
  onRevisionSaved,
}: {
  readOnly: boolean;
  baseRevision: number;
  onSaveRevision: DesignEditorProps["onSaveRevision"];
  onRevisionSaved: () => void;
}) {
  return (
    <div
      className="flex flex-wrap items-center gap-1 border-b border-ink-200 bg-white px-2 py-1.5"
      role="toolbar"
      aria-label="Design tools"
    >
      {readOnly ? <span className="mr-2 rounded bg-ink-100 px-2 py-0.5 text-xs font-semibold text-ink-600">Read only</span> : null}
      <EditTools readOnly={readOnly} />
      <span className="mx-1 h-5 w-px bg-ink-200" aria-hidden="true" />
      <FileTools readOnly={readOnly} />
      {readOnly ? null : <SaveRevision baseRevision={baseRevision} onSaveRevision={onSaveRevision} onSaved={onRevisionSaved} />}
    </div>
  );
}
