// Pure conversion between the design document (spec chainproof/design@1) and xyflow nodes/edges.
// Loading is tolerant: the editor must open invalid documents too, so every field is coerced to
// the nearest shape the canvas can draw, and what cannot be drawn is reported, never thrown.
import type { Component, Condition, Controller, Design, InputFunction, Rule, Wire } from "../engine";
import { DESIGN_FORMAT, INPUT_FUNCTIONS } from "../engine/vocabulary";
import type { CanvasEdge, CanvasNode, DesignRest, XY } from "./types";

export type FlowGraph = { rest: DesignRest; nodes: CanvasNode[]; edges: CanvasEdge[] };
export type LoadResult = FlowGraph & {
  /** Components that had no saved position (the caller lays them out). */
  unplaced: string[];
  /** Things in the document the canvas could not represent and dropped. */
  dropped: string[];
};

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === "object" && v !== null && !Array.isArray(v);
const str = (v: unknown, fallback = ""): string => (typeof v === "string" ? v : fallback);
const strList = (v: unknown): string[] => (Array.isArray(v) ? v.filter((s): s is string => typeof s === "string") : []);
const optLabel = (v: unknown): { label?: string } => (typeof v === "string" ? { label: v } : {});

/** The design a new, empty design starts from: a throttle condition the controller needs anyway. */
export function starterDocument(name: string): Design {
  return {
    format: DESIGN_FORMAT,
    name,
    conditions: [{ id: "throttle", label: "Throttle", states: ["released", "applied"] }],
    components: [],
    wires: [],
    controller: {
      throttle: { condition: "throttle", released: ["released"], applied: ["applied"], fault: [] },
      brakeCutsDrive: true,
      lockouts: [],
    },
    rules: [],
    layout: {},
  };
}

/** Splits "COMP.term" at its last dot (ids may contain dots; terminals never do). */
export function splitTerminal(ref: string): { component: string; terminal: string } | null {
  const dot = ref.lastIndexOf(".");
  if (dot <= 0 || dot === ref.length - 1) return null;
  return { component: ref.slice(0, dot), terminal: ref.slice(dot + 1) };
}

export const terminalRef = (component: string, terminal: string) => `${component}.${terminal}`;
export const wireId = (from: string, to: string) => `${from}~${to}`;

function isEmptyDocument(input: unknown): boolean {
  if (!isObj(input)) return true;
  const has = (k: string) => Array.isArray(input[k]) && (input[k] as unknown[]).length > 0;
  return !has("conditions") && !has("components") && !has("rules") && !isObj(input.controller);
}

function readController(v: unknown): Controller {
  const c = isObj(v) ? v : {};
  const t = isObj(c.throttle) ? c.throttle : {};
  const out: Controller = {
    ...c,
    throttle: {
      ...t,
      condition: str(t.condition),
      released: strList(t.released),
      applied: strList(t.applied),
      ...(t.fault !== undefined ? { fault: strList(t.fault) } : {}),
    },
  };
  if (c.brakeCutsDrive !== undefined) out.brakeCutsDrive = c.brakeCutsDrive !== false;
  if (c.lockouts !== undefined) out.lockouts = strList(c.lockouts) as Controller["lockouts"];
  return out;
}

function readPosition(layout: unknown, id: string): XY | null {
  if (!isObj(layout)) return null;
  const p = layout[id];
  if (isObj(p) && typeof p.x === "number" && typeof p.y === "number" && Number.isFinite(p.x) && Number.isFinite(p.y)) {
    return { x: p.x, y: p.y };
  }
  return null;
}

/** Builds one canvas node from a component object (the component's own shape, without layout). */
export function nodeFromComponent(c: Obj, position: XY): CanvasNode | null {
  const id = str(c.id);
  if (!id) return null;
  const { id: _id, type: _type, ...fields } = c;
  switch (c.type) {
    case "supply":
      return { id, type: "supply", position, data: { ...fields, ...optLabel(c.label) } };
    case "junction":
      return { id, type: "junction", position, data: { ...fields, ...optLabel(c.label) } };
    case "contact":
      return {
        id,
        type: "contact",
        position,
        data: {
          ...fields,
          ...optLabel(c.label),
          condition: str(c.condition),
          closedIn: strList(c.closedIn),
          ...(typeof c.part === "string" ? { part: c.part } : {}),
        },
      };
    case "input": {
      const fn = (INPUT_FUNCTIONS as readonly string[]).includes(str(c.function)) ? (c.function as InputFunction) : "enable";
      return { id, type: "input", position, data: { ...fields, ...optLabel(c.label), function: fn } };
    }
    default:
      return null;
  }
}

