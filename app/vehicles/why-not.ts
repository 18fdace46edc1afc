// "Why won't it drive?": turns the engine's diagnosis of one row into the list a technician works
// through, in the order they would check it (power, enable, direction, brake, throttle, lockout).
// Pure TypeScript for the browser; every fact comes from the engine (diagnose, evaluateRow,
// explainReadings), only the wording and the ordering are ours (decision 073).
import {
  diagnose,
  encodeRow,
  replayTrace,
  smallestChange,
  type RestoreGoal,
  type SmallestChange,
  evaluateRow,
  explainReadings,
  type CompiledDesign,
  type ContactComponent,
  type Diagnosis,
  type FaultMode,
  type InputFunction,
  type RowView,
} from "../engine";
import { lockoutName } from "../lib/lockouts";
import { ISOLATE_FIRST } from "../lib/safety";

export type WireEnd = { terminal: string; to: string[] };

/** One contact to check: where it is, its state now, and the states that would give the wanted position. */
export type ContactCheck = {
  contact: string;
  label: string;
  part?: string;
  condition: string;
  conditionLabel: string;
  state: string;
  /** "close": it is open and must close; "open": it is closed and must open. */
  want: "close" | "open";
  /** Condition states in which the contact is in the wanted position. */
  targetStates: string[];
  terminals: WireEnd[];
};

/** One condition to change, in a technician's words. */
export type ChangeStep = { condition: string; conditionLabel: string; from: string; to: string };

/** A smallest change of conditions: what to set, and the rows to set it through, in order. */
export type ChangeOption = {
  changes: ChangeStep[];
  /** A lockout latches on the way: the throttle must go back to rest and be applied again. */
  cycleThrottle: boolean;
  /**
   * Even after that a lockout holds drive off (the throttle's own contacts re-arm it when it is
   * applied): these conditions give drive in the steady table, but not when reached this way.
   */
  heldOff: boolean;
  /** The conditions after each move (the Apply button replays them as taps). */
  steps: Array<Record<string, string>>;
};

/** The smallest change of conditions that reaches a goal, or none: then only a wiring fault explains it. */
export type ChangeAdvice = { kind: "none" } | { kind: "change"; size: number; options: ChangeOption[]; count: number };

export type Blocker = {
  code: Diagnosis["reasons"][number]["code"];
  title: string;
  advice: string;
  /** The smallest change of conditions that clears this blocker (absent for a latched lockout). */
  change?: ChangeAdvice;
  /**
   * Where to measure: smallest sets of contacts in the way, each set one that some setting of the
   * conditions closes (or opens) together. Sets no setting can give are left out.
   */
  contactSets: ContactCheck[][];
  /** The engine listed only some of the smallest sets. */
  truncated?: boolean;
  /** No contact change can bring the input live (it is not wired towards a supply). */
  unreachable?: boolean;
};

export type WhyNot = {
  drive: boolean;
  steadyDrive: boolean;
  latched: boolean;
  row: RowView;
  /** The smallest change of conditions that brings drive back (size 0 and no options when it runs). */
  restore: ChangeAdvice;
  blockers: Blocker[];
};

export { lockoutName };

const list = (xs: string[], last = "or") => (xs.length <= 1 ? xs.join("") : `${xs.slice(0, -1).join(", ")} ${last} ${xs[xs.length - 1]}`);

/** The other ends of every wire at each terminal of a component, named for a technician. */
export function wiresAt(c: CompiledDesign, componentId: string): WireEnd[] {
  const comp = c.design.components.find((x) => x.id === componentId);
  if (!comp) return [];
  const labelOf = (terminal: string) => {
    const [id] = terminal.split(".");
    const other = c.design.components.find((x) => x.id === id);
    return other?.label && other.label !== id ? `${terminal} (${other.label})` : terminal;
  };
  const terms = comp.type === "contact" ? ["1", "2"] : comp.type === "supply" ? ["+"] : comp.type === "junction" ? ["j"] : ["in"];
  return terms.map((t) => {
    const here = `${componentId}.${t}`;
    const to: string[] = [];
    for (const w of c.design.wires) {
      if (w.from === here) to.push(labelOf(w.to));
      else if (w.to === here) to.push(labelOf(w.from));
    }
    return { terminal: here, to };
  });
}

