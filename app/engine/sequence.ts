// Sequential behaviour (spec 1.5): the lockout latch step, trace replay, and the shortest
// counterexample of a no-restart rule by breadth-first search over the abstract controller state.
import type { CompiledDesign } from "./compile";
import { encodeRow, evaluateRow, rowProblems, type ControllerState, type RowView } from "./rows";
import { viewCode } from "./rules";
import type { Lockout } from "./schema";

const DIR_CODE = { forward: 0, neutral: 1, reverse: 2, conflict: 3 } as const;
const THROTTLE_CODE = { released: 0, applied: 1, fault: 2 } as const;
const NEUTRAL = 1;
const RELEASED = 0;
const APPLIED = 1;
const FAULT = 2;

export function codeOfState(s: ControllerState): number {
  return viewCode(+s.powered, +s.enabled, DIR_CODE[s.direction], +s.braking, THROTTLE_CODE[s.throttle]);
}

const powered = (code: number) => (code & 1) === 1;
const enabled = (code: number) => (code & 2) === 2;
const direction = (code: number) => (code >> 2) & 3;
const braking = (code: number) => (code & 16) === 16;
const throttle = (code: number) => code >> 5;
const moving = (code: number) => direction(code) === 0 || direction(code) === 2;

/** The view before the first step: controller off, throttle where the first row has it. */
export function initialViewCode(firstThrottle: number): number {
  return viewCode(0, 0, NEUTRAL, 0, firstThrottle);
}

export function steadyDriveOf(c: CompiledDesign, code: number): boolean {
  return powered(code) && enabled(code) && moving(code) && !(braking(code) && c.brakeCutsDrive) && throttle(code) === APPLIED;
}

export type StepResult = {
  latched: boolean;
  drive: boolean;
  armed: Lockout[];
  /** Drive turned on at this step with the previous throttle class not released (a no-restart violation). */
  restart: boolean;
};

/** One step of spec 1.5 from previous view `p` (with its latched drive) and latch `latched` to view `v`. */
export function step(c: CompiledDesign, p: number, prevDrive: boolean, latched: boolean, v: number): StepResult {
  const armed: Lockout[] = [];
  for (const l of c.lockouts) {
    let event = false;
    switch (l) {
      case "power-on":
        event = powered(v) && !powered(p);
        break;
      case "enable-restore":
        event = enabled(v) && !enabled(p);
        break;
      case "direction-engage":
        event = moving(v) && !moving(p);
        break;
      case "brake-release":
        event = !braking(v) && braking(p);
        break;
      case "throttle-fault":
        event = throttle(v) === FAULT;
        break;
    }
    if (event) armed.push(l);
  }
  const L = powered(v) ? (latched || armed.length > 0) && throttle(v) !== RELEASED : false;
  const drive = steadyDriveOf(c, v) && !L;
  return { latched: L, drive, armed, restart: !prevDrive && drive && throttle(p) !== RELEASED };
}

/**
 * Shortest sequence of rows ending in a no-restart violation, or null when none exists.
 * `views` maps each controller view present in the table to a representative row; the search runs
 * over (previous view, previous drive, latch), so its size does not depend on the table's.
 */
export function shortestRestart(c: CompiledDesign, views: Map<number, number>): number[] | null {
  const codes = [...views.keys()].sort((a, b) => a - b);
  const STATES = 96 * 4;
  const parent = new Int32Array(STATES).fill(-2);
  const via = new Int32Array(STATES);
  const queue: number[] = [];
  const pathTo = (key: number, last: number): number[] => {
    const out = [last];
    for (let k = key; k >= 0; k = parent[k]) out.push(via[k]);
    return out.reverse().map((code) => views.get(code)!);
  };
  for (const v of codes) {
    const r = step(c, initialViewCode(throttle(v)), false, false, v);
    if (r.restart) return [views.get(v)!];
    const key = v * 4 + (+r.drive << 1) + +r.latched;
    if (parent[key] === -2) {
      parent[key] = -1;
      via[key] = v;
      queue.push(key);
    }
  }
  for (let h = 0; h < queue.length; h++) {
    const key = queue[h];
    const p = key >> 2;
    const prevDrive = (key & 2) === 2;
    const latched = (key & 1) === 1;
    for (const v of codes) {
      const r = step(c, p, prevDrive, latched, v);
      if (r.restart) return pathTo(key, v);
      const next = v * 4 + (+r.drive << 1) + +r.latched;
      if (parent[next] === -2) {
        parent[next] = key;
        via[next] = v;
        queue.push(next);
      }
    }
  }
  return null;
}

export type StepView = {
  /** 1 for the first step. */
  step: number;
  row: RowView;
  /** Lockouts whose event happened at this step. */
  armed: Lockout[];
  /** The latch L after this step. */
  latched: boolean;
  /** drive_t: steady drive and not latched. */
  drive: boolean;
  /** Drive turned on here while the previous throttle class was not released. */
  restart: boolean;
};

/** Replays rows as consecutive steps from power-up (spec 1.5). Throws on an incomplete row. */
export function replayTrace(c: CompiledDesign, rows: Array<Record<string, string>>): StepView[] {
  const out: StepView[] = [];
  let p = -1;
  let prevDrive = false;
  let latched = false;
  rows.forEach((states, t) => {
    const index = encodeRow(c, states);
    if (index < 0) throw new Error(`step ${t + 1}: ${rowProblems(c, states).join("; ")}`);
    const row = evaluateRow(c, index);
    const v = codeOfState(row.controller);
    if (p < 0) p = initialViewCode(throttle(v));
    const r = step(c, p, prevDrive, latched, v);
    out.push({ step: t + 1, row, armed: r.armed, latched: r.latched, drive: r.drive, restart: r.restart });
    p = v;
    prevDrive = r.drive;
    latched = r.latched;
  });
  return out;
}
