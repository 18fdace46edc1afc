// Property-based checks of the record module against references written here, independently of its code:
// rounding by integer arithmetic on decimal strings, the findings of random records by exact integer
// arithmetic (centivolts, deciamps), the order of findings by grouping, and validation by mutation.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  FINDING_CODES,
  checkRecord,
  parseRecord,
  roundHalfAway,
  sortFindings,
  type Finding,
  type FindingCode,
} from "../../../app/controller-record";
import { LOCKOUTS, type Lockout } from "../../../app/engine";
import { designController, withValue, type Json } from "./fixtures";

const RUNS = { numRuns: 300 };

describe("rounding: halves away from zero on the decimal value", () => {
  it("matches integer rounding of a value written as a decimal with three more places", () => {
    fc.assert(
      fc.property(fc.bigInt({ min: -(10n ** 12n), max: 10n ** 12n }), fc.integer({ min: 0, max: 3 }), (m, places) => {
        // value = m / 10^(places+3); the reference rounds |m| at the thousands digit by integer arithmetic
        const value = Number(`${m}e-${places + 3}`);
        const neg = m < 0n;
        const a = neg ? -m : m;
        const kept = a / 1000n + (a % 1000n >= 500n ? 1n : 0n);
        const expected = Number(`${neg && kept !== 0n ? "-" : ""}${kept}e-${places}`);
        expect(Object.is(roundHalfAway(value, places), expected) || roundHalfAway(value, places) === expected).toBe(true);
      }),
      { numRuns: 2000 },
    );
  });

  it("rounds every exact half away from zero, also where the float lies just below the half", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 10 ** 9 }), fc.integer({ min: 0, max: 3 }), fc.boolean(), (n, places, neg) => {
        const half = Number(`${neg ? "-" : ""}${n}5e-${places + 1}`); // n.5 at the rounding place
        const away = Number(`${neg ? "-" : ""}${n + 1}e-${places}`);
        expect(roundHalfAway(half, places)).toBe(away);
      }),
      { numRuns: 2000 },
    );
  });

  it("the spec's edges: 2.8 * 24 is 67.20, 0.07 * 300 is 21.0, 0.94971 is 0.950", () => {
    expect(roundHalfAway(2.8 * 24, 2)).toBe(67.2);
    expect(roundHalfAway(0.07 * 300, 1)).toBe(21);
    expect(roundHalfAway(0.94971, 3)).toBe(0.95);
    expect(roundHalfAway(1.005, 2)).toBe(1.01); // 1.005 is stored as 1.00499999999999989...
  });
});

// ------------------------------------------------------------------ random valid records

/** Per-cell volts in hundredths (typical cell datasheet values; common practice, from memory). */
const CELL_CENTI: Record<string, [number, number]> = {
  lifepo4: [250, 365],
  nmc: [300, 420],
  lto: [180, 280],
  "lead-acid": [175, 240],
};

type Gen = {
  chemistry: string;
  cells: number;
  capacityAh: number;
  cTenths: number | null;
  fuseA: number | null;
  ratedA: number;
  cminCenti: number;
  cmaxCenti: number;
  cutbackCenti: number;
  cutoffCenti: number;
  batteryPct: number;
  motorPct: number;
  sensor: "hall" | "resistive-3wire" | "voltage";
  /** hundredths of a volt: faultBelow < releasedBelow <= appliedFrom < faultAbove, rest < full */
  t: { fb: number; rb: number; af: number; fa: number; rest: number; full: number };
  lockouts: Lockout[];
  brake: boolean | null;
  precharge: { ohm: number; uf: number; delayMs: number } | null;
  design: { lockouts: Lockout[]; brake: boolean | null; fault: boolean };
};

/** A pack-side voltage: anywhere, or at the pack's minimum or maximum give or take 0.01 V (the edges). */
type PackVolts = { kind: "free"; centi: number } | { kind: "min" | "max"; off: number };
const packVolts: fc.Arbitrary<PackVolts> = fc.oneof(
  fc.record({ kind: fc.constant("free" as const), centi: fc.integer({ min: 1, max: 100_000 }) }),
  fc.record({ kind: fc.constantFrom("min" as const, "max" as const), off: fc.integer({ min: -1, max: 1 }) }),
);

const lockoutList = fc.array(fc.constantFrom(...LOCKOUTS), { maxLength: 7 });

