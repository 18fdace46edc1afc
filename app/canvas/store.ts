// The editor's one store (zustand, one instance per mounted editor, handed down by context).
// The canvas graph (nodes, edges) plus the rest of the document is the state. Every action that
// changes the design is ONE undo step: it snapshots the document, applies an edit that keeps
// every reference consistent (edits.ts, graph-ops.ts), and clears the messages that described the
// document before it. An edit that would break a reference is refused with a sentence instead.
import { createContext, useContext } from "react";
import { applyEdgeChanges, applyNodeChanges, type Connection, type EdgeChange, type NodeChange } from "@xyflow/react";
import { createStore, useStore, type StoreApi } from "zustand";
import type { Design, InputFunction, Problem, Rule, Verdict } from "../engine";
import { contentKey, documentToFlow, flowToDocument } from "./convert";
import {
  addCondition,
  addState,
  removeCondition,
  removeState,
  renameComponentIn,
  renameCondition,
  renameDesign,
  renameRule,
  renameState,
  type Graph,
  type Outcome,
} from "./edits";
import { addInParallel, addInSeries, checkConnection, copyOf, duplicateNodes, newNode, pasteClip, type Clip } from "./graph-ops";
import type { CanvasEdge, CanvasNode, ComponentKind, DesignRest, Simulation, SimView, XY } from "./types";

export type { SimSource, Simulation, SimView } from "./types";

export type Panel = "properties" | "conditions" | "controller" | "rules" | "problems" | "simulate";

export type ProofState =
  | { status: "pending" }
  | { status: "invalid"; problems: Problem[] }
  | { status: "done"; verdict: Verdict; ms: number }
  | { status: "error"; message: string };

/** A message across the top of the editor. Unless `sticky`, it describes the document as it was and goes with the next change. */
export type Banner = {
  tone: "error" | "success" | "warning";
  text: string;
  /** A second paragraph (the cautions under a saved revision). */
  detail?: string;
  actions?: Array<{ label: string; run: () => void }>;
  sticky?: boolean;
};

/** A short line on the canvas about wiring (the terminal a wire starts from, why a wire was refused). */
export type CanvasNote = { tone: "info" | "error"; text: string };

