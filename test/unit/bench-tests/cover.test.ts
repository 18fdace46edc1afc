// The fewest rows meeting every need (app/bench-tests/cover.ts) against an exhaustive search over
// every subset of rows, on random need lists.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { minimumCover, type Need } from "../../../app/bench-tests/cover";

/** Size of the smallest subset of rows 0..n-1 meeting every need that some row meets, by trying all 2^n. */
function bruteForce(needs: Need[], n: number, fixed: number[] = []): number {
  let best = Infinity;
  const live = needs.filter((x) => x.rows.length > 0);
  for (let mask = 0; mask < 1 << n; mask++) {
    const rows = new Set(fixed);
    let size = 0;
    for (let i = 0; i < n; i++)
      if (mask & (1 << i)) {
        rows.add(i);
        if (!fixed.includes(i)) size++;
      }
    if (live.every((x) => x.rows.some((r) => rows.has(r)))) best = Math.min(best, size);
  }
  return best;
}

const instances = fc.integer({ min: 1, max: 11 }).chain((n) =>
  fc.record({
    n: fc.constant(n),
    needs: fc.array(
      fc.uniqueArray(fc.integer({ min: 0, max: n - 1 }), { maxLength: n }).map((rows) => rows),
      { minLength: 0, maxLength: 14 },
    ),
    fixed: fc.uniqueArray(fc.integer({ min: 0, max: n - 1 }), { maxLength: 2 }),
  }),
);

describe("minimumCover", () => {
  it("meets every need some row meets with as few rows as an exhaustive search, and reports the rest as unmet", () => {
    fc.assert(
      fc.property(instances, ({ n, needs, fixed }) => {
        const list: Need[] = needs.map((rows, i) => ({ id: `n${i}`, rows }));
        const got = minimumCover(list, { fixed });
        const chosen = new Set([...got.rows, ...fixed]);
        for (const x of list) if (x.rows.length > 0) expect(x.rows.some((r) => chosen.has(r))).toBe(true);
        expect(got.unmet).toEqual(list.filter((x) => x.rows.length === 0).map((x) => x.id));
        expect(got.exact).toBe(true);
        expect(got.rows.filter((r) => !fixed.includes(r)).length).toBe(bruteForce(list, n, fixed));
        expect(got.lowerBound).toBe(got.rows.length);
      }),
      { numRuns: 300 },
    );
  });

  it("states a true lower bound when the search runs out of budget", () => {
    fc.assert(
      fc.property(instances, ({ n, needs }) => {
        const list: Need[] = needs.map((rows, i) => ({ id: `n${i}`, rows }));
        const got = minimumCover(list, { budget: 1 });
        expect(got.lowerBound).toBeLessThanOrEqual(bruteForce(list, n));
        expect(got.rows.length).toBeGreaterThanOrEqual(bruteForce(list, n));
      }),
      { numRuns: 200 },
    );
  });
});
