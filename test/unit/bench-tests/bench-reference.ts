// An independent reading of a bench plan, written from the spec (sections 1.3-1.7) without the
// engine: rows are evaluated by graph connectivity (graphology) with faults applied as edges, the
// controller's step of section 1.5 is written out here, and every claim of a plan (each step's
// expected drive, inputs and latch; "in any order"; what each step reveals; the faults, rules and
// lockouts covered; the faults no observation can reveal; the lower bound) is checked by brute force.
import Graph from "graphology";
import { connectedComponents } from "graphology-components";
import type { Design, Predicate } from "../../../app/engine";
import type { BenchPlan } from "../../../app/bench-tests/types";

type States = Record<string, string>;
type Fault = { contact: string; mode: "stuck-open" | "stuck-closed" } | null;
type Dir = "forward" | "neutral" | "reverse" | "conflict";
type View = { powered: boolean; enabled: boolean; dir: Dir; braking: boolean; throttle: "released" | "applied" | "fault" };
type Seen = { inputs: Record<string, boolean>; view: View; drive: boolean };
type Memory = { p: View; drive: boolean; L: boolean };
const LOCKOUT_IDS = ["power-on", "enable-restore", "direction-engage", "brake-release", "throttle-fault"] as const;

const TERMINALS: Record<string, string[]> = { supply: ["+"], contact: ["1", "2"], junction: ["j"], input: ["in"] };

export class Reference {
  readonly rows: number;
  readonly contacts: Array<{ id: string; condition: string; closedIn: string[] }>;
  readonly inputs: Array<{ id: string; fn: string }>;
  readonly faults: Fault[];
  private readonly cache = new Map<string, Seen>();
  constructor(readonly d: Design) {
    this.rows = d.conditions.reduce((n, c) => n * c.states.length, 1);
    this.contacts = d.components.flatMap((k) => (k.type === "contact" ? [{ id: k.id, condition: k.condition, closedIn: k.closedIn }] : []));
    this.inputs = d.components.flatMap((k) => (k.type === "input" ? [{ id: k.id, fn: k.function }] : []));
    this.faults = this.contacts.flatMap((k) => [
      { contact: k.id, mode: "stuck-open" as const },
      { contact: k.id, mode: "stuck-closed" as const },
    ]);
  }

  /** Row index -> states, the last condition fastest (spec 1.1). */
  states(index: number): States {
    const out: States = {};
    for (let i = this.d.conditions.length - 1; i >= 0; i--) {
      const c = this.d.conditions[i];
      out[c.id] = c.states[index % c.states.length];
      index = Math.floor(index / c.states.length);
    }
    return out;
  }

  private netOf: Map<string, string> | null = null;
  /** Terminal -> a name of its net: the connected components of the wire graph. */
  private nets(): Map<string, string> {
    if (this.netOf) return this.netOf;
    const g = new Graph({ type: "undirected", multi: true, allowSelfLoops: true });
    for (const k of this.d.components) for (const t of TERMINALS[k.type]) g.addNode(`${k.id}.${t}`);
    for (const w of this.d.wires) g.addEdge(w.from, w.to);
    this.netOf = new Map();
    for (const group of connectedComponents(g)) for (const t of group) this.netOf.set(t, group[0]);
    return this.netOf;
  }

