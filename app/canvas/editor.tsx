// The design editor (client only; design-editor.tsx loads it after mount so SSR never runs xyflow):
// one store per editor behind context, the canvas between the palette and the side panels, the
// toolbar above and the status bar below. Keyboard shortcuts work wherever the editor was last
// used, including after a click on empty canvas.
import "@xyflow/react/dist/style.css";
import "./canvas.css";
import { useEffect, useRef, useState } from "react";
import { ReactFlowProvider } from "@xyflow/react";
import { CanvasView } from "./canvas-view";
import type { DesignEditorProps } from "./contract";
import { useAutosave, useLayoutRequests, useLiveProof, useSimulationDriver } from "./hooks";
import { LeaveGuard } from "./leave-guard";
import { Palette } from "./palette";
import { SidePanel } from "./side-panel";
import { StatusBar } from "./status-bar";
import { createEditorStore, EditorContext, useEditor, useEditorStore } from "./store";
import { Toolbar } from "./toolbar/toolbar";
import { useEditorKeys } from "./keys";
import { Button } from "../components/ui/button";
import { cardVariants } from "../components/ui/card";

export default function Editor(props: DesignEditorProps) {
  const [store] = useState(() =>
    createEditorStore({
      initial: props.initial,
      readOnly: props.readOnly,
      designName: props.designName,
      baseRevision: props.baseRevision,
      row: props.row,
      initialIsRevision: props.initialIsRevision,
    }),
  );
  return (
    <EditorContext.Provider value={store}>
      <ReactFlowProvider>
        <EditorShell {...props} />
      </ReactFlowProvider>
    </EditorContext.Provider>
  );
}

function EditorShell(props: DesignEditorProps) {
  const store = useEditorStore();
  const readOnly = props.readOnly;
  const root = useRef<HTMLDivElement>(null);
  useLiveProof();
  useSimulationDriver();
  useLayoutRequests();
  useEditorKeys(root);
  const autosave = useAutosave({ enabled: !readOnly, draftVersion: props.draftVersion, onSaveDraft: props.onSaveDraft });
  const { state: autosaveState, keepMine } = autosave;

  useEffect(() => {
    if (autosaveState.kind !== "conflict") return;
    const v = autosaveState.currentVersion;
    store.getState().setBanner({
      tone: "warning",
      sticky: true,
      text: "Another tab or person saved this design's working copy since you opened it. Autosave is paused.",
      actions: [
        { label: "Reload their version", run: () => window.location.reload() },
        {
          label: "Keep mine (save over it)",
          run: () => {
            keepMine(v);
            store.getState().setBanner(null);
          },
        },
      ],
    });
  }, [autosaveState, keepMine, store]);

  return (
    <div
      ref={root}
      className={cardVariants({ padding: "none", className: "cp-editor flex min-w-0 flex-col overflow-hidden md:min-h-[480px] md:flex-1" })}
    >
      <Toolbar
        readOnly={readOnly}
        baseRevision={props.baseRevision}
        onSaveRevision={props.onSaveRevision}
        onRevisionSaved={autosave.saveAgain}
      />
      <BannerView />
      <div className="flex min-w-0 flex-col md:min-h-0 md:flex-1 md:flex-row">
        {readOnly ? null : <Palette />}
        <div className="relative h-[60vh] min-h-[320px] min-w-0 md:h-auto md:min-h-0 md:flex-1">
          <CanvasView />
        </div>
        <SidePanel />
      </div>
      <StatusBar draft={autosave.state} readOnly={readOnly} />
      {readOnly ? null : <LeaveGuard dirty={autosave.dirty} />}
    </div>
  );
}

function BannerView() {
  const banner = useEditor((s) => s.banner);
  const setBanner = useEditor((s) => s.setBanner);
  if (!banner) return null;
  const tone =
    banner.tone === "error"
      ? "border-brick-600 bg-brick-50 text-brick-700"
      : banner.tone === "success"
        ? "border-moss-600 bg-moss-50 text-moss-700"
        : "border-copper-500 bg-copper-50 text-copper-700";
  return (
    <div
      role={banner.tone === "error" ? "alert" : "status"}
      data-testid="editor-banner"
      className={`flex flex-wrap items-start gap-2 border-b px-3 py-2 text-sm ${tone}`}
    >
      <div className="min-w-0 flex-1">
        <p className="font-medium">{banner.text}</p>
        {banner.detail ? <p className="mt-1 text-xs">{banner.detail}</p> : null}
      </div>
      {banner.actions?.map((a) => (
        <Button key={a.label} type="button" variant="outline" size="xs" onClick={a.run}>
          {a.label}
        </Button>
      ))}
      <Button type="button" variant="bare" size="xs" aria-label="Dismiss" onClick={() => setBanner(null)}>
        ✕
      </Button>
    </div>
  );
}
