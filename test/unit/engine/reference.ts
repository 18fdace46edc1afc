// A deliberately simple, row-at-a-time evaluator written straight from the spec, independent of
// the engine's internals. Tests compare the engine against it; the benchmark times it.
import type { Design, Predicate, RowStates, SingleFault, Verdict } from "../../../app/engine/schema";

type Fault = { component: string; mode: "stuck-open" | "stuck-closed" };

export type RefView = {
  powered: boolean;
  enabled: boolean;
  direction: "forward" | "neutral" | "reverse" | "conflict";
  braking: boolean;
  throttle: "released" | "applied" | "fault";
};

export type RefRow = { inputs: Record<string, boolean>; view: RefView; drive: boolean };

export function refRowCount(d: Design): number {
  return d.conditions.reduce((n, c) => n * c.states.length, 1);
}

/** Row index -> states; the last condition varies fastest. */
export function refDecode(d: Design, index: number): RowStates {
  const out: RowStates = {};
  for (let i = d.conditions.length - 1; i >= 0; i--) {
    const c = d.conditions[i];
    out[c.id] = c.states[index % c.states.length];
    index = Math.floor(index / c.states.length);
  }
  return out;
}

export function refHolds(p: Predicate, states: RowStates): boolean {
  if ("cond" in p) return p.in.includes(states[p.cond]);
  if ("all" in p) return p.all.every((x) => refHolds(x, states));
  if ("any" in p) return p.any.some((x) => refHolds(x, states));
  if ("not" in p) return !refHolds(p.not, states);
  return true;
}

/** Whether `when` holds in at least one row, by trying every row. */
export function refMatchesSomeRow(d: Design, when: Predicate): boolean {
  const n = refRowCount(d);
  for (let i = 0; i < n; i++) if (refHolds(when, refDecode(d, i))) return true;
  return false;
}

/** Spec 1.6 (1.1): the paths of the rules whose `when` holds in no row (each makes the design invalid). */
export function refEmptyRulePaths(d: Design): string[] {
  return d.rules.flatMap((r, i) => (r.type !== "no-restart" && !refMatchesSomeRow(d, r.when) ? [`rules[${i}].when`] : []));
}

/** Energized inputs by breadth-first search over terminals (wires and closed contacts are edges). */
export function refInputs(d: Design, states: RowStates, faults: Fault[] = []): Record<string, boolean> {
  const edges = new Map<string, string[]>();
  const link = (a: string, b: string) => {
    edges.set(a, [...(edges.get(a) ?? []), b]);
    edges.set(b, [...(edges.get(b) ?? []), a]);
  };
  for (const w of d.wires) link(w.from, w.to);
  for (const comp of d.components) {
    if (comp.type !== "contact") continue;
    const fault = faults.find((f) => f.component === comp.id);
    const closed = fault ? fault.mode === "stuck-closed" : comp.closedIn.includes(states[comp.condition]);
    if (closed) link(`${comp.id}.1`, `${comp.id}.2`);
  }
  const seen = new Set<string>();
  const queue = d.components.filter((c) => c.type === "supply").map((c) => `${c.id}.+`);
  for (const t of queue) seen.add(t);
  while (queue.length > 0) {
    const t = queue.shift()!;
    for (const u of edges.get(t) ?? []) {
      if (!seen.has(u)) {
        seen.add(u);
        queue.push(u);
      }
    }
  }
  const out: Record<string, boolean> = {};
  for (const comp of d.components) if (comp.type === "input") out[comp.id] = seen.has(`${comp.id}.in`);
  return out;
}

export function refRow(d: Design, states: RowStates, faults: Fault[] = []): RefRow {
  const inputs = refInputs(d, states, faults);
  const byFn = (fn: string) => d.components.find((c) => c.type === "input" && c.function === fn)?.id;
  const live = (fn: string, absent: boolean) => {
    const id = byFn(fn);
    return id === undefined ? absent : inputs[id];
  };
  const hasF = byFn("forward") !== undefined;
  const hasR = byFn("reverse") !== undefined;
  const f = live("forward", false);
  const r = live("reverse", false);
  let direction: RefView["direction"];
  if (!hasF && !hasR) direction = "forward";
  else if (hasF && !hasR) direction = f ? "forward" : "neutral";
  else if (!hasF && hasR) direction = r ? "reverse" : "forward";
  else direction = f && r ? "conflict" : f ? "forward" : r ? "reverse" : "neutral";
  const t = d.controller.throttle;
  const ts = states[t.condition];
  const throttle = t.released.includes(ts) ? "released" : t.applied.includes(ts) ? "applied" : "fault";
  const view: RefView = {
    powered: live("power", true),
    enabled: live("enable", true),
    direction,
    braking: live("brake", false),
    throttle,
  };
  const cuts = d.controller.brakeCutsDrive ?? true;
  const drive =
    view.powered &&
    view.enabled &&
    (direction === "forward" || direction === "reverse") &&
    !(view.braking && cuts) &&
    throttle === "applied";
  return { inputs, view, drive };
}

export type RefSeqState = { p: RefView; prevDrive: boolean; L: boolean };

