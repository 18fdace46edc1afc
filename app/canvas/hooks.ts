// Editor effects: live proof in a worker, the simulation driver, the row the editor opened with,
// layout requests and fitting the view, autosave. What the first paint does not need (the engine
// on this thread for simulation, elkjs) is imported when it is first used.
import { useCallback, useEffect, useRef, useState } from "react";
import { useReactFlow, useStoreApi } from "@xyflow/react";
import { contentKey, flowToDocument } from "./convert";
import { fitPadding, fitViewport, type Size } from "./fit";
import { autoLayout } from "./layout";
import type { ProofReply, ProofRequest } from "./proof-protocol";
import { useEditor, useEditorStore, type EditorState } from "./store";
import type { SaveDraftResult } from "./contract";

export const PROOF_DEBOUNCE_MS = 150;
export const AUTOSAVE_DEBOUNCE_MS = 1000;
const FIT_MAX_ZOOM = 1.2;
/**
 * Fit view never zooms out further than this: a node's label (14 px) stays above 10 px on screen.
 * A drawing too large to fit at this zoom is shown from its top-left corner, and the rest is
 * reached by panning (decision 141).
 */
export const FIT_MIN_ZOOM = 0.75;

const docOf = (s: EditorState) => flowToDocument(s.rest, s.nodes, s.edges);
const simulationModule = () => import("./simulation");

/** Proves the design on every change of its content (debounced), in a Web Worker when there is one. */
export function useLiveProof() {
  const store = useEditorStore();
  useEffect(() => {
    let worker: Worker | null = null;
    try {
      worker = typeof Worker === "undefined" ? null : new Worker(new URL("./proof.worker.ts", import.meta.url), { type: "module" });
    } catch {
      worker = null;
    }
    let latest = 0;
    let timer: ReturnType<typeof setTimeout> | undefined;
    let lastKey = "";
    let stopped = false;
    const receive = (reply: ProofReply) => {
      if (stopped || reply.id !== latest) return; // a newer request is on its way
      const s = store.getState();
      if (reply.kind === "invalid") s.setProof({ status: "invalid", problems: reply.problems });
      else if (reply.kind === "verdict") s.setProof({ status: "done", verdict: reply.verdict, ms: reply.ms });
      else s.setProof({ status: "error", message: reply.message });
    };
    if (worker) worker.onmessage = (e: MessageEvent<ProofReply>) => receive(e.data);
    const send = (request: ProofRequest) => {
      if (worker) return worker.postMessage(request);
      // No workers (unit tests): the same work, loaded on demand, on this thread.
      void import("./proof-protocol").then((m) => receive(m.proveHere(request)));
    };
    const schedule = (s: EditorState) => {
      const doc = docOf(s);
      const key = contentKey(doc);
      if (key === lastKey) return;
      lastKey = key;
      clearTimeout(timer);
      if (s.proof.status !== "pending") s.setProof({ status: "pending" });
      timer = setTimeout(() => {
        latest += 1;
        send({ id: latest, doc });
      }, PROOF_DEBOUNCE_MS);
    };
    schedule(store.getState());
    const unsubscribe = store.subscribe((s, prev) => {
      if (s.rest !== prev.rest || s.nodes !== prev.nodes || s.edges !== prev.edges) schedule(s);
    });
    return () => {
      stopped = true;
      unsubscribe();
      clearTimeout(timer);
      worker?.terminate();
    };
  }, [store]);
}

/** Keeps `simView` (what nodes and wires draw in simulation) in step with the simulation. */
export function useSimulationDriver() {
  const store = useEditorStore();
  const simulation = useEditor((s) => s.simulation);
  const openRow = useEditor((s) => s.openRow);
  useEffect(() => {
    if (openRow === null) return;
    let cancelled = false;
    void simulationModule().then((m) => {
      if (!cancelled) store.getState().startAt(m.rowStart(openRow, docOf(store.getState())));
    });
    return () => {
      cancelled = true;
    };
  }, [store, openRow]);
  useEffect(() => {
    const s = store.getState();
    if (!simulation) return s.setSimView(null);
    let cancelled = false;
    void simulationModule().then((m) => {
      if (cancelled) return;
      const now = store.getState();
      const c = m.compiledOf(docOf(now));
      if (!c) return now.simulate(null);
      now.setSimView(m.viewFor(c, simulation));
    });
    return () => {
      cancelled = true;
    };
  }, [store, simulation]);
}

