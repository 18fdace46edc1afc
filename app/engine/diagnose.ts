// Why is there no drive in this row? Per dead input, the smallest sets of open contacts whose
// closing would energize it; controller-level reasons in plain words; and which single contact
// fault would explain input readings taken on the bench.
import type { CompiledDesign } from "./compile";
import { encodeRow, evaluateRow, rowProblems, type ControllerState, type RowView } from "./rows";
import type { FaultMode, InputFunction, Lockout } from "./schema";
import { replayTrace } from "./sequence";

export type ContactToClose = {
  contact: string;
  label: string;
  condition: string;
  /** States of the condition in which this contact closes. */
  closeIn: string[];
};

export type InputDiagnosis = {
  input: string;
  label: string;
  function: InputFunction;
  energized: boolean;
  /** For a dead input: every smallest set of open contacts whose closing would energize it. */
  fixes: ContactToClose[][];
  /** No set of contacts can energize this input (it is not wired towards any supply). */
  unreachable: boolean;
  /** More smallest sets exist than were listed. */
  truncated: boolean;
};

export type DriveReasonCode =
  "unpowered" | "not-enabled" | "neutral" | "direction-conflict" | "braking" | "throttle-released" | "throttle-fault" | "lockout-latched";

export type DriveReason = { code: DriveReasonCode; message: string; input?: string; lockouts?: Lockout[] };

export type Diagnosis = {
  row: number;
  states: Record<string, string>;
  controller: ControllerState;
  /** Steady drive of the row (spec 1.4). */
  steadyDrive: boolean;
  /** drive_t after the history when one is given, else the steady drive. */
  drive: boolean;
  /** The lockout latch after the history (false without history). */
  latched: boolean;
  inputs: InputDiagnosis[];
  /** Why drive is off (empty when drive is on). */
  reasons: DriveReason[];
};

const MAX_FIXES = 50;
const MAX_CHECKS = 200_000;
const q = JSON.stringify;

function rowIndexOf(c: CompiledDesign, states: Record<string, string>): number {
  const index = encodeRow(c, states);
  if (index < 0 || Object.keys(states).some((k) => !(k in c.conditionIndex))) {
    throw new Error(rowProblems(c, states).join("; "));
  }
  return index;
}

/**
 * Diagnoses one row. With `history` (earlier rows, oldest first) the row is replayed as the step
 * after them from power-up, so a latched lockout is reported; without it only steady drive counts.
 */
export function diagnose(
  c: CompiledDesign,
  states: Record<string, string>,
  opts: { history?: Array<Record<string, string>> } = {},
): Diagnosis {
  const index = rowIndexOf(c, states);
  const view = evaluateRow(c, index);
  let drive = view.drive;
  let latched = false;
  let latchedBy: Lockout[] = [];
  if (opts.history) {
    const steps = replayTrace(c, [...opts.history, view.states]);
    for (const s of steps) {
      if (!s.latched) latchedBy = [];
      else for (const l of s.armed) if (!latchedBy.includes(l)) latchedBy.push(l);
    }
    const last = steps[steps.length - 1];
    drive = last.drive;
    latched = last.latched;
  }

  const inputs = c.inputs.map((input): InputDiagnosis => {
    const energized = view.inputs[input.id];
    const base = { input: input.id, label: input.label, function: input.fn, energized };
    if (energized) return { ...base, fixes: [], unreachable: false, truncated: false };
    return { ...base, ...smallestFixes(c, view, input.net) };
  });

  const reasons: DriveReason[] = drive ? [] : driveReasons(c, view, latched, latchedBy);
  return {
    row: index,
    states: view.states,
    controller: view.controller,
    steadyDrive: view.drive,
    drive,
    latched,
    inputs,
    reasons,
  };
}