export function refInitial(firstThrottle: RefView["throttle"]): RefSeqState {
  return {
    p: { powered: false, enabled: false, direction: "neutral", braking: false, throttle: firstThrottle },
    prevDrive: false,
    L: false,
  };
}

/** One step of spec 1.5; returns the next state, drive_t and whether it is a no-restart violation. */
export function refStep(d: Design, s: RefSeqState, row: RefRow): { next: RefSeqState; drive: boolean; violation: boolean } {
  const v = row.view;
  const p = s.p;
  const moving = (x: RefView) => x.direction === "forward" || x.direction === "reverse";
  const lockouts = new Set(d.controller.lockouts ?? []);
  const armed =
    (lockouts.has("power-on") && v.powered && !p.powered) ||
    (lockouts.has("enable-restore") && v.enabled && !p.enabled) ||
    (lockouts.has("direction-engage") && moving(v) && !moving(p)) ||
    (lockouts.has("brake-release") && !v.braking && p.braking) ||
    (lockouts.has("throttle-fault") && v.throttle === "fault");
  const L = !v.powered ? false : (s.L || armed) && v.throttle !== "released";
  const drive = row.drive && !L;
  const violation = !s.prevDrive && drive && p.throttle !== "released";
  return { next: { p: v, prevDrive: drive, L }, drive, violation };
}

/** Shortest no-restart counterexample by breadth-first search with every row as an edge; null when none. */
export function refRestartTrace(d: Design, rows: RefRow[]): number[] | null {
  const key = (s: RefSeqState) => JSON.stringify([s.p, s.prevDrive, s.L]);
  type Node = { s: RefSeqState; path: number[] };
  let frontier: Node[] = [];
  const seen = new Set<string>();
  for (let i = 0; i < rows.length; i++) {
    const r = refStep(d, refInitial(rows[i].view.throttle), rows[i]);
    if (r.violation) return [i];
    if (!seen.has(key(r.next))) {
      seen.add(key(r.next));
      frontier.push({ s: r.next, path: [i] });
    }
  }
  while (frontier.length > 0) {
    const next: Node[] = [];
    for (const n of frontier) {
      for (let i = 0; i < rows.length; i++) {
        const r = refStep(d, n.s, rows[i]);
        if (r.violation) return [...n.path, i];
        if (!seen.has(key(r.next))) {
          seen.add(key(r.next));
          next.push({ s: r.next, path: [...n.path, i] });
        }
      }
    }
    frontier = next;
  }
  return null;
}

/** Per rule: rows where `when` holds and the bad ones among them (violating / failing), with the first bad row. */
function inhibitCounts(d: Design, faults: Fault[]) {
  const n = refRowCount(d);
  const counts = d.rules.map(() => ({ unsafe: 0, violating: 0, example: -1 }));
  let driveRows = 0;
  const rows: RefRow[] = [];
  for (let i = 0; i < n; i++) {
    const states = refDecode(d, i);
    const row = refRow(d, states, faults);
    rows.push(row);
    if (row.drive) driveRows++;
    d.rules.forEach((rule, k) => {
      if (rule.type === "no-restart" || !refHolds(rule.when, states)) return;
      counts[k].unsafe++;
      const bad = rule.type === "require-drive" ? !row.drive : rule.forbid === "drive" ? row.drive : row.inputs[rule.forbid.energized];
      if (bad) {
        counts[k].violating++;
        if (counts[k].example < 0) counts[k].example = i;
      }
    });
  }
  return { counts, driveRows, rows };
}

/** The whole verdict, row by row, fault by fault (require-drive rules are not re-checked under faults). */
export function refVerdict(d: Design): Verdict {
  const base = inhibitCounts(d, []);
  const trace = d.rules.some((r) => r.type === "no-restart") ? refRestartTrace(d, base.rows) : null;
  const rules = d.rules.map((rule, k) => {
    const c = base.counts[k];
    const example = c.violating > 0 ? { example: refDecode(d, c.example) } : {};
    if (rule.type === "inhibit") {
      return { id: rule.id, holds: c.violating === 0, unsafeRows: c.unsafe, violatingRows: c.violating, ...example };
    }
    if (rule.type === "require-drive") {
      return { id: rule.id, holds: c.violating === 0, demandRows: c.unsafe, failingRows: c.violating, ...example };
    }
    return trace === null ? { id: rule.id, holds: true } : { id: rule.id, holds: false, trace: trace.map((i) => refDecode(d, i)) };
  });
  const singleFaults: SingleFault[] = [];
  const contacts = d.components
    .filter((c) => c.type === "contact")
    .map((c) => c.id)
    .sort();
  for (const id of contacts) {
    for (const mode of ["stuck-closed", "stuck-open"] as const) {
      const faulted = inhibitCounts(d, [{ component: id, mode }]);
      const defeats = d.rules
        .filter((r, k) => r.type === "inhibit" && base.counts[k].violating === 0 && faulted.counts[k].violating > 0)
        .map((r) => r.id);
      if (defeats.length > 0) singleFaults.push({ component: id, mode, defeats });
    }
  }
  return {
    format: "chainproof/verdict@1",
    ok: rules.every((r) => r.holds) && base.driveRows > 0,
    rows: refRowCount(d),
    driveRows: base.driveRows,
    rules,
    singleFaults,
  };
}
