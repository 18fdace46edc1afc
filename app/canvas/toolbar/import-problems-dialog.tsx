// The problems of a document that was imported, with the choice to open it anyway and fix them.
import { useEffect, useRef } from "react";
import { ProblemList } from "../panels/problem-list";
import type { Problem } from "../../engine";
import { toolButton as btn } from "./tool-button";

/** A document that could not be imported as it is: its parsed value (null when not JSON) and its problems. */
export type ImportTrouble = { doc: unknown; problems: Problem[]; file: string };

export function ImportProblemsDialog({ trouble, onClose, onOpenAnyway }: { trouble: ImportTrouble; onClose: () => void; onOpenAnyway?: () => void }) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const d = ref.current;
    if (d && !d.open) d.showModal?.();
  }, []);
  const n = trouble.problems.length;
  return (
    <dialog
      ref={ref}
      aria-labelledby="cp-import-title"
      onClose={onClose}
      onCancel={onClose}
      className="m-auto max-h-[80vh] w-full max-w-lg overflow-y-auto rounded-lg bg-white p-4 shadow-xl backdrop:bg-ink-900/40"
    >
      <h2 id="cp-import-title" className="text-base font-semibold [overflow-wrap:anywhere]">
        {trouble.file} has {n} {n === 1 ? "problem" : "problems"}
      </h2>
      <div className="mt-2">
        <ProblemList problems={trouble.problems} />
      </div>
      <div className="mt-3 flex justify-end gap-2">
        <button type="button" className={btn} onClick={onClose}>
          Cancel
        </button>
        {onOpenAnyway ? (
          <button type="button" className="rounded bg-copper-600 px-3 py-1 text-sm font-semibold text-white" onClick={onOpenAnyway}>
            Open it anyway and fix
          </button>
        ) : null}
      </div>
    </dialog>
  );
}