const gen: fc.Arbitrary<Gen> = fc
  .record({
    chemistry: fc.constantFrom("lifepo4", "nmc", "lto", "lead-acid"),
    cells: fc.integer({ min: 1, max: 240 }),
    capacityAh: fc.integer({ min: 1, max: 400 }),
    cTenths: fc.option(fc.integer({ min: 1, max: 50 })),
    // a fuse anywhere, or at the battery current limit give or take 1 A (the edge)
    fuseA: fc.option(
      fc.oneof(
        fc.integer({ min: 1, max: 800 }).map((a) => ({ a })),
        fc.integer({ min: -1, max: 1 }).map((off) => ({ off })),
      ),
    ),
    ratedA: fc.integer({ min: 1, max: 800 }),
    range: fc.tuple(packVolts, packVolts),
    volts: fc.tuple(packVolts, packVolts),
    batteryPct: fc.integer({ min: 0, max: 100 }),
    motorPct: fc.integer({ min: 0, max: 100 }),
    sensor: fc.constantFrom("hall" as const, "resistive-3wire" as const, "voltage" as const),
    thresholds: fc.uniqueArray(fc.integer({ min: 0, max: 500 }), { minLength: 4, maxLength: 4 }).map((xs) => [...xs].sort((a, b) => a - b)),
    meet: fc.boolean(),
    readings: fc.uniqueArray(fc.integer({ min: 0, max: 500 }), { minLength: 2, maxLength: 2 }).map((xs) => [...xs].sort((a, b) => a - b)),
    lockouts: lockoutList,
    brake: fc.option(fc.boolean()),
    precharge: fc.option(
      fc.record({
        ohm: fc.integer({ min: 1, max: 500 }),
        uf: fc.integer({ min: 10, max: 5000 }),
        delayMs: fc.integer({ min: 1, max: 5000 }),
      }),
    ),
    design: fc.record({ lockouts: lockoutList, brake: fc.option(fc.boolean()), fault: fc.boolean() }),
  })
  .map((x) => {
    const [fb, rb, af0, fa] = x.thresholds;
    const af = x.meet ? rb : af0; // releasedBelowV may equal appliedFromV
    const [minC, maxC] = CELL_CENTI[x.chemistry];
    const at = (v: PackVolts) => Math.max(1, v.kind === "free" ? v.centi : x.cells * (v.kind === "min" ? minC : maxC) + v.off);
    // both pairs ordered, a pair that came out equal apart by 0.01 V
    const ordered = ([a, b]: [PackVolts, PackVolts]) => {
      const [lo, hi] = [at(a), at(b)].sort((p, q) => p - q);
      return [lo, hi === lo ? hi + 1 : hi];
    };
    const [cutbackCenti, cutoffCenti] = ordered(x.volts);
    const [cminCenti, cmaxCenti] = ordered(x.range);
    return {
      chemistry: x.chemistry,
      cells: x.cells,
      capacityAh: x.capacityAh,
      cTenths: x.cTenths,
      fuseA: x.fuseA === null ? null : "a" in x.fuseA ? x.fuseA.a : Math.max(1, Math.round((x.batteryPct * x.ratedA) / 100) + x.fuseA.off),
      ratedA: x.ratedA,
      cminCenti,
      cmaxCenti,
      cutbackCenti,
      cutoffCenti,
      batteryPct: x.batteryPct,
      motorPct: x.motorPct,
      sensor: x.sensor,
      t: { fb, rb, af, fa, rest: x.readings[0], full: x.readings[1] },
      lockouts: x.lockouts,
      brake: x.brake,
      precharge: x.precharge,
      design: x.design,
    };
  });

/** A decimal number from an integer count of hundredths or tenths, written as text first. */
const centi = (n: number) => Number(`${n}e-2`);
const tenths = (n: number) => Number(`${n}e-1`);