export type Terminal = { component: string; terminal: string };

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
  /** The engine's problems with the document at its latest check (kept while the next one runs). */
  problems: Problem[];
  simulation: Simulation | null;
  /** The `row` the editor was opened with, until the simulation module has looked at it (startAt). */
  openRow: string | null;
  simView: SimView | null;
  /** Bumped when the graph needs a fresh layout + fit (load, import, undo of a layout). */
  layoutRequest: number;
  fitRequest: number;
  /** Revision the working copy is based on, and the content key it had then (null: unknown / edited). */
  revision: { number: number; key: string | null };
  loadNotes: string[];
  /** The server's refusal of the last "Save revision" (400 problems or 422 verdict). */
  refusal: { kind: "problems"; problems: Problem[] } | { kind: "verdict"; verdict: Verdict } | null;
  banner: Banner | null;
  canvasNote: CanvasNote | null;
  /** The terminal a click-to-wire started from. */
  pendingWire: Terminal | null;
  /** The last component rename, so the properties form follows the component instead of starting over. */
  lastRename: { from: string; to: string } | null;

  document(): Design;
  /** Pushes an undo snapshot of the document as it is now (before a drag). */
  commit(): void;
  undo(): void;
  redo(): void;
  replace(doc: unknown, opts?: { keepHistory?: boolean }): void;
  onNodesChange(changes: NodeChange<CanvasNode>[]): void;
  onEdgesChange(changes: EdgeChange<CanvasEdge>[]): void;
  /** Adds a wire; null when added, else why not. */
  connect(c: Pick<Connection, "source" | "sourceHandle" | "target" | "targetHandle">): string | null;
  /** Click-to-wire: the first click picks a terminal, the second joins it to another. */
  clickTerminal(t: Terminal): void;
  cancelWire(): void;
  addComponent(kind: ComponentKind, position: XY, fn?: InputFunction): string;
  /** Deletes the selection with its wires; refused (with the reason, also on the canvas) when a rule names a selected input. */
  deleteSelected(): string | null;
  duplicateSelected(): void;
  copySelected(): number;
  cutSelected(): void;
  paste(): string[];
  selectAll(): void;
  addBeside(mode: "series" | "parallel", contactId?: string): string | null;
  /** Changes a component's fields; refused when it would give a second input the same function. */
  updateComponent(id: string, data: Partial<CanvasNode["data"]>): string | null;
  renameComponent(id: string, next: string): string | null;
  setDesignName(name: string): string | null;
  addCondition(): void;
  renameCondition(index: number, next: string): string | null;
  setConditionLabel(index: number, label: string): void;
  removeCondition(index: number): string | null;
  renameState(condIndex: number, stateIndex: number, next: string): string | null;
  addState(condIndex: number, name: string): string | null;
  removeState(condIndex: number, stateIndex: number): string | null;
  renameRule(index: number, next: string): string | null;
  updateRule(index: number, fn: (r: Rule) => Rule): void;
  addRule(make: (rest: DesignRest) => Rule): void;
  removeRule(index: number): void;
  /** Any other edit of the non-graph part (controller, rules' fields): one undo step. */
  updateRest(fn: (rest: DesignRest) => DesignRest): void;
  setPositions(positions: Record<string, XY>, opts?: { commit?: boolean }): void;
  select(id: string | null): void;
  setPanel(p: Panel): void;
  setProof(p: ProofState): void;
  simulate(s: Simulation | null): void;
  setSimView(v: SimView | null): void;
  /** Where the editor starts for its `row`: simulating that row, or a notice saying why not. */
  startAt(start: { simulation: Simulation | null; notice: string | null }): void;
  /** Records that `doc` (default: the document as it is) was saved as revision `number`. */
  markRevision(number: number, doc?: Design): void;
  requestFit(): void;
  setRefusal(r: EditorState["refusal"]): void;
  setBanner(b: Banner | null): void;
  setCanvasNote(n: CanvasNote | null): void;
};

export type EditorStore = StoreApi<EditorState>;

