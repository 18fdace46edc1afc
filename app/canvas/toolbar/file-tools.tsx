// Import and export of the design document; an import with problems opens a dialog listing them.
import { useRef, useState } from "react";
import { useDocument } from "../panels/common";
import { useEditor, useEditorStore } from "../store";
import { ImportProblemsDialog, type ImportTrouble } from "./import-problems-dialog";
import { Button } from "../../components/ui/button";

export function FileTools({ readOnly }: { readOnly: boolean }) {
  const store = useEditorStore();
  const editing = useEditor((s) => !s.readOnly && s.simulation === null);
  const doc = useDocument();
  const [trouble, setTrouble] = useState<ImportTrouble | null>(null);
  const fileRef = useRef<HTMLInputElement>(null);

  const exportJson = () => {
    const blob = new Blob([JSON.stringify(doc, null, 2)], { type: "application/json" });
    const a = document.createElement("a");
    a.href = URL.createObjectURL(blob);
    a.download = `${(doc.name || "design").replace(/[^A-Za-z0-9_.-]+/g, "-")}.design.json`;
    a.click();
    setTimeout(() => URL.revokeObjectURL(a.href), 1000);
  };
  const importJson = async (file: File) => {
    let parsed: unknown;
    try {
      parsed = JSON.parse(await file.text());
    } catch (e) {
      setTrouble({
        doc: null,
        problems: [{ path: "", message: `not JSON: ${e instanceof Error ? e.message : String(e)}` }],
        file: file.name,
      });
      return;
    }
    // The validator is only needed here, so it is loaded here.
    const { validateDesign } = await import("../../engine/validate");
    const v = validateDesign(parsed);
    if (v.ok) store.getState().replace(parsed, { keepHistory: true });
    else setTrouble({ doc: parsed, problems: v.problems, file: file.name });
  };

  return (
    <>
      {readOnly ? null : (
        <>
          <Button type="button" variant="ghost" size="sm" disabled={!editing} onClick={() => fileRef.current?.click()}>
            Import…
          </Button>
          <input
            ref={fileRef}
            type="file"
            accept="application/json,.json"
            className="sr-only"
            tabIndex={-1}
            aria-label="Design document to import"
            data-testid="import-file"
            onChange={(e) => {
              const f = e.target.files?.[0];
              if (f) void importJson(f);
              e.target.value = "";
            }}
          />
        </>
      )}
      <Button type="button" variant="ghost" size="sm" onClick={exportJson}>
        Export JSON
      </Button>
      <ImportProblemsDialog
        trouble={trouble}
        onClose={() => setTrouble(null)}
        onOpenAnyway={
          trouble && trouble.doc !== null && typeof trouble.doc === "object"
            ? () => {
                store.getState().replace(trouble.doc, { keepHistory: true });
                setTrouble(null);
              }
            : undefined
        }
      />
    </>
  );
}
