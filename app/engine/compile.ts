// Compiles a valid design into plain numeric tables: conditions with their mixed-radix strides,
// nets (union-find over wired terminals), contacts between nets, inputs, literals and rules.
// The result is plain data (JSON-serializable) and keeps the source design.
import { LOCKOUTS, TERMINALS, type ContactComponent, type Design, type InputFunction, type Lockout, type Predicate } from "./schema";
import { validateStoredDesign } from "./validate";

export type CompiledCondition = {
  id: string;
  label: string;
  states: string[];
  radix: number;
  /** Rows between two changes of this condition's state (1 for the last condition). */
  stride: number;
};

/** A set of states of one condition, as a bit mask over state indexes. */
export type Literal = { cond: number; mask: number };

export type CompiledContact = {
  id: string;
  label: string;
  cond: number;
  closedMask: number;
  closedIn: string[];
  netA: number;
  netB: number;
  /** Literal index of "closed". */
  lit: number;
};

export type CompiledInput = { id: string; label: string; fn: InputFunction; net: number };

export type CompiledPredicate =
  | { k: "lit"; lit: number }
  | { k: "all"; items: CompiledPredicate[] }
  | { k: "any"; items: CompiledPredicate[] }
  | { k: "not"; item: CompiledPredicate }
  | { k: "true" };

export type CompiledRule =
  | {
      type: "inhibit";
      id: string;
      label: string;
      index: number;
      when: CompiledPredicate;
      /** -1 forbids drive; otherwise the input index whose energizing is forbidden. */
      forbidInput: number;
    }
  | { type: "require-drive"; id: string; label: string; index: number; when: CompiledPredicate }
  | { type: "no-restart"; id: string; label: string; index: number };

export type CompiledDesign = {
  kind: "chainproof/compiled@1";
  design: Design;
  rows: number;
  conditions: CompiledCondition[];
  conditionIndex: Record<string, number>;
  /** Terminals ("COMP.term") of each net. */
  nets: string[][];
  terminalNet: Record<string, number>;
  supplyNets: number[];
  contacts: CompiledContact[];
  contactIndex: Record<string, number>;
  /**
   * Contacts that can ever carry supply current (in the supply's part of the wiring, not shorted),
   * in propagation order, with `near` the end closer to a supply.
   */
  flow: { contact: number; near: number; far: number }[];
  /** True when the flow graph is a tree, so one pass in flow order settles every net. */
  singlePass: boolean;
  inputs: CompiledInput[];
  inputIndex: Record<string, number>;
  /** Input index per function, -1 when the design has no such input. */
  inputOf: Record<InputFunction, number>;
  throttle: { cond: number; classOf: number[]; released: number; applied: number; fault: number };
  brakeCutsDrive: boolean;
  lockouts: Lockout[];
  literals: Literal[];
  rules: CompiledRule[];
};

export const THROTTLE_CLASSES = ["released", "applied", "fault"] as const;
export type ThrottleClass = (typeof THROTTLE_CLASSES)[number];

/**
 * Compiles a design; throws when the design is invalid (callers validate first). A rule whose
 * `when` matches no row is compiled (it holds in no row, so vacuously): version 1.1 refuses such a
 * design at validation, but a revision stored before 1.1 must stay readable.
 */
