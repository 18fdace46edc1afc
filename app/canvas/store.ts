// The editor's one store (zustand, one instance per mounted editor, handed down by context).
// The canvas graph (nodes, edges) plus the rest of the document is the state; undo/redo keep
// whole design snapshots, so every action that changes the design first calls `commit()`.
import { createContext, useContext } from "react";
import { applyEdgeChanges, applyNodeChanges, type Connection, type EdgeChange, type NodeChange } from "@xyflow/react";
import { createStore, useStore, type StoreApi } from "zustand";
import type { ContactFault, Design, InputFunction, Problem, RowStates, Verdict } from "../engine";
import { contentKey, documentToFlow, flowToDocument } from "./convert";
import { rowStart } from "./simulation";
import { addInParallel, addInSeries, checkConnection, duplicateNodes, newNode } from "./graph-ops";
import type { CanvasEdge, CanvasNode, ComponentKind, DesignRest, XY } from "./types";

export type Panel = "properties" | "conditions" | "controller" | "rules" | "problems" | "simulate";

export type ProofState =
  | { status: "pending" }
  | { status: "invalid"; problems: Problem[] }
  | { status: "done"; verdict: Verdict; ms: number }
  | { status: "error"; message: string };

/** What the canvas shows in simulation: one row (by hand, from a counterexample, or a step of a trace). */
export type SimSource =
  | { kind: "hand" }
  | { kind: "row"; index: number }
  | { kind: "example"; ruleId: string }
  | { kind: "fault"; ruleId: string; fault: ContactFault }
  | { kind: "trace"; ruleId: string; rows: RowStates[]; step: number };
export type Simulation = { states: RowStates; source: SimSource };

/** The evaluated row the nodes and wires draw from (computed by the simulation driver). */
export type SimView = {
  contacts: Record<string, boolean>;
  inputs: Record<string, boolean>;
  energized: ReadonlySet<string>;
  drive: boolean;
  latched?: boolean;
  armed?: string[];
  error?: string;
};

const HISTORY_LIMIT = 100;

export type EditorState = {
  readOnly: boolean;
  rest: DesignRest;
  nodes: CanvasNode[];
  edges: CanvasEdge[];
  past: Design[];
  future: Design[];
  panel: Panel;
  proof: ProofState;
  simulation: Simulation | null;
  simView: SimView | null;
  /** Bumped when the graph needs a fresh layout + fit (load, import, undo of a layout). */
  layoutRequest: number;
  fitRequest: number;
  /** Revision the working copy is based on, and the content key it had then (null: unknown / edited). */
  revision: { number: number; key: string | null };
  loadNotes: string[];
  /** Why the `row` the editor was opened with is not being simulated (null: none asked, or it is). */
  rowNotice: string | null;
  /** The server's refusal of the last "Save revision" (400 problems or 422 verdict). */
  refusal: { kind: "problems"; problems: Problem[] } | { kind: "verdict"; verdict: Verdict } | null;

  document(): Design;
  /** Pushes an undo snapshot. Edits with the same `tag` in quick succession (typing) share one. */
  commit(tag?: string): void;
  undo(): void;
  redo(): void;
  replace(doc: unknown, opts?: { keepHistory?: boolean }): void;
  onNodesChange(changes: NodeChange<CanvasNode>[]): void;
  onEdgesChange(changes: EdgeChange<CanvasEdge>[]): void;
  connect(c: Connection): boolean;
  addComponent(kind: ComponentKind, position: XY, fn?: InputFunction): string;
  deleteSelected(): void;
  duplicateSelected(): void;
  addBeside(mode: "series" | "parallel", contactId: string): string | null;
  updateComponent(id: string, data: Partial<CanvasNode["data"]>, tag?: string): void;
  renameComponent(id: string, next: string): string | null;
  updateRest(fn: (rest: DesignRest) => DesignRest, tag?: string): void;
  updateDesign(fn: (g: { rest: DesignRest; nodes: CanvasNode[] }) => { rest: DesignRest; nodes: CanvasNode[] }, tag?: string): void;
  setPositions(positions: Record<string, XY>, opts?: { commit?: boolean }): void;
  select(id: string | null): void;
  setPanel(p: Panel): void;
  setProof(p: ProofState): void;
  simulate(s: Simulation | null): void;
  setSimView(v: SimView | null): void;
  markRevision(number: number): void;
  requestFit(): void;
  setRefusal(r: EditorState["refusal"]): void;
};

export type EditorStore = StoreApi<EditorState>;

