// Undo and redo, the selection's tools (delete, duplicate, series, parallel), auto-layout and fit.
import { useState } from "react";
import { autoLayout } from "../layout";
import { useEditor, useEditorStore } from "../store";
import { Button } from "../../components/ui/button";

export function EditTools({ readOnly }: { readOnly: boolean }) {
  const store = useEditorStore();
  const canUndo = useEditor((s) => s.past.length > 0 && s.simulation === null);
  const canRedo = useEditor((s) => s.future.length > 0 && s.simulation === null);
  const selectedCount = useEditor((s) => s.nodes.filter((n) => n.selected).length + s.edges.filter((e) => e.selected).length);
  const oneContact = useEditor((s) => {
    const picked = s.nodes.filter((n) => n.selected);
    return picked.length === 1 && picked[0].type === "contact";
  });
  const editing = useEditor((s) => !s.readOnly && s.simulation === null);
  const [laying, setLaying] = useState(false);
  const layout = async () => {
    const s = store.getState();
    setLaying(true);
    try {
      const positions = await autoLayout(s.nodes, s.edges);
      store.getState().setPositions(positions, { commit: true });
      store.getState().requestFit();
    } catch (e) {
      store.getState().setCanvasNote({ tone: "error", text: e instanceof Error ? e.message : String(e) });
    } finally {
      setLaying(false);
    }
  };
  const fit = (
    <Button type="button" variant="ghost" size="sm" onClick={() => store.getState().requestFit()}>
      Fit view
    </Button>
  );
  if (readOnly) return fit;
  return (
    <>
      <Button type="button" variant="ghost" size="sm" disabled={!canUndo} onClick={() => store.getState().undo()} title="Ctrl+Z">
        Undo
      </Button>
      <Button
        type="button"
        variant="ghost"
        size="sm"
        disabled={!canRedo}
        onClick={() => store.getState().redo()}
        title="Ctrl+Shift+Z / Ctrl+Y"
      >
        Redo
      </Button>
      <span className="mx-1 h-5 w-px bg-ink-200" aria-hidden="true" />
      <Button
        type="button"
        variant="ghost"
        size="sm"
        disabled={!editing || selectedCount === 0}
        onClick={() => store.getState().deleteSelected()}
        title="Delete"
      >
        Delete
      </Button>
      <Button
        type="button"
        variant="ghost"
        size="sm"
        disabled={!editing || selectedCount === 0}
        onClick={() => store.getState().duplicateSelected()}
        title="Ctrl+D"
      >
        Duplicate
      </Button>
      <Button
        type="button"
        variant="ghost"
        size="sm"
        disabled={!editing || !oneContact}
        onClick={() => store.getState().addBeside("series")}
      >
        Add in series
      </Button>
      <Button
        type="button"
        variant="ghost"
        size="sm"
        disabled={!editing || !oneContact}
        onClick={() => store.getState().addBeside("parallel")}
      >
        Add in parallel
      </Button>
      <Button type="button" variant="ghost" size="sm" disabled={!editing || laying} aria-busy={laying} onClick={layout}>
        {laying ? "Laying out…" : "Auto-layout"}
      </Button>
      {fit}
    </>
  );
}