export function createEditorStore(init: {
  initial: unknown;
  readOnly: boolean;
  designName: string;
  baseRevision: number;
  row?: string | null;
  initialIsRevision?: boolean;
}): EditorStore {
  const loaded = documentToFlow(init.initial, init.designName);
  const snapshot = (s: Pick<EditorState, "rest" | "nodes" | "edges">) => flowToDocument(s.rest, s.nodes, s.edges);
  const loadedDoc = flowToDocument(loaded.rest, loaded.nodes, loaded.edges);
  const opensAtRow = init.row !== null && init.row !== undefined;

  return createStore<EditorState>()((set, get) => {
    const apply = (doc: Design) => {
      const g = documentToFlow(doc, get().rest.name);
      return { rest: g.rest, nodes: g.nodes, edges: g.edges };
    };
    const editable = () => !get().readOnly && get().simulation === null;
    /** What goes stale when the document's content changes: messages about the document as it was. */
    const stale = (s: EditorState) => ({
      refusal: null,
      loadNotes: s.loadNotes.length ? [] : s.loadNotes,
      banner: s.banner?.sticky ? s.banner : null,
      canvasNote: null,
      pendingWire: null,
    });
    /** Applies one edit of the document as one undo step (nothing when it changes nothing). */
    const edit = (next: Partial<Pick<EditorState, "rest" | "nodes" | "edges">> & Partial<EditorState>) => {
      const s = get();
      if ((next.rest ?? s.rest) === s.rest && (next.nodes ?? s.nodes) === s.nodes && (next.edges ?? s.edges) === s.edges) return;
      set({ past: [...s.past.slice(-(HISTORY_LIMIT - 1)), snapshot(s)], future: [], ...stale(s), ...next });
    };
    /** Applies an accepted reference-keeping edit; gives the refusal's sentence otherwise. */
    const outcome = (make: (g: Graph) => Outcome): string | null => {
      if (!editable()) return "the design cannot be edited now";
      const s = get();
      const o = make({ rest: s.rest, nodes: s.nodes });
      if (!o.ok) return o.message;
      if (o.rest !== s.rest || o.nodes !== s.nodes) edit({ rest: o.rest, nodes: o.nodes });
      return null;
    };
    // What Copy took, for Paste in this design (its contacts name this design's conditions).
    let clipboard: Clip | null = null;
    const travel = (from: Design, to: Design) => (contentKey(from) === contentKey(to) ? {} : stale(get()));

    return {
      readOnly: init.readOnly,
      rest: loaded.rest,
      nodes: loaded.nodes,
      edges: loaded.edges,
      past: [],
      future: [],
      panel: opensAtRow ? "simulate" : "properties",
      proof: { status: "pending" },
      problems: [],
      simulation: null,
      openRow: opensAtRow ? init.row! : null,
      simView: null,
      layoutRequest: loaded.unplaced.length > 0 && loaded.nodes.length > 0 ? 1 : 0,
      fitRequest: 1,
      revision: {
        number: init.baseRevision,
        key: init.baseRevision > 0 && init.initialIsRevision !== false ? contentKey(loadedDoc) : null,
      },
      loadNotes: loaded.dropped,
      refusal: null,
      banner: null,
      canvasNote: null,
      pendingWire: null,
      lastRename: null,

      document: () => snapshot(get()),
      commit: () => set((s) => ({ past: [...s.past.slice(-(HISTORY_LIMIT - 1)), snapshot(s)], future: [] })),
      undo: () => {
        const s = get();
        if (!editable() || s.past.length === 0) return;
        const prev = s.past[s.past.length - 1];
        const now = snapshot(s);
        set({ ...travel(now, prev), ...apply(prev), past: s.past.slice(0, -1), future: [now, ...s.future] });
      },
      redo: () => {
        const s = get();
        if (!editable() || s.future.length === 0) return;
        const next = s.future[0];
        const now = snapshot(s);
        set({ ...travel(now, next), ...apply(next), past: [...s.past, now], future: s.future.slice(1) });
      },
      replace: (doc, opts) => {
        const g = documentToFlow(doc, get().rest.name);
        if (opts?.keepHistory) get().commit();
        set((s) => ({
          ...stale(s),
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
        // Selection, measured sizes and moves (a drag's undo step is taken when it starts) apply;
        // removals go through deleteSelected, so they are one undo step with their wires.
        const allowed = changes.filter((c) => c.type === "select" || c.type === "dimensions" || (c.type === "position" && editable()));
        if (allowed.length === 0) return;
        set((s) => ({ nodes: applyNodeChanges(allowed, s.nodes) }));
      },
      onEdgesChange: (changes) => {
        const allowed = changes.filter((c) => c.type === "select");
        if (allowed.length === 0) return;
        set((s) => ({ edges: applyEdgeChanges(allowed, s.edges) }));
      },
      connect: (c) => {
        if (!editable()) return "the design cannot be edited now";
        const s = get();
        const check = checkConnection(c, s.nodes, s.edges);
        if (!check.ok) return check.reason;
        edit({ edges: [...s.edges, check.edge] });
        return null;
      },
      clickTerminal: (t) => {
        if (!editable()) return;
        const from = get().pendingWire;
        if (!from) {
          set({
            pendingWire: t,
            canvasNote: { tone: "info", text: `Wiring from ${t.component}.${t.terminal}: click the terminal to join it to (Esc cancels).` },
          });
          return;
        }
        if (from.component === t.component && from.terminal === t.terminal) return get().cancelWire();
        const why = get().connect({ source: from.component, sourceHandle: from.terminal, target: t.component, targetHandle: t.terminal });
        set({
          pendingWire: null,
          canvasNote: why
            ? { tone: "error", text: `No wire from ${from.component}.${from.terminal} to ${t.component}.${t.terminal}: ${why}.` }
            : { tone: "info", text: `Wired ${from.component}.${from.terminal} to ${t.component}.${t.terminal}.` },
        });
      },
      cancelWire: () => set({ pendingWire: null, canvasNote: null }),
      addComponent: (kind, position, fn) => {
        if (!editable()) return "";
        const s = get();
        const node = newNode(kind, position, s.nodes, s.rest, fn);
        edit({
          nodes: [...s.nodes.map((n) => (n.selected ? { ...n, selected: false } : n)), { ...node, selected: true } as CanvasNode],
          edges: s.edges.map((e) => (e.selected ? { ...e, selected: false } : e)),
          panel: "properties",
        });
        return node.id;
      },
      deleteSelected: () => {
        if (!editable()) return "the design cannot be edited now";
        const s = get();
        const gone = new Set(s.nodes.filter((n) => n.selected).map((n) => n.id));
        const named = s.rest.rules.filter((r) => {
          const forbid = (r as { forbid?: unknown }).forbid;
          return typeof forbid === "object" && forbid !== null && gone.has((forbid as { energized: string }).energized);
        });
        if (named.length > 0) {
          const why = `rule ${named.map((r) => r.id).join(", rule ")} ${named.length === 1 ? "names" : "name"} ${[...new Set(named.map((r) => (r as { forbid: { energized: string } }).forbid.energized))].join(", ")}: change the rule first`;
          set({ canvasNote: { tone: "error", text: `Not deleted: ${why}.` } });
          return why;
        }
        const edges = s.edges.filter((e) => !e.selected && !gone.has(e.source) && !gone.has(e.target));
        if (gone.size === 0 && edges.length === s.edges.length) return null;
        edit({ nodes: s.nodes.filter((n) => !gone.has(n.id)), edges });
        return null;
      },
      duplicateSelected: () => {
        if (!editable()) return;
        const s = get();
        const out = duplicateNodes(s.nodes, s.edges, s.rest);
        if (out) edit({ nodes: out.nodes, edges: out.edges });
      },
      copySelected: () => {
        const s = get();
        const clip = copyOf(s.nodes, s.edges);
        if (clip) clipboard = clip;
        return clip?.nodes.length ?? 0;
      },
      cutSelected: () => {
        if (!editable()) return;
        if (get().copySelected() > 0) void get().deleteSelected();
      },
      paste: () => {
        if (!editable() || !clipboard) return [];
        const s = get();
        const out = pasteClip(clipboard, s.nodes, s.edges, s.rest);
        if (!out) return [];
        if (out.added.length > 0) edit({ nodes: out.nodes, edges: out.edges });
        if (out.skippedInputs > 0) {
          set({
            canvasNote: {
              tone: "error",
              text: `${out.skippedInputs === 1 ? "An input was" : `${out.skippedInputs} inputs were`} not pasted: this design already has an input of that function.`,
            },
          });
        }
        return out.added;
      },
      selectAll: () =>
        set((s) => ({
          nodes: s.nodes.map((n) => (n.selected ? n : { ...n, selected: true })),
          edges: s.edges.map((e) => (e.selected ? e : { ...e, selected: true })),
        })),
      addBeside: (mode, contactId) => {
        if (!editable()) return null;
        const s = get();
        const picked = s.nodes.filter((n) => n.selected);
        const id = contactId ?? (picked.length === 1 ? picked[0].id : null);
        if (!id) return null;
        const out = (mode === "series" ? addInSeries : addInParallel)(id, s.nodes, s.edges, s.rest);
        if (!out) return null;
        edit({
          nodes: out.nodes.map((n) => (n.id === out.added ? { ...n, selected: true } : n.selected ? { ...n, selected: false } : n)),
          edges: out.edges,
          panel: "properties",
        });
        return out.added;
      },
      updateComponent: (id, data) => {
        if (!editable()) return "the design cannot be edited now";
        const s = get();
        const fn = (data as { function?: string }).function;
        if (fn !== undefined && s.nodes.some((n) => n.id !== id && n.type === "input" && n.data.function === fn)) {
          return `this design already has a ${fn} input; a design has at most one input per function`;
        }
        edit({ nodes: s.nodes.map((n) => (n.id === id ? ({ ...n, data: dropUndefined({ ...n.data, ...data }) } as CanvasNode) : n)) });
        return null;
      },
      renameComponent: (id, next) => {
        if (!editable()) return "the design cannot be edited now";
        const s = get();
        if (!s.nodes.some((n) => n.id === id)) return "that component is no longer there";
        const o = renameComponentIn({ rest: s.rest, nodes: s.nodes, edges: s.edges }, id, next);
        if (!o.ok) return o.message;
        if (o.nodes !== s.nodes) {
          const to = o.nodes[s.nodes.findIndex((n) => n.id === id)].id;
          edit({ rest: o.rest, nodes: o.nodes, edges: o.edges, lastRename: { from: id, to } });
        }
        return null;
      },
      setDesignName: (name) => outcome((g) => renameDesign(g, name)),
      addCondition: () => void outcome(addCondition),
      renameCondition: (index, next) => outcome((g) => renameCondition(g, index, next)),
      setConditionLabel: (index, label) =>
        get().updateRest((rest) => ({ ...rest, conditions: rest.conditions.map((c, k) => (k === index ? { ...c, label } : c)) })),
      removeCondition: (index) => outcome((g) => removeCondition(g, index)),
      renameState: (condIndex, stateIndex, next) => outcome((g) => renameState(g, condIndex, stateIndex, next)),
      addState: (condIndex, name) => outcome((g) => addState(g, condIndex, name)),
      removeState: (condIndex, stateIndex) => outcome((g) => removeState(g, condIndex, stateIndex)),
      renameRule: (index, next) => outcome((g) => renameRule(g, index, next)),
      updateRule: (index, fn) => get().updateRest((rest) => ({ ...rest, rules: rest.rules.map((r, k) => (k === index ? fn(r) : r)) })),
      addRule: (make) => get().updateRest((rest) => ({ ...rest, rules: [...rest.rules, make(rest)] })),
      removeRule: (index) => get().updateRest((rest) => ({ ...rest, rules: rest.rules.filter((_, k) => k !== index) })),
      updateRest: (fn) => {
        if (!editable()) return;
        edit({ rest: fn(get().rest) });
      },
      setPositions: (positions, opts) => {
        if (opts?.commit) get().commit();
        set((s) => ({ nodes: s.nodes.map((n) => (positions[n.id] ? { ...n, position: positions[n.id] } : n)) }));
      },
      select: (id) =>
        set((s) => ({
          nodes: s.nodes.map((n) => ((n.id === id) !== Boolean(n.selected) ? { ...n, selected: n.id === id } : n)),
          edges: s.edges.map((e) => (e.selected ? { ...e, selected: false } : e)),
        })),
      setPanel: (panel) => set({ panel }),
      setProof: (proof) =>
        set((s) => ({ proof, problems: proof.status === "invalid" ? proof.problems : proof.status === "done" ? [] : s.problems })),
      simulate: (simulation) => set({ simulation, pendingWire: null, ...(simulation ? {} : { simView: null }) }),
      setSimView: (simView) => set({ simView }),
      startAt: ({ simulation, notice }) =>
        set({
          openRow: null,
          simulation,
          panel: simulation ? "simulate" : "properties",
          ...(notice ? { banner: { tone: "warning" as const, text: notice } } : {}),
        }),
      markRevision: (number, doc) => set((s) => ({ revision: { number, key: contentKey(doc ?? snapshot(s)) } })),
      setRefusal: (refusal) => set({ refusal, ...(refusal ? { panel: "problems" as const } : {}) }),
      setBanner: (banner) => set({ banner }),
      setCanvasNote: (canvasNote) => set({ canvasNote }),
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