function toRecord(g: Gen): Json {
  const rec: Json = {
    format: "chainproof/controller-record@1",
    pack: { chemistry: g.chemistry, seriesCells: g.cells, capacityAh: g.capacityAh },
    controller: { description: "generated", ratedCurrentA: g.ratedA, minVoltageV: centi(g.cminCenti), maxVoltageV: centi(g.cmaxCenti) },
    settings: {
      lowVoltageCutbackV: centi(g.cutbackCenti),
      overVoltageCutoffV: centi(g.cutoffCenti),
      batteryCurrentPercent: g.batteryPct,
      motorCurrentPercent: g.motorPct,
      throttle: {
        sensor: g.sensor,
        restV: centi(g.t.rest),
        fullV: centi(g.t.full),
        releasedBelowV: centi(g.t.rb),
        appliedFromV: centi(g.t.af),
        faultBelowV: centi(g.t.fb),
        faultAboveV: centi(g.t.fa),
      },
      lockouts: g.lockouts,
    },
  };
  if (g.cTenths !== null) rec.pack.continuousC = tenths(g.cTenths);
  if (g.fuseA !== null) rec.pack.fuseA = g.fuseA;
  if (g.brake !== null) rec.settings.brakeCutsDrive = g.brake;
  if (g.precharge) rec.settings.precharge = { resistorOhm: g.precharge.ohm, capacitanceUF: g.precharge.uf, delayMs: g.precharge.delayMs };
  return rec;
}

/** The reference: which findings a record has, by integer arithmetic (codes in the order found here). */
function referenceCodes(g: Gen, withDesign: boolean): FindingCode[] {
  const out: FindingCode[] = [];
  const [minC, maxC] = CELL_CENTI[g.chemistry];
  const packMin = g.cells * minC; // centivolts, exact
  const packMax = g.cells * maxC;
  if (g.cutbackCenti < packMin) out.push("cutback-below-pack-min");
  if (g.cutoffCenti <= packMax) out.push("cutoff-below-pack-max");
  if (packMin < g.cminCenti || packMax > g.cmaxCenti) out.push("outside-controller-range");
  // deciamps: pct * rated / 10, halves up (all positive)
  const batteryDeci = Math.floor((g.batteryPct * g.ratedA + 5) / 10);
  if (g.cTenths !== null && batteryDeci > g.capacityAh * g.cTenths) out.push("battery-current-above-pack");
  if (g.fuseA !== null && batteryDeci > g.fuseA * 10) out.push("battery-current-above-fuse");
  const cls = (v: number) => (v < g.t.fb || v > g.t.fa ? "fault" : v < g.t.rb ? "released" : v >= g.t.af ? "applied" : "dead-band");
  if (cls(g.t.rest) !== "released") out.push("throttle-rest-not-released");
  if (cls(g.t.full) !== "applied") out.push("throttle-full-not-applied");
  const ground = g.sensor !== "voltage";
  const openFault = cls(0) === "fault" || (ground && cls(500) === "fault");
  if (cls(0) !== "fault" || (ground && cls(500) !== "fault")) out.push("throttle-open-wire-not-fault");
  if (g.precharge) {
    // fraction reached >= 0.9495 rounds to at least 0.950: delay >= -tau ln(0.0505)
    const tauMs = (g.precharge.ohm * g.precharge.uf) / 1000;
    if (g.precharge.delayMs < -tauMs * Math.log(1 - 0.9495)) out.push("precharge-too-short");
  }
  if (withDesign) {
    const seen = new Set<Lockout>();
    for (const l of g.design.lockouts) {
      if (seen.has(l)) continue;
      seen.add(l);
      if (!g.lockouts.includes(l)) out.push("lockout-missing");
    }
    if ((g.design.brake ?? true) !== (g.brake ?? true)) out.push("brake-behaviour-differs");
    if (openFault && g.design.lockouts.includes("throttle-fault") && !g.design.fault) out.push("throttle-fault-unused");
  }
  return out;
}

/** Far enough from the precharge boundary that floating point cannot decide it. */
const clearOfPrechargeEdge = (g: Gen) => {
  if (!g.precharge) return true;
  const tauMs = (g.precharge.ohm * g.precharge.uf) / 1000;
  return Math.abs(g.precharge.delayMs / tauMs + Math.log(1 - 0.9495)) > 1e-9;
};

const designOf = (g: Gen) =>
  designController({
    lockouts: g.design.lockouts,
    fault: g.design.fault ? ["fault"] : [],
    ...(g.design.brake === null ? {} : { brakeCutsDrive: g.design.brake }),
  });

