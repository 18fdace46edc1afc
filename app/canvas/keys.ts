// The editor's keyboard shortcuts. They are heard on the document, not on the editor's box, so
// they keep working after a click on empty canvas (which leaves the focus on the page body);
// they apply while the editor is the last thing pointed at, and never while typing in a field.
import { useEffect, type RefObject } from "react";
import { useEditorStore } from "./store";

const TYPING = "input, textarea, select, [contenteditable=''], [contenteditable=true]";

export function useEditorKeys(root: RefObject<HTMLElement | null>) {
  const store = useEditorStore();
  useEffect(() => {
    let active = false;
    const onPointer = (e: PointerEvent) => {
      active = Boolean(root.current && e.target instanceof Node && root.current.contains(e.target));
    };
    const onFocus = (e: FocusEvent) => {
      if (root.current && e.target instanceof Node && root.current.contains(e.target)) active = true;
    };
    const onKey = (e: KeyboardEvent) => {
      const t = e.target instanceof Element ? e.target : null;
      const inside = Boolean(t && root.current?.contains(t));
      const onPage = !t || t === document.body || t === document.documentElement;
      if (!(inside || (onPage && active))) return;
      if (t?.closest(TYPING) || t?.closest("dialog[open], [role=dialog]")) return;
      const s = store.getState();
      const mod = e.ctrlKey || e.metaKey;
      const key = e.key.toLowerCase();
      const textSelected = (window.getSelection()?.toString() ?? "") !== "";
      if (mod && key === "z" && !e.shiftKey) s.undo();
      else if (mod && ((key === "z" && e.shiftKey) || key === "y")) s.redo();
      else if (mod && key === "d") s.duplicateSelected();
      else if (mod && key === "a") s.selectAll();
      else if (mod && key === "c" && !textSelected) s.copySelected();
      else if (mod && key === "x" && !textSelected) s.cutSelected();
      else if (mod && key === "v") s.paste();
      else if (!mod && (e.key === "Delete" || e.key === "Backspace")) s.deleteSelected();
      else if (e.key === "Escape" && s.pendingWire) s.cancelWire();
      else return;
      e.preventDefault();
    };
    document.addEventListener("pointerdown", onPointer, true);
    document.addEventListener("focusin", onFocus);
    document.addEventListener("keydown", onKey);
    return () => {
      document.removeEventListener("pointerdown", onPointer, true);
      document.removeEventListener("focusin", onFocus);
      document.removeEventListener("keydown", onKey);
    };
  }, [store, root]);
}
