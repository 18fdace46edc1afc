// Simulation on the main thread: compile the current design once per content, evaluate one row
// (optionally with a contact fault), or replay a trace up to a step.
import {
  compileDesign,
  decodeRow,
  evaluateRow,
  replayTrace,
  encodeRow,
  rowCount,
  validateDesign,
  type CompiledDesign,
  type ContactFault,
  type Design,
} from "../engine";
import { contentKey } from "./convert";
import type { Simulation, SimView } from "./types";

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
    return {
      contacts: row.contacts,
      inputs: row.inputs,
      energized: new Set(row.nets.energizedTerminals),
      drive: row.drive,
      ...(faults[0] ? { fault: faults[0] } : {}),
    };
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

/** The `row` query parameter: absent, a row index (digits only, a safe integer), or not a row number. */
export type RowParam = { kind: "none" } | { kind: "index"; index: number } | { kind: "bad"; text: string };

export function parseRowParam(raw: string | null | undefined): RowParam {
  if (raw === null || raw === undefined) return { kind: "none" };
  const text = raw.trim();
  if (/^(0|[1-9][0-9]{0,15})$/.test(text) && Number.isSafeInteger(Number(text))) return { kind: "index", index: Number(text) };
  return { kind: "bad", text: raw.length > 24 ? `${raw.slice(0, 24)}…` : raw };
}

/**
 * Where the editor starts for `?row=`: simulating that row of `doc`'s truth table, or not
 * simulating with a sentence saying why the row was ignored (bad number, out of range, invalid design).
 */
export function rowStart(raw: string | null | undefined, doc: Design): { simulation: Simulation | null; notice: string | null } {
  const param = parseRowParam(raw);
  if (param.kind === "none") return { simulation: null, notice: null };
  if (param.kind === "bad")
    return { simulation: null, notice: `“${param.text}” is not a row number, so the design opened without simulating.` };
  const compiled = compiledOf(doc);
  if (!compiled) return { simulation: null, notice: `Row ${param.index} cannot be simulated: this design has problems to fix first.` };
  const rows = rowCount(compiled);
  if (param.index >= rows) {
    return {
      simulation: null,
      notice: `This design has no row ${param.index} (its truth table has rows 0 to ${(rows - 1).toLocaleString("en-US")}), so it opened without simulating.`,
    };
  }
  return { simulation: { states: decodeRow(compiled, param.index), source: { kind: "row", index: param.index } }, notice: null };
}
