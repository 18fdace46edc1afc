// Small helpers to write test designs compactly, and a random design generator for property tests.
import fc from "fast-check";
import type { Component, Design, InputFunction, Lockout, Predicate, Rule } from "../../../app/engine/schema";
import { refMatchesSomeRow } from "./reference";

export type Spec = {
  conditions: Array<[id: string, states: string[]]>;
  /** [id, condition, closedIn] */
  contacts?: Array<[string, string, string[]]>;
  inputs?: Array<[string, InputFunction]>;
  supplies?: string[];
  junctions?: string[];
  wires: Array<[string, string]>;
  throttle: { condition: string; released: string[]; applied: string[]; fault?: string[] };
  lockouts?: Lockout[];
  brakeCutsDrive?: boolean;
  rules?: Rule[];
};

export function makeDesign(s: Spec): Design {
  const components: Component[] = [
    ...(s.supplies ?? ["BAT"]).map((id): Component => ({ id, type: "supply", label: id })),
    ...(s.contacts ?? []).map(([id, condition, closedIn]): Component => ({ id, type: "contact", label: id, condition, closedIn })),
    ...(s.junctions ?? []).map((id): Component => ({ id, type: "junction" })),
    ...(s.inputs ?? []).map(([id, fn]): Component => ({ id, type: "input", label: id, function: fn })),
  ];
  return {
    format: "chainproof/design@1",
    name: "test design",
    conditions: s.conditions.map(([id, states]) => ({ id, label: id, states })),
    components,
    wires: s.wires.map(([from, to]) => ({ from, to })),
    controller: {
      throttle: { fault: [], ...s.throttle },
      brakeCutsDrive: s.brakeCutsDrive ?? true,
      lockouts: s.lockouts ?? [],
    },
    rules: s.rules ?? [],
    layout: {},
  };
}

export const inhibit = (id: string, when: Predicate, forbid: "drive" | { energized: string } = "drive"): Rule => ({
  id,
  label: id,
  type: "inhibit",
  when,
  forbid,
});
export const requireDrive = (id: string, when: Predicate): Rule => ({ id, label: id, type: "require-drive", when });
export const noRestart = (id = "no-restart"): Rule => ({ id, label: id, type: "no-restart" });
export const is = (cond: string, ...states: string[]): Predicate => ({ cond, in: states });

/**
 * A random valid design: 1-4 conditions of 2-3 states, 1-2 supplies, 2-8 contacts, 0-3 junctions,
 * any subset of input functions; contacts between random nets (so series, parallel and bridge
 * arrangements), junction chains, unwired terminals, self-wires and duplicate wires all occur.
 * Inhibit rules, 0-2 require-drive rules (some pinned to a single row with the throttle applied, so
 * that some hold) and sometimes a no-restart rule. A rule whose `when` matches no row (spec 1.1:
 * invalid) is dropped, judged by the reference's brute force; with `emptyRules` such rules are kept
 * and 1-2 more are added on purpose (an empty state list, an "any" of nothing, a contradiction,
 * "not always"), so the design is invalid exactly at those rules.
 */
