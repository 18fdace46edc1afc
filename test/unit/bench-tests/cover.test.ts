// The fewest rows meeting every need (app/bench-tests/cover.ts) against an exhaustive search over
// every subset of rows, on random need lists.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { minimumCover, type Need } from "../../../app/bench-tests/cover";
import { largestApart } from "../../../app/bench-tests/table-bound";

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

describe("faults no row shows together (a packing bound, app/bench-tests/table-bound.ts)", () => {
  /** The largest set of nodes with no edge between any two, by trying all 2^n subsets. */
  function largestByBruteForce(n: number, edge: (i: number, j: number) => boolean): number {
    let best = 0;
    for (let mask = 0; mask < 1 << n; mask++) {
      const nodes = Array.from({ length: n }, (_, i) => i).filter((i) => mask & (1 << i));
      if (nodes.every((i) => nodes.every((j) => i === j || !edge(i, j)))) best = Math.max(best, nodes.length);
    }
    return best;
  }

  it("is a set no two of which meet, as large as any such set on small graphs", () => {
    const graphs = fc.integer({ min: 0, max: 12 }).chain((n) =>
      fc.record({
        n: fc.constant(n),
        edges: fc.array(fc.tuple(fc.nat(Math.max(0, n - 1)), fc.nat(Math.max(0, n - 1))), { maxLength: 40 }),
      }),
    );
    fc.assert(
      fc.property(graphs, ({ n, edges }) => {
        const key = (i: number, j: number) => `${Math.min(i, j)}-${Math.max(i, j)}`;
        const set = new Set(edges.filter(([i, j]) => i !== j).map(([i, j]) => key(i, j)));
        const edge = (i: number, j: number) => set.has(key(i, j));
        const got = largestApart(n, edge);
        for (const i of got) for (const j of got) if (i !== j) expect(edge(i, j)).toBe(false);
        expect(new Set(got).size).toBe(got.length);
        expect(got.length).toBe(largestByBruteForce(n, edge));
      }),
      { numRuns: 300 },
    );
  });
});
