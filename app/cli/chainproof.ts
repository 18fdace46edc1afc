// Command line for the proof engine: prove, table, diagnose.
// Exit codes: 0 success (prove: every rule holds), 1 a rule fails (prove), 2 invalid design or usage.
import { readFileSync } from "node:fs";
import { parseArgs } from "node:util";
import {
  compileDesign,
  csvChunks,
  diagnose,
  prove,
  textTableChunks,
  validateDesign,
  type CompiledDesign,
  type Diagnosis,
  type RowFilter,
} from "../engine/index";

const HELP = `chainproof - proves drive-inhibit wiring designs (format chainproof/design@1)

Usage:
  chainproof prove <design.json>
  chainproof table <design.json> [--csv] [--from N] [--count M] [--only unsafe|violating|drive] [--rule ID] [--where COND=S1|S2,...]
  chainproof diagnose <design.json> --row COND=STATE,... [--history COND=STATE,...]... [--text]
  chainproof <command> --help

Exit codes: 0 success (prove: every rule holds), 1 prove found a failing rule,
2 invalid design, unreadable file or bad usage. Design problems go to stderr,
one per line, each starting with its field path ("(root)" for the document).
`;

const COMMAND_HELP: Record<string, string> = {
  prove: `chainproof prove <design.json>

Checks every rule and every single contact fault, and prints the verdict
(chainproof/verdict@1) as JSON on stdout.
Exit 0 when every rule holds, 1 when one fails, 2 when the design is invalid.
`,
  table: `chainproof table <design.json> [options]

Prints the truth table, one row per line, streamed. Default output is an aligned
text table with a header line; --csv prints CSV instead. Columns: row, each
condition, input:ID (1 energized, 0 dead), powered, enabled, direction, braking,
throttle, drive (steady drive), rule:ID per inhibit rule (violating, unsafe, or -).

Options:
  --csv                         CSV output
  --only unsafe|violating|drive keep only these rows (unsafe/violating: for any
                                inhibit rule, or the one named by --rule)
  --rule ID                     the inhibit rule for --only unsafe|violating
  --where COND=S1|S2,...        keep rows whose conditions are in the listed states
  --from N                      skip the first N matching rows (default 0)
  --count M                     print at most M rows (default: all)
`,
  diagnose: `chainproof diagnose <design.json> --row COND=STATE,... [options]

Explains one row: the controller's view, whether it drives, for each dead input
the smallest sets of open contacts whose closing would energize it, and every
reason the drive is off. --row must name a state for every condition.

Options:
  --row COND=STATE,...      the row to explain (required)
  --history COND=STATE,...  an earlier step (repeat, oldest first); with history
                            the row is replayed after it from power-up, so a
                            latched lockout is reported
  --text                    plain text instead of JSON
`,
};

class UsageError extends Error {}

function fail(message: string): never {
  throw new UsageError(message);
}

