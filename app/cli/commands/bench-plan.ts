// `chainproof bench-plan`: the bench-test procedure of a design as JSON (or text), so a plan can be
// checked from outside the code: every step's moves and instruction, the conditions it ends in, the
// expected drive, inputs and latch, what it checks and which stuck contacts it reveals; then the
// items left unchecked with the reason.
import { parseArgs } from "node:util";
import { generateBenchPlan, type BenchPlan } from "../../bench-tests/generate";
import { fail, loadDesign, write, type Command } from "../shared";

function planText(p: BenchPlan): string {
  const lines: string[] = [`Bench test of ${p.design}: ${p.steps.length} steps`, "", `Start: ${p.start.instruction}`];
  for (const s of p.steps) {
    lines.push("", `Step ${s.n}${s.kind === "sequence" ? " (lockout check)" : ""}: ${s.instruction}`);
    if (s.caution) lines.push(`  Caution: ${s.caution}`);
    const live = Object.entries(s.expect.inputs)
      .filter(([, on]) => on)
      .map(([id]) => id);
    lines.push(
      `  Expect: drive ${s.expect.drive ? "ON" : "off"}${s.expect.latched ? ", latched" : ""}; live: ${live.join(", ") || "none"}`,
    );
    if (s.covers.length > 0) lines.push(`  Checks: ${s.covers.join(", ")}`);
    if ((s.reveals ?? []).length > 0) lines.push(`  Reveals: ${s.reveals!.map((f) => f.replace(/^fault:/, "")).join(", ")}`);
  }
  if (p.uncovered.length > 0) {
    lines.push("", "Not checked:");
    for (const u of p.uncovered) lines.push(`  ${u.item}: ${u.reason}`);
  }
  const lb = p.stats.lowerBound;
  if (lb?.searched) {
    // A sampled table: a bound over the whole table, and the fewest among the rows searched (no bound).
    lines.push(
      "",
      `Rows observed: ${lb.planRows}; every plan needs at least ${lb.rows} (${lb.apart!.faults.length} faults no row shows together)` +
        (lb.rowsWithDrive !== undefined ? `, ${lb.rowsWithDrive} with a row that shows drive` : "") +
        `; fewest among the ${lb.searched.rows} of ${p.stats.rows} rows searched: ${lb.searched.fewest}` +
        (lb.searched.fewestWithDrive !== undefined ? ` (${lb.searched.fewestWithDrive} with a drive row)` : ""),
    );
  } else if (lb) {
    lines.push(
      "",
      `Rows observed: ${lb.planRows}; fewest rows that reveal every revealable fault and show each rule: ${lb.rows}${lb.exact ? "" : " or more"}` +
        (lb.rowsWithDrive !== undefined
          ? `; with a row that shows drive (lockout checks need one): ${lb.rowsWithDrive}${lb.exactWithDrive ? "" : " or more"}`
          : ""),
    );
  }
  return lines.join("\n") + "\n";
}

export const benchPlanCommand: Command = {
  name: "bench-plan",
  usage: "chainproof bench-plan <design.json> [--text]",
  help: `chainproof bench-plan <design.json> [--text]

Prints the bench-test procedure of a design (format chainproof/bench-plan@1).
Each step lists its moves (one condition at a time, in the order to make them;
"anyOrder" marks the moves whose order does not matter), the conditions it
ends in ("set"), what the bench must show ("expect": drive, every controller
input live or dead, the lockout latch), the rules and lockouts it checks
("covers") and the single stuck contacts that would show there ("reveals").
"uncovered" lists every rule, lockout and stuck contact no step checks, with
the reason; "stats.lowerBound" compares the rows the plan observes with the
fewest rows that could reveal every revealable fault and show each rule. A
table over 4,096 rows is searched in part: its bound then comes from faults
no row shows together ("apart", checked over the whole table), and
"searched" gives the fewest rows among those searched, which is no bound.

Options:
  --text   plain text instead of JSON
`,
  async run(argv) {
    const { positionals, values } = parseArgs({ args: argv, allowPositionals: true, strict: true, options: { text: { type: "boolean" } } });
    if (positionals.length !== 1) fail("bench-plan takes exactly one <design.json>");
    const c = loadDesign(positionals[0]);
    const plan = generateBenchPlan(c.design);
    await write(values.text ? planText(plan) : JSON.stringify(plan, null, 2) + "\n");
  },
};