  /** What the controller sees in a row, with a fault applied (spec 1.3, 1.4, 1.7). */
  see(states: States, fault: Fault = null, remember = true): Seen {
    const key = remember ? JSON.stringify([states, fault]) : "";
    const hit = remember ? this.cache.get(key) : undefined;
    if (hit) return hit;
    // Nets: components of the wire graph (graphology), once; then closed contacts join nets.
    const nets = this.nets();
    const parent = new Map<string, string>();
    const find = (x: string): string => {
      while (parent.has(x)) x = parent.get(x)!;
      return x;
    };
    for (const k of this.contacts) {
      const closed = fault?.contact === k.id ? fault.mode === "stuck-closed" : k.closedIn.includes(states[k.condition]);
      if (!closed) continue;
      const a = find(nets.get(`${k.id}.1`)!);
      const b = find(nets.get(`${k.id}.2`)!);
      if (a !== b) parent.set(a, b);
    }
    const fed = new Set(this.d.components.filter((k) => k.type === "supply").map((k) => find(nets.get(`${k.id}.+`)!)));
    const live = { has: (t: string) => fed.has(find(nets.get(t)!)) };
    const inputs: Record<string, boolean> = {};
    for (const x of this.inputs) inputs[x.id] = live.has(`${x.id}.in`);
    const of = (fn: string) => this.inputs.find((x) => x.fn === fn);
    const on = (fn: string, absent: boolean) => (of(fn) ? inputs[of(fn)!.id] : absent);
    const hasF = !!of("forward");
    const hasR = !!of("reverse");
    const f = on("forward", false);
    const r = on("reverse", false);
    const dir: Dir =
      !hasF && !hasR
        ? "forward"
        : !hasR
          ? f
            ? "forward"
            : "neutral"
          : !hasF
            ? r
              ? "reverse"
              : "forward"
            : f && r
              ? "conflict"
              : f
                ? "forward"
                : r
                  ? "reverse"
                  : "neutral";
    const t = this.d.controller.throttle;
    const ts = states[t.condition];
    const throttle = t.released.includes(ts) ? "released" : t.applied.includes(ts) ? "applied" : "fault";
    const view: View = { powered: on("power", true), enabled: on("enable", true), dir, braking: on("brake", false), throttle };
    const drive =
      view.powered &&
      view.enabled &&
      (dir === "forward" || dir === "reverse") &&
      !(view.braking && (this.d.controller.brakeCutsDrive ?? true)) &&
      throttle === "applied";
    const out = { inputs, view, drive };
    if (remember) this.cache.set(key, out);
    return out;
  }

  /** One step of spec 1.5 into `v`; null memory: the controller was off before. */
  step(m: Memory | null, v: View): { memory: Memory; drive: boolean; armed: string[] } {
    const p: View = m ? m.p : { powered: false, enabled: false, dir: "neutral", braking: false, throttle: v.throttle };
    const moving = (x: View) => x.dir === "forward" || x.dir === "reverse";
    const listed = new Set(this.d.controller.lockouts ?? []);
    const event: Record<(typeof LOCKOUT_IDS)[number], boolean> = {
      "power-on": v.powered && !p.powered,
      "enable-restore": v.enabled && !p.enabled,
      "direction-engage": moving(v) && !moving(p),
      "brake-release": !v.braking && p.braking,
      "throttle-fault": v.throttle === "fault",
    };
    const armed = LOCKOUT_IDS.filter((l) => listed.has(l) && event[l]);
    const L = !v.powered ? false : ((m?.L ?? false) || armed.length > 0) && v.throttle !== "released";
    const steady =
      v.powered && v.enabled && moving(v) && !(v.braking && (this.d.controller.brakeCutsDrive ?? true)) && v.throttle === "applied";
    const drive = steady && !L;
    return { memory: { p: v, drive, L }, drive, armed };
  }

  holds(p: Predicate, s: States): boolean {
    if ("cond" in p) return p.in.includes(s[p.cond]);
    if ("all" in p) return p.all.every((q) => this.holds(q, s));
    if ("any" in p) return p.any.some((q) => this.holds(q, s));
    if ("not" in p) return !this.holds(p.not, s);
    return true;
  }

  /** Rows where the fault changes some input: those in which a bench can see it (the first `limit`). */
  revealingRows(fault: Fault, limit = Infinity): number[] {
    const out: number[] = [];
    for (let i = 0; i < this.rows && out.length < limit; i++) {
      const s = this.states(i);
      const a = this.see(s, null, false).inputs;
      const b = this.see(s, fault, false).inputs;
      if (Object.keys(a).some((id) => a[id] !== b[id])) out.push(i);
    }
    return out;
  }