function contactCheck(c: CompiledDesign, row: RowView, id: string, want: "close" | "open"): ContactCheck {
  const k = c.design.components.find((x) => x.id === id) as ContactComponent;
  const cond = c.conditions[c.conditionIndex[k.condition]];
  const targetStates = want === "close" ? k.closedIn.slice() : cond.states.filter((s) => !k.closedIn.includes(s));
  return {
    contact: id,
    label: k.label ?? id,
    ...(k.part ? { part: k.part } : {}),
    condition: cond.id,
    conditionLabel: cond.label,
    state: row.states[cond.id],
    want,
    targetStates,
    terminals: wiresAt(c, id),
  };
}

/**
 * Closed contacts whose opening alone (by the engine, as a stuck-open fault) takes the input dead.
 * Those that change no other input come first and alone when there are any: opening the key switch
 * also clears a live brake input, but it is not what a technician should do about it.
 */
function contactsFeeding(c: CompiledDesign, row: RowView, inputId: string): ContactCheck[][] {
  const only: ContactCheck[][] = [];
  const all: ContactCheck[][] = [];
  for (const k of c.contacts) {
    if (!row.contacts[k.id]) continue;
    // A contact that closes in every state can't be opened by changing its condition.
    if (k.closedIn.length >= c.conditions[k.cond].states.length) continue;
    const v = evaluateRow(c, row.index, [{ component: k.id, mode: "stuck-open" }]);
    if (v.inputs[inputId]) continue;
    const check = [contactCheck(c, row, k.id, "open")];
    all.push(check);
    if (c.inputs.every((x) => x.id === inputId || v.inputs[x.id] === row.inputs[x.id])) only.push(check);
  }
  return only.length > 0 ? only : all;
}

/** Some one setting of the conditions puts every contact of the set in its wanted position. */
function settable(c: CompiledDesign, set: ContactCheck[]): boolean {
  const allowed = new Map<string, string[]>();
  for (const k of set) {
    const prev = allowed.get(k.condition);
    allowed.set(k.condition, prev ? prev.filter((s) => k.targetStates.includes(s)) : k.targetStates);
  }
  return [...allowed.values()].every((xs) => xs.length > 0);
}

const restStateOf = (c: CompiledDesign) => {
  const t = c.conditions[c.throttle.cond];
  return t.states.find((_, i) => c.throttle.classOf[i] === 0);
};

/**
 * The moves of one change as taps: every other condition first, the throttle last; with a history,
 * replayed (spec 1.5) and, when a lockout latches on the way, the throttle returned to rest and
 * applied again.
 */
function optionOf(
  c: CompiledDesign,
  states: Record<string, string>,
  changes: ChangeStep[],
  history: Array<Record<string, string>> | undefined,
  goal: RestoreGoal,
): ChangeOption {
  const t = c.conditions[c.throttle.cond].id;
  const target = { ...states };
  for (const ch of changes) target[ch.condition] = ch.to;
  const steps: Array<Record<string, string>> = [];
  const others = changes.filter((ch) => ch.condition !== t);
  if (others.length > 0 && others.length < changes.length) {
    const mid = { ...states };
    for (const ch of others) mid[ch.condition] = ch.to;
    steps.push(mid);
  }
  if (changes.length > 0) steps.push(target);
  let cycleThrottle = false;
  let heldOff = false;
  if (goal === "drive" && history) {
    const drives = (moves: Array<Record<string, string>>) => {
      const trace = replayTrace(c, [...history, states, ...moves]);
      return trace[trace.length - 1].drive;
    };
    const rest = restStateOf(c);
    if (!drives(steps) && rest !== undefined && target[t] !== rest) {
      steps.push({ ...target, [t]: rest }, target);
      cycleThrottle = true;
    }
    heldOff = !drives(steps);
  }
  return { changes, cycleThrottle, heldOff, steps };
}

