// Tabular export of the truth table (CSV and an aligned text table), streamed in chunks:
// rows are produced word by word and never held all at once.
import type { CompiledDesign } from "./compile";
import { THROTTLE_CLASSES } from "./compile";
import { compileFilter, FilterScanner, type RowFilter } from "./rows";
import { lowestBit, popcount, WORD } from "./table";

const CHUNK_CHARS = 1 << 16;

/**
 * One CSV field. A cell a spreadsheet would run as a formula (it begins with = + - @ tab or carriage
 * return; OWASP "CSV Injection") gets a leading single quote and is quoted, so it opens as the text it
 * is. The rule column's lone "-" stays: an operator alone is no formula.
 */
function csvField(s: string): string {
  const formula = /^[=+\-@\t\r]/.test(s) && s !== "-";
  const text = formula ? `'${s}` : s;
  return formula || /[",\r\n]/.test(text) || text.trim() !== text ? `"${text.replace(/"/g, '""')}"` : text;
}

/** One CSV line (with its newline) of any table the product writes, through the same field writer. */
export function csvLine(fields: readonly string[]): string {
  return fields.map(csvField).join(",") + "\n";
}

/** The rules with a column, in design order: inhibit and require-drive rules (no-restart is about sequences). */
function rowRules(c: CompiledDesign) {
  return c.rules.filter((r) => r.type !== "no-restart");
}

/**
 * Columns: `row`, one per condition (its id), `input:ID` per input (1 energized / 0),
 * `powered`, `enabled` (1/0), `direction`, `braking` (1/0), `throttle`, `drive` (steady drive, 1/0),
 * and `rule:ID` per inhibit or require-drive rule in design order: for an inhibit rule `violating`,
 * `unsafe`, or `-` where its `when` does not hold; for a require-drive rule `failing` (a demand row
 * without drive), `demand`, or `-`.
 */
export function csvHeader(c: CompiledDesign): string[] {
  return [
    "row",
    ...c.conditions.map((x) => x.id),
    ...c.inputs.map((x) => `input:${x.id}`),
    "powered",
    "enabled",
    "direction",
    "braking",
    "throttle",
    "drive",
    ...rowRules(c).map((r) => `rule:${r.id}`),
  ];
}

/** Widest value of each column, for the aligned text table. */
function columnWidths(c: CompiledDesign): number[] {
  const values = [
    String(c.rows - 1).length,
    ...c.conditions.map((x) => Math.max(...x.states.map((s) => s.length))),
    ...c.inputs.map(() => 1),
    1,
    1,
    "conflict".length,
    1,
    "released".length,
    1,
    ...rowRules(c).map((r) => (r.type === "inhibit" ? "violating" : "failing").length),
  ];
  return csvHeader(c).map((h, i) => Math.max(h.length, values[i]));
}

/**
 * Lines of the matching rows from position `from`, at most `count`, in chunks. Each column's
 * possible values are formatted once up front (`cell(column, text)`), so a row is a concatenation.
 */
function* rowLines(
  c: CompiledDesign,
  filter: RowFilter | undefined,
  opts: { from?: number; count?: number },
  cell: (column: number, text: string) => string,
  sep: string,
  header: string,
): Generator<string> {
  const from = Math.max(0, Math.floor(opts.from ?? 0));
  const count = opts.count === undefined ? Infinity : Math.max(0, Math.floor(opts.count));
  const ruled = rowRules(c);
  const ruleIndex = ruled.map((r) => r.index);
  const isInhibit = ruled.map((r) => r.type === "inhibit");
  let col = 1;
  const states = c.conditions.map((cond) => {
    const at = col++;
    return cond.states.map((s) => sep + cell(at, s));
  });
  const strides = c.conditions.map((x) => x.stride);
  const radices = c.conditions.map((x) => x.radix);
  const bits = (at: number) => [sep + cell(at, "0"), sep + cell(at, "1")];
  const inputs = c.inputs.map(() => bits(col++));
  const inputNets = c.inputs.map((x) => x.net);
  const powered = bits(col++);
  const enabled = bits(col++);
  const dirCol = col++;
  const direction = ["forward", "neutral", "reverse", "conflict"].map((d) => sep + cell(dirCol, d));
  const braking = bits(col++);
  const thrCol = col++;
  const throttle = THROTTLE_CLASSES.map((t) => sep + cell(thrCol, t));
  const drive = bits(col++);
  const ruleCells = ruled.map((r) => {
    const at = col++;
    return (r.type === "inhibit" ? ["-", "unsafe", "violating"] : ["-", "demand", "failing"]).map((v) => sep + cell(at, v));
  });
  // Per rule column: the rows where `when` holds, and among them the bad ones (violating / failing).
  const unsafe = new Int32Array(ruled.length);
  const forbidden = new Int32Array(ruled.length);

  let chunk = header;
  let position = 0;
  let emitted = 0;
  const scanner = new FilterScanner(c, compileFilter(c, filter));
  const e = scanner.ev;
  for (let w = 0; w < e.wordCount && emitted < count; w++) {
    let m = scanner.word(w);
    if (m === 0) continue;
    const n = popcount(m);
    if (position + n <= from) {
      position += n;
      continue;
    }
    for (let k = 0; k < ruled.length; k++) {
      unsafe[k] = e.whenWord(ruleIndex[k]);
      forbidden[k] = isInhibit[k] ? e.forbiddenWord(ruleIndex[k]) : ~e.drive;
    }
    while (m !== 0 && emitted < count) {
      const j = lowestBit(m);
      m &= m - 1;
      if (position++ < from) continue;
      const index = w * WORD + j;
      let line = cell(0, String(index));
      for (let k = 0; k < states.length; k++) line += states[k][Math.floor(index / strides[k]) % radices[k]];
      for (let k = 0; k < inputs.length; k++) line += inputs[k][(e.reach[inputNets[k]] >>> j) & 1];
      line +=
        powered[(e.powered >>> j) & 1] +
        enabled[(e.enabled >>> j) & 1] +
        direction[(e.dirForward >>> j) & 1 ? 0 : (e.dirNeutral >>> j) & 1 ? 1 : (e.dirReverse >>> j) & 1 ? 2 : 3] +
        braking[(e.braking >>> j) & 1] +
        throttle[(e.thrReleased >>> j) & 1 ? 0 : (e.thrApplied >>> j) & 1 ? 1 : 2] +
        drive[(e.drive >>> j) & 1];
      for (let k = 0; k < ruleCells.length; k++) {
        line += ruleCells[k][(unsafe[k] >>> j) & 1 ? 1 + ((forbidden[k] >>> j) & 1) : 0];
      }
      chunk += line + "\n";
      emitted++;
      if (chunk.length >= CHUNK_CHARS) {
        yield chunk;
        chunk = "";
      }
    }
  }
  if (chunk.length > 0) yield chunk;
}

/** CSV: the header line, then matching rows from position `from` (within the filtered rows), `count` at most. */
export function csvChunks(c: CompiledDesign, filter?: RowFilter, opts: { from?: number; count?: number } = {}): Generator<string> {
  const header = csvHeader(c).map(csvField).join(",") + "\n";
  return rowLines(c, filter, opts, (_, text) => csvField(text), ",", header);
}

/** The same rows as an aligned, human-readable text table (header line first). */
export function textTableChunks(c: CompiledDesign, filter?: RowFilter, opts: { from?: number; count?: number } = {}): Generator<string> {
  const widths = columnWidths(c);
  const last = widths.length - 1;
  const cell = (column: number, text: string) =>
    column === 0 ? text.padStart(widths[0]) : column === last ? text : text.padEnd(widths[column]);
  const header =
    csvHeader(c)
      .map((h, i) => cell(i, h))
      .join("  ") + "\n";
  return rowLines(c, filter, opts, cell, "  ", header);
}
