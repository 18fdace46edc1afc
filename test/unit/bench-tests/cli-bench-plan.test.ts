// `chainproof bench-plan`, run as a separate process: its JSON holds when replayed independently
// (bench-reference.ts), its text names every step, bad input exits 2 with one line.
import { spawnSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import type { BenchPlan } from "../../../app/bench-tests/types";
import type { Design } from "../../../app/engine";
import { checkPlan } from "./bench-reference";

const EXAMPLES = "/work/shared/spec/examples";
const SLOW = 60_000;

function run(...args: string[]) {
  const r = spawnSync(process.execPath, ["--import", "tsx", "app/cli/chainproof.ts", ...args], { encoding: "utf8", cwd: process.cwd() });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

describe("chainproof bench-plan", () => {
  it(
    "prints a plan whose every claim holds when replayed from the spec",
    () => {
      const file = `${EXAMPLES}/campus-hauler.design.json`;
      const r = run("bench-plan", file);
      expect(r.code).toBe(0);
      const plan = JSON.parse(r.out) as BenchPlan;
      expect(plan.format).toBe("chainproof/bench-plan@1");
      for (const s of plan.steps) {
        expect(s).toMatchObject({
          instruction: expect.any(String),
          set: expect.any(Object),
          expect: { drive: expect.any(Boolean), latched: expect.any(Boolean) },
        });
        expect(Array.isArray(s.moves) && Array.isArray(s.reveals)).toBe(true);
      }
      expect(checkPlan(JSON.parse(readFileSync(file, "utf8")) as Design, plan)).toEqual([]);
    },
    SLOW,
  );

  it(
    "prints the same plan as text, with the unchecked items and their reasons",
    () => {
      const r = run("bench-plan", `${EXAMPLES}/deck-mower.design.json`, "--text");
      expect(r.code).toBe(0);
      expect(r.out).toMatch(/^Bench test of .*: \d+ steps/);
      expect(r.out).toMatch(/Not checked:\n {2}lockout:power-on: the design has no power input/);
      expect(r.out).toMatch(/Rows observed: \d+; fewest rows/);
    },
    SLOW,
  );

  it(
    "exits 2 with one line for a missing file or a stray argument",
    () => {
      for (const args of [["bench-plan", "nowhere.json"], ["bench-plan"], ["bench-plan", `${EXAMPLES}/trail-bike.design.json`, "--csv"]]) {
        const r = run(...args);
        expect(r.code).toBe(2);
        expect(r.err).not.toMatch(/^\s+at .+:\d+/m);
        expect(r.err.split("\n")[0]).toMatch(/^chainproof: /);
      }
    },
    SLOW,
  );
});
