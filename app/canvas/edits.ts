// Pure edits of a design that keep every reference consistent. Each takes the graph and the rest
// of the document and gives either the edited pair or a sentence saying why it was refused; the
// store applies an accepted edit as one undo step. Positions (list indexes) name what is edited,
// so two conditions or states that share a name are never both changed: references move with a
// rename only when no other entry keeps the old name.
import { ID_PATTERN } from "../engine/vocabulary";
import type { Predicate, Rule } from "../engine";
import { terminalRef, wireId } from "./convert";
import type { CanvasEdge, CanvasNode, DesignRest } from "./types";

export type Graph = { rest: DesignRest; nodes: CanvasNode[] };
export type Outcome = ({ ok: true } & Graph) | { ok: false; message: string };
export type FullGraph = Graph & { edges: CanvasEdge[] };

export const ID_RULE = "an id is 1-64 characters from A-Z a-z 0-9 _ - .";
const STATE_MAX = 64;
const STATES_MIN = 2;
export const STATES_MAX = 8;
const q = (s: string) => `“${s}”`;
const refuse = (message: string): Outcome => ({ ok: false, message });

export function mapPredicate(p: Predicate, f: (test: { cond: string; in: string[] }) => Predicate): Predicate {
  if ("cond" in p) return f(p);
  if ("all" in p) return { ...p, all: p.all.map((x) => mapPredicate(x, f)) };
  if ("any" in p) return { ...p, any: p.any.map((x) => mapPredicate(x, f)) };
  if ("not" in p) return { ...p, not: mapPredicate(p.not, f) };
  return p;
}

function predicateTests(p: Predicate, out: Array<{ cond: string; in: string[] }> = []) {
  mapPredicate(p, (t) => (out.push(t), t));
  return out;
}

const whenOf = (r: Rule): Predicate | null => {
  const w = (r as { when?: unknown }).when;
  return typeof w === "object" && w !== null ? (w as Predicate) : null;
};

/** Every rule with a `when` (inhibit, and any later type that has one) with its tests mapped. */
const mapRules = (rules: Rule[], f: (t: { cond: string; in: string[] }) => Predicate): Rule[] =>
  rules.map((r) => {
    const when = whenOf(r);
    return when ? ({ ...r, when: mapPredicate(when, f) } as Rule) : r;
  });

/** An id as typed, trimmed; or why it cannot be one. */
function cleanId(typed: string): { id: string } | { message: string } {
  const id = typed.trim();
  return ID_PATTERN.test(id) ? { id } : { message: ID_RULE };
}

// ---------------------------------------------------------------- conditions

export function freshConditionId(g: Graph): string {
  const taken = new Set([...g.rest.conditions.map((c) => c.id), ...g.nodes.map((n) => n.id)]);
  for (let n = g.rest.conditions.length + 1; ; n++) if (!taken.has(`c${n}`)) return `c${n}`;
}

export function addCondition(g: Graph): Outcome {
  const id = freshConditionId(g);
  return { ok: true, nodes: g.nodes, rest: { ...g.rest, conditions: [...g.rest.conditions, { id, label: "", states: ["off", "on"] }] } };
}

export function renameCondition(g: Graph, index: number, typed: string): Outcome {
  const c = g.rest.conditions[index];
  if (!c) return refuse("that condition is no longer there");
  const clean = cleanId(typed);
  if ("message" in clean) return refuse(clean.message);
  const to = clean.id;
  const from = c.id;
  if (to === from) return { ok: true, ...g };
  if (g.rest.conditions.some((x, k) => k !== index && x.id === to)) return refuse(`another condition is already called ${q(to)}`);
  if (g.nodes.some((n) => n.id === to)) return refuse(`a component is already called ${q(to)}; condition and component ids must differ`);
  const conditions = g.rest.conditions.map((x, k) => (k === index ? { ...x, id: to } : x));
  // A second condition still called `from` keeps the references (they were never this one's alone).
  if (conditions.some((x) => x.id === from)) return { ok: true, nodes: g.nodes, rest: { ...g.rest, conditions } };
  const t = g.rest.controller.throttle;
  return {
    ok: true,
    rest: {
      ...g.rest,
      conditions,
      controller: { ...g.rest.controller, throttle: t.condition === from ? { ...t, condition: to } : t },
      rules: mapRules(g.rest.rules, (p) => (p.cond === from ? { ...p, cond: to } : p)),
    },
    nodes: g.nodes.map((n) => (n.type === "contact" && n.data.condition === from ? { ...n, data: { ...n.data, condition: to } } : n)),
  };
}

