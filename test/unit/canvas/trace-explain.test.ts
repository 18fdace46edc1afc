// The explained no-restart trace (app/canvas/trace-explain.ts) against a reference written from
// spec 1.5 alone: on random designs whose no-restart rule fails, the latch and drive at each step,
// the violating step, and "which lockout would have caught it" (each lockout that is off, added
// alone, keeps drive off at the violating step) are recomputed here and must agree.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  compileDesign,
  encodeRow,
  evaluateRow,
  LOCKOUTS,
  prove,
  type ControllerState,
  type Design,
  type Lockout,
} from "../../../app/engine";
import { explainTrace } from "../../../app/canvas/trace-explain";

const CONDITIONS = [
  { id: "key", states: ["off", "on"] },
  { id: "seat", states: ["empty", "occupied"] },
  { id: "brake", states: ["released", "pressed"] },
  { id: "gear", states: ["forward", "neutral", "reverse"] },
  { id: "throttle", states: ["released", "applied", "fault"] },
];
type Fn = "power" | "enable" | "brake" | "forward" | "reverse";
const WIRING: Record<Fn, { cond: string; closedIn: string[] }> = {
  power: { cond: "key", closedIn: ["on"] },
  enable: { cond: "seat", closedIn: ["occupied"] },
  brake: { cond: "brake", closedIn: ["pressed"] },
  forward: { cond: "gear", closedIn: ["forward"] },
  reverse: { cond: "gear", closedIn: ["reverse"] },
};

function design(fns: Fn[], lockouts: Lockout[], brakeCutsDrive: boolean): Design {
  return {
    format: "chainproof/design@1",
    name: "Yard tug trace",
    conditions: CONDITIONS.map((c) => ({ ...c })),
    components: [
      { id: "B1", type: "supply" },
      ...fns.flatMap((f) => [
        { id: `K_${f}`, type: "contact" as const, condition: WIRING[f].cond, closedIn: WIRING[f].closedIn },
        { id: `IN_${f}`, type: "input" as const, function: f },
      ]),
    ],
    wires: fns.flatMap((f) => [
      { from: "B1.+", to: `K_${f}.1` },
      { from: `K_${f}.2`, to: `IN_${f}.in` },
    ]),
    controller: {
      throttle: { condition: "throttle", released: ["released"], applied: ["applied"], fault: ["fault"] },
      brakeCutsDrive,
      lockouts,
    },
    rules: [{ id: "NR", type: "no-restart" }],
  };
}

/** Spec 1.5, step by step, from the controller's views of the rows. */
function reference(views: ControllerState[], lockouts: readonly Lockout[], brakeCutsDrive: boolean) {
  const moving = (v: ControllerState) => v.direction === "forward" || v.direction === "reverse";
  let p: ControllerState = { powered: false, enabled: false, direction: "neutral", braking: false, throttle: views[0].throttle };
  let L = false;
  let prevDrive = false;
  return views.map((v) => {
    const armed = lockouts.filter((l) =>
      l === "power-on"
        ? v.powered && !p.powered
        : l === "enable-restore"
          ? v.enabled && !p.enabled
          : l === "direction-engage"
            ? moving(v) && !moving(p)
            : l === "brake-release"
              ? !v.braking && p.braking
              : v.throttle === "fault",
    );
    L = v.powered ? (L || armed.length > 0) && v.throttle !== "released" : false;
    const steady = v.powered && v.enabled && moving(v) && !(v.braking && brakeCutsDrive) && v.throttle === "applied";
    const drive = steady && !L;
    const restart = !prevDrive && drive && p.throttle !== "released";
    p = v;
    prevDrive = drive;
    return { latched: L, drive, restart };
  });
}

describe("explained no-restart traces", () => {
  it("agree with a spec 1.5 reference on the latch, the violating step and the lockouts that would catch it", () => {
    let checked = 0;
    fc.assert(
      fc.property(
        fc.subarray(["power", "enable", "brake", "forward", "reverse"] as Fn[]),
        fc.subarray([...LOCKOUTS]),
        fc.boolean(),
        (fns, lockouts, cuts) => {
          const d = design(fns, lockouts, cuts);
          const verdict = prove(d);
          const nr = verdict.rules.find((r) => r.id === "NR") as { holds: boolean; trace?: Array<Record<string, string>> };
          const trace = nr.trace;
          if (nr.holds || !trace) return;
          checked++;
          const c = compileDesign(d);
          const views = trace.map((row) => evaluateRow(c, encodeRow(c, row)).controller);
          const ex = explainTrace(d, trace)!;
          const ref = reference(views, lockouts, cuts);
          expect(ex.steps.map((s) => ({ latched: s.latched, drive: s.drive, restart: s.restart }))).toEqual(ref);
          const violating = ref.findIndex((r) => r.restart) + 1;
          expect(violating).toBeGreaterThan(0);
          expect(ex.violatingStep).toBe(violating);
          const catchers = LOCKOUTS.filter((l) => !lockouts.includes(l) && !reference(views, [...lockouts, l], cuts)[violating - 1].drive);
          expect(ex.catchers).toEqual(catchers);
          // The step where a catcher would set the latch is marked, and only catchers are.
          for (const st of ex.steps) for (const l of st.wouldArm) expect(catchers).toContain(l);
          for (const [i, st] of ex.steps.entries()) {
            const before = i === 0 ? null : trace[i - 1];
            expect(st.changed.map((x) => x.cond)).toEqual(Object.keys(trace[i]).filter((k) => !before || before[k] !== trace[i][k]));
          }
        },
      ),
      { numRuns: 300 },
    );
    expect(checked).toBeGreaterThan(20);
  });

  it("says which lockout is off at the step it would have caught (a brake let off on a held throttle)", () => {
    const d = design(["power", "enable", "brake", "forward"], ["power-on", "enable-restore"], true);
    const trace = [
      { key: "on", seat: "occupied", brake: "pressed", gear: "forward", throttle: "released" },
      { key: "on", seat: "occupied", brake: "pressed", gear: "forward", throttle: "applied" },
      { key: "on", seat: "occupied", brake: "released", gear: "forward", throttle: "applied" },
    ];
    const ex = explainTrace(d, trace)!;
    expect(ex.violatingStep).toBe(3);
    expect(ex.catchers).toEqual(["brake-release"]);
    expect(ex.steps[2].wouldArm).toEqual(["brake-release"]);
    expect(ex.steps[2].changed).toEqual([{ cond: "brake", from: "pressed", to: "released" }]);
    expect(ex.steps[2].controllerChanges).toEqual(["brake released"]);
  });
});
