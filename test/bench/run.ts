// Benchmark of the proof engine (npm run bench): prints JSON figures.
// The naive row-at-a-time reference is timed on an evenly spread sample of the same table and
// extrapolated (its full verdict re-evaluates the whole table once per single fault).
import { availableParallelism } from "node:os";
import { compileDesign, csvChunks, groupRows, pageRows, prove, whyRuleHolds, type CompiledDesign } from "../../app/engine/index";
import { summarizeTable } from "../../app/engine/rules";
import { refDecode, refRow } from "../unit/engine/reference";
import { generatedDesign } from "./designs";
import { benchPlanFigures } from "./bench-plans";

function time<T>(f: () => T): [number, T] {
  const t0 = performance.now();
  const out = f();
  return [performance.now() - t0, out];
}

function stats(samples: number[]) {
  const s = samples.slice().sort((a, b) => a - b);
  return { minMs: round(s[0]), medianMs: round(s[Math.floor(s.length / 2)]), runs: s.length };
}

const round = (x: number, digits = 2) => Math.round(x * 10 ** digits) / 10 ** digits;

function designFacts(c: CompiledDesign) {
  return {
    conditions: c.conditions.length,
    rows: c.rows,
    contacts: c.contacts.length,
    nets: c.nets.length,
    inhibitRules: c.rules.filter((r) => r.type === "inhibit").length,
    requireDriveRules: c.rules.filter((r) => r.type === "require-drive").length,
    noRestartRules: c.rules.filter((r) => r.type === "no-restart").length,
    treeWiring: c.singlePass,
  };
}

// ------------------------------------------------------------------ the 6,291,456-row design
const big = generatedDesign(21);
const [compileMs, c] = time(() => compileDesign(big));
const verdictRuns: number[] = [];
let verdict = prove(c);
for (let i = 0; i < 3; i++) {
  const [ms, v] = time(() => prove(c));
  verdictRuns.push(ms);
  verdict = v;
}
const [faultFreeMs] = time(() => summarizeTable(c, { views: true, faults: false }));

// Naive reference on a sample spread over the whole table.
const SAMPLE = 20_000;
const step = Math.floor(c.rows / SAMPLE);
let driveInSample = 0;
const [naiveSampleMs] = time(() => {
  for (let k = 0; k < SAMPLE; k++) if (refRow(big, refDecode(big, k * step)).drive) driveInSample++;
});
const naivePerRowMs = naiveSampleMs / SAMPLE;
const faultCount = 2 * c.contacts.length;
const naiveFaultFreeMs = naivePerRowMs * c.rows;
const naiveVerdictMs = naivePerRowMs * c.rows * (1 + faultCount);
const verdictMedian = stats(verdictRuns).medianMs;

// ------------------------------------------------------------------ a 20-contact design
let small = generatedDesign(10);
for (let n = 10; n <= 20; n++) {
  const d = generatedDesign(n);
  if (d.components.filter((x) => x.type === "contact").length >= 20) {
    small = d;
    break;
  }
}
const cs = compileDesign(small);
prove(cs);
const smallRuns: number[] = [];
for (let i = 0; i < 20; i++) smallRuns.push(time(() => prove(compileDesign(small)))[0]);

// ------------------------------------------------------------------ paging with a filter
const filter = { only: "violating" as const };
const [firstPageMs, first] = time(() => pageRows(c, { filter, from: 0, count: 100 }));
const laterRuns: number[] = [];
for (let i = 1; i <= 5; i++) laterRuns.push(time(() => pageRows(c, { filter, from: i * 1000, count: 100 }))[0]);

// ------------------------------------------------------------------ CSV throughput
const CSV_ROWS = 1_000_000;
let csvChars = 0;
let csvLines = 0;
const [csvMs] = time(() => {
  for (const chunk of csvChunks(c, undefined, { count: CSV_ROWS })) {
    csvChars += chunk.length;
    for (let i = chunk.indexOf("\n"); i >= 0; i = chunk.indexOf("\n", i + 1)) csvLines++;
  }
});

