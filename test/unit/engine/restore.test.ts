// The smallest change of conditions that restores drive (and clears each blocker), checked by brute
// force over every row with the spec's own evaluator (test/unit/engine/reference.ts, written from
// design-format.md 1.4-1.5), and on a design whose reverse line is wired behind the forward contact.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { compileDesign, smallestChange, validateDesign, type Design, type RestoreGoal } from "../../../app/engine";
import { whyNot } from "../../../app/vehicles/why-not";
import { makeDesign, randomDesign } from "./builders";
import { refDecode, refInitial, refRow, refRowCount, refStep, type RefRow } from "./reference";

const GOALS: Record<RestoreGoal, (r: RefRow, d: Design) => boolean> = {
  drive: (r) => r.drive,
  powered: (r) => r.view.powered,
  enabled: (r) => r.view.enabled,
  direction: (r) => r.view.direction === "forward" || r.view.direction === "reverse",
  "not-braking": (r) => !r.view.braking,
  "throttle-applied": (r) => r.view.throttle === "applied",
};

const differ = (a: Record<string, string>, b: Record<string, string>) => Object.keys(a).filter((k) => a[k] !== b[k]).length;

/** Replays rows from power-up by the spec (1.5) and returns drive at the last one. */
function refDriveAfter(d: Design, rows: Array<Record<string, string>>): boolean {
  const views = rows.map((s) => refRow(d, s));
  let st = refInitial(views[0].view.throttle);
  let drive = false;
  for (const v of views) {
    const r = refStep(d, st, v);
    st = r.next;
    drive = r.drive;
  }
  return drive;
}

describe("smallest change of conditions, by brute force", () => {
  it("is the nearest rows (fewest conditions changed) where each goal holds, all of them counted; none when no row has it", () => {
    fc.assert(
      fc.property(fc.gen(), fc.nat(), (g, pick) => {
        const d = randomDesign(g, { maxConditions: 5 });
        fc.pre(validateDesign(d).ok);
        const c = compileDesign(d);
        const n = refRowCount(d);
        const all = Array.from({ length: n }, (_, i) => refDecode(d, i) as Record<string, string>);
        const refs = all.map((s) => refRow(d, s));
        const here = all[pick % n];
        for (const [goal, holds] of Object.entries(GOALS) as Array<[RestoreGoal, (r: RefRow, d: Design) => boolean]>) {
          const distances = all.map((s, i) => (holds(refs[i], d) ? differ(here, s) : Infinity));
          const min = Math.min(...distances);
          const found = smallestChange(c, here, goal);
          if (min === Infinity) {
            expect(found, goal).toEqual({ reachable: false });
            continue;
          }
          expect(found.reachable, goal).toBe(true);
          if (!found.reachable) continue;
          expect(found.size, goal).toBe(min);
          expect(found.count, goal).toBe(distances.filter((x) => x === min).length);
          expect(found.changes.length).toBe(Math.min(found.count, 12));
          const seen = new Set<string>();
          for (const set of found.changes) {
            expect(set.length).toBe(min);
            const target = { ...here };
            for (const ch of set) {
              expect(ch.from).toBe(here[ch.condition]);
              expect(ch.to).not.toBe(ch.from);
              target[ch.condition] = ch.to;
            }
            expect(holds(refRow(d, target), d), `${goal} after ${JSON.stringify(set)}`).toBe(true);
            seen.add(JSON.stringify(target));
          }
          expect(seen.size).toBe(found.changes.length);
        }
      }),
      { numRuns: 300 },
    );
  }, 120_000);

  it("the page's way back to drive, tapped in order after any history, drives by the spec's replay or says a lockout holds it off", () => {
    fc.assert(
      fc.property(fc.gen(), fc.array(fc.nat(), { minLength: 0, maxLength: 3 }), fc.nat(), (g, past, pick) => {
        const d = randomDesign(g, { maxConditions: 4 });
        fc.pre(validateDesign(d).ok);
        const c = compileDesign(d);
        const n = refRowCount(d);
        const history = past.map((i) => refDecode(d, i % n) as Record<string, string>);
        const states = refDecode(d, pick % n) as Record<string, string>;
        const w = whyNot(c, states, history);
        expect(w.drive).toBe(refDriveAfter(d, [...history, states]));
        if (w.drive) return;
        if (w.restore.kind === "none") {
          // No row of the design drives at all.
          for (let i = 0; i < n; i++) expect(refRow(d, refDecode(d, i)).drive).toBe(false);
          return;
        }
        expect(w.restore.options.length).toBeGreaterThan(0);
        for (const o of w.restore.options) {
          const target = o.steps[o.steps.length - 1];
          expect(refRow(d, target).drive).toBe(true);
          expect(differ(states, target)).toBe(w.restore.size);
          expect(refDriveAfter(d, [...history, states, ...o.steps])).toBe(!o.heldOff);
        }
      }),
      { numRuns: 300 },
    );
  }, 120_000);
});