  /**
   * Does a row step (throttle to a released state, the other conditions, the throttle last) show the
   * row's steady outcome through at least one released state?
   */
  approachSteady(i: number): boolean {
    const t = this.d.controller.throttle;
    const s = this.states(i);
    if (t.released.length === 0 || t.released.includes(s[t.condition])) return true;
    return t.released.some((r) => {
      const settled = this.step(null, this.see({ ...s, [t.condition]: r }).view).memory;
      return !this.step(settled, this.see(s).view).memory.L;
    });
  }

  /** Rule test rows (decisions 050 and 134), by brute force over every row. */
  testRows(ruleId: string): number[] {
    const rule = this.d.rules.find((r) => r.id === ruleId)!;
    const out: number[] = [];
    if (rule.type === "no-restart") return out;
    const when = (rule as { when: Predicate }).when;
    for (let i = 0; i < this.rows; i++) {
      const s = this.states(i);
      if (!this.holds(when, s) || !this.approachSteady(i)) continue;
      if (rule.type !== "inhibit") {
        out.push(i);
        continue;
      }
      const conds = new Set<string>();
      const walk = (p: Predicate) => {
        if ("cond" in p) conds.add(p.cond);
        if ("all" in p) p.all.forEach(walk);
        if ("any" in p) p.any.forEach(walk);
        if ("not" in p) walk(p.not);
      };
      walk(when);
      let variants: States[] = [s];
      for (const id of conds)
        variants = variants.flatMap((v) => this.d.conditions.find((c) => c.id === id)!.states.map((x) => ({ ...v, [id]: x })));
      const forbidden = (v: States) => (rule.forbid === "drive" ? this.see(v).drive : this.see(v).inputs[rule.forbid.energized]);
      if (variants.some((v) => !this.holds(when, v) && forbidden(v))) out.push(i);
    }
    return out;
  }
}

const key = (s: States) =>
  JSON.stringify(
    Object.keys(s)
      .sort()
      .map((k) => [k, s[k]]),
  );
const faultTag = (f: NonNullable<Fault>) => `fault:${f.contact}:${f.mode}`;

type Replayed = { drive: boolean; latched: boolean; inputs: Record<string, boolean>; memory: Memory; causes: string[] };

/** Replays a plan's moves from its start row with a fault applied; one observation per step. */
export function replayPlan(ref: Reference, plan: BenchPlan, fault: Fault = null, problems: string[] = []): Replayed[] {
  let states = { ...plan.start.set };
  let memory = ref.step(null, ref.see(states, fault).view).memory;
  const out: Replayed[] = [];
  for (const s of plan.steps) {
    let causes: string[] = [];
    for (const m of s.moves ?? []) {
      if (states[m.condition] !== m.from)
        problems.push(`step ${s.n}: move of ${m.condition} from ${m.from}, but it is ${states[m.condition]}`);
      states = { ...states, [m.condition]: m.to };
      const wasLatched = memory.L;
      const r = ref.step(memory, ref.see(states, fault).view);
      if (r.memory.L && !wasLatched) causes = r.armed;
      memory = r.memory;
    }
    if (key(states) !== key(s.set)) problems.push(`step ${s.n}: the moves end in ${key(states)}, not in the step's conditions`);
    out.push({ drive: memory.drive, latched: memory.L, inputs: ref.see(states, fault).inputs, memory, causes });
  }
  return out;
}

function permutations<T>(xs: T[]): T[][] {
  if (xs.length <= 1) return [xs];
  return xs.flatMap((x, i) => permutations([...xs.slice(0, i), ...xs.slice(i + 1)]).map((p) => [x, ...p]));
}