export function createEditorStore(init: { initial: unknown; readOnly: boolean; designName: string; baseRevision: number; row?: string | null; initialIsRevision?: boolean }): EditorStore {
  const loaded = documentToFlow(init.initial, init.designName);
  const snapshot = (s: EditorState) => flowToDocument(s.rest, s.nodes, s.edges);
  const loadedDoc = flowToDocument(loaded.rest, loaded.nodes, loaded.edges);
  const start = rowStart(init.row, loadedDoc);

  return createStore<EditorState>()((set, get) => {
    const apply = (doc: Design) => {
      const g = documentToFlow(doc, get().rest.name);
      return { rest: g.rest, nodes: g.nodes, edges: g.edges };
    };
    let lastCommit: { tag?: string; at: number } = { at: 0 };
    const editable = () => !get().readOnly && get().simulation === null;

    return {
      readOnly: init.readOnly,
      rest: loaded.rest,
      nodes: loaded.nodes,
      edges: loaded.edges,
      past: [],
      future: [],
      panel: start.simulation ? "simulate" : "properties",
      proof: { status: "pending" },
      simulation: start.simulation,
      simView: null,
      layoutRequest: loaded.unplaced.length > 0 && loaded.nodes.length > 0 ? 1 : 0,
      fitRequest: 1,
      revision: { number: init.baseRevision, key: init.baseRevision > 0 && init.initialIsRevision !== false ? contentKey(loadedDoc) : null },
      loadNotes: loaded.dropped,
      rowNotice: start.notice,
      refusal: null,

      document: () => snapshot(get()),
      commit: (tag) => {
        const now = Date.now();
        const same = tag !== undefined && lastCommit.tag === tag && now - lastCommit.at < 1500;
        lastCommit = { tag, at: now };
        if (same) return;
        set((s) => ({ past: [...s.past.slice(-(HISTORY_LIMIT - 1)), snapshot(s)], future: [] }));
      },
      undo: () => {
        lastCommit = { at: 0 };
        const s = get();
        if (!editable() || s.past.length === 0) return;
        const prev = s.past[s.past.length - 1];
        set({ ...apply(prev), past: s.past.slice(0, -1), future: [snapshot(s), ...s.future] });
      },
      redo: () => {
        const s = get();
        if (!editable() || s.future.length === 0) return;
        const next = s.future[0];
        set({ ...apply(next), past: [...s.past, snapshot(s)], future: s.future.slice(1) });
      },
      replace: (doc, opts) => {
        const g = documentToFlow(doc, get().rest.name);
        if (opts?.keepHistory) get().commit();
        set((s) => ({
          rest: g.rest,
          nodes: g.nodes,
          edges: g.edges,
          loadNotes: g.dropped,
          layoutRequest: g.unplaced.length > 0 ? s.layoutRequest + 1 : s.layoutRequest,
          fitRequest: s.fitRequest + 1,
          simulation: null,
          simView: null,
        }));
      },
      onNodesChange: (changes) => {
        // Selection and measured sizes always apply; moves and removals only while editing.
        const allowed = editable()
          ? changes
          : changes.filter((c) => c.type === "select" || c.type === "dimensions");
        if (allowed.some((c) => c.type === "remove")) get().commit();
        set((s) => ({ nodes: applyNodeChanges(allowed, s.nodes) }));
        if (allowed.some((c) => c.type === "remove")) {
          const alive = new Set(get().nodes.map((n) => n.id));
          set((s) => ({ edges: s.edges.filter((e) => alive.has(e.source) && alive.has(e.target)) }));
        }
      },
      onEdgesChange: (changes) => {
        const allowed = editable() ? changes : changes.filter((c) => c.type === "select");
        if (allowed.some((c) => c.type === "remove")) get().commit();
        set((s) => ({ edges: applyEdgeChanges(allowed, s.edges) }));
      },
      connect: (c) => {
        const s = get();
        if (!editable()) return false;
        const check = checkConnection(c, s.nodes, s.edges);
        if (!check.ok) return false;
        s.commit();
        set((st) => ({ edges: [...st.edges, check.edge] }));
        return true;
      },
      addComponent: (kind, position, fn) => {
        if (!editable()) return "";
        const s = get();
        const node = newNode(kind, position, s.nodes, s.rest, fn);
        s.commit();
        set((st) => ({
          nodes: [...st.nodes.map((n) => (n.selected ? { ...n, selected: false } : n)), { ...node, selected: true } as CanvasNode],
          edges: st.edges.map((e) => (e.selected ? { ...e, selected: false } : e)),
          panel: "properties",
        }));
        return node.id;
      },
      deleteSelected: () => {
        if (!editable()) return;
        const s = get();
        const gone = new Set(s.nodes.filter((n) => n.selected).map((n) => n.id));
        const edges = s.edges.filter((e) => !e.selected && !gone.has(e.source) && !gone.has(e.target));
        if (gone.size === 0 && edges.length === s.edges.length) return;
        s.commit();
        set({ nodes: s.nodes.filter((n) => !gone.has(n.id)), edges });
      },
      duplicateSelected: () => {
        if (!editable()) return;
        const s = get();
        const out = duplicateNodes(s.nodes, s.edges, s.rest);
        if (!out) return;
        s.commit();
        set({ nodes: out.nodes, edges: out.edges });
      },
      addBeside: (mode, contactId) => {
        if (!editable()) return null;
        const s = get();
        const out = (mode === "series" ? addInSeries : addInParallel)(contactId, s.nodes, s.edges, s.rest);
        if (!out) return null;
        s.commit();
        set({
          nodes: out.nodes.map((n) => (n.id === out.added ? { ...n, selected: true } : n.selected ? { ...n, selected: false } : n)),
          edges: out.edges,
          panel: "properties",
        });
        return out.added;
      },
      updateComponent: (id, data, tag) => {
        if (!editable()) return;
        get().commit(tag);
        set((s) => ({
          nodes: s.nodes.map((n) => (n.id === id ? ({ ...n, data: dropUndefined({ ...n.data, ...data }) } as CanvasNode) : n)),
        }));
      },
      renameComponent: (id, next) => {
        const s = get();
        if (!editable() || id === next) return null;
        if (s.nodes.some((n) => n.id === next)) return `another component is already called "${next}"`;
        if (s.rest.conditions.some((c) => c.id === next)) return `a condition is already called "${next}"`;
        if (!/^[A-Za-z0-9_.-]{1,64}$/.test(next)) return "an id is 1-64 characters from A-Z a-z 0-9 _ - .";
        s.commit();
        const ren = (x: string) => (x === id ? next : x);
        set((st) => ({
          nodes: st.nodes.map((n) => (n.id === id ? { ...n, id: next } : n)),
          edges: st.edges.map((e) => ({ ...e, id: `${ren(e.source)}.${e.sourceHandle}~${ren(e.target)}.${e.targetHandle}`, source: ren(e.source), target: ren(e.target) })),
          rest: {
            ...st.rest,
            rules: st.rest.rules.map((r) =>
              r.type === "inhibit" && typeof r.forbid === "object" && r.forbid.energized === id ? { ...r, forbid: { energized: next } } : r,
            ),
          },
        }));
        return null;
      },
      updateRest: (fn, tag) => {
        if (!editable()) return;
        get().commit(tag);
        set((s) => ({ rest: fn(s.rest) }));
      },
      updateDesign: (fn, tag) => {
        if (!editable()) return;
        get().commit(tag);
        set((s) => fn({ rest: s.rest, nodes: s.nodes }));
      },
      setPositions: (positions, opts) => {
        if (opts?.commit) get().commit();
        set((s) => ({ nodes: s.nodes.map((n) => (positions[n.id] ? { ...n, position: positions[n.id] } : n)) }));
      },
      select: (id) =>
        set((s) => ({
          nodes: s.nodes.map((n) => (n.id === id) !== Boolean(n.selected) ? { ...n, selected: n.id === id } : n),
          edges: s.edges.map((e) => (e.selected ? { ...e, selected: false } : e)),
        })),
      setPanel: (panel) => set({ panel }),
      setProof: (proof) => set({ proof }),
      simulate: (simulation) => set({ simulation, ...(simulation ? {} : { simView: null }) }),
      setSimView: (simView) => set({ simView }),
      markRevision: (number) => set((s) => ({ revision: { number, key: contentKey(snapshot(s)) } })),
      setRefusal: (refusal) => set({ refusal, ...(refusal ? { panel: "problems" as const } : {}) }),
      requestFit: () => set((s) => ({ fitRequest: s.fitRequest + 1 })),
    };
  });
}

function dropUndefined<T extends object>(o: T): T {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as T;
}

export const EditorContext = createContext<EditorStore | null>(null);

export function useEditorStore(): EditorStore {
  const store = useContext(EditorContext);
  if (!store) throw new Error("useEditor must be used inside the design editor");
  return store;
}

/** Reads one narrow slice of the editor state. */
export function useEditor<T>(selector: (s: EditorState) => T): T {
  return useStore(useEditorStore(), selector);
}