describe("findings of random records", () => {
  it("are exactly the reference's, with the spec's severity and path", () => {
    fc.assert(
      fc.property(gen, fc.boolean(), (g, withDesign) => {
        fc.pre(clearOfPrechargeEdge(g));
        const p = parseRecord(toRecord(g));
        if (!p.ok) throw new Error(JSON.stringify(p.problems));
        const got = checkRecord(p.record, withDesign ? designOf(g) : undefined).findings;
        expect(got.map((f) => f.code).sort()).toEqual(referenceCodes(g, withDesign).sort());
        for (const f of got) {
          expect(f.severity).toBe(FINDING_CODES[f.code].severity);
          expect(f.path).toBe(FINDING_CODES[f.code].path);
          expect(f.message.length).toBeGreaterThan(20);
        }
      }),
      RUNS,
    );
  });

  it("come errors first, then by code, then by path; missing lockouts in the design's order", () => {
    fc.assert(
      fc.property(gen, (g) => {
        const p = parseRecord(toRecord(g));
        if (!p.ok) throw new Error(JSON.stringify(p.problems));
        const got = checkRecord(p.record, designOf(g)).findings;
        for (let i = 1; i < got.length; i++) {
          const [a, b] = [got[i - 1], got[i]];
          const key = (f: Finding) => [f.severity === "error" ? 0 : 1, f.code, f.path] as const;
          const [ka, kb] = [key(a), key(b)];
          const le = ka[0] < kb[0] || (ka[0] === kb[0] && (ka[1] < kb[1] || (ka[1] === kb[1] && ka[2] <= kb[2])));
          expect(le).toBe(true);
        }
        const named = got.filter((f) => f.code === "lockout-missing").map((f) => LOCKOUTS.find((l) => f.message.includes(` ${l} lockout`)));
        const expected = [...new Set(g.design.lockouts)].filter((l) => !g.lockouts.includes(l));
        expect(named).toEqual(expected);
      }),
      RUNS,
    );
  });
});

describe("sortFindings", () => {
  const anyFinding = fc.record({
    code: fc.constantFrom(...(Object.keys(FINDING_CODES) as FindingCode[])),
    severity: fc.constantFrom("error" as const, "warning" as const),
    path: fc.constantFrom("controller", "settings.lockouts", "settings.throttle", "settings.throttle.restV", "a", "B"),
    message: fc.string(),
  });

  it("equals a grouping of the input by severity, then code, then path, each group in input order", () => {
    fc.assert(
      fc.property(fc.array(anyFinding, { maxLength: 30 }), (fs) => {
        // reference: bucket in input order, then read buckets in key order
        const buckets = new Map<string, Finding[]>();
        for (const f of fs) {
          const k = JSON.stringify([f.severity === "error" ? 0 : 1, f.code, f.path]);
          buckets.set(k, [...(buckets.get(k) ?? []), f]);
        }
        const keys = [...buckets.keys()].sort((x, y) => {
          const [a, b] = [JSON.parse(x), JSON.parse(y)];
          for (let i = 0; i < 3; i++) if (a[i] !== b[i]) return a[i] < b[i] ? -1 : 1;
          return 0;
        });
        expect(sortFindings(fs)).toEqual(keys.flatMap((k) => buckets.get(k)!));
      }),
      { numRuns: 1000 },
    );
  });
});

describe("validation by mutation", () => {
  // Each impossible value, with the path it must be named at.
  const breakers: [string, (r: Json) => unknown, string?][] = [
    ["pack.capacityAh", () => -1],
    ["pack.seriesCells", () => 0.5],
    ["pack.chemistry", () => "nickel-iron"],
    ["pack.continuousC", () => 0],
    ["pack.fuseA", () => -5],
    ["controller.ratedCurrentA", () => 0],
    ["settings.batteryCurrentPercent", () => 100.01],
    ["settings.motorCurrentPercent", () => -0.01],
    ["settings.throttle.sensor", () => "magnetic"],
    ["settings.throttle.restV", (r) => r.settings.throttle.fullV],
    ["settings.throttle.faultBelowV", (r) => r.settings.throttle.releasedBelowV],
    ["settings.throttle.releasedBelowV", (r) => r.settings.throttle.appliedFromV + 0.001],
    ["settings.throttle.appliedFromV", (r) => r.settings.throttle.faultAboveV],
    ["settings.throttle.faultAboveV", () => 5.01],
    ["settings.lockouts", () => ["stand-down"], "settings.lockouts[0]"],
    ["settings.brakeCutsDrive", () => 1],
  ];

  it("every impossible value is refused with its path; nothing else about the record matters", () => {
    fc.assert(
      fc.property(gen, fc.constantFrom(...breakers), (g, [path, value, named]) => {
        const rec = toRecord(g);
        const v = parseRecord(withValue(rec, path, value(rec)));
        expect(v.ok).toBe(false);
        if (!v.ok) expect(v.problems.map((p) => p.path)).toContain(named ?? path);
      }),
      RUNS,
    );
  });
});
