// Findings of a controller settings record on its own (spec section 3) and against a design's proof
// (section 4). Every comparison is on the ROUNDED derived values.
import type { Design, Lockout } from "../engine/index";
import { CELL_VOLTS, OPEN_GROUND_V, OPEN_SIGNAL_V, type DerivedValues, type ThrottleClassName } from "./derive";
import { recordBrakeCutsDrive, recordLockouts, type ControllerRecord } from "./schema";
import { CHEMISTRY_WORDS, CLASS_WORDS, LOCKOUT_WORDS } from "./words";
import { lockoutName } from "../lib/lockouts";

export type Severity = "error" | "warning";

/** Every finding code with its severity and the path it is reported at. */
export const FINDING_CODES = {
  "cutback-below-pack-min": { severity: "error", path: "settings.lowVoltageCutbackV" },
  "cutoff-below-pack-max": { severity: "error", path: "settings.overVoltageCutoffV" },
  "outside-controller-range": { severity: "error", path: "controller" },
  "battery-current-above-pack": { severity: "warning", path: "settings.batteryCurrentPercent" },
  "battery-current-above-fuse": { severity: "error", path: "settings.batteryCurrentPercent" },
  "throttle-rest-not-released": { severity: "error", path: "settings.throttle.restV" },
  "throttle-full-not-applied": { severity: "error", path: "settings.throttle.fullV" },
  "throttle-open-wire-not-fault": { severity: "error", path: "settings.throttle" },
  "precharge-too-short": { severity: "error", path: "settings.precharge.delayMs" },
  "lockout-missing": { severity: "error", path: "settings.lockouts" },
  "brake-behaviour-differs": { severity: "error", path: "settings.brakeCutsDrive" },
  "throttle-fault-unused": { severity: "warning", path: "settings.throttle" },
} as const satisfies Record<string, { severity: Severity; path: string }>;

export type FindingCode = keyof typeof FINDING_CODES;

export type Finding = { code: FindingCode; severity: Severity; path: string; message: string };

/** The least fraction of the pack voltage the precharge must reach before the contactor closes. */
export const PRECHARGE_LEAST_FRACTION = 0.95;

const finding = (code: FindingCode, message: string): Finding => ({
  code,
  severity: FINDING_CODES[code].severity,
  path: FINDING_CODES[code].path,
  message,
});

/** A rounded value written with its places (40 -> "40.00" at 2). */
const fixed = (v: number, places: number) => v.toFixed(places);
const volts = (v: number) => `${fixed(v, 2)} V`;
const amps = (v: number) => `${fixed(v, 1)} A`;

/** Errors first, then code, then path (code-unit order); a stable sort keeps a design's order within a code. */
export function sortFindings(findings: Finding[]): Finding[] {
  const rank = (s: Severity) => (s === "error" ? 0 : 1);
  const cmp = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);
  return [...findings].sort((a, b) => rank(a.severity) - rank(b.severity) || cmp(a.code, b.code) || cmp(a.path, b.path));
}

