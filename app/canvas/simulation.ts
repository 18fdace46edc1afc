// Simulation on the main thread: compile the current design once per content, evaluate one row
// (optionally with a contact fault), or replay a trace up to a step.
import { compileDesign, evaluateRow, replayTrace, encodeRow, rowCount, validateDesign, type CompiledDesign, type ContactFault, type Design } from "../engine";
import { contentKey } from "./convert";
import type { Simulation, SimView } from "./store";

let cache: { key: string; compiled: CompiledDesign | null } | null = null;

/** The compiled design, or null while the design is invalid. Cached by content. */
export function compiledOf(doc: Design): CompiledDesign | null {
  const key = contentKey(doc);
  if (cache?.key === key) return cache.compiled;
  const v = validateDesign(doc);
  const compiled = v.ok ? compileDesign(v.design) : null;
  cache = { key, compiled };
  return compiled;
}

export function viewFor(c: CompiledDesign, sim: Simulation): SimView {
  try {
    if (sim.source.kind === "trace") {
      const steps = replayTrace(c, sim.source.rows.slice(0, sim.source.step));
      const last = steps[steps.length - 1];
      return {
        contacts: last.row.contacts,
        inputs: last.row.inputs,
        energized: new Set(last.row.nets.energizedTerminals),
        drive: last.drive,
        latched: last.latched,
        armed: last.armed,
      };
    }
    const index = encodeRow(c, sim.states);
    if (index < 0) throw new Error("pick a state for every condition");
    const faults: ContactFault[] = sim.source.kind === "fault" ? [sim.source.fault] : [];
    const row = evaluateRow(c, index, faults);
    return { contacts: row.contacts, inputs: row.inputs, energized: new Set(row.nets.energizedTerminals), drive: row.drive };
  } catch (e) {
    return { contacts: {}, inputs: {}, energized: new Set(), drive: false, error: e instanceof Error ? e.message : String(e) };
  }
}

const FAULT_SCAN_LIMIT = 1 << 16;

/** A row where `ruleId` is violated with `fault` applied (the fault's counterexample), or null. */
export function faultRow(c: CompiledDesign, ruleId: string, fault: ContactFault): Record<string, string> | null {
  const n = Math.min(rowCount(c), FAULT_SCAN_LIMIT);
  for (let i = 0; i < n; i++) {
    const row = evaluateRow(c, i, [fault]);
    if (row.rules[ruleId]?.violating) return row.states;
  }
  return null;
}

/** Every condition at its first state: where simulation by hand starts. */
export function restRow(doc: Design): Record<string, string> {
  return Object.fromEntries(doc.conditions.map((c) => [c.id, c.states[0] ?? ""]));
}