/** Document -> canvas. Never throws. */
export function documentToFlow(input: unknown, fallbackName = "Untitled design"): LoadResult {
  const doc: Obj = isEmptyDocument(input)
    ? { ...starterDocument(isObj(input) ? str(input.name, fallbackName) || fallbackName : fallbackName) }
    : (input as Obj);
  const { format, name, conditions, components, wires, controller, rules, layout, ...extra } = doc;
  const dropped: string[] = [];
  const unplaced: string[] = [];
  const nodes: CanvasNode[] = [];
  const seen = new Set<string>();
  (Array.isArray(components) ? components : []).forEach((c, i) => {
    const pos = isObj(c) ? readPosition(layout, str(c.id)) : null;
    const node = isObj(c) ? nodeFromComponent(c, pos ?? { x: 0, y: 0 }) : null;
    if (!node || seen.has(node.id)) {
      dropped.push(`components[${i}]: ${node ? `duplicate id "${node.id}"` : "not a supply, contact, junction or input with an id"}`);
      return;
    }
    seen.add(node.id);
    if (!pos) unplaced.push(node.id);
    nodes.push(node);
  });
  const edges: CanvasEdge[] = [];
  const edgeIds = new Set<string>();
  (Array.isArray(wires) ? wires : []).forEach((w, i) => {
    const from = isObj(w) ? splitTerminal(str(w.from)) : null;
    const to = isObj(w) ? splitTerminal(str(w.to)) : null;
    if (!from || !to || !seen.has(from.component) || !seen.has(to.component)) {
      dropped.push(`wires[${i}]: both ends must name a terminal of a component on the canvas`);
      return;
    }
    let id = wireId(str((w as Obj).from), str((w as Obj).to));
    for (let k = 2; edgeIds.has(id); k++) id = `${wireId(str((w as Obj).from), str((w as Obj).to))}#${k}`;
    edgeIds.add(id);
    edges.push({ id, type: "wire", source: from.component, sourceHandle: from.terminal, target: to.component, targetHandle: to.terminal });
  });
  const rest: DesignRest = {
    format: str(format, DESIGN_FORMAT) || DESIGN_FORMAT,
    name: str(name, fallbackName),
    conditions: (Array.isArray(conditions) ? conditions.filter(isObj) : []).map(
      (c) => ({ ...c, id: str(c.id), states: strList(c.states), ...optLabel(c.label) }) as Condition,
    ),
    controller: readController(controller),
    rules: (Array.isArray(rules) ? rules.filter(isObj) : []) as unknown as Rule[],
    extra,
  };
  return { rest, nodes, edges, unplaced, dropped };
}

/** Canvas node -> spec component (layout excluded). */
export function componentFromNode(n: CanvasNode): Component {
  return { id: n.id, type: n.type, ...n.data } as Component;
}

/** Canvas -> document, with positions (rounded to whole pixels) in `layout`. */
export function flowToDocument(rest: DesignRest, nodes: readonly CanvasNode[], edges: readonly CanvasEdge[]): Design {
  const layout: Record<string, XY> = {};
  for (const n of nodes) layout[n.id] = { x: Math.round(n.position.x), y: Math.round(n.position.y) };
  const wires: Wire[] = edges.map((e) => ({
    from: terminalRef(e.source, e.sourceHandle ?? ""),
    to: terminalRef(e.target, e.targetHandle ?? ""),
  }));
  return {
    ...rest.extra,
    format: rest.format as Design["format"],
    name: rest.name,
    conditions: rest.conditions,
    components: nodes.map(componentFromNode),
    wires,
    controller: rest.controller,
    rules: rest.rules,
    layout,
  };
}

/** A stable key of the document's meaning (layout excluded): what proof and "unchanged?" compare. */
export function contentKey(d: Design): string {
  const { layout: _layout, ...content } = d;
  return JSON.stringify(content);
}
