// The problems of a document that was imported, with the choice to open it anyway and fix them.
import { ProblemList } from "../panels/problem-list";
import type { Problem } from "../../engine";
import { Button } from "../../components/ui/button";
import { Dialog } from "../../components/ui/dialog";

/** A document that could not be imported as it is: its parsed value (null when not JSON) and its problems. */
export type ImportTrouble = { doc: unknown; problems: Problem[]; file: string };

export function ImportProblemsDialog({
  trouble,
  onClose,
  onOpenAnyway,
}: {
  trouble: ImportTrouble | null;
  onClose: () => void;
  onOpenAnyway?: () => void;
}) {
  const n = trouble?.problems.length ?? 0;
  return (
    <Dialog
      open={trouble !== null}
      onClose={onClose}
      title={trouble ? `${trouble.file} has ${n} ${n === 1 ? "problem" : "problems"}` : ""}
      actions={
        <>
          <Button type="button" variant="ghost" size="sm" onClick={onClose}>
            Cancel
          </Button>
          {onOpenAnyway ? (
            <Button type="button" variant="action" size="sm" onClick={onOpenAnyway}>
              Open it anyway and fix
            </Button>
          ) : null}
        </>
      }
    >
      {trouble ? <ProblemList problems={trouble.problems} /> : null}
    </Dialog>
  );
}