function loadDesign(file: string | undefined): CompiledDesign {
  if (!file) fail("missing <design.json>");
  let text: string;
  try {
    text = readFileSync(file, "utf8");
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    fail(`cannot read ${JSON.stringify(file)}: ${code === "ENOENT" ? "no such file" : code === "EISDIR" ? "it is a directory" : (code ?? "read error")}`);
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (e) {
    fail(`${JSON.stringify(file)} is not valid JSON: ${(e as Error).message}`);
  }
  const checked = validateDesign(json);
  if (!checked.ok) {
    for (const p of checked.problems) process.stderr.write(`${p.path === "" ? "(root)" : p.path}: ${p.message}\n`);
    process.exitCode = 2;
    throw new InvalidDesign();
  }
  return compileDesign(checked.design);
}

class InvalidDesign extends Error {}

function parseRow(text: string, flag: string): Record<string, string> {
  const out: Record<string, string> = {};
  for (const part of text.split(",")) {
    if (part.trim() === "") continue;
    const eq = part.indexOf("=");
    if (eq <= 0) fail(`${flag}: expected COND=STATE, got ${JSON.stringify(part)}`);
    out[part.slice(0, eq).trim()] = part.slice(eq + 1).trim();
  }
  return out;
}

function checkRow(c: CompiledDesign, states: Record<string, string>, flag: string): void {
  const missing = c.conditions.filter((x) => !(x.id in states)).map((x) => x.id);
  if (missing.length > 0) fail(`${flag}: no state given for condition${missing.length > 1 ? "s" : ""} ${missing.join(", ")}`);
  for (const [k, v] of Object.entries(states)) {
    const cond = c.conditions[c.conditionIndex[k]];
    if (!cond) fail(`${flag}: no condition with id ${JSON.stringify(k)}`);
    if (!cond.states.includes(v)) {
      fail(`${flag}: ${JSON.stringify(v)} is not a state of condition ${JSON.stringify(k)} (${cond.states.join(", ")})`);
    }
  }
}

function nonNegativeInt(text: string | undefined, flag: string): number | undefined {
  if (text === undefined) return undefined;
  if (!/^\d+$/.test(text)) fail(`${flag} needs a whole number, got ${JSON.stringify(text)}`);
  return Number(text);
}

function write(chunk: string): Promise<void> {
  return new Promise((resolve, reject) => {
    if (process.stdout.write(chunk)) resolve();
    else process.stdout.once("drain", resolve).once("error", reject);
  });
}

async function cmdProve(argv: string[]): Promise<void> {
  const { positionals } = parseArgs({ args: argv, allowPositionals: true, strict: true, options: {} });
  if (positionals.length !== 1) fail("prove takes exactly one <design.json>");
  const c = loadDesign(positionals[0]);
  const verdict = prove(c);
  await write(JSON.stringify(verdict, null, 2) + "\n");
  process.exitCode = verdict.ok ? 0 : 1;
}

async function cmdTable(argv: string[]): Promise<void> {
  const { positionals, values } = parseArgs({
    args: argv,
    allowPositionals: true,
    strict: true,
    options: {
      csv: { type: "boolean" },
      from: { type: "string" },
      count: { type: "string" },
      only: { type: "string" },
      rule: { type: "string" },
      where: { type: "string" },
    },
  });
  if (positionals.length !== 1) fail("table takes exactly one <design.json>");
  const from = nonNegativeInt(values.from, "--from");
  const count = nonNegativeInt(values.count, "--count");
  if (values.only !== undefined && !["unsafe", "violating", "drive"].includes(values.only)) {
    fail(`--only must be unsafe, violating or drive, got ${JSON.stringify(values.only)}`);
  }
  const c = loadDesign(positionals[0]);
  const filter: RowFilter = {};
  if (values.only) filter.only = values.only as RowFilter["only"];
  if (values.rule !== undefined) {
    const rule = c.rules.find((r) => r.id === values.rule);
    if (!rule) fail(`--rule: no rule with id ${JSON.stringify(values.rule)}`);
    if (rule.type !== "inhibit") fail(`--rule: ${JSON.stringify(values.rule)} is not an inhibit rule`);
    filter.rule = values.rule;
  }
  if (values.where !== undefined) {
    const where: Record<string, string[]> = {};
    for (const [k, v] of Object.entries(parseRow(values.where, "--where"))) {
      const cond = c.conditions[c.conditionIndex[k]];
      if (!cond) fail(`--where: no condition with id ${JSON.stringify(k)}`);
      const states = v.split("|");
      for (const s of states) if (!cond.states.includes(s)) fail(`--where: ${JSON.stringify(s)} is not a state of condition ${JSON.stringify(k)}`);
      where[k] = states;
    }
    filter.where = where;
  }
  const chunks = values.csv ? csvChunks(c, filter, { from, count }) : textTableChunks(c, filter, { from, count });
  for (const chunk of chunks) await write(chunk);
}

function diagnosisText(c: CompiledDesign, d: Diagnosis): string {
  const lines: string[] = [];
  lines.push(`Row ${d.row}: ${Object.entries(d.states).map(([k, v]) => `${k}=${v}`).join(", ")}`);
  const ctl = d.controller;
  lines.push(
    `Controller: ${ctl.powered ? "powered" : "unpowered"}, ${ctl.enabled ? "enabled" : "not enabled"}, direction ${ctl.direction}, ` +
      `${ctl.braking ? "braking" : "not braking"}, throttle ${ctl.throttle}`,
  );
  lines.push(`Drive: ${d.drive ? "ON" : "off"}${d.latched ? " (lockout latched)" : ""}`);
  for (const r of d.reasons) lines.push(`  - ${r.message}`);
  for (const input of d.inputs) {
    if (input.energized) {
      lines.push(`Input ${input.input} (${input.function}): live`);
      continue;
    }
    lines.push(`Input ${input.input} (${input.function}): dead`);
    if (input.unreachable) lines.push("    no contact can energize it: it is not wired towards any supply");
    for (const fix of input.fixes) {
      lines.push(`    close ${fix.map((k) => `${k.contact} (${k.condition} in ${k.closeIn.join("|")})`).join(" and ")}`);
    }
    if (input.truncated) lines.push("    (more sets of the same size exist)");
  }
  void c;
  return lines.join("\n") + "\n";
}

async function cmdDiagnose(argv: string[]): Promise<void> {
  const { positionals, values } = parseArgs({
    args: argv,
    allowPositionals: true,
    strict: true,
    options: {
      row: { type: "string" },
      history: { type: "string", multiple: true },
      text: { type: "boolean" },
    },
  });
  if (positionals.length !== 1) fail("diagnose takes exactly one <design.json>");
  if (values.row === undefined) fail("diagnose needs --row COND=STATE,...");
  const rowText = values.row;
  const c = loadDesign(positionals[0]);
  const row = parseRow(rowText, "--row");
  checkRow(c, row, "--row");
  const history = values.history?.map((h, i) => {
    const states = parseRow(h, `--history #${i + 1}`);
    checkRow(c, states, `--history #${i + 1}`);
    return states;
  });
  const d = diagnose(c, row, { history });
  await write(values.text ? diagnosisText(c, d) : JSON.stringify(d, null, 2) + "\n");
}

async function main(argv: string[]): Promise<void> {
  const [command, ...rest] = argv;
  if (command === undefined || command === "--help" || command === "-h" || command === "help") {
    await write(HELP);
    return;
  }
  if (!(command in COMMAND_HELP)) fail(`unknown command ${JSON.stringify(command)}`);
  if (rest.includes("--help") || rest.includes("-h")) {
    await write(COMMAND_HELP[command]);
    return;
  }
  if (command === "prove") await cmdProve(rest);
  else if (command === "table") await cmdTable(rest);
  else await cmdDiagnose(rest);
}

main(process.argv.slice(2)).catch((e: unknown) => {
  if (e instanceof InvalidDesign) {
    process.exitCode = 2;
    return;
  }
  if (e instanceof UsageError || (e as { code?: string }).code?.startsWith("ERR_PARSE_ARGS")) {
    process.stderr.write(`chainproof: ${(e as Error).message}\nRun "chainproof --help" for usage.\n`);
    process.exitCode = 2;
    return;
  }
  if ((e as { code?: string }).code === "EPIPE") return;
  process.stderr.write(`chainproof: internal error: ${(e as Error).message ?? String(e)}\n`);
  process.exitCode = 3;
});