/** Every problem with a plan, found independently of the generator and the engine; [] when every claim holds. */
export function checkPlan(d: Design, plan: BenchPlan): string[] {
  const ref = new Reference(d);
  const problems: string[] = [];
  const plain = replayPlan(ref, plan, null, problems);

  // Start: throttle where the procedure begins, no drive.
  const start = ref.step(null, ref.see(plan.start.set).view);
  if (start.drive !== plan.start.expect.drive) problems.push("start: drive differs");
  if (ref.see(plan.start.set).drive) problems.push("start: the start row drives");

  // Every expectation as the moves replay.
  plan.steps.forEach((s, k) => {
    const o = plain[k];
    if (s.n !== k + 1) problems.push(`step ${k + 1} is numbered ${s.n}`);
    if (s.expect.drive !== o.drive) problems.push(`step ${s.n}: expects drive ${s.expect.drive}, replay gives ${o.drive}`);
    if ((s.expect.latched ?? false) !== o.latched)
      problems.push(`step ${s.n}: expects latched ${s.expect.latched}, replay gives ${o.latched}`);
    for (const x of ref.inputs)
      if (s.expect.inputs[x.id] !== o.inputs[x.id])
        problems.push(`step ${s.n}: input ${x.id} expected ${s.expect.inputs[x.id]}, replay gives ${o.inputs[x.id]}`);
    if (Object.keys(s.expect.inputs).length !== ref.inputs.length)
      problems.push(`step ${s.n}: expects ${Object.keys(s.expect.inputs).length} inputs`);
    const throttleHeld = (s.moves ?? []).some(
      (m) => m.condition === d.controller.throttle.condition && !d.controller.throttle.released.includes(m.to),
    );
    if (
      (throttleHeld || !d.controller.throttle.released.includes(s.set[d.controller.throttle.condition])) &&
      !/drive wheels/.test(s.caution ?? "")
    ) {
      problems.push(`step ${s.n}: the throttle is applied without the lift-the-wheels caution`);
    }
    // "In any order": every order of those moves leaves the controller in the same place.
    if (s.anyOrder) {
      const [a, b] = s.anyOrder;
      const before = k === 0 ? ref.step(null, ref.see(plan.start.set).view).memory : plain[k - 1].memory;
      const from = k === 0 ? plan.start.set : plan.steps[k - 1].set;
      const moves = s.moves!;
      const orders = permutations(moves.slice(a, b)).slice(0, 24);
      const outcomes = new Set(
        orders.map((mid) => {
          let st = { ...from };
          let m = before;
          for (const mv of [...moves.slice(0, a), ...mid, ...moves.slice(b)]) {
            st = { ...st, [mv.condition]: mv.to };
            m = ref.step(m, ref.see(st).view).memory;
          }
          return JSON.stringify(m);
        }),
      );
      if (outcomes.size !== 1) problems.push(`step ${s.n}: the moves said to be in any order give different outcomes in different orders`);
    }
  });

  // What each step reveals: exactly the faults whose replay differs there.
  const revealed = new Set<string>();
  for (const f of ref.faults) {
    const tag = faultTag(f!);
    const faulty = replayPlan(ref, plan, f);
    plan.steps.forEach((s, k) => {
      const a = plain[k];
      const b = faulty[k];
      const differs = a.drive !== b.drive || a.latched !== b.latched || ref.inputs.some((x) => a.inputs[x.id] !== b.inputs[x.id]);
      if (differs) revealed.add(tag);
      if (differs !== (s.reveals ?? []).includes(tag))
        problems.push(`step ${s.n}: ${tag} ${differs ? "shows here but is not listed" : "is listed but does not show here"}`);
    });
  }

  // Every fault some row reveals is revealed; every other one is listed with a reason.
  const uncovered = new Map(plan.uncovered.map((u) => [u.item, u.reason]));
  for (const f of ref.faults) {
    const tag = faultTag(f!);
    const revealable = ref.revealingRows(f, 1).length > 0;
    if (revealable && !revealed.has(tag)) problems.push(`${tag}: revealable but no step reveals it`);
    if (!revealable && !/^No combination of conditions changes any controller input/.test(uncovered.get(tag) ?? ""))
      problems.push(`${tag}: unrevealable but not explained`);
    if (revealable && uncovered.has(tag)) problems.push(`${tag}: revealable but listed as uncovered`);
  }

  // Rules: the covering step is a test row shown steady; a rule with a test row is covered.
  const ruleSteps = new Map<string, number>();
  plan.steps.forEach((s, k) => s.covers.filter((x) => x.startsWith("rule:")).forEach((x) => ruleSteps.set(x.slice(5), k)));
  for (const r of d.rules) {
    if (r.type === "no-restart") continue;
    const rows = new Set(ref.testRows(r.id).map((i) => key(ref.states(i))));
    const k = ruleSteps.get(r.id);
    if (k === undefined) {
      if (rows.size > 0) problems.push(`rule:${r.id}: has test rows but no step`);
      if (!uncovered.has(`rule:${r.id}`)) problems.push(`rule:${r.id}: neither covered nor explained`);
      continue;
    }
    const s = plan.steps[k];
    if (!rows.has(key(s.set))) problems.push(`rule:${r.id}: step ${s.n} is not one of its test rows`);
    if (plain[k].latched || plain[k].drive !== ref.see(s.set).drive)
      problems.push(`rule:${r.id}: step ${s.n} does not show the row's steady outcome`);
  }

  // Lockouts: held off after its event with the throttle held, where an earlier step showed drive.
  for (const l of new Set(d.controller.lockouts ?? [])) {
    const k = plan.steps.findIndex((s) => s.covers.includes(`lockout:${l}`));
    if (k < 0) {
      if (!uncovered.has(`lockout:${l}`)) problems.push(`lockout:${l}: neither checked nor explained`);
      continue;
    }
    const s = plan.steps[k];
    const o = plain[k];
    if (!o.latched || o.drive || !ref.see(s.set).drive)
      problems.push(`lockout:${l}: step ${s.n} does not show drive held off by the latch`);
    if (!o.causes.includes(l)) problems.push(`lockout:${l}: step ${s.n} latches on ${o.causes.join(",") || "nothing"}`);
    const shown = plan.steps.slice(0, k).some((e, j) => key(e.set) === key(s.set) && plain[j].drive);
    if (!shown) problems.push(`lockout:${l}: no earlier step shows drive in the same conditions`);
  }

  if (plan.stats.steps !== plan.steps.length) problems.push("stats.steps is not the number of steps");
  return problems;
}