function adviceOf(
  c: CompiledDesign,
  states: Record<string, string>,
  found: SmallestChange,
  history: Array<Record<string, string>> | undefined,
  goal: RestoreGoal,
): ChangeAdvice {
  if (!found.reachable) return { kind: "none" };
  const label = (id: string) => c.conditions[c.conditionIndex[id]].label;
  return {
    kind: "change",
    size: found.size,
    count: found.count,
    options: found.changes.map((set) =>
      optionOf(
        c,
        states,
        set.map((ch) => ({ ...ch, conditionLabel: label(ch.condition) })),
        history,
        goal,
      ),
    ),
  };
}

/** The smallest change of conditions that reaches `goal` from `states` (after `history`, for drive). */
export function changeFor(
  c: CompiledDesign,
  states: Record<string, string>,
  goal: RestoreGoal,
  history?: Array<Record<string, string>>,
): ChangeAdvice {
  return adviceOf(c, states, smallestChange(c, states, goal), history, goal);
}

function inputName(c: CompiledDesign, fn: InputFunction): string {
  const i = c.inputOf[fn];
  if (i < 0) return fn;
  const x = c.inputs[i];
  return x.label !== x.id ? `${x.label} (${x.id})` : x.id;
}

/** The diagnosis of `states` after `history` (oldest first; omit for steady state), as a checklist. */
export function whyNot(c: CompiledDesign, states: Record<string, string>, history?: Array<Record<string, string>>): WhyNot {
  const d = diagnose(c, states, history ? { history } : {});
  const row = evaluateRow(c, d.row);
  const inputOf = (fn: InputFunction) => d.inputs.find((x) => x.function === fn);
  const setsFor = (fn: InputFunction) => {
    const x = inputOf(fn);
    if (!x) return { contactSets: [] as ContactCheck[][] };
    return {
      contactSets: x.fixes.map((set) => set.map((k) => contactCheck(c, row, k.contact, "close"))).filter((set) => settable(c, set)),
      ...(x.truncated ? { truncated: true } : {}),
      ...(x.unreachable ? { unreachable: true } : {}),
    };
  };
  const t = c.conditions[c.throttle.cond];
  const throttleStates = (cls: 0 | 1 | 2) => t.states.filter((_, i) => c.throttle.classOf[i] === cls);
  const blockers: Blocker[] = [];
  for (const r of d.reasons) {
    switch (r.code) {
      case "unpowered":
        blockers.push({
          code: r.code,
          title: `No power: ${inputName(c, "power")} is dead`,
          advice: "Bring power to the controller first; nothing else can be checked without it.",
          change: changeFor(c, states, "powered"),
          ...setsFor("power"),
        });
        break;
      case "not-enabled":
        blockers.push({
          code: r.code,
          title: `Not enabled: ${inputName(c, "enable")} is dead`,
          advice: "The enable line is open somewhere.",
          change: changeFor(c, states, "enabled"),
          ...setsFor("enable"),
        });
        break;
      case "neutral": {
        const fwd = setsFor("forward");
        const rev = setsFor("reverse");
        blockers.push({
          code: r.code,
          title: "No direction selected",
          advice: "Select a direction.",
          change: changeFor(c, states, "direction"),
          contactSets: [...fwd.contactSets, ...rev.contactSets],
          ...(fwd.truncated || rev.truncated ? { truncated: true } : {}),
        });
        break;
      }
      case "direction-conflict": {
        const sets = [
          ...contactsFeeding(c, row, c.inputs[c.inputOf.forward].id),
          ...contactsFeeding(c, row, c.inputs[c.inputOf.reverse].id),
        ];
        blockers.push({
          code: r.code,
          title: "Forward and reverse are both live",
          advice:
            "The controller refuses to choose. If none of the contacts below should be closed here, look for a short between the direction lines.",
          change: changeFor(c, states, "direction"),
          contactSets: sets,
        });
        break;
      }
      case "braking":
        blockers.push({
          code: r.code,
          title: `Brake applied: ${inputName(c, "brake")} is live`,
          advice: "Braking cuts the drive. Release the brake; if it is released, one of the contacts below is feeding the brake input.",
          change: changeFor(c, states, "not-braking"),
          contactSets: contactsFeeding(c, row, c.inputs[c.inputOf.brake].id),
        });
        break;
      case "throttle-released":
        blockers.push({
          code: r.code,
          title: `${t.label} is at rest (${states[t.id]})`,
          advice: `Apply it: set ${t.label} to ${list(throttleStates(1))}.`,
          change: changeFor(c, states, "throttle-applied"),
          contactSets: [],
        });
        break;
      case "throttle-fault":
        blockers.push({
          code: r.code,
          title: `${t.label} reads a fault (${states[t.id]})`,
          advice: `The controller ignores a faulty throttle. Check the throttle unit and its wiring until it reads ${list([...throttleStates(0), ...throttleStates(1)])}.`,
          change: changeFor(c, states, "throttle-applied"),
          contactSets: [],
        });
        break;
      case "lockout-latched": {
        const names = (r.lockouts ?? []).map(lockoutName);
        const rest = throttleStates(0);
        blockers.push({
          code: r.code,
          title: names.length ? `Held off by the ${list(names, "and")}` : "Held off by a lockout",
          advice: `The throttle was applied when the controller came on or changed state, so it holds the drive off. Return ${t.label} to ${list(rest)} (its rest position), then apply it again.`,
          contactSets: [],
        });
        break;
      }
    }
  }
  const restore: ChangeAdvice = d.drive
    ? { kind: "change", size: 0, count: 1, options: [{ changes: [], cycleThrottle: false, heldOff: false, steps: [] }] }
    : changeFor(c, states, "drive", history);
  return { drive: d.drive, steadyDrive: d.steadyDrive, latched: d.latched, row, restore, blockers };
}