/** Smallest sets of open contacts whose closing connects `target` to a supply. */
function smallestFixes(
  c: CompiledDesign,
  view: RowView,
  target: number,
): { fixes: ContactToClose[][]; unreachable: boolean; truncated: boolean } {
  const nets = c.nets.length;
  const closed = c.contacts.map((k) => view.contacts[k.id]);
  // 0-1 breadth-first distances (closed contact costs 0, open costs 1) from the supplies and from the target.
  const distances = (starts: number[]): number[] => {
    const dist = new Array<number>(nets).fill(Infinity);
    const deque: number[] = [];
    for (const s of starts) {
      dist[s] = 0;
      deque.push(s);
    }
    while (deque.length > 0) {
      const n = deque.shift()!;
      c.contacts.forEach((k, i) => {
        if (k.netA !== n && k.netB !== n) return;
        const other = k.netA === n ? k.netB : k.netA;
        const d = dist[n] + (closed[i] ? 0 : 1);
        if (d < dist[other]) {
          dist[other] = d;
          if (closed[i]) deque.unshift(other);
          else deque.push(other);
        }
      });
    }
    return dist;
  };
  const fromSupply = distances(c.supplyNets);
  const need = fromSupply[target];
  if (need === Infinity) return { fixes: [], unreachable: true, truncated: false };
  const toTarget = distances([target]);
  // A member of a smallest set lies on a cheapest path through it.
  const candidates = c.contacts
    .map((k, i) => i)
    .filter((i) => {
      if (closed[i]) return false;
      const k = c.contacts[i];
      return Math.min(fromSupply[k.netA] + toTarget[k.netB], fromSupply[k.netB] + toTarget[k.netA]) + 1 <= need;
    });

  const parent = new Int32Array(nets);
  const find = (x: number): number => {
    while (parent[x] !== x) x = parent[x] = parent[parent[x]];
    return x;
  };
  const energizes = (extra: number[]): boolean => {
    for (let n = 0; n < nets; n++) parent[n] = n;
    const join = (a: number, b: number) => {
      const ra = find(a);
      const rb = find(b);
      if (ra !== rb) parent[ra] = rb;
    };
    c.contacts.forEach((k, i) => closed[i] && join(k.netA, k.netB));
    for (const i of extra) join(c.contacts[i].netA, c.contacts[i].netB);
    const t = find(target);
    return c.supplyNets.some((s) => find(s) === t);
  };

  const sets: number[][] = [];
  let checks = 0;
  let truncated = false;
  const pick: number[] = [];
  const walk = (start: number): void => {
    if (truncated) return;
    if (pick.length === need) {
      if (++checks > MAX_CHECKS) {
        truncated = true;
        return;
      }
      if (energizes(pick)) {
        if (sets.length >= MAX_FIXES) truncated = true;
        else sets.push(pick.slice());
      }
      return;
    }
    for (let k = start; k <= candidates.length - (need - pick.length); k++) {
      pick.push(candidates[k]);
      walk(k + 1);
      pick.pop();
    }
  };
  walk(0);
  const describe = (i: number): ContactToClose => {
    const k = c.contacts[i];
    return { contact: k.id, label: k.label, condition: c.conditions[k.cond].id, closeIn: k.closedIn.slice() };
  };
  return { fixes: sets.map((s) => s.map(describe)), unreachable: false, truncated };
}

