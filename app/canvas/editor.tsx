// The design editor (client only; design-editor.tsx loads it after mount so SSR never runs xyflow).
import "@xyflow/react/dist/style.css";
import "./canvas.css";
import { useCallback, useContext, useEffect, useMemo, useRef, useState, type DragEvent, type KeyboardEvent } from "react";
import {
  Background,
  ConnectionMode,
  ControlButton,
  Controls,
  MiniMap,
  ReactFlow,
  ReactFlowProvider,
  useReactFlow,
  type Connection,
  type Edge,
} from "@xyflow/react";
import { UNSAFE_DataRouterContext, useBlocker } from "react-router";
import { INPUT_FUNCTIONS, validateDesign, type InputFunction, type Problem } from "../engine";
import type { DesignEditorProps } from "./contract";
import { contentKey } from "./convert";
import { checkConnection } from "./graph-ops";
import { useAutosave, useLayoutRequests, useLiveProof, useSimulationDriver, type DraftState } from "./hooks";
import { autoLayout } from "./layout";
import { NODE_KINDS, nodeTypes } from "./nodes/registry";
import { FUNCTION_LABEL } from "./nodes/input";
import { ConditionsPanel } from "./panels/conditions-panel";
import { ControllerPanel } from "./panels/controller-panel";
import { ProblemList, ProblemsPanel } from "./panels/problems-panel";
import { PropertiesPanel } from "./panels/properties-panel";
import { RulesPanel } from "./panels/rules-panel";
import { SimulatePanel } from "./panels/simulate-panel";
import { useDocument } from "./panels/common";
import { createEditorStore, EditorContext, useEditor, useEditorStore, type Panel } from "./store";
import type { CanvasEdge, CanvasNode, ComponentKind } from "./types";
import { edgeTypes as edgeTypesMap } from "./wire-edge";

const DRAG_TYPE = "application/x-chainproof-component";

export default function Editor(props: DesignEditorProps) {
  const [store] = useState(() =>
    createEditorStore({ initial: props.initial, readOnly: props.readOnly, designName: props.designName, baseRevision: props.baseRevision, row: props.row, initialIsRevision: props.initialIsRevision }),
  );
  return (
    <EditorContext.Provider value={store}>
      <ReactFlowProvider>
        <EditorShell {...props} />
      </ReactFlowProvider>
    </EditorContext.Provider>
  );
}

type Banner = { tone: "error" | "success" | "warning"; text: string; actions?: Array<{ label: string; run: () => void }> } | null;

