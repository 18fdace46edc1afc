// The wiring canvas (xyflow). Wires are drawn by dragging from one terminal to another or by
// clicking one and then the other; a refused wire says why on the canvas. Terminal hit areas grow
// as the view zooms out so they stay at least 24 px on screen (--cp-hit, canvas.css).
import { useCallback, useEffect, useRef, type DragEvent } from "react";
import {
  Background,
  ConnectionMode,
  ControlButton,
  Controls,
  MiniMap,
  ReactFlow,
  useReactFlow,
  useStoreApi,
  type Connection,
  type Edge,
  type FinalConnectionState,
} from "@xyflow/react";
import { kindColours } from "../lib/kind-colours";

/** The minimap draws each node in its kind's colour, from the one table every diagram uses. */
export const minimapNodeColor = (n: { type?: string }) => kindColours(n.type).mark;
import type { InputFunction } from "../engine/vocabulary";
import { checkConnection } from "./graph-ops";
import { nodeTypes } from "./nodes/registry";
import { DRAG_TYPE } from "./palette";
import { useEditor, useEditorStore } from "./store";
import type { CanvasEdge, CanvasNode, ComponentKind } from "./types";
import { edgeTypes } from "./wire-edge";
import { Button } from "../components/ui/button";

/** Smallest zoom a person can reach; Fit view stops higher (hooks.ts, FIT_MIN_ZOOM). */
export const MIN_ZOOM = 0.25;
/** On-screen size (px) a terminal's hit area never goes below. */
export const TERMINAL_HIT_PX = 26;

export function CanvasView() {
  const store = useEditorStore();
  const nodes = useEditor((s) => s.nodes);
  const edges = useEditor((s) => s.edges);
  const editable = useEditor((s) => !s.readOnly && s.simulation === null);
  const simulating = useEditor((s) => s.simulation !== null);
  const wiring = useEditor((s) => s.pendingWire !== null);
  const onNodesChange = useEditor((s) => s.onNodesChange);
  const onEdgesChange = useEditor((s) => s.onEdgesChange);
  const { screenToFlowPosition } = useReactFlow();
  const wrapper = useRef<HTMLDivElement>(null);
  useHitSize(wrapper);

  const isValidConnection = useCallback(
    (c: Connection | Edge) => {
      const s = store.getState();
      return checkConnection(c as Connection, s.nodes, s.edges).ok;
    },
    [store],
  );
  const onConnect = useCallback(
    (c: Connection) => {
      const why = store.getState().connect(c);
      if (why)
        store
          .getState()
          .setCanvasNote({ tone: "error", text: `No wire from ${c.source}.${c.sourceHandle} to ${c.target}.${c.targetHandle}: ${why}.` });
    },
    [store],
  );
  // A drag that ends on a terminal the wire may not join: say why instead of doing nothing.
  const onConnectEnd = useCallback(
    (_: MouseEvent | TouchEvent, state: FinalConnectionState) => {
      const from = state.fromHandle;
      const to = state.toHandle;
      if (!from || !to || state.isValid) return;
      if (from.nodeId === to.nodeId && from.id === to.id) return;
      const s = store.getState();
      const check = checkConnection(
        { source: from.nodeId, sourceHandle: from.id ?? null, target: to.nodeId, targetHandle: to.id ?? null },
        s.nodes,
        s.edges,
      );
      if (!check.ok)
        s.setCanvasNote({ tone: "error", text: `No wire from ${from.nodeId}.${from.id} to ${to.nodeId}.${to.id}: ${check.reason}.` });
    },
    [store],
  );
  const onDrop = (e: DragEvent) => {
    const payload = e.dataTransfer.getData(DRAG_TYPE);
    if (!payload) return;
    e.preventDefault();
    const [kind, fn] = payload.split(":") as [ComponentKind, InputFunction | undefined];
    const p = screenToFlowPosition({ x: e.clientX, y: e.clientY });
    store.getState().addComponent(kind, { x: Math.round(p.x - 40), y: Math.round(p.y - 20) }, fn);
  };

  return (
    <div ref={wrapper} className={`h-full w-full ${wiring ? "cp-wiring" : ""}`}>
      <ReactFlow<CanvasNode, CanvasEdge>
        nodes={nodes}
        edges={edges}
        nodeTypes={nodeTypes}
        edgeTypes={edgeTypes}
        onNodesChange={onNodesChange}
        onEdgesChange={onEdgesChange}
        onConnect={onConnect}
        onConnectEnd={onConnectEnd}
        isValidConnection={isValidConnection}
        connectionMode={ConnectionMode.Loose}
        connectOnClick={false}
        onNodeDragStart={() => store.getState().commit()}
        onPaneClick={() => store.getState().pendingWire && store.getState().cancelWire()}
        nodesDraggable={editable}
        nodesConnectable={editable}
        edgesReconnectable={false}
        deleteKeyCode={null}
        selectionKeyCode="Shift"
        multiSelectionKeyCode={["Meta", "Control"]}
        onDragOver={(e) => {
          if (e.dataTransfer.types.includes(DRAG_TYPE)) {
            e.preventDefault();
            e.dataTransfer.dropEffect = "copy";
          }
        }}
        onDrop={onDrop}
        minZoom={MIN_ZOOM}
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
        <MiniMap pannable zoomable ariaLabel="Overview of the wiring" style={{ width: 160, height: 110 }} nodeColor={minimapNodeColor} />
      </ReactFlow>
      <CanvasNoteView />
    </div>
  );
}

/** Keeps --cp-hit (a terminal's hit area in flow pixels) at TERMINAL_HIT_PX on screen for the current zoom. */
function useHitSize(wrapper: React.RefObject<HTMLDivElement | null>) {
  const flow = useStoreApi();
  useEffect(() => {
    const apply = (zoom: number) => wrapper.current?.style.setProperty("--cp-hit", `${Math.max(14, TERMINAL_HIT_PX / zoom)}px`);
    apply(flow.getState().transform[2]);
    return flow.subscribe((s, prev) => {
      if (s.transform[2] !== prev.transform[2]) apply(s.transform[2]);
    });
  }, [flow, wrapper]);
}

function CanvasNoteView() {
  const note = useEditor((s) => s.canvasNote);
  const clear = useEditor((s) => s.setCanvasNote);
  if (!note) return null;
  return (
    <div
      role={note.tone === "error" ? "alert" : "status"}
      data-testid="canvas-note"
      className={`absolute left-2 right-2 top-2 z-10 flex items-start gap-2 rounded border px-2 py-1 text-sm shadow-sm sm:right-auto sm:max-w-[36rem] ${note.tone === "error" ? "border-brick-600 bg-brick-50 text-brick-700" : "border-ink-300 bg-white text-ink-800"}`}
    >
      <span className="min-w-0 flex-1">{note.text}</span>
      <Button type="button" variant="bare" size="xs" aria-label="Dismiss" onClick={() => clear(null)}>
        ✕
      </Button>
    </div>
  );
}