function driveReasons(c: CompiledDesign, view: RowView, latched: boolean, latchedBy: Lockout[]): DriveReason[] {
  const out: DriveReason[] = [];
  const ctl = view.controller;
  const input = (fn: InputFunction) => {
    const i = c.inputOf[fn];
    return i < 0 ? undefined : c.inputs[i];
  };
  const name = (fn: InputFunction) => {
    const x = input(fn)!;
    return x.label !== x.id ? `${q(x.id)} (${x.label})` : q(x.id);
  };
  if (!ctl.powered) {
    out.push({ code: "unpowered", input: input("power")!.id, message: `The controller has no power: input ${name("power")} is dead.` });
  }
  if (!ctl.enabled) {
    out.push({ code: "not-enabled", input: input("enable")!.id, message: `Drive is not enabled: input ${name("enable")} is dead.` });
  }
  if (ctl.direction === "neutral") {
    const fwd = input("forward");
    const rev = input("reverse");
    out.push({
      code: "neutral",
      message:
        fwd && rev
          ? `No direction is selected: neither ${name("forward")} nor ${name("reverse")} is live.`
          : `No direction is selected: ${name("forward")} is dead, which the controller reads as neutral.`,
    });
  }
  if (ctl.direction === "conflict") {
    out.push({
      code: "direction-conflict",
      message: `Forward ${name("forward")} and reverse ${name("reverse")} are both live; the controller will not pick one.`,
    });
  }
  if (ctl.braking && c.brakeCutsDrive) {
    out.push({
      code: "braking",
      input: input("brake")!.id,
      message: `The brake input ${name("brake")} is live, and braking cuts the drive.`,
    });
  }
  const t = c.conditions[c.throttle.cond];
  const state = view.states[t.id];
  if (ctl.throttle === "released") {
    out.push({ code: "throttle-released", message: `The throttle (${q(t.id)}) is ${q(state)}, which counts as released.` });
  }
  if (ctl.throttle === "fault") {
    out.push({ code: "throttle-fault", message: `The throttle (${q(t.id)}) is ${q(state)}, which counts as a throttle fault.` });
  }
  if (latched) {
    out.push({
      code: "lockout-latched",
      lockouts: latchedBy,
      message: `A lockout is holding the drive off (${latchedBy.join(", ")}); release the throttle to clear it.`,
    });
  }
  return out;
}

export type ReadingsExplanation = {
  consistent: boolean;
  /** Single faults that reproduce every measured reading, most likely first. */
  explanations: Array<{ component: string; mode: FaultMode; otherInputsChanged: string[] }>;
};

/**
 * Which single contact fault explains measured input readings that the fault-free design cannot
 * produce in this row. Ordering: fewest unmeasured inputs changed, then fewest nets changed,
 * then component id (code-unit order), stuck-closed before stuck-open.
 */
export function explainReadings(c: CompiledDesign, states: Record<string, string>, measured: Record<string, boolean>): ReadingsExplanation {
  const index = rowIndexOf(c, states);
  for (const id of Object.keys(measured)) {
    if (!(id in c.inputIndex)) throw new Error(`no input with id ${q(id)}`);
  }
  const matches = (v: RowView) => Object.entries(measured).every(([id, on]) => v.inputs[id] === on);
  const base = evaluateRow(c, index);
  if (matches(base)) return { consistent: true, explanations: [] };
  const baseNets = new Set(base.nets.energized);
  const found: Array<{ component: string; mode: FaultMode; otherInputsChanged: string[]; nets: number }> = [];
  for (const k of c.contacts) {
    for (const mode of ["stuck-closed", "stuck-open"] as const) {
      if (base.contacts[k.id] === (mode === "stuck-closed")) continue; // no change in this row
      const v = evaluateRow(c, index, [{ component: k.id, mode }]);
      if (!matches(v)) continue;
      const otherInputsChanged = c.inputs.filter((x) => !(x.id in measured) && v.inputs[x.id] !== base.inputs[x.id]).map((x) => x.id);
      const now = new Set(v.nets.energized);
      let nets = 0;
      for (let n = 0; n < c.nets.length; n++) if (now.has(n) !== baseNets.has(n)) nets++;
      found.push({ component: k.id, mode, otherInputsChanged, nets });
    }
  }
  found.sort(
    (a, b) =>
      a.otherInputsChanged.length - b.otherInputsChanged.length ||
      a.nets - b.nets ||
      (a.component < b.component ? -1 : a.component > b.component ? 1 : 0) ||
      (a.mode === b.mode ? 0 : a.mode === "stuck-closed" ? -1 : 1),
  );
  return {
    consistent: false,
    explanations: found.map(({ component, mode, otherInputsChanged }) => ({ component, mode, otherInputsChanged })),
  };
}
