// Bench-plan figures for `npm run bench`: plan length against the lower bound (the fewest rows that
// reveal every revealable fault and show a test row for each rule, exact when the search finished; for
// a sampled table a packing bound over the whole table, with the fewest rows among those searched),
// lockout steps, faults revealed, and the time to generate, for the shared examples, the held-back
// fixtures and generated designs of growing size.
import { readdirSync, readFileSync } from "node:fs";
import { generateBenchPlan } from "../../app/bench-tests/generate";
import { validateDesign, type Design } from "../../app/engine/index";
import { generatedDesign } from "./designs";

const EXAMPLES = "/work/shared/spec/examples";
const FIXTURES = new URL("../unit/bench-tests/fixtures/", import.meta.url);

function designs(): Array<[string, Design]> {
  const read = (dir: string | URL, f: string): [string, Design] => [
    f.replace(".design.json", ""),
    JSON.parse(readFileSync(new URL(f, dir instanceof URL ? dir : `file://${dir}/`), "utf8")),
  ];
  const list = (dir: string | URL) => {
    try {
      return readdirSync(dir)
        .filter((f) => f.endsWith(".design.json"))
        .sort();
    } catch {
      return [];
    }
  };
  return [
    ...list(EXAMPLES).map((f) => read(EXAMPLES, f)),
    ...list(FIXTURES).map((f) => read(FIXTURES, f)),
    ...[10, 12, 16].map((n): [string, Design] => [`generated-${n}-conditions`, generatedDesign(n)]),
  ].filter(([, d]) => validateDesign(d).ok);
}

export function benchPlanFigures() {
  return designs().map(([name, d]) => {
    const runs: number[] = [];
    let plan = generateBenchPlan(d);
    for (let i = 0; i < 3; i++) {
      const t0 = performance.now();
      plan = generateBenchPlan(d);
      runs.push(performance.now() - t0);
    }
    const s = plan.stats;
    return {
      design: name,
      rows: s.rows,
      rowsSearched: s.rowsSearched,
      steps: s.steps,
      rowSteps: s.steps - (s.lockoutSteps ?? 0),
      lockoutSteps: s.lockoutSteps,
      planRows: s.lowerBound!.planRows,
      lowerBoundRows: s.lowerBound!.rows,
      lowerBoundExact: s.lowerBound!.exact,
      lowerBoundWithDriveRow: s.lowerBound!.rowsWithDrive,
      fewestAmongSearched: s.lowerBound!.searched?.fewest,
      fewestAmongSearchedWithDriveRow: s.lowerBound!.searched?.fewestWithDrive,
      faults: s.faults,
      itemsCovered: `${s.covered} of ${s.items}`,
      uncovered: plan.uncovered.map((u) => u.item),
      medianMs: Math.round(runs.sort((a, b) => a - b)[1]),
    };
  });
}