/**
 * The fewest rows meeting every need, by brute force over distinct need sets: each revealable fault
 * needs a row revealing it, each rule with test rows one of them. Returns null above `maxRows`.
 */
export function fewestRows(d: Design, maxRows = 200, opts: { withDrive?: boolean } = {}): number | null {
  const ref = new Reference(d);
  if (ref.rows > maxRows) return null;
  const needs: Array<Set<number>> = [];
  for (const f of ref.faults) {
    const rows = ref.revealingRows(f);
    if (rows.length > 0) needs.push(new Set(rows));
  }
  for (const r of d.rules) {
    if (r.type === "no-restart") continue;
    const rows = ref.testRows(r.id);
    if (rows.length > 0) needs.push(new Set(rows));
  }
  if (opts.withDrive) {
    const rows = Array.from({ length: ref.rows }, (_, i) => i).filter((i) => ref.see(ref.states(i)).drive && ref.approachSteady(i));
    if (rows.length > 0) needs.push(new Set(rows));
  }
  if (needs.length === 0) return 0;
  // Rows as the sets of needs they meet; equal sets are one choice.
  const options = [
    ...new Set(
      Array.from({ length: ref.rows }, (_, i) =>
        needs
          .map((n, e) => (n.has(i) ? e : -1))
          .filter((e) => e >= 0)
          .join(","),
      ),
    ),
  ]
    .filter((x) => x !== "")
    .map((x) => new Set(x.split(",").map(Number)));
  // Iterative deepening; any cover meets the first unmet need, so branch on the rows meeting it.
  const search = (met: Set<number>, left: number): boolean => {
    if (met.size === needs.length) return true;
    if (left === 0) return false;
    let e = 0;
    while (met.has(e)) e++;
    return options.some((o) => o.has(e) && search(new Set([...met, ...o]), left - 1));
  };
  for (let size = 1; size <= needs.length; size++) if (search(new Set(), size)) return size;
  return needs.length;
}
