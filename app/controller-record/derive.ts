// Values derived from a controller settings record (spec section 2), each rounded as the spec states:
// pack volts to 0.01, milliseconds and amps to 0.1, joules to 0.01, the fraction to 0.001.
import type { Chemistry, ControllerRecord, PrechargeSettings, ThrottleSettings } from "./schema";
import { roundHalfAway } from "./round";

/**
 * Per-cell voltages: end of discharge, nominal, end of charge. Typical cell datasheet values
 * (common practice, from memory; check-values.md "Traction packs"); the spec fixes one value where the
 * table gives a range (NMC 3.7 nominal, LTO 1.8 / 2.4 / 2.8, lead-acid 2.4 absorption charge).
 */
export const CELL_VOLTS: Record<Chemistry, { min: number; nominal: number; max: number }> = {
  lifepo4: { min: 2.5, nominal: 3.2, max: 3.65 },
  nmc: { min: 3.0, nominal: 3.7, max: 4.2 },
  lto: { min: 1.8, nominal: 2.4, max: 2.8 },
  "lead-acid": { min: 1.75, nominal: 2.0, max: 2.4 },
};

export type ThrottleClassName = "released" | "applied" | "fault" | "dead-band";

export type DerivedPrecharge = {
  tauMs: number;
  t95Ms: number;
  t99Ms: number;
  inrushA: number;
  energyJ: number;
  reachedAtDelay: number;
};

export type DerivedThrottle = {
  rest: ThrottleClassName;
  full: ThrottleClassName;
  openSignal: ThrottleClassName;
  /** Only for sensors whose open ground reads near the supply (hall, resistive-3wire). */
  openGround?: ThrottleClassName;
};

export type DerivedValues = {
  pack: { minV: number; nominalV: number; maxV: number };
  batteryCurrentA: number;
  motorCurrentA: number;
  packContinuousA?: number;
  precharge?: DerivedPrecharge;
  throttle: DerivedThrottle;
};

/** The reading an open signal wire gives (pulled down) and an open ground gives (pulled to the 5 V supply). */
export const OPEN_SIGNAL_V = 0.0;
export const OPEN_GROUND_V = 5.0;

/** The class a throttle reading falls in (spec section 2): fault bands first, then released, applied, dead band. */
export function classifyReading(t: ThrottleSettings, volts: number): ThrottleClassName {
  if (volts < t.faultBelowV || volts > t.faultAboveV) return "fault";
  if (volts < t.releasedBelowV) return "released";
  if (volts >= t.appliedFromV) return "applied";
  return "dead-band";
}

/** Whether an open ground reads near the supply on this sensor (a 0-5 V signal from another device: no). */
export function hasOpenGroundReading(sensor: ThrottleSettings["sensor"]): boolean {
  return sensor === "hall" || sensor === "resistive-3wire";
}

export function deriveThrottle(t: ThrottleSettings): DerivedThrottle {
  const out: DerivedThrottle = {
    rest: classifyReading(t, t.restV),
    full: classifyReading(t, t.fullV),
    openSignal: classifyReading(t, OPEN_SIGNAL_V),
  };
  if (hasOpenGroundReading(t.sensor)) out.openGround = classifyReading(t, OPEN_GROUND_V);
  return out;
}

/**
 * Precharge of the controller's capacitance through the resistor from `volts` (handbook RC formulas:
 * Vc = Vb(1 - e^(-t/RC)), t = -RC ln(1 - q)).
 */
export function derivePrecharge(volts: number, p: PrechargeSettings): DerivedPrecharge {
  const tauMs = p.resistorOhm * p.capacitanceUF * 1e-3; // ohm x uF = us
  const farads = p.capacitanceUF * 1e-6;
  return {
    tauMs: roundHalfAway(tauMs, 1),
    t95Ms: roundHalfAway(-tauMs * Math.log(0.05), 1),
    t99Ms: roundHalfAway(-tauMs * Math.log(0.01), 1),
    inrushA: roundHalfAway(volts / p.resistorOhm, 1),
    energyJ: roundHalfAway((farads * volts * volts) / 2, 2),
    reachedAtDelay: roundHalfAway(1 - Math.exp(-p.delayMs / tauMs), 3),
  };
}

export function deriveValues(r: ControllerRecord): DerivedValues {
  const cell = CELL_VOLTS[r.pack.chemistry];
  const n = r.pack.seriesCells;
  const pack = {
    minV: roundHalfAway(cell.min * n, 2),
    nominalV: roundHalfAway(cell.nominal * n, 2),
    maxV: roundHalfAway(cell.max * n, 2),
  };
  const rated = r.controller.ratedCurrentA;
  const out: DerivedValues = {
    pack,
    batteryCurrentA: roundHalfAway((r.settings.batteryCurrentPercent * rated) / 100, 1),
    motorCurrentA: roundHalfAway((r.settings.motorCurrentPercent * rated) / 100, 1),
    throttle: deriveThrottle(r.settings.throttle),
  };
  if (r.pack.continuousC !== undefined) out.packContinuousA = roundHalfAway(r.pack.capacityAh * r.pack.continuousC, 1);
  if (r.settings.precharge) out.precharge = derivePrecharge(pack.maxV, r.settings.precharge);
  // Key order as in the spec's example.
  return {
    pack: out.pack,
    batteryCurrentA: out.batteryCurrentA,
    motorCurrentA: out.motorCurrentA,
    ...(out.packContinuousA !== undefined ? { packContinuousA: out.packContinuousA } : {}),
    ...(out.precharge ? { precharge: out.precharge } : {}),
    throttle: out.throttle,
  };
}

/**
 * Derived numbers that came out infinite (a value too large or too small to compute with), each named
 * at the field that drives it; empty for every record a vehicle can have.
 */
export function uncomputable(d: DerivedValues): { path: string; message: string }[] {
  const out: { path: string; message: string }[] = [];
  const check = (v: number | undefined, path: string) => {
    if (v !== undefined && !Number.isFinite(v)) out.push({ path, message: "is too large or too small to compute with" });
  };
  check(d.pack.maxV, "pack.seriesCells");
  check(d.batteryCurrentA, "controller.ratedCurrentA");
  check(d.motorCurrentA, "controller.ratedCurrentA");
  check(d.packContinuousA, "pack.capacityAh");
  if (d.precharge) {
    check(d.precharge.tauMs, "settings.precharge.capacitanceUF");
    check(d.precharge.inrushA, "settings.precharge.resistorOhm");
    check(d.precharge.energyJ, "settings.precharge.capacitanceUF");
  }
  return out.filter((p, i) => out.findIndex((q) => q.path === p.path) === i);
}