/** Who uses condition `id`: contacts, the throttle, rules (by id), for a refusal's sentence. */
export function usersOfCondition(g: Graph, id: string): string[] {
  const out: string[] = g.nodes.filter((n) => n.type === "contact" && n.data.condition === id).map((n) => n.id);
  if (g.rest.controller.throttle.condition === id) out.push("the throttle");
  for (const r of g.rest.rules) {
    const when = whenOf(r);
    if (when && predicateTests(when).some((t) => t.cond === id)) out.push(`rule ${r.id}`);
  }
  return out;
}

const list = (xs: string[]) => (xs.length <= 1 ? xs.join("") : `${xs.slice(0, -1).join(", ")} and ${xs[xs.length - 1]}`);

export function removeCondition(g: Graph, index: number): Outcome {
  const c = g.rest.conditions[index];
  if (!c) return refuse("that condition is no longer there");
  const conditions = g.rest.conditions.filter((_, k) => k !== index);
  if (!conditions.some((x) => x.id === c.id)) {
    const users = usersOfCondition(g, c.id);
    if (users.length > 0)
      return refuse(
        `${q(c.id)} is used by ${list(users.slice(0, 6))}${users.length > 6 ? ` and ${users.length - 6} more` : ""}: change them first`,
      );
  }
  return { ok: true, nodes: g.nodes, rest: { ...g.rest, conditions } };
}

// ---------------------------------------------------------------- states

function cleanState(typed: string): { state: string } | { message: string } {
  const state = typed.trim();
  if (state === "") return { message: "a state needs a name" };
  if (state.length > STATE_MAX) return { message: `a state name is at most ${STATE_MAX} characters` };
  return { state };
}

/** Rewrites every use of state `from` of condition `cond`: to another name, or (null) out of every list. */
function changeStateEverywhere(g: Graph, cond: string, from: string, to: string | null): Graph {
  const fix = (xs: string[]) => (to === null ? xs.filter((s) => s !== from) : xs.map((s) => (s === from ? to : s)));
  const t = g.rest.controller.throttle;
  return {
    rest: {
      ...g.rest,
      controller: {
        ...g.rest.controller,
        throttle:
          t.condition === cond
            ? { ...t, released: fix(t.released ?? []), applied: fix(t.applied ?? []), ...(t.fault ? { fault: fix(t.fault) } : {}) }
            : t,
      },
      rules: mapRules(g.rest.rules, (p) => (p.cond === cond ? { ...p, in: fix(p.in ?? []) } : p)),
    },
    nodes: g.nodes.map((n) =>
      n.type === "contact" && n.data.condition === cond ? { ...n, data: { ...n.data, closedIn: fix(n.data.closedIn) } } : n,
    ),
  };
}

/** The references to a condition belong to it only when no other condition has the same id. */
const ownsReferences = (g: Graph, index: number) => {
  const id = g.rest.conditions[index].id;
  return g.rest.conditions.filter((c) => c.id === id).length === 1;
};

export function renameState(g: Graph, condIndex: number, stateIndex: number, typed: string): Outcome {
  const c = g.rest.conditions[condIndex];
  const from = c?.states[stateIndex];
  if (!c || from === undefined) return refuse("that state is no longer there");
  const clean = cleanState(typed);
  if ("message" in clean) return refuse(clean.message);
  const to = clean.state;
  if (to === from) return { ok: true, ...g };
  if (c.states.some((s, k) => k !== stateIndex && s === to)) return refuse(`${c.id} already has a state ${q(to)}`);
  const states = c.states.map((s, k) => (k === stateIndex ? to : s));
  const withStates = { ...g, rest: { ...g.rest, conditions: g.rest.conditions.map((x, k) => (k === condIndex ? { ...x, states } : x)) } };
  // A second state of the same name keeps the references; so does a second condition of the same id.
  if (states.includes(from) || !ownsReferences(g, condIndex)) return { ok: true, ...withStates };
  return { ok: true, ...changeStateEverywhere(withStates, c.id, from, to) };
}

export function addState(g: Graph, condIndex: number, typed: string): Outcome {
  const c = g.rest.conditions[condIndex];
  if (!c) return refuse("that condition is no longer there");
  const clean = cleanState(typed);
  if ("message" in clean) return refuse(clean.message);
  if (c.states.includes(clean.state)) return refuse(`${c.id} already has a state ${q(clean.state)}`);
  if (c.states.length >= STATES_MAX) return refuse(`a condition has at most ${STATES_MAX} states`);
  const conditions = g.rest.conditions.map((x, k) => (k === condIndex ? { ...x, states: [...x.states, clean.state] } : x));
  return { ok: true, nodes: g.nodes, rest: { ...g.rest, conditions } };
}

