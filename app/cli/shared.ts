// What every command of the command line shares: usage errors, reading a design, parsing rows, writing.
import { readFileSync } from "node:fs";
import { compileDesign, validateDesign, type CompiledDesign } from "../engine/index";

/** One subcommand: its name, a line for the overview, its own help and what it does. */
export type Command = {
  name: string;
  usage: string;
  help: string;
  run: (argv: string[]) => Promise<void>;
};

export class UsageError extends Error {}

export function fail(message: string): never {
  throw new UsageError(message);
}

export function loadDesign(file: string | undefined): CompiledDesign {
  if (!file) fail("missing <design.json>");
  const checked = validateDesign(readJsonFile(file));
  if (!checked.ok) {
    printProblems(checked.problems);
    throw new InvalidDesign();
  }
  return compileDesign(checked.design);
}

/** Problems of an invalid document on stderr, one a line, each starting with its path; exit code 2. */
export function printProblems(problems: { path: string; message: string }[]): void {
  for (const p of problems) process.stderr.write(`${p.path === "" ? "(root)" : p.path}: ${p.message}\n`);
  process.exitCode = 2;
}

/** The parsed JSON of a file; an unreadable file or bad JSON is a usage error (exit 2, one line). */
export function readJsonFile(file: string): unknown {
  let text: string;
  try {
    text = readFileSync(file, "utf8");
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    fail(
      `cannot read ${JSON.stringify(file)}: ${code === "ENOENT" ? "no such file" : code === "EISDIR" ? "it is a directory" : (code ?? "read error")}`,
    );
  }
  try {
    return JSON.parse(text);
  } catch (e) {
    fail(`${JSON.stringify(file)} is not valid JSON: ${(e as Error).message}`);
  }
}

export class InvalidDesign extends Error {}

export function parseRow(text: string, flag: string): Record<string, string> {
  const out: Record<string, string> = {};
  for (const part of text.split(",")) {
    if (part.trim() === "") continue;
    const eq = part.indexOf("=");
    if (eq <= 0) fail(`${flag}: expected COND=STATE, got ${JSON.stringify(part)}`);
    out[part.slice(0, eq).trim()] = part.slice(eq + 1).trim();
  }
  return out;
}

export function checkRow(c: CompiledDesign, states: Record<string, string>, flag: string): void {
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

export function nonNegativeInt(text: string | undefined, flag: string): number | undefined {
  if (text === undefined) return undefined;
  if (!/^\d+$/.test(text)) fail(`${flag} needs a whole number, got ${JSON.stringify(text)}`);
  return Number(text);
}

export function write(chunk: string): Promise<void> {
  return new Promise((resolve, reject) => {
    if (process.stdout.write(chunk)) resolve();
    else process.stdout.once("drain", resolve).once("error", reject);
  });
}