// A reverse line wired behind the forward contact: reverse can only be live with the selector in
// forward AND in reverse at once, so no setting ever gives reverse.
const behind = compileDesign(
  makeDesign({
    conditions: [
      ["key", ["off", "on"]],
      ["selector", ["neutral", "fwd", "rev"]],
      ["pedal", ["up", "down"]],
    ],
    contacts: [
      ["KEY", "key", ["on"]],
      ["FWD", "selector", ["fwd"]],
      ["REV", "selector", ["rev"]],
    ],
    inputs: [
      ["PWR", "power"],
      ["FW", "forward"],
      ["RV", "reverse"],
    ],
    wires: [
      ["BAT.+", "KEY.1"],
      ["KEY.2", "PWR.in"],
      ["KEY.2", "FWD.1"],
      ["FWD.2", "FW.in"],
      ["FWD.2", "REV.1"],
      ["REV.2", "RV.in"],
    ],
    throttle: { condition: "pedal", released: ["up"], applied: ["down"] },
  }),
);

describe("why won't it drive: a reverse line wired behind the forward contact", () => {
  it("in neutral suggests the selector to fwd, never to rev, and lists no contact set no setting can close", () => {
    const w = whyNot(behind, { key: "on", selector: "neutral", pedal: "down" });
    expect(w.drive).toBe(false);
    expect(w.restore).toMatchObject({ kind: "change", size: 1, count: 1 });
    if (w.restore.kind !== "change") return;
    expect(w.restore.options.map((o) => o.changes)).toEqual([
      [{ condition: "selector", conditionLabel: "selector", from: "neutral", to: "fwd" }],
    ]);
    const neutral = w.blockers.find((b) => b.code === "neutral")!;
    expect(neutral.change).toMatchObject({ kind: "change", size: 1 });
    const sets = neutral.contactSets.map((s) => s.map((k) => k.contact).sort());
    expect(sets).toEqual([["FWD"]]);
    expect(JSON.stringify(neutral)).not.toContain('"to":"rev"');
  });

  it("in rev (the reverse input dead) also suggests fwd", () => {
    const w = whyNot(behind, { key: "on", selector: "rev", pedal: "down" });
    expect(w.restore.kind === "change" && w.restore.options.map((o) => o.changes.map((ch) => `${ch.condition}=${ch.to}`))).toEqual([
      ["selector=fwd"],
    ]);
  });

  it("with the key off and the pedal up, the smallest change is key, selector and pedal together", () => {
    const w = whyNot(behind, { key: "off", selector: "neutral", pedal: "up" });
    expect(w.restore).toMatchObject({ kind: "change", size: 3, count: 1 });
  });
});

describe("why won't it drive: when no change of conditions can", () => {
  // The enable line runs through two seat contacts in series that are never closed together.
  const never = compileDesign(
    makeDesign({
      conditions: [
        ["seat", ["empty", "occupied"]],
        ["pedal", ["up", "down"]],
      ],
      contacts: [
        ["SEAT_A", "seat", ["occupied"]],
        ["SEAT_B", "seat", ["empty"]],
      ],
      inputs: [["EN", "enable"]],
      wires: [
        ["BAT.+", "SEAT_A.1"],
        ["SEAT_A.2", "SEAT_B.1"],
        ["SEAT_B.2", "EN.in"],
      ],
      throttle: { condition: "pedal", released: ["up"], applied: ["down"] },
    }),
  );

  it("says so for the drive and for the enable line; the open contact in the way stays a place to measure", () => {
    const w = whyNot(never, { seat: "occupied", pedal: "down" });
    expect(w.restore).toEqual({ kind: "none" });
    const enable = w.blockers.find((b) => b.code === "not-enabled")!;
    expect(enable.change).toEqual({ kind: "none" });
    expect(enable.contactSets.map((set) => set.map((k) => k.contact))).toEqual([["SEAT_B"]]);
  });
});

describe("why won't it drive: a latched lockout", () => {
  const lockout = compileDesign(
    makeDesign({
      conditions: [
        ["key", ["off", "on"]],
        ["pedal", ["up", "down"]],
      ],
      contacts: [["KEY", "key", ["on"]]],
      inputs: [["PWR", "power"]],
      wires: [
        ["BAT.+", "KEY.1"],
        ["KEY.2", "PWR.in"],
      ],
      throttle: { condition: "pedal", released: ["up"], applied: ["down"] },
      lockouts: ["power-on"],
    }),
  );

  it("changes no condition but returns the throttle to rest and applies it again", () => {
    const w = whyNot(lockout, { key: "on", pedal: "down" }, [{ key: "off", pedal: "down" }]);
    expect(w.drive).toBe(false);
    expect(w.steadyDrive).toBe(true);
    expect(w.restore).toMatchObject({ kind: "change", size: 0 });
    if (w.restore.kind !== "change") return;
    expect(w.restore.options[0]).toMatchObject({
      changes: [],
      cycleThrottle: true,
      heldOff: false,
      steps: [
        { key: "on", pedal: "up" },
        { key: "on", pedal: "down" },
      ],
    });
    expect(w.blockers.find((b) => b.code === "lockout-latched")!.title).toContain("power-on lockout");
  });
});
