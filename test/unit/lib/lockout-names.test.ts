// One name per lockout everywhere a person reads it: "why won't it drive", bench steps, the
// controller record and the editor's controller panel all take it from app/lib/lockouts.ts.
import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { compileDesign, LOCKOUTS, type Lockout } from "../../../app/engine";
import { latchedBy, lockoutWords } from "../../../app/bench-tests/words";
import { LOCKOUT_WORDS } from "../../../app/controller-record/words";
import { LOCKOUT_TEXT, lockoutName, lockoutTitle } from "../../../app/lib/lockouts";
import { whyNot } from "../../../app/vehicles/why-not";
import { makeDesign } from "../engine/builders";

describe("lockout names", () => {
  it("are the spec's ids with 'lockout'", () => {
    for (const l of LOCKOUTS) {
      expect(lockoutName(l)).toBe(`${l} lockout`);
      expect(lockoutTitle(l).toLowerCase()).toBe(`${l} lockout`);
    }
  });

  it("diagnosis names the latched lockout by that name", () => {
    // Power comes on with the pedal held: the power-on lockout latches (spec 1.5).
    const c = compileDesign(
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
    const w = whyNot(c, { key: "on", pedal: "down" }, [{ key: "off", pedal: "down" }]);
    expect(w.blockers.find((b) => b.code === "lockout-latched")!.title).toBe("Held off by the power-on lockout");
  });

  it("bench steps and the controller record use the same names and words", () => {
    for (const l of LOCKOUTS) {
      expect(latchedBy([l])).toContain(lockoutName(l));
      expect(lockoutWords([l], 1, []).head).toBe(`Check the ${lockoutName(l)}.`);
      expect(LOCKOUT_WORDS[l]).toBe(LOCKOUT_TEXT[l].check);
    }
  });

  it("no other module of the app spells a lockout's name its own way", () => {
    const names = LOCKOUTS.map((l: Lockout) => l.replace("-", "[- ]?"));
    const other = new RegExp(
      `((start-up|startup|enable-return|direction-select) lockout|lockout (${names.join("|")})|(${names.join("|")}) lockout)`,
      "i",
    );
    const files: string[] = [];
    const walk = (dir: string) => {
      for (const f of readdirSync(dir)) {
        const p = path.join(dir, f);
        if (statSync(p).isDirectory()) walk(p);
        else if (/\.(ts|tsx)$/.test(f) && !f.endsWith(".test.ts")) files.push(p);
      }
    };
    walk(path.resolve(import.meta.dirname, "../../../app"));
    const offenders = files.filter((f) => !f.endsWith(path.join("lib", "lockouts.ts")) && other.test(readFileSync(f, "utf8")));
    expect(offenders).toEqual([]);
  });
});