function EditorShell(props: DesignEditorProps) {
  const store = useEditorStore();
  const readOnly = props.readOnly;
  useLiveProof();
  useSimulationDriver();
  useLayoutRequests();
  const autosave = useAutosave({ enabled: !readOnly, draftVersion: props.draftVersion, onSaveDraft: props.onSaveDraft });
  // A `row` that could not be simulated is said once, gently; the design opens as usual.
  const [banner, setBanner] = useState<Banner>(() => {
    const notice = store.getState().rowNotice;
    return notice ? { tone: "warning", text: notice } : null;
  });
  const [baseRevision, setBaseRevision] = useState(props.baseRevision);

  useEffect(() => {
    if (autosave.state.kind !== "conflict") return;
    const v = autosave.state.currentVersion;
    setBanner({
      tone: "warning",
      text: "Another tab or person saved this design's working copy since you opened it. Autosave is paused.",
      actions: [
        { label: "Reload their version", run: () => window.location.reload() },
        { label: "Keep mine (save over it)", run: () => (autosave.keepMine(v), setBanner(null)) },
      ],
    });
  }, [autosave.state]);

  const onKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    const t = e.target as HTMLElement;
    if (t.closest("input, textarea, select, [contenteditable=true]")) return;
    const s = store.getState();
    const mod = e.ctrlKey || e.metaKey;
    const key = e.key.toLowerCase();
    if (mod && key === "z" && !e.shiftKey) s.undo();
    else if (mod && ((key === "z" && e.shiftKey) || key === "y")) s.redo();
    else if (mod && key === "d") s.duplicateSelected();
    else if (!mod && (e.key === "Delete" || e.key === "Backspace")) s.deleteSelected();
    else return;
    e.preventDefault();
  };

  return (
    <div className="cp-editor flex flex-col overflow-hidden rounded-lg border border-ink-200 bg-white md:h-[calc(100dvh-10.5rem)] md:min-h-[560px]" onKeyDown={onKeyDown}>
      <Toolbar readOnly={readOnly} baseRevision={baseRevision} onSaveRevision={props.onSaveRevision} setBanner={setBanner} setBaseRevision={setBaseRevision} />
      {banner ? (
        <div role={banner.tone === "error" ? "alert" : "status"} className={`flex flex-wrap items-center gap-2 border-b px-3 py-2 text-sm ${banner.tone === "error" ? "border-brick-600 bg-brick-50 text-brick-700" : banner.tone === "success" ? "border-moss-600 bg-moss-50 text-moss-700" : "border-copper-500 bg-copper-50 text-copper-700"}`}>
          <span className="flex-1">{banner.text}</span>
          {banner.actions?.map((a) => (
            <button key={a.label} type="button" className="rounded border border-current px-2 py-0.5 text-xs font-semibold" onClick={a.run}>
              {a.label}
            </button>
          ))}
          <button type="button" aria-label="Dismiss" className="px-1 text-xs" onClick={() => setBanner(null)}>
            ✕
          </button>
        </div>
      ) : null}
      <div className="flex flex-col md:min-h-0 md:flex-1 md:flex-row">
        {readOnly ? null : <Palette />}
        <div className="relative h-[60vh] min-h-[320px] min-w-0 md:h-auto md:min-h-0 md:flex-1">
          <Canvas />
        </div>
        <SidePanel />
      </div>
      <StatusBar draft={autosave.state} readOnly={readOnly} />
      {readOnly ? null : <LeaveGuard dirty={autosave.dirty} />}
    </div>
  );
}

function Canvas() {
  const store = useEditorStore();
  const nodes = useEditor((s) => s.nodes);
  const edges = useEditor((s) => s.edges);
  const editable = useEditor((s) => !s.readOnly && s.simulation === null);
  const simulating = useEditor((s) => s.simulation !== null);
  const onNodesChange = useEditor((s) => s.onNodesChange);
  const onEdgesChange = useEditor((s) => s.onEdgesChange);
  const { screenToFlowPosition } = useReactFlow();

  const isValidConnection = useCallback(
    (c: Connection | Edge) => {
      const s = store.getState();
      return checkConnection(c as Connection, s.nodes, s.edges).ok;
    },
    [store],
  );
  const onConnect = useCallback((c: Connection) => void store.getState().connect(c), [store]);
  const onDrop = (e: DragEvent) => {
    const payload = e.dataTransfer.getData(DRAG_TYPE);
    if (!payload) return;
    e.preventDefault();
    const [kind, fn] = payload.split(":") as [ComponentKind, InputFunction | undefined];
    const p = screenToFlowPosition({ x: e.clientX, y: e.clientY });
    store.getState().addComponent(kind, { x: p.x - 40, y: p.y - 20 }, fn);
  };

  return (
    <ReactFlow<CanvasNode, CanvasEdge>
      nodes={nodes}
      edges={edges}
      nodeTypes={nodeTypes}
      edgeTypes={edgeTypesMap}
      onNodesChange={onNodesChange}
      onEdgesChange={onEdgesChange}
      onConnect={onConnect}
      isValidConnection={isValidConnection}
      connectionMode={ConnectionMode.Loose}
      onNodeDragStart={() => store.getState().commit()}
      nodesDraggable={editable}
      nodesConnectable={editable}
      edgesReconnectable={false}
      deleteKeyCode={null}
      onDragOver={(e) => {
        if (e.dataTransfer.types.includes(DRAG_TYPE)) {
          e.preventDefault();
          e.dataTransfer.dropEffect = "copy";
        }
      }}
      onDrop={onDrop}
      minZoom={0.1}
      proOptions={{ hideAttribution: true }}
      className={simulating ? "cp-simulating" : ""}
      aria-label="Wiring canvas"
    >
      <Background gap={20} color="var(--color-ink-200)" />
      {/* Our own fit button: the store's fit keeps the drawing clear of the minimap and controls. */}
      <Controls showInteractive={false} showFitView={false}>
        <ControlButton onClick={() => store.getState().requestFit()} title="Fit view" aria-label="Fit view">
          <svg viewBox="0 0 16 16" aria-hidden="true">
            <path d="M1 5V1h4M11 1h4v4M15 11v4h-4M5 15H1v-4" fill="none" stroke="currentColor" strokeWidth="2" />
          </svg>
        </ControlButton>
      </Controls>
      <MiniMap pannable zoomable ariaLabel="Overview of the wiring" style={{ width: 160, height: 110 }} nodeColor={(n) => (n.type === "supply" ? "#3f7a35" : n.type === "input" ? "#ad5520" : "#5f6878")} />
    </ReactFlow>
  );
}

