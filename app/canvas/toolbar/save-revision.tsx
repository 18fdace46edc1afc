// "Save revision": a message and the button. The server proves the design again and keeps it only
// when every rule holds; its answer becomes a banner (saved, someone else saved first, failed) or
// the Problems panel (refused, with what to fix).
import { useState } from "react";
import { COMMON_CAUSE_TEXT } from "../../components/common-cause-note";
import type { DesignEditorProps } from "../contract";
import { contentKey } from "../convert";
import { useEditor, useEditorStore } from "../store";
import { Button } from "../../components/ui/button";

export function SaveRevision({
  baseRevision: initialBase,
  onSaveRevision,
  onSaved,
}: {
  baseRevision: number;
  onSaveRevision: DesignEditorProps["onSaveRevision"];
  /** After a revision is saved (the draft is saved again so it records its new base). */
  onSaved: () => void;
}) {
  const store = useEditorStore();
  const simulating = useEditor((s) => s.simulation !== null);
  const [baseRevision, setBaseRevision] = useState(initialBase);
  const [message, setMessage] = useState("");
  const [saving, setSaving] = useState(false);

  const save = async () => {
    setSaving(true);
    const s0 = store.getState();
    s0.setBanner(null);
    const sent = s0.document();
    try {
      const res = await onSaveRevision(sent, baseRevision, message.trim());
      const s = store.getState();
      if (res.status === 201) {
        const unchanged = contentKey(s.document()) === contentKey(sent);
        s.setRefusal(null);
        s.markRevision(res.revision.number, sent);
        setBaseRevision(res.revision.number);
        setMessage("");
        onSaved();
        s.setBanner({
          tone: "success",
          text: unchanged
            ? `Revision ${res.revision.number} saved: every rule holds, proven again by the server.`
            : `Revision ${res.revision.number} saved as it was when you pressed Save; your changes since then are in the draft.`,
          detail: `${COMMON_CAUSE_TEXT} Verify the wiring on the vehicle before relying on it.`,
        });
      } else if (res.status === 400) {
        s.setRefusal({ kind: "problems", problems: res.problems });
      } else if (res.status === 422) {
        s.setRefusal({ kind: "verdict", verdict: res.verdict });
      } else {
        s.setBanner({
          tone: "warning",
          text: `Revision ${res.latestRevision} was saved by someone else after you opened this design; yours was not saved.`,
          actions: [
            { label: "Reload to see it", run: () => window.location.reload() },
            {
              label: "Keep editing (next save follows it)",
              run: () => (setBaseRevision(res.latestRevision), store.getState().setBanner(null)),
            },
          ],
        });
      }
    } catch (e) {
      store.getState().setBanner({ tone: "error", text: `Could not save the revision: ${e instanceof Error ? e.message : String(e)}` });
    } finally {
      setSaving(false);
    }
  };

  return (
    <form
      className="ml-auto flex items-center gap-1"
      onSubmit={(e) => {
        e.preventDefault();
        void save();
      }}
    >
      <label htmlFor="cp-revision-message" className="sr-only">
        Revision message
      </label>
      <input
        id="cp-revision-message"
        value={message}
        onChange={(e) => setMessage(e.target.value)}
        maxLength={500}
        placeholder="What changed?"
        className="w-48 rounded border border-ink-300 px-2 py-1 text-sm focus:border-copper-500 focus:outline-none"
      />
      <Button type="submit" variant="action" size="sm" disabled={saving || simulating}>
        {saving ? "Saving…" : "Save revision"}
      </Button>
    </form>
  );
}