export function compileDesign(design: Design): CompiledDesign {
  const checked = validateStoredDesign(design);
  if (!checked.ok) {
    const first = checked.problems[0];
    throw new Error(`invalid design (${checked.problems.length} problems), first: ${first.path}: ${first.message}`);
  }
  design = checked.design;

  // Conditions and mixed-radix strides: the LAST condition varies fastest.
  const conditions: CompiledCondition[] = design.conditions.map((c) => ({
    id: c.id,
    label: c.label ?? c.id,
    states: c.states.slice(),
    radix: c.states.length,
    stride: 1,
  }));
  let rows = 1;
  for (let i = conditions.length - 1; i >= 0; i--) {
    conditions[i].stride = rows;
    rows *= conditions[i].radix;
  }
  const conditionIndex: Record<string, number> = Object.create(null); // ids like "__proto__" are legal
  conditions.forEach((c, i) => (conditionIndex[c.id] = i));

  const literals: Literal[] = [];
  const literalKey = new Map<string, number>();
  const literal = (cond: number, states: readonly string[]): number => {
    let mask = 0;
    for (const s of states) mask |= 1 << conditions[cond].states.indexOf(s);
    const key = `${cond}:${mask}`;
    let at = literalKey.get(key);
    if (at === undefined) {
      at = literals.length;
      literals.push({ cond, mask });
      literalKey.set(key, at);
    }
    return at;
  };

  // Nets: union-find over every terminal of every component, joined by wires.
  const terminals: string[] = [];
  const terminalAt = new Map<string, number>();
  for (const comp of design.components) {
    for (const t of TERMINALS[comp.type]) {
      terminalAt.set(`${comp.id}.${t}`, terminals.length);
      terminals.push(`${comp.id}.${t}`);
    }
  }
  const parent = terminals.map((_, i) => i);
  const find = (x: number): number => {
    while (parent[x] !== x) {
      parent[x] = parent[parent[x]];
      x = parent[x];
    }
    return x;
  };
  for (const w of design.wires) {
    const a = find(terminalAt.get(w.from)!);
    const b = find(terminalAt.get(w.to)!);
    if (a !== b) parent[Math.max(a, b)] = Math.min(a, b);
  }
  const netOfRoot = new Map<number, number>();
  const nets: string[][] = [];
  const terminalNet: Record<string, number> = Object.create(null); // ids like "__proto__" are legal
  terminals.forEach((t, i) => {
    const root = find(i);
    let net = netOfRoot.get(root);
    if (net === undefined) {
      net = nets.length;
      netOfRoot.set(root, net);
      nets.push([]);
    }
    nets[net].push(t);
    terminalNet[t] = net;
  });

  const supplyNets = [...new Set(design.components.filter((c) => c.type === "supply").map((c) => terminalNet[`${c.id}.+`]))];

  const contacts: CompiledContact[] = design.components
    .filter((c): c is ContactComponent => c.type === "contact")
    .map((c) => {
      const cond = conditionIndex[c.condition];
      const closedIn = [...new Set(c.closedIn)];
      const lit = literal(cond, closedIn);
      return {
        id: c.id,
        label: c.label ?? c.id,
        cond,
        closedMask: literals[lit].mask,
        closedIn,
        netA: terminalNet[`${c.id}.1`],
        netB: terminalNet[`${c.id}.2`],
        lit,
      };
    });
  const contactIndex: Record<string, number> = Object.create(null); // ids like "__proto__" are legal
  contacts.forEach((c, i) => (contactIndex[c.id] = i));

  const inputs: CompiledInput[] = [];
  const inputOf: Record<InputFunction, number> = { power: -1, enable: -1, forward: -1, reverse: -1, brake: -1 };
  for (const c of design.components) {
    if (c.type !== "input") continue;
    inputOf[c.function] = inputs.length;
    inputs.push({ id: c.id, label: c.label ?? c.id, fn: c.function, net: terminalNet[`${c.id}.in`] });
  }
  const inputIndex: Record<string, number> = Object.create(null); // ids like "__proto__" are legal
  inputs.forEach((x, i) => (inputIndex[x.id] = i));

  const { flow, singlePass } = planFlow(supplyNets, contacts);

  const t = design.controller.throttle;
  const tc = conditionIndex[t.condition];
  const classOf = conditions[tc].states.map((s) => (t.released.includes(s) ? 0 : t.applied.includes(s) ? 1 : 2));
  const throttle = {
    cond: tc,
    classOf,
    released: literal(tc, t.released),
    applied: literal(tc, t.applied),
    fault: literal(tc, t.fault ?? []),
  };

  const compilePredicate = (p: Predicate): CompiledPredicate => {
    if ("cond" in p) return { k: "lit", lit: literal(conditionIndex[p.cond], [...new Set(p.in)]) };
    if ("all" in p) return { k: "all", items: p.all.map(compilePredicate) };
    if ("any" in p) return { k: "any", items: p.any.map(compilePredicate) };
    if ("not" in p) return { k: "not", item: compilePredicate(p.not) };
    return { k: "true" };
  };

  const rules: CompiledRule[] = design.rules.map((r, index): CompiledRule => {
    const label = r.label ?? r.id;
    if (r.type === "inhibit") {
      return {
        type: "inhibit",
        id: r.id,
        label,
        index,
        when: compilePredicate(r.when),
        forbidInput: r.forbid === "drive" ? -1 : inputIndex[r.forbid.energized],
      };
    }
    if (r.type === "require-drive") return { type: "require-drive", id: r.id, label, index, when: compilePredicate(r.when) };
    return { type: "no-restart", id: r.id, label, index };
  });

  const listed = new Set(design.controller.lockouts ?? []);
  return {
    kind: "chainproof/compiled@1",
    design,
    rows,
    conditions,
    conditionIndex,
    nets,
    terminalNet,
    supplyNets,
    contacts,
    contactIndex,
    flow,
    singlePass,
    inputs,
    inputIndex,
    inputOf,
    throttle,
    brakeCutsDrive: design.controller.brakeCutsDrive ?? true,
    lockouts: LOCKOUTS.filter((l) => listed.has(l)),
    literals,
    rules,
  };
}

