// The shared example designs against the verdicts of the independent row-by-row reference
// (spec 1.1; yard-tug has a require-drive rule).
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { compileDesign, evaluateRow, encodeRow, prove, replayTrace, validateDesign } from "../../../app/engine";
import type { InhibitVerdict, NoRestartVerdict, RequireDriveVerdict, Verdict } from "../../../app/engine";

const DIR = "/work/shared/spec/examples";
const NAMES = ["trail-bike", "deck-mower", "campus-hauler", "yard-tug"];
const read = (file: string) => JSON.parse(readFileSync(`${DIR}/${file}`, "utf8"));

describe.each(NAMES)("example %s", (name) => {
  const design = read(`${name}.design.json`);
  const expected: Verdict = read(`${name}.verdict.json`);
  const checked = validateDesign(design);
  if (!checked.ok) throw new Error(`example ${name} should be valid: ${JSON.stringify(checked.problems)}`);
  const c = compileDesign(checked.design);
  const verdict = prove(c);

  it("has the reference's row count, drive rows and ok", () => {
    expect(verdict.format).toBe("chainproof/verdict@1");
    expect(verdict.rows).toBe(expected.rows);
    expect(verdict.driveRows).toBe(expected.driveRows);
    expect(verdict.ok).toBe(expected.ok);
  });

  it("has the reference's per-rule counts and holds", () => {
    expect(verdict.rules.map((r) => r.id)).toEqual(expected.rules.map((r) => r.id));
    verdict.rules.forEach((r, i) => {
      const e = expected.rules[i];
      expect(r.holds).toBe(e.holds);
      if ("unsafeRows" in e) {
        expect((r as InhibitVerdict).unsafeRows).toBe(e.unsafeRows);
        expect((r as InhibitVerdict).violatingRows).toBe(e.violatingRows);
      }
      if ("demandRows" in e) {
        expect((r as RequireDriveVerdict).demandRows).toBe(e.demandRows);
        expect((r as RequireDriveVerdict).failingRows).toBe(e.failingRows);
      }
      expect("example" in r).toBe("example" in e);
    });
  });

  it("gives examples that really violate their rule", () => {
    for (const r of verdict.rules) {
      if (r.holds) continue;
      if ("unsafeRows" in r) {
        expect(r.example).toBeDefined();
        const row = evaluateRow(c, encodeRow(c, r.example!));
        expect(row.rules[r.id]).toEqual({ unsafe: true, violating: true });
      }
      if ("demandRows" in r) {
        const row = evaluateRow(c, encodeRow(c, r.example!));
        expect(row.demands[r.id]).toEqual({ demand: true, failing: true });
        expect(row.drive).toBe(false);
      }
    }
  });

  it("gives traces that replay to a violation and are as short as the reference's", () => {
    verdict.rules.forEach((r, i) => {
      const e = expected.rules[i] as NoRestartVerdict;
      if ("unsafeRows" in r || "demandRows" in r || r.holds) return;
      const trace = (r as NoRestartVerdict).trace!;
      expect(trace.length).toBe(e.trace!.length);
      const steps = replayTrace(c, trace);
      expect(steps[steps.length - 1].restart).toBe(true);
      expect(steps.slice(0, -1).every((s) => !s.restart)).toBe(true);
      // The reference's own trace also replays to a violation under this engine.
      const theirs = replayTrace(c, e.trace!);
      expect(theirs[theirs.length - 1].restart).toBe(true);
    });
  });

  it("lists the reference's single faults", () => {
    expect(verdict.singleFaults).toEqual(expected.singleFaults);
  });
});