/** The findings of the record on its own (spec section 3), unsorted. */
export function recordFindings(r: ControllerRecord, d: DerivedValues): Finding[] {
  const out: Finding[] = [];
  const { pack } = d;
  const cell = CELL_VOLTS[r.pack.chemistry];
  const cells = `${r.pack.seriesCells} ${CHEMISTRY_WORDS[r.pack.chemistry]} cell${r.pack.seriesCells === 1 ? "" : "s"}`;
  const s = r.settings;

  if (s.lowVoltageCutbackV < pack.minV) {
    out.push(
      finding(
        "cutback-below-pack-min",
        `The low-voltage cut-back (${s.lowVoltageCutbackV} V) is below the pack's minimum of ${volts(pack.minV)} (${cells} at ${cell.min} V): the controller keeps full power on a pack that is already empty.`,
      ),
    );
  }
  if (s.overVoltageCutoffV <= pack.maxV) {
    out.push(
      finding(
        "cutoff-below-pack-max",
        `The over-voltage cut-off (${s.overVoltageCutoffV} V) is not above the pack's full-charge voltage of ${volts(pack.maxV)} (${cells} at ${cell.max} V): a full pack, or braking energy returned to it, trips the cut-off.`,
      ),
    );
  }
  const c = r.controller;
  const below = pack.minV < c.minVoltageV;
  const above = pack.maxV > c.maxVoltageV;
  if (below || above) {
    const ends = [
      below ? `its minimum is below the controller's lowest (${c.minVoltageV} V)` : "",
      above ? `its maximum is above the controller's highest (${c.maxVoltageV} V)` : "",
    ].filter(Boolean);
    out.push(
      finding(
        "outside-controller-range",
        `The pack's window, ${volts(pack.minV)} to ${volts(pack.maxV)}, is not inside the controller's rated range of ${c.minVoltageV} to ${c.maxVoltageV} V: ${ends.join(" and ")}.`,
      ),
    );
  }
  const limit = `The battery current limit (${s.batteryCurrentPercent} % of ${c.ratedCurrentA} A, ${amps(d.batteryCurrentA)})`;
  if (d.packContinuousA !== undefined && d.batteryCurrentA > d.packContinuousA) {
    out.push(
      finding(
        "battery-current-above-pack",
        `${limit} is above what the pack can give continuously (${r.pack.capacityAh} Ah at ${r.pack.continuousC} C, ${amps(d.packContinuousA)}).`,
      ),
    );
  }
  if (r.pack.fuseA !== undefined && d.batteryCurrentA > r.pack.fuseA) {
    out.push(finding("battery-current-above-fuse", `${limit} is above the main fuse's rating (${r.pack.fuseA} A).`));
  }
  const t = s.throttle;
  const cls = (k: ThrottleClassName) => CLASS_WORDS[k];
  if (d.throttle.rest !== "released") {
    out.push(
      finding(
        "throttle-rest-not-released",
        `At rest the throttle reads ${t.restV} V, which the thresholds class as ${cls(d.throttle.rest)}, not released (released below ${t.releasedBelowV} V, fault below ${t.faultBelowV} V).`,
      ),
    );
  }
  if (d.throttle.full !== "applied") {
    out.push(
      finding(
        "throttle-full-not-applied",
        `Fully applied the throttle reads ${t.fullV} V, which the thresholds class as ${cls(d.throttle.full)}, not applied (applied from ${t.appliedFromV} V, fault above ${t.faultAboveV} V).`,
      ),
    );
  }
  const open: string[] = [];
  if (d.throttle.openSignal !== "fault") {
    open.push(
      `an open signal wire reads ${OPEN_SIGNAL_V.toFixed(1)} V, classed as ${cls(d.throttle.openSignal)} (fault below ${t.faultBelowV} V)`,
    );
  }
  if (d.throttle.openGround !== undefined && d.throttle.openGround !== "fault") {
    open.push(
      `an open ground wire reads ${OPEN_GROUND_V.toFixed(1)} V, classed as ${cls(d.throttle.openGround)} (fault above ${t.faultAboveV} V)`,
    );
  }
  if (open.length > 0) {
    out.push(finding("throttle-open-wire-not-fault", `A broken throttle wire is not seen as a fault: ${open.join("; ")}.`));
  }
  if (s.precharge && d.precharge && d.precharge.reachedAtDelay < PRECHARGE_LEAST_FRACTION) {
    const p = d.precharge;
    out.push(
      finding(
        "precharge-too-short",
        `The precharge time (${s.precharge.delayMs} ms) charges the controller to ${(p.reachedAtDelay * 100).toFixed(1)} % of the pack's ${volts(pack.maxV)} (time constant ${fixed(p.tauMs, 1)} ms); 95 % takes ${fixed(p.t95Ms, 1)} ms.`,
      ),
    );
  }
  return out;
}

/** Lockouts listed once each, in the order first listed. */
const once = (xs: readonly Lockout[]) => xs.filter((x, i) => xs.indexOf(x) === i);

/** What the record contradicts of a design's proof (spec section 4), in the design's order, unsorted. */
export function designFindings(r: ControllerRecord, d: DerivedValues, design: Pick<Design, "controller">): Finding[] {
  const out: Finding[] = [];
  const assumed = once(design.controller.lockouts ?? []);
  const has = new Set(recordLockouts(r));
  for (const l of assumed) {
    if (!has.has(l)) {
      out.push(finding("lockout-missing", `The proof assumes the ${lockoutName(l)} (${LOCKOUT_WORDS[l]}); the record does not have it.`));
    }
  }
  const designBrake = design.controller.brakeCutsDrive ?? true;
  const recordBrake = recordBrakeCutsDrive(r);
  if (designBrake !== recordBrake) {
    const says = (cuts: boolean) => (cuts ? "cuts drive" : "does not cut drive");
    out.push(
      finding(
        "brake-behaviour-differs",
        `The proof assumes the brake input ${says(designBrake)}; the record says it ${says(recordBrake)}.`,
      ),
    );
  }
  const openFault = d.throttle.openSignal === "fault" || d.throttle.openGround === "fault";
  const designFault = design.controller.throttle.fault ?? [];
  if (openFault && assumed.includes("throttle-fault") && designFault.length === 0) {
    out.push(
      finding(
        "throttle-fault-unused",
        `The controller reads a broken throttle wire as a fault and the design lists the ${lockoutName("throttle-fault")}, but the design's throttle has no fault state, so the proof never looks at a throttle fault.`,
      ),
    );
  }
  return out;
}
