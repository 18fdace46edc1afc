// What a no-restart counterexample means, step by step: what changed since the step before (the
// conditions and, through the wiring, the controller's view), where the lockout latch stands, and
// which lockout that is switched off would have caught the start on a held throttle. "Would have
// caught" is found by replaying the same steps with that one lockout switched on (spec 1.5).
import { lockoutName } from "../lib/lockouts";
import {
  compileDesign,
  LOCKOUTS,
  replayTrace,
  validateDesign,
  type ControllerState,
  type Design,
  type Lockout,
  type RowStates,
  type StepView,
} from "../engine";

export type Change = { cond: string; from: string; to: string };

export type ExplainedStep = {
  step: number;
  states: RowStates;
  /** Conditions whose state differs from the step before (every condition at step 1 is new). */
  changed: Change[];
  controller: ControllerState;
  /** The controller's view, in words, where it differs from the step before (or from "off" at step 1). */
  controllerChanges: string[];
  /** Lockouts (switched on) whose event happened at this step. */
  armed: Lockout[];
  latched: boolean;
  drive: boolean;
  /** Drive came on here with the throttle not released at the step before: the violation. */
  restart: boolean;
  /** Lockouts switched off that, switched on alone, would set the latch here and keep it to the violating step. */
  wouldArm: Lockout[];
};

export type TraceExplanation = {
  steps: ExplainedStep[];
  /** 1-based step of the first start on a held throttle (0: none in these steps). */
  violatingStep: number;
  /** The lockouts switched off that would each, alone, keep drive off at the violating step. */
  catchers: Lockout[];
};

/** The names people read (one source: lib/lockouts, decision 137). */
export const LOCKOUT_NAME: Record<Lockout, string> = Object.fromEntries(LOCKOUTS.map((l) => [l, lockoutName(l)])) as Record<
  Lockout,
  string
>;

const OFF: ControllerState = { powered: false, enabled: false, direction: "neutral", braking: false, throttle: "released" };

function controllerChanges(prev: ControllerState, now: ControllerState): string[] {
  const out: string[] = [];
  if (prev.powered !== now.powered) out.push(now.powered ? "power came on" : "power went off");
  if (prev.enabled !== now.enabled) out.push(now.enabled ? "enable came on" : "enable went off");
  if (prev.direction !== now.direction) out.push(`direction ${prev.direction} → ${now.direction}`);
  if (prev.braking !== now.braking) out.push(now.braking ? "brake applied" : "brake released");
  if (prev.throttle !== now.throttle) out.push(`throttle ${prev.throttle} → ${now.throttle}`);
  return out;
}

/** Explains `rows` as steps of `doc`; null when the design is not valid (nothing to replay). */
export function explainTrace(doc: Design, rows: RowStates[]): TraceExplanation | null {
  const v = validateDesign(doc);
  if (!v.ok || rows.length === 0) return null;
  const design = v.design;
  const base = replayTrace(compileDesign(design), rows);
  const violating = base.findIndex((s) => s.restart) + 1;
  const on = new Set(design.controller.lockouts ?? []);
  // Each lockout that is off, replayed alone on top of those that are on.
  const alt = new Map<Lockout, StepView[]>();
  for (const l of LOCKOUTS) {
    if (on.has(l)) continue;
    const withIt: Design = { ...design, controller: { ...design.controller, lockouts: LOCKOUTS.filter((x) => x === l || on.has(x)) } };
    alt.set(l, replayTrace(compileDesign(withIt), rows));
  }
  const catchers = violating > 0 ? [...alt].filter(([, steps]) => !steps[violating - 1].drive).map(([l]) => l) : [];
  const steps = base.map((s, i): ExplainedStep => {
    const before = i === 0 ? null : base[i - 1];
    const prevStates = before?.row.states;
    const changed = Object.entries(s.row.states)
      .filter(([cond, st]) => !prevStates || prevStates[cond] !== st)
      .map(([cond, st]) => ({ cond, from: prevStates?.[cond] ?? "", to: st }));
    // The controller was off before step 1, its throttle already where step 1 has it (spec 1.5).
    const prevController = before?.row.controller ?? { ...OFF, throttle: s.row.controller.throttle };
    const wouldArm =
      violating > 0 && i < violating
        ? catchers.filter((l) => {
            const steps = alt.get(l)!;
            // Armed here, and the latch it sets is still holding at the violating step.
            if (!steps[i].armed.includes(l) || !steps[i].latched) return false;
            return steps.slice(i, violating).every((x) => x.latched);
          })
        : [];
    return {
      step: s.step,
      states: s.row.states,
      changed,
      controller: s.row.controller,
      controllerChanges: controllerChanges(prevController, s.row.controller),
      armed: s.armed,
      latched: s.latched,
      drive: s.drive,
      restart: s.restart,
      wouldArm,
    };
  });
  return { steps, violatingStep: violating, catchers };
}