export type Suspect = {
  contact: string;
  label: string;
  mode: FaultMode;
  /** What the technician should find when measuring the contact in the present state. */
  check: string;
  terminals: WireEnd[];
  otherInputsChanged: string[];
};

export type ReadingsVerdict =
  | { kind: "none" }
  | { kind: "consistent" }
  | { kind: "faults"; suspects: Suspect[]; mismatched: string[] }
  | { kind: "unexplained"; mismatched: string[] };

/** Measured input readings against the design: consistent, or the single stuck contacts that explain them. */
export function explainMeasured(c: CompiledDesign, states: Record<string, string>, measured: Record<string, boolean>): ReadingsVerdict {
  if (Object.keys(measured).length === 0) return { kind: "none" };
  const r = explainReadings(c, states, measured);
  if (r.consistent) return { kind: "consistent" };
  const row = evaluateRow(c, encodeRow(c, states));
  const mismatched = Object.entries(measured)
    .filter(([id, on]) => row.inputs[id] !== on)
    .map(([id]) => id);
  if (r.explanations.length === 0) return { kind: "unexplained", mismatched };
  const suspects = r.explanations.map((e): Suspect => {
    const k = c.design.components.find((x) => x.id === e.component) as ContactComponent;
    const cond = c.conditions[c.conditionIndex[k.condition]];
    const state = states[cond.id];
    const check =
      e.mode === "stuck-closed"
        ? `${ISOLATE_FIRST} Then, with ${cond.label} ${state}, it should be open: measure across its terminals; continuity means it is stuck closed.`
        : `${ISOLATE_FIRST} Then, with ${cond.label} ${state}, it should be closed: measure across its terminals; no continuity means it is stuck open (or a wire to it is broken).`;
    return {
      contact: k.id,
      label: k.label ?? k.id,
      mode: e.mode,
      check,
      terminals: wiresAt(c, k.id),
      otherInputsChanged: e.otherInputsChanged,
    };
  });
  return { kind: "faults", suspects, mismatched };
}

/** A starting position: every condition in its first state, the throttle at rest. */
export function restingStates(c: CompiledDesign): Record<string, string> {
  const out: Record<string, string> = {};
  for (const k of c.conditions) out[k.id] = k.states[0];
  const t = c.conditions[c.throttle.cond];
  const rest = t.states.find((_, i) => c.throttle.classOf[i] === 0);
  if (rest) out[t.id] = rest;
  return out;
}