const PALETTE: Array<{ kind: ComponentKind; fn?: InputFunction; title: string; hint: string }> = [
  { kind: "supply", title: NODE_KINDS.supply.title, hint: NODE_KINDS.supply.description },
  { kind: "contact", title: NODE_KINDS.contact.title, hint: NODE_KINDS.contact.description },
  { kind: "junction", title: NODE_KINDS.junction.title, hint: NODE_KINDS.junction.description },
  ...INPUT_FUNCTIONS.map((fn) => ({ kind: "input" as const, fn, title: `${FUNCTION_LABEL[fn]} input`, hint: "Controller input" })),
];

function Palette() {
  const store = useEditorStore();
  const editable = useEditor((s) => s.simulation === null);
  const usedFunctions = useEditor((s) => s.nodes.filter((n) => n.type === "input").map((n) => (n.data as { function: string }).function).join(","));
  const { screenToFlowPosition } = useReactFlow();
  const added = useRef(0);
  const addAtCentre = (kind: ComponentKind, fn?: InputFunction) => {
    const pane = document.querySelector(".cp-editor .react-flow")?.getBoundingClientRect();
    const p = pane ? screenToFlowPosition({ x: pane.left + pane.width / 2, y: pane.top + pane.height / 2 }) : { x: 0, y: 0 };
    const k = added.current++ % 6;
    store.getState().addComponent(kind, { x: p.x - 60 + k * 24, y: p.y - 30 + k * 24 }, fn);
  };
  return (
    <nav aria-label="Component palette" className="flex-none border-b border-ink-200 bg-ink-50 p-2 md:w-40 md:overflow-y-auto md:border-r md:border-b-0">
      <h2 className="mb-1 text-xs font-bold uppercase tracking-wide text-ink-500">Components</h2>
      <p className="mb-2 text-[11px] text-ink-500">Drag onto the canvas, or press to add.</p>
      <ul className="flex flex-wrap gap-1 md:block md:space-y-1">
        {PALETTE.map((item) => {
          const taken = item.kind === "input" && usedFunctions.split(",").includes(item.fn!);
          return (
            <li key={`${item.kind}:${item.fn ?? ""}`}>
              <button
                type="button"
                draggable={editable && !taken}
                disabled={!editable || taken}
                data-testid={`palette-${item.kind}${item.fn ? `-${item.fn}` : ""}`}
                title={taken ? "A design has at most one input per function" : item.hint}
                onDragStart={(e) => {
                  e.dataTransfer.setData(DRAG_TYPE, item.fn ? `${item.kind}:${item.fn}` : item.kind);
                  e.dataTransfer.effectAllowed = "copy";
                }}
                onClick={() => addAtCentre(item.kind, item.fn)}
                className="cursor-grab rounded border border-ink-300 bg-white px-2 py-1.5 text-left text-sm font-medium text-ink-800 hover:border-copper-500 disabled:cursor-not-allowed disabled:opacity-50 md:w-full"
              >
                {item.title}
              </button>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}

function Toolbar({
  readOnly,
  baseRevision,
  onSaveRevision,
  setBanner,
  setBaseRevision,
}: {
  readOnly: boolean;
  baseRevision: number;
  onSaveRevision: DesignEditorProps["onSaveRevision"];
  setBanner: (b: Banner) => void;
  setBaseRevision: (n: number) => void;
}) {
  const store = useEditorStore();
  const canUndo = useEditor((s) => s.past.length > 0 && s.simulation === null);
  const canRedo = useEditor((s) => s.future.length > 0 && s.simulation === null);
  const selectedCount = useEditor((s) => s.nodes.filter((n) => n.selected).length + s.edges.filter((e) => e.selected).length);
  const selectedContact = useEditor((s) => {
    const picked = s.nodes.filter((n) => n.selected);
    return picked.length === 1 && picked[0].type === "contact" ? picked[0].id : null;
  });
  const simulating = useEditor((s) => s.simulation !== null);
  const doc = useDocument();
  const [message, setMessage] = useState("");
  const [saving, setSaving] = useState(false);
  const [importProblems, setImportProblems] = useState<{ doc: unknown; problems: Problem[]; file: string } | null>(null);
  const fileRef = useRef<HTMLInputElement>(null);
  const editing = !readOnly && !simulating;

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
      setImportProblems({ doc: null, problems: [{ path: "", message: `not JSON: ${e instanceof Error ? e.message : String(e)}` }], file: file.name });
      return;
    }
    const v = validateDesign(parsed);
    if (v.ok) store.getState().replace(parsed, { keepHistory: true });
    else setImportProblems({ doc: parsed, problems: v.problems, file: file.name });
  };
  const layout = async () => {
    const s = store.getState();
    const positions = await autoLayout(s.nodes, s.edges);
    store.getState().setPositions(positions, { commit: true });
    store.getState().requestFit();
  };
  const saveRevision = async () => {
    setSaving(true);
    setBanner(null);
    try {
      const current = store.getState().document();
      const res = await onSaveRevision(current, baseRevision, message.trim());
      const s = store.getState();
      if (res.status === 201) {
        s.setRefusal(null);
        s.markRevision(res.revision.number);
        setBaseRevision(res.revision.number);
        setMessage("");
        setBanner({ tone: "success", text: `Revision ${res.revision.number} saved: every rule holds.` });
      } else if (res.status === 400) {
        s.setRefusal({ kind: "problems", problems: res.problems });
      } else if (res.status === 422) {
        s.setRefusal({ kind: "verdict", verdict: res.verdict });
      } else {
        setBanner({
          tone: "warning",
          text: `Revision ${res.latestRevision} was saved by someone else after you opened this design; yours was not saved.`,
          actions: [
            { label: "Reload to see it", run: () => window.location.reload() },
            { label: "Keep editing (next save follows it)", run: () => (setBaseRevision(res.latestRevision), setBanner(null)) },
          ],
        });
      }
    } catch (e) {
      setBanner({ tone: "error", text: `Could not save the revision: ${e instanceof Error ? e.message : String(e)}` });
    } finally {
      setSaving(false);
    }
  };

  const btn = "rounded px-2 py-1 text-sm font-medium text-ink-700 hover:bg-ink-100 disabled:cursor-not-allowed disabled:text-ink-300";
  return (
    <div className="flex flex-wrap items-center gap-1 border-b border-ink-200 bg-white px-2 py-1.5" role="toolbar" aria-label="Design tools">
      {readOnly ? <span className="mr-2 rounded bg-ink-100 px-2 py-0.5 text-xs font-semibold text-ink-600">Read only</span> : null}
      {!readOnly ? (
        <>
          <button type="button" className={btn} disabled={!canUndo} onClick={() => store.getState().undo()} title="Ctrl+Z">
            Undo
          </button>
          <button type="button" className={btn} disabled={!canRedo} onClick={() => store.getState().redo()} title="Ctrl+Shift+Z / Ctrl+Y">
            Redo
          </button>
          <span className="mx-1 h-5 w-px bg-ink-200" aria-hidden="true" />
          <button type="button" className={btn} disabled={!editing || selectedCount === 0} onClick={() => store.getState().deleteSelected()} title="Delete">
            Delete
          </button>
          <button type="button" className={btn} disabled={!editing || selectedCount === 0} onClick={() => store.getState().duplicateSelected()} title="Ctrl+D">
            Duplicate
          </button>
          <button type="button" className={btn} disabled={!editing || !selectedContact} onClick={() => selectedContact && store.getState().addBeside("series", selectedContact)}>
            Add in series
          </button>
          <button type="button" className={btn} disabled={!editing || !selectedContact} onClick={() => selectedContact && store.getState().addBeside("parallel", selectedContact)}>
            Add in parallel
          </button>
          <button type="button" className={btn} disabled={!editing} onClick={layout}>
            Auto-layout
          </button>
        </>
      ) : null}
      <button type="button" className={btn} onClick={() => store.getState().requestFit()}>
        Fit view
      </button>
      <span className="mx-1 h-5 w-px bg-ink-200" aria-hidden="true" />
      {!readOnly ? (
        <>
          <button type="button" className={btn} disabled={!editing} onClick={() => fileRef.current?.click()}>
            Import…
          </button>
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
      ) : null}
      <button type="button" className={btn} onClick={exportJson}>
        Export JSON
      </button>
      {!readOnly ? (
        <form
          className="ml-auto flex items-center gap-1"
          onSubmit={(e) => {
            e.preventDefault();
            void saveRevision();
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
          <button type="submit" disabled={saving || simulating} className="rounded bg-copper-600 px-3 py-1 text-sm font-semibold text-white hover:bg-copper-700 disabled:bg-ink-300">
            {saving ? "Saving…" : "Save revision"}
          </button>
        </form>
      ) : null}
      {importProblems ? (
        <div role="dialog" aria-modal="true" aria-labelledby="cp-import-title" className="fixed inset-0 z-50 flex items-center justify-center bg-ink-900/40 p-4">
          <div className="max-h-[80vh] w-full max-w-lg overflow-y-auto rounded-lg bg-white p-4 shadow-xl">
            <h2 id="cp-import-title" className="text-base font-semibold">
              {importProblems.file} has {importProblems.problems.length} {importProblems.problems.length === 1 ? "problem" : "problems"}
            </h2>
            <div className="mt-2">
              <ProblemList problems={importProblems.problems} />
            </div>
            <div className="mt-3 flex justify-end gap-2">
              <button type="button" className={btn} onClick={() => setImportProblems(null)}>
                Cancel
              </button>
              {importProblems.doc !== null && typeof importProblems.doc === "object" ? (
                <button
                  type="button"
                  className="rounded bg-copper-600 px-3 py-1 text-sm font-semibold text-white"
                  onClick={() => {
                    store.getState().replace(importProblems.doc, { keepHistory: true });
                    setImportProblems(null);
                  }}
                >
                  Open it anyway and fix
                </button>
              ) : null}
            </div>
          </div>
        </div>
      ) : null}
    </div>
  );
}

const TABS: Array<{ id: Panel; label: string }> = [
  { id: "properties", label: "Properties" },
  { id: "conditions", label: "Conditions" },
  { id: "controller", label: "Controller" },
  { id: "rules", label: "Rules" },
  { id: "problems", label: "Problems" },
  { id: "simulate", label: "Simulate" },
];

function SidePanel() {
  const panel = useEditor((s) => s.panel);
  const setPanel = useEditor((s) => s.setPanel);
  const failing = useEditor((s) => (s.proof.status === "invalid" ? s.proof.problems.length : s.proof.status === "done" ? s.proof.verdict.rules.filter((r) => !r.holds).length : 0));
  return (
    <aside className="flex flex-none flex-col border-t border-ink-200 bg-ink-50 md:w-80 md:border-t-0 md:border-l" aria-label="Design details">
      <div role="tablist" aria-label="Panels" className="flex flex-wrap gap-0.5 border-b border-ink-200 bg-white px-1 pt-1">
        {TABS.map((t) => (
          <button
            key={t.id}
            role="tab"
            type="button"
            id={`cp-tab-${t.id}`}
            aria-selected={panel === t.id}
            aria-controls="cp-panel"
            onClick={() => setPanel(t.id)}
            className={`rounded-t px-2 py-1 text-xs font-semibold ${panel === t.id ? "border-b-2 border-copper-600 text-copper-700" : "text-ink-600 hover:text-ink-900"}`}
          >
            {t.label}
            {t.id === "problems" && failing > 0 ? <span className="ml-1 rounded-full bg-brick-600 px-1.5 text-[10px] text-white">{failing}</span> : null}
          </button>
        ))}
      </div>
      <div id="cp-panel" role="tabpanel" aria-labelledby={`cp-tab-${panel}`} className="md:min-h-0 md:flex-1 md:overflow-y-auto">
        {panel === "properties" ? <PropertiesPanel /> : null}
        {panel === "conditions" ? <ConditionsPanel /> : null}
        {panel === "controller" ? <ControllerPanel /> : null}
        {panel === "rules" ? <RulesPanel /> : null}
        {panel === "problems" ? <ProblemsPanel /> : null}
        {panel === "simulate" ? <SimulatePanel /> : null}
      </div>
    </aside>
  );
}

function StatusBar({ draft, readOnly }: { draft: DraftState; readOnly: boolean }) {
  const proof = useEditor((s) => s.proof);
  const revision = useEditor((s) => s.revision);
  const simulating = useEditor((s) => s.simulation !== null);
  const doc = useDocument();
  const key = useMemo(() => contentKey(doc), [doc]);
  const isRevision = revision.number > 0 && revision.key === key;
  let proofText = "Checking…";
  let tone = "text-ink-600";
  if (proof.status === "invalid") {
    proofText = `${proof.problems.length} ${proof.problems.length === 1 ? "problem" : "problems"} to fix before proving`;
    tone = "text-brick-700";
  } else if (proof.status === "error") {
    proofText = `Check failed: ${proof.message}`;
    tone = "text-brick-700";
  } else if (proof.status === "done") {
    const failing = proof.verdict.rules.filter((r) => !r.holds).length;
    proofText = failing === 0 ? "Proven: every rule holds" : `${failing} of ${proof.verdict.rules.length} ${proof.verdict.rules.length === 1 ? "rule fails" : "rules fail"}`;
    tone = failing === 0 ? "text-moss-700" : "text-brick-700";
    proofText += ` · ${proof.verdict.rows.toLocaleString("en-US")} rows, ${proof.verdict.driveRows.toLocaleString("en-US")} with drive`;
    if (proof.verdict.singleFaults.length) proofText += ` · ${proof.verdict.singleFaults.length} single ${proof.verdict.singleFaults.length === 1 ? "fault defeats" : "faults defeat"} a rule`;
  }
  const draftText =
    readOnly
      ? ""
      : draft.kind === "saving"
        ? "Saving draft…"
        : draft.kind === "pending"
          ? "Unsaved changes"
          : draft.kind === "conflict"
            ? "Autosave paused (saved elsewhere)"
            : draft.kind === "error"
              ? `Draft not saved: ${draft.message}`
              : "Draft saved";
  return (
    <div role="status" aria-live="polite" data-testid="status-bar" className="flex flex-wrap items-center gap-x-4 gap-y-1 border-t border-ink-200 bg-white px-3 py-1.5 text-sm">
      <span className={`font-semibold ${tone}`} data-testid="proof-status">
        {proofText}
      </span>
      <span className={`font-semibold ${isRevision ? "text-moss-700" : "text-ink-600"}`} data-testid="revision-status">
        {isRevision ? `Revision ${revision.number}, proven` : `Draft, not proven${revision.number > 0 ? ` (based on revision ${revision.number})` : ""}`}
      </span>
      {simulating ? <span className="font-semibold text-copper-700">Simulating</span> : null}
      {draftText ? <span className="ml-auto text-ink-500">{draftText}</span> : null}
    </div>
  );
}

/** Warns before leaving with unsaved changes: the browser's own prompt, and in-app navigation. */
function LeaveGuard({ dirty }: { dirty: boolean }) {
  useEffect(() => {
    if (!dirty) return;
    const warn = (e: BeforeUnloadEvent) => {
      e.preventDefault();
      e.returnValue = "";
    };
    window.addEventListener("beforeunload", warn);
    return () => window.removeEventListener("beforeunload", warn);
  }, [dirty]);
  // useBlocker needs a data router; the editor also runs outside one (tests, benchmarks).
  return useContext(UNSAFE_DataRouterContext) ? <RouterLeaveGuard dirty={dirty} /> : null;
}

function RouterLeaveGuard({ dirty }: { dirty: boolean }) {
  const blocker = useBlocker(({ currentLocation, nextLocation }) => dirty && currentLocation.pathname !== nextLocation.pathname);
  useEffect(() => {
    if (blocker.state !== "blocked") return;
    if (window.confirm("This design has changes that are not saved yet. Leave anyway?")) blocker.proceed();
    else blocker.reset();
  }, [blocker]);
  return null;
}
