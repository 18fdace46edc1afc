// The record's words: every field's label and unit, and the names of chemistries, sensors, lockouts
// and throttle classes. Plain trade words of our own, shared by the form, the findings and the pages.
import type { Lockout } from "../engine/index";
import { LOCKOUTS } from "../engine/vocabulary";
import { LOCKOUT_TEXT } from "../lib/lockouts";
import type { Chemistry, ThrottleSensor } from "./schema";
import type { ThrottleClassName } from "./derive";

export type FieldWords = { label: string; unit?: string; hint?: string };

/** Every field of the record by its path. */
export const FIELD_WORDS = {
  "pack.chemistry": { label: "Cell chemistry" },
  "pack.seriesCells": { label: "Cells in series", unit: "cells" },
  "pack.capacityAh": { label: "Capacity", unit: "Ah" },
  "pack.continuousC": { label: "Continuous discharge rate", unit: "C", hint: "Optional: from the pack's datasheet" },
  "pack.fuseA": { label: "Main fuse rating", unit: "A", hint: "Optional" },
  "controller.description": { label: "Controller", hint: "Make, model or notes: anything that identifies it" },
  "controller.ratedCurrentA": { label: "Rated current", unit: "A" },
  "controller.minVoltageV": { label: "Lowest rated supply voltage", unit: "V" },
  "controller.maxVoltageV": { label: "Highest rated supply voltage", unit: "V" },
  "settings.lowVoltageCutbackV": {
    label: "Low-voltage cut-back",
    unit: "V",
    hint: "Pack voltage where the controller starts reducing power",
  },
  "settings.overVoltageCutoffV": { label: "Over-voltage cut-off", unit: "V", hint: "Pack voltage where the controller stops" },
  "settings.batteryCurrentPercent": { label: "Battery current limit", unit: "%", hint: "Percent of the controller's rated current" },
  "settings.motorCurrentPercent": { label: "Motor current limit", unit: "%", hint: "Percent of the controller's rated current" },
  "settings.throttle.sensor": { label: "Throttle sensor" },
  "settings.throttle.restV": { label: "Reading at rest", unit: "V", hint: "Measured at the controller's throttle input, foot or hand off" },
  "settings.throttle.fullV": { label: "Reading fully applied", unit: "V" },
  "settings.throttle.releasedBelowV": { label: "Counts as released below", unit: "V" },
  "settings.throttle.appliedFromV": { label: "Counts as applied from", unit: "V" },
  "settings.throttle.faultBelowV": { label: "Wiring fault below", unit: "V" },
  "settings.throttle.faultAboveV": { label: "Wiring fault above", unit: "V" },
  "settings.brakeCutsDrive": { label: "The brake input cuts drive" },
  "settings.lockouts": { label: "Lockouts", hint: "Each one holds drive off until the throttle has been let go" },
  "settings.precharge.resistorOhm": { label: "Precharge resistor", unit: "Ω" },
  "settings.precharge.capacitanceUF": { label: "Controller input capacitance", unit: "µF" },
  "settings.precharge.delayMs": { label: "Precharge time before the main contactor closes", unit: "ms" },
} as const satisfies Record<string, FieldWords>;

export type RecordField = keyof typeof FIELD_WORDS;

export const CHEMISTRY_WORDS: Record<Chemistry, string> = {
  lifepo4: "Lithium iron phosphate (LiFePO4)",
  nmc: "Lithium NMC",
  lto: "Lithium titanate (LTO)",
  "lead-acid": "Lead-acid (flooded or AGM)",
};

export const SENSOR_WORDS: Record<ThrottleSensor, string> = {
  hall: "Hall-effect, three wires",
  "resistive-3wire": "Resistive (potentiometer), three wires",
  voltage: "0-5 V signal from another device",
};

/** What each lockout makes the controller do, as a technician would check it on the vehicle (one source: lib/lockouts). */
export const LOCKOUT_WORDS: Record<Lockout, string> = Object.fromEntries(LOCKOUTS.map((l) => [l, LOCKOUT_TEXT[l].check])) as Record<
  Lockout,
  string
>;

export const CLASS_WORDS: Record<ThrottleClassName, string> = {
  released: "released",
  applied: "applied",
  fault: "a wiring fault",
  "dead-band": "the dead band between released and applied",
};