export function removeState(g: Graph, condIndex: number, stateIndex: number): Outcome {
  const c = g.rest.conditions[condIndex];
  const st = c?.states[stateIndex];
  if (!c || st === undefined) return refuse("that state is no longer there");
  if (c.states.length <= STATES_MIN) return refuse(`a condition needs at least ${STATES_MIN} states`);
  const states = c.states.filter((_, k) => k !== stateIndex);
  const withStates = { ...g, rest: { ...g.rest, conditions: g.rest.conditions.map((x, k) => (k === condIndex ? { ...x, states } : x)) } };
  // Removing one of two equal states leaves the name in place: nothing else changes.
  if (states.includes(st) || !ownsReferences(g, condIndex)) return { ok: true, ...withStates };
  const onlyHere = g.nodes.filter(
    (n) => n.type === "contact" && n.data.condition === c.id && n.data.closedIn.length > 0 && n.data.closedIn.every((s) => s === st),
  );
  if (onlyHere.length > 0)
    return refuse(
      `${list(onlyHere.map((n) => n.id))} ${onlyHere.length === 1 ? "conducts" : "conduct"} only in ${q(st)}: change ${onlyHere.length === 1 ? "it" : "them"} first`,
    );
  const t = g.rest.controller.throttle;
  if (t.condition === c.id) {
    for (const k of ["released", "applied"] as const) {
      const xs = t[k] ?? [];
      if (xs.length > 0 && xs.every((s) => s === st))
        return refuse(`${q(st)} is the throttle's only ${k} state: change the throttle under Controller first`);
    }
  }
  return { ok: true, ...changeStateEverywhere(withStates, c.id, st, null) };
}

// ---------------------------------------------------------------- rules and the design

export function renameRule(g: Graph, index: number, typed: string): Outcome {
  const r = g.rest.rules[index];
  if (!r) return refuse("that rule is no longer there");
  const clean = cleanId(typed);
  if ("message" in clean) return refuse(clean.message);
  if (clean.id === r.id) return { ok: true, ...g };
  if (g.rest.rules.some((x, k) => k !== index && x.id === clean.id)) return refuse(`another rule is already called ${q(clean.id)}`);
  return { ok: true, nodes: g.nodes, rest: { ...g.rest, rules: g.rest.rules.map((x, k) => (k === index ? { ...x, id: clean.id } : x)) } };
}

export function renameDesign(g: Graph, typed: string): Outcome {
  const name = typed.trim();
  if (name === "") return refuse("a design needs a name");
  if (name.length > 200) return refuse("a design name is at most 200 characters");
  return { ok: true, nodes: g.nodes, rest: { ...g.rest, name } };
}

// ---------------------------------------------------------------- components

export function renameComponentIn(g: FullGraph, id: string, typed: string): ({ ok: true } & FullGraph) | { ok: false; message: string } {
  const clean = cleanId(typed);
  if ("message" in clean) return { ok: false, message: clean.message };
  const next = clean.id;
  if (next === id) return { ok: true, ...g };
  if (g.nodes.some((n) => n.id === next)) return { ok: false, message: `another component is already called ${q(next)}` };
  if (g.rest.conditions.some((c) => c.id === next))
    return { ok: false, message: `a condition is already called ${q(next)}; condition and component ids must differ` };
  const ren = (x: string) => (x === id ? next : x);
  return {
    ok: true,
    nodes: g.nodes.map((n) => (n.id === id ? { ...n, id: next } : n)),
    edges: g.edges.map((e) =>
      e.source === id || e.target === id
        ? {
            ...e,
            id:
              wireId(terminalRef(ren(e.source), e.sourceHandle ?? ""), terminalRef(ren(e.target), e.targetHandle ?? "")) +
              (/#\d+$/.exec(e.id)?.[0] ?? ""),
            source: ren(e.source),
            target: ren(e.target),
          }
        : e,
    ),
    rest: {
      ...g.rest,
      rules: g.rest.rules.map((r) => {
        const forbid = (r as { forbid?: unknown }).forbid;
        return typeof forbid === "object" && forbid !== null && (forbid as { energized?: string }).energized === id
          ? ({ ...r, forbid: { energized: next } } as Rule)
          : r;
      }),
    },
  };
}