/** Runs elk when the store asks for a layout, and fits the view when it asks for a fit. */
export function useLayoutRequests() {
  const store = useEditorStore();
  const layoutRequest = useEditor((s) => s.layoutRequest);
  const fitRequest = useEditor((s) => s.fitRequest);
  const flow = useReactFlow();
  const flowStore = useStoreApi();
  useEffect(() => {
    if (layoutRequest === 0) return;
    let cancelled = false;
    const { nodes, edges } = store.getState();
    autoLayout(nodes, edges)
      .then((positions) => {
        if (cancelled) return;
        store.getState().setPositions(positions);
        store.getState().requestFit();
      })
      .catch((e: unknown) => store.getState().setCanvasNote({ tone: "error", text: e instanceof Error ? e.message : String(e) }));
    return () => {
      cancelled = true;
    };
  }, [store, layoutRequest]);
  useEffect(() => {
    // xyflow queues a fit requested on an empty canvas until the first node appears; don't ask then.
    if (store.getState().nodes.length === 0) return;
    const fit = () => {
      const pane = flowStore.getState().domNode?.getBoundingClientRect();
      const nodes = flow.getNodes();
      if (!pane || nodes.length === 0)
        return void flow.fitView({ padding: 0.2, minZoom: FIT_MIN_ZOOM, maxZoom: FIT_MAX_ZOOM, duration: 0 });
      const bounds = flow.getNodesBounds(nodes);
      const box = (selector: string) => flowStore.getState().domNode?.querySelector(selector)?.getBoundingClientRect() ?? null;
      const mm = box(".react-flow__minimap");
      const ctl = box(".react-flow__controls");
      // Footprints from the pane's corners: the minimap sits bottom right, the controls bottom left.
      const minimap: Size | null = mm && mm.width > 0 ? { width: pane.right - mm.left, height: pane.bottom - mm.top } : null;
      const controls: Size | null = ctl && ctl.width > 0 ? { width: ctl.right - pane.left, height: pane.bottom - ctl.top } : null;
      const padding = fitPadding(pane, bounds, { minimap, controls }, FIT_MAX_ZOOM);
      void flow.setViewport(fitViewport(pane, bounds, padding, FIT_MIN_ZOOM, FIT_MAX_ZOOM), { duration: 0 });
    };
    const id = requestAnimationFrame(fit);
    return () => cancelAnimationFrame(id);
    // Only a new request fits: xyflow's helpers settle once the pane is ready, which must not refit by itself.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [store, fitRequest]);
}

export type DraftState =
  | { kind: "saved" }
  | { kind: "pending" }
  | { kind: "saving" }
  | { kind: "conflict"; currentVersion: number }
  | { kind: "error"; message: string };

/** Autosaves the working copy (debounced, versioned); a 409 stops autosave until the user picks. */
export function useAutosave(opts: {
  enabled: boolean;
  draftVersion: number;
  onSaveDraft: (doc: unknown, version: number) => Promise<SaveDraftResult>;
}) {
  const store = useEditorStore();
  const [state, setState] = useState<DraftState>({ kind: "saved" });
  const ref = useRef({
    version: opts.draftVersion,
    saved: JSON.stringify(docOf(store.getState())),
    busy: false,
    stopped: false,
    force: false,
  });
  const onSave = useRef(opts.onSaveDraft);
  useEffect(() => {
    onSave.current = opts.onSaveDraft;
  });
  const [kick, setKick] = useState(0);

  useEffect(() => {
    if (!opts.enabled) return;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const r = ref.current;
    const save = async () => {
      if (r.busy || r.stopped) return;
      const doc = docOf(store.getState());
      const json = JSON.stringify(doc);
      const forced = r.force;
      r.force = false;
      if (json === r.saved && !forced) return setState({ kind: "saved" });
      r.busy = true;
      setState({ kind: "saving" });
      try {
        const res = await onSave.current(doc, r.version);
        if (res.ok) {
          r.version = res.version;
          r.saved = json;
          setState(JSON.stringify(docOf(store.getState())) === json ? { kind: "saved" } : { kind: "pending" });
        } else {
          r.stopped = true;
          setState({ kind: "conflict", currentVersion: res.currentVersion });
        }
      } catch (e) {
        setState({ kind: "error", message: e instanceof Error ? e.message : String(e) });
      } finally {
        r.busy = false;
      }
      if (!r.stopped && (r.force || JSON.stringify(docOf(store.getState())) !== r.saved)) {
        clearTimeout(timer);
        timer = setTimeout(save, AUTOSAVE_DEBOUNCE_MS);
      }
    };
    const unsubscribe = store.subscribe((s, prev) => {
      if (s.rest === prev.rest && s.nodes === prev.nodes && s.edges === prev.edges) return;
      if (r.stopped) return;
      if (JSON.stringify(docOf(s)) === r.saved) return;
      setState((st) => (st.kind === "saving" ? st : { kind: "pending" }));
      clearTimeout(timer);
      timer = setTimeout(save, AUTOSAVE_DEBOUNCE_MS);
    });
    if (kick > 0) timer = setTimeout(save, 0);
    return () => {
      unsubscribe();
      clearTimeout(timer);
    };
  }, [store, opts.enabled, kick]);

  const saveAgain = useCallback(() => {
    ref.current.force = true;
    setKick((k) => k + 1);
  }, []);
  const keepMine = useCallback((currentVersion: number) => {
    ref.current.version = currentVersion;
    ref.current.stopped = false;
    setState({ kind: "pending" });
    setKick((k) => k + 1);
  }, []);
  return {
    state,
    dirty: state.kind !== "saved",
    /**
     * Saves the draft again even when its content is unchanged: after a revision is saved, so the
     * draft records its new base (a draft save that raced the revision recorded the old one).
     */
    saveAgain,
    /** After a conflict: take the other tab's version as the base and save this copy over it. */
    keepMine,
  };
}