/**
 * Orders the contacts that can carry supply current by breadth-first distance from the supplies
 * (all contacts taken as closed), and tells whether that graph is a tree (parallel contacts between
 * the same two nets count as one edge), in which case a single pass settles every net.
 */
function planFlow(supplyNets: number[], contacts: CompiledContact[]): { flow: CompiledDesign["flow"]; singlePass: boolean } {
  const SOURCE = -1;
  const node = (net: number) => (supplyNets.includes(net) ? SOURCE : net);
  const adj = new Map<number, number[]>();
  contacts.forEach((c, i) => {
    const a = node(c.netA);
    const b = node(c.netB);
    if (a === b) return;
    (adj.get(a) ?? adj.set(a, []).get(a)!).push(i);
    (adj.get(b) ?? adj.set(b, []).get(b)!).push(i);
  });
  const dist = new Map<number, number>([[SOURCE, 0]]);
  const queue = [SOURCE];
  for (let h = 0; h < queue.length; h++) {
    const n = queue[h];
    for (const ci of adj.get(n) ?? []) {
      const c = contacts[ci];
      const other = node(c.netA) === n ? node(c.netB) : node(c.netA);
      if (!dist.has(other)) {
        dist.set(other, dist.get(n)! + 1);
        queue.push(other);
      }
    }
  }
  const flow: CompiledDesign["flow"] = [];
  contacts.forEach((c, i) => {
    const a = node(c.netA);
    const b = node(c.netB);
    if (a === b || !dist.has(a)) return;
    const [near, far] = dist.get(a)! <= dist.get(b)! ? [c.netA, c.netB] : [c.netB, c.netA];
    flow.push({ contact: i, near, far });
  });
  const d = (net: number) => dist.get(node(net))!;
  flow.sort((x, y) => d(x.near) - d(y.near) || d(x.far) - d(y.far) || x.contact - y.contact);

  // Tree test on the simple graph (source merged, parallel contacts collapsed).
  const pairs = new Set<string>();
  let edges = 0;
  for (const f of flow) {
    const a = node(f.near);
    const b = node(f.far);
    const key = a < b ? `${a}:${b}` : `${b}:${a}`;
    if (!pairs.has(key)) {
      pairs.add(key);
      edges++;
    }
  }
  const singlePass = edges === dist.size - 1;
  return { flow, singlePass };
}