export function randomDesign(
  g: fc.GeneratorValue,
  opts: {
    maxContacts?: number;
    meshed?: boolean;
    cutRules?: boolean;
    maxConditions?: number;
    maxStates?: number;
    emptyRules?: boolean;
  } = {},
): Design {
  const int = (min: number, max: number) => g(fc.integer, { min, max });
  const conditions = Array.from({ length: int(1, opts.maxConditions ?? 4) }, (_, i) => ({
    id: `c${i}`,
    states: Array.from({ length: int(2, opts.maxStates ?? 3) }, (_, k) => `s${k}`),
  }));
  const pickCond = () => conditions[int(0, conditions.length - 1)];
  const subset = (states: string[], minLength: number) => g(fc.subarray, states, { minLength });
  const supplies = Array.from({ length: int(1, 2) }, (_, i) => `V${i}`);
  const contacts = Array.from({ length: int(2, opts.maxContacts ?? 8) }, (_, i): [string, string, string[]] => {
    const c = pickCond();
    return [`K${i}`, c.id, subset(c.states, 1)];
  });
  const junctions = Array.from({ length: int(0, 3) }, (_, i) => `J${i}`);
  const fns: InputFunction[] = ["power", "enable", "forward", "reverse", "brake"];
  const inputs = g(fc.subarray, fns, { minLength: 0 }).map((fn): [string, InputFunction] => [`I_${fn}`, fn]);
  // Wiring: nets grow from the supply's net; each contact joins an existing net to a new or an
  // existing one (series, parallel, bridges), a few terminals stay unwired, and each net is wired as
  // a chain through its terminals (junctions included), plus stray self-wires and duplicates.
  const members: string[][] = [[]];
  const deal = (terminal: string, net: number) => {
    if (net >= 0) members[net].push(terminal);
  };
  const existing = () => int(0, members.length - 1);
  const unwiredOr = (net: number) => (int(0, 9) === 0 ? -1 : net);
  deal(`${supplies[0]}.+`, 0);
  for (const [id] of contacts) {
    deal(`${id}.1`, unwiredOr(existing()));
    const fresh = opts.meshed ? int(0, 3) === 0 : g(fc.boolean);
    if (fresh) members.push([]);
    deal(`${id}.2`, unwiredOr(fresh ? members.length - 1 : existing()));
  }
  for (const s of supplies.slice(1)) deal(`${s}.+`, existing());
  for (const j of junctions) deal(`${j}.j`, existing());
  for (const [id] of inputs) deal(`${id}.in`, unwiredOr(existing()));
  const wires: Array<[string, string]> = [];
  for (const m of members) {
    const order = g(fc.shuffledSubarray, m, { minLength: m.length });
    for (let k = 1; k < order.length; k++) wires.push([order[k - 1], order[k]]);
  }
  const terminals = members.flat();
  for (let k = int(0, 2); k > 0 && terminals.length > 0; k--) {
    const a = terminals[int(0, terminals.length - 1)];
    wires.push(g(fc.boolean) ? [a, a] : [a, terminals[int(0, terminals.length - 1)]]);
  }
  const t = pickCond();
  const cls = t.states.map((_, k) => (k === 0 ? 0 : k === 1 ? 1 : int(0, 2)));
  const throttle = {
    condition: t.id,
    released: t.states.filter((_, k) => cls[k] === 0),
    applied: t.states.filter((_, k) => cls[k] === 1),
    fault: t.states.filter((_, k) => cls[k] === 2),
  };
  const predicate = (depth: number): Predicate => {
    const kind = depth >= 2 ? 0 : int(0, 4);
    if (kind === 0 || kind === 4) {
      const c = pickCond();
      return { cond: c.id, in: subset(c.states, 1) };
    }
    if (kind === 1) return { all: Array.from({ length: int(0, 2) }, () => predicate(depth + 1)) };
    if (kind === 2) return { any: Array.from({ length: int(0, 2) }, () => predicate(depth + 1)) };
    return g(fc.boolean) ? { not: predicate(depth + 1) } : { always: true };
  };
  const rules: Rule[] = Array.from({ length: opts.cutRules ? 0 : int(1, 3) }, (_, i) => {
    const target = inputs.length > 0 && g(fc.boolean) ? { energized: inputs[int(0, inputs.length - 1)][0] } : "drive";
    return inhibit(`R${i}`, predicate(0), target);
  });
  // Rules that hold exactly when one contact cuts every path to an input, so faults matter.
  for (let k = opts.cutRules ? int(2, 5) : int(0, 1); k > 0 && inputs.length > 0; k--) {
    const [, cond, closedIn] = contacts[int(0, contacts.length - 1)];
    const target = inputs[int(0, inputs.length - 1)][0];
    rules.push(inhibit(`CUT${k}`, { not: { cond, in: closedIn } }, g(fc.boolean) ? "drive" : { energized: target }));
  }
  if (rules.length === 0) rules.push(inhibit("R", { always: true }));
  // Require-drive rules: a random `when`, or one row (every condition pinned, the throttle applied).
  for (let k = int(0, 2); k > 0; k--) {
    const pinned = (): Predicate => ({
      all: conditions.map((c) => ({
        cond: c.id,
        in: [
          c.id === t.id && throttle.applied.length > 0
            ? throttle.applied[int(0, throttle.applied.length - 1)]
            : c.states[int(0, c.states.length - 1)],
        ],
      })),
    });
    rules.push(requireDrive(`D${k}`, g(fc.boolean) ? pinned() : predicate(0)));
  }
  if (opts.emptyRules) {
    for (let k = int(1, 2); k > 0; k--) {
      const c = pickCond();
      const empties: Predicate[] = [
        { cond: c.id, in: [] },
        { any: [] },
        {
          all: [
            { cond: c.id, in: [c.states[0]] },
            { cond: c.id, in: [c.states[1]] },
          ],
        },
        { not: { always: true } },
        { all: [predicate(1), { not: { cond: c.id, in: c.states } }] },
      ];
      const when = empties[int(0, empties.length - 1)];
      const at = int(0, rules.length);
      rules.splice(at, 0, g(fc.boolean) ? inhibit(`E${k}`, when) : requireDrive(`E${k}`, when));
    }
  }
  if (g(fc.boolean)) rules.push(noRestart("NR"));
  const lockouts = subset(["power-on", "enable-restore", "direction-engage", "brake-release", "throttle-fault"], 0) as Lockout[];
  const design = makeDesign({
    conditions: conditions.map((c) => [c.id, c.states]),
    supplies,
    contacts,
    junctions,
    inputs,
    wires,
    throttle,
    lockouts,
    brakeCutsDrive: g(fc.boolean),
    rules,
  });
  if (!opts.emptyRules) {
    design.rules = design.rules.filter((r) => r.type === "no-restart" || refMatchesSomeRow(design, r.when));
    if (!design.rules.some((r) => r.type === "inhibit")) design.rules.unshift(inhibit("R", { always: true }));
  }
  return design;
}
