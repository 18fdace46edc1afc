// Pure edits of the non-graph part of a design that keep references consistent: renaming a
// condition or a state updates contacts, the throttle mapping and every rule predicate.
import type { Predicate, Rule } from "../engine";
import type { CanvasNode, DesignRest } from "./types";

export function mapPredicate(p: Predicate, f: (test: { cond: string; in: string[] }) => Predicate): Predicate {
  if ("cond" in p) return f(p);
  if ("all" in p) return { ...p, all: p.all.map((q) => mapPredicate(q, f)) };
  if ("any" in p) return { ...p, any: p.any.map((q) => mapPredicate(q, f)) };
  if ("not" in p) return { ...p, not: mapPredicate(p.not, f) };
  return p;
}

const mapRules = (rules: Rule[], f: (t: { cond: string; in: string[] }) => Predicate): Rule[] =>
  rules.map((r) => (r.type === "inhibit" && r.when && typeof r.when === "object" ? { ...r, when: mapPredicate(r.when, f) } : r));

export function renameConditionIn(rest: DesignRest, nodes: CanvasNode[], from: string, to: string): { rest: DesignRest; nodes: CanvasNode[] } {
  const t = rest.controller.throttle;
  return {
    rest: {
      ...rest,
      conditions: rest.conditions.map((c) => (c.id === from ? { ...c, id: to } : c)),
      controller: { ...rest.controller, throttle: t.condition === from ? { ...t, condition: to } : t },
      rules: mapRules(rest.rules, (p) => (p.cond === from ? { ...p, cond: to } : p)),
    },
    nodes: nodes.map((n) => (n.type === "contact" && n.data.condition === from ? { ...n, data: { ...n.data, condition: to } } : n)),
  };
}

/** Renames (to a string) or removes (to null) one state of a condition everywhere it is used. */
export function changeStateIn(
  rest: DesignRest,
  nodes: CanvasNode[],
  cond: string,
  from: string,
  to: string | null,
): { rest: DesignRest; nodes: CanvasNode[] } {
  const fix = (list: string[] | undefined) =>
    list === undefined ? undefined : to === null ? list.filter((s) => s !== from) : list.map((s) => (s === from ? to : s));
  const t = rest.controller.throttle;
  return {
    rest: {
      ...rest,
      conditions: rest.conditions.map((c) => (c.id === cond ? { ...c, states: fix(c.states)! } : c)),
      controller: {
        ...rest.controller,
        throttle:
          t.condition === cond
            ? { ...t, released: fix(t.released)!, applied: fix(t.applied)!, ...(t.fault ? { fault: fix(t.fault) } : {}) }
            : t,
      },
      rules: mapRules(rest.rules, (p) => (p.cond === cond ? { ...p, in: fix(p.in)! } : p)),
    },
    nodes: nodes.map((n) =>
      n.type === "contact" && n.data.condition === cond ? { ...n, data: { ...n.data, closedIn: fix(n.data.closedIn)! } } : n,
    ),
  };
}