// ------------------------------------------------------------------ row groups of every set
// Every set the design has (spec section 4), grouped once each after one warm-up run.
const groupSets = [
  "drive",
  ...c.rules.flatMap((r) =>
    r.type === "inhibit"
      ? [`unsafe:${r.id}`, `violating:${r.id}`]
      : r.type === "require-drive"
        ? [`demand:${r.id}`, `failing:${r.id}`]
        : [],
  ),
  ...c.contacts.flatMap((k) => [`broken:${k.id}/stuck-closed`, `broken:${k.id}/stuck-open`]),
];
groupRows(c, "drive");
const grouped = groupSets.map((set) => {
  const [ms, doc] = time(() => groupRows(c, set));
  return { set, rows: doc.rows, groups: doc.groupCount, ms: round(ms, 0) };
});
const whys = c.rules.flatMap((r) => {
  if (r.type !== "inhibit" || r.forbidInput >= 0) return [];
  const [ms, doc] = time(() => whyRuleHolds(c, r.id));
  return [
    {
      rule: r.id,
      unsafeRows: doc.unsafeRows,
      reasons: doc.reasons.map((p) => `${p.reason}: ${p.rows} rows in ${p.groupCount} groups`),
      ms: round(ms, 0),
    },
  ];
});
const slowest = [...grouped, ...whys.map((w) => ({ set: `why ${w.rule}`, ms: w.ms }))].sort((a, b) => b.ms - a.ms)[0];
const emptyBroken = grouped.filter((g) => g.set.startsWith("broken:") && g.rows === 0);

const report = {
  machine: { cpus: availableParallelism(), node: process.version },
  largeDesign: {
    ...designFacts(c),
    compileMs: round(compileMs),
    verdict: {
      ...stats(verdictRuns),
      ok: verdict.ok,
      driveRows: verdict.driveRows,
      rulesHolding: verdict.rules.filter((r) => r.holds).length,
      singleFaultsFound: verdict.singleFaults.length,
      faultsChecked: faultCount,
    },
    faultFreeScanMs: round(faultFreeMs),
  },
  naiveReference: {
    method: `row-at-a-time reference timed on ${SAMPLE} rows spread evenly over the table, extrapolated to all rows; full verdict = fault-free pass + one pass per single fault (${faultCount}), no-restart search not counted (so a lower bound)`,
    sampleMs: round(naiveSampleMs),
    sampleDriveRows: driveInSample,
    perRowMicroseconds: round(naivePerRowMs * 1000, 3),
    faultFreePassEstimateMs: Math.round(naiveFaultFreeMs),
    fullVerdictEstimateMs: Math.round(naiveVerdictMs),
    speedupFullVerdict: Math.round(naiveVerdictMs / verdictMedian),
    speedupFaultFreePass: Math.round(naiveFaultFreeMs / faultFreeMs),
  },
  twentyContactDesign: { ...designFacts(cs), verdict: stats(smallRuns) },
  pageRowsViolating: {
    filter,
    matchingRows: first.total,
    pageSize: 100,
    firstPageMs: round(firstPageMs),
    firstPageNote: "includes the one-time count index for this filter (a full scan)",
    laterPage: stats(laterRuns),
  },
  csv: {
    rows: CSV_ROWS,
    lines: csvLines,
    megabytes: round(csvChars / 1e6),
    ms: round(csvMs),
    rowsPerSecond: Math.round((CSV_ROWS / csvMs) * 1000),
    megabytesPerSecond: round(csvChars / 1e6 / (csvMs / 1000)),
  },
  rowGroups: {
    method:
      "groupRows / whyRuleHolds on the large design: every set scanned from the table, then its reduced decision diagram read as groups",
    slowest: { set: slowest.set, ms: slowest.ms, goalMs: 1000 },
    sets: grouped.filter((g) => !(g.set.startsWith("broken:") && g.rows === 0)),
    brokenSetsEmpty: { count: emptyBroken.length, slowestMs: Math.max(...emptyBroken.map((g) => g.ms)) },
    why: whys,
  },
  benchPlans: benchPlanFigures(),
  memory: { rssMB: round(process.memoryUsage().rss / 1e6, 1), heapUsedMB: round(process.memoryUsage().heapUsed / 1e6, 1) },
};
console.log(JSON.stringify(report, null, 2));
