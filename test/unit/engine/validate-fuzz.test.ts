// Fuzzing the engine's front door: mutated shipped designs, arbitrary JSON and odd values through
// validateDesign and prove. Never a throw; every problem names a real place in
// the document; whatever is accepted can be proven.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { prove, validateDesign } from "../../../app/engine";
import { BASE_DESIGNS, mutatedDesign, pathNamesPlaceIn } from "../../support/fuzz-designs";

// Generous per-test limits: the machine is shared; these are not timing assertions.
const SLOW = 120_000;
// Fixed seeds so a failure replays the same way (fast-check prints the seed and path on failure).
const SEED = 0x0c4a1;

/** Checks one document; returns whether the engine accepted it. */
function checkDocument(doc: unknown): boolean {
  const result = validateDesign(doc);
  if (!result.ok) {
    expect(result.problems.length).toBeGreaterThan(0);
    for (const p of result.problems) {
      expect(typeof p.path).toBe("string");
      expect(typeof p.message).toBe("string");
      expect(p.message.trim()).not.toBe("");
      if (!pathNamesPlaceIn(doc, p.path))
        throw new Error(`problem path ${JSON.stringify(p.path)} names no place in the document (${p.message})`);
    }
    return false;
  }
  const rows = result.design.conditions.reduce((n, c) => n * c.states.length, 1);
  if (rows <= 2 ** 14) {
    const verdict = prove(result.design);
    expect(verdict.format).toBe("chainproof/verdict@1");
    expect(verdict.rows).toBe(rows);
    expect(verdict.rules).toHaveLength(result.design.rules.length);
    // Example rows and traces name every condition as an own key, whatever its id ("__proto__" too).
    const ids = result.design.conditions.map((c) => c.id).sort();
    for (const r of verdict.rules) {
      const rowsShown = "example" in r && r.example ? [r.example] : "trace" in r && r.trace ? r.trace : [];
      for (const row of rowsShown) expect(Object.keys(row).sort()).toEqual(ids);
    }
  }
  return true;
}

describe("validateDesign under bad input", () => {
  it("every shipped design is valid (the fuzz starts from good documents)", () => {
    expect(BASE_DESIGNS.length).toBeGreaterThanOrEqual(4);
    for (const d of BASE_DESIGNS) expect(validateDesign(d).ok).toBe(true);
  });

  it("never throws on 4,000 mutated designs; problems name real paths; accepted ones prove", { timeout: SLOW }, () => {
    let accepted = 0;
    fc.assert(
      fc.property(mutatedDesign(4), (doc) => {
        if (checkDocument(doc)) accepted += 1;
      }),
      { seed: SEED, numRuns: 4000 },
    );
    // Both sides of the fence are exercised: some mutations keep a design valid, most break it.
    expect(accepted).toBeGreaterThan(50);
    expect(accepted).toBeLessThan(3000);
  });

  it("never throws on 2,000 arbitrary JSON values and objects", { timeout: SLOW }, () => {
    fc.assert(
      fc.property(
        fc.oneof(
          fc.jsonValue({ maxDepth: 6 }),
          fc.dictionary(
            fc.constantFrom("format", "name", "conditions", "components", "wires", "controller", "rules", "layout"),
            fc.jsonValue({ maxDepth: 4 }),
          ),
          fc.anything({
            maxDepth: 3,
            withBigInt: true,
            withDate: true,
            withMap: true,
            withSet: true,
            withTypedArray: true,
            withSparseArray: true,
            withNullPrototype: true,
          }),
        ),
        (doc) => {
          expect(checkDocument(doc)).toBe(false);
        },
      ),
      { seed: SEED + 1, numRuns: 2000 },
    );
  });
});
