// Tabular export of the truth table (CSV and an aligned text table), streamed in chunks:
// rows are produced word by word and never held all at once.
import type { CompiledDesign } from "./compile";
import { THROTTLE_CLASSES } from "./compile";
import { matchingRows, type RowFilter } from "./rows";
import { WORD, type WordEvaluator } from "./table";

const CHUNK_CHARS = 1 << 16;

function csvField(s: string): string {
  return /[",\r\n]/.test(s) || s.trim() !== s ? `"${s.replace(/"/g, '""')}"` : s;
}

/**
 * Columns: `row`, one per condition (its id), `input:ID` per input (1 energized / 0),
 * `powered`, `enabled` (1/0), `direction`, `braking` (1/0), `throttle`, `drive` (steady drive, 1/0),
 * and `rule:ID` per inhibit rule (`violating`, `unsafe`, or `-` where its `when` does not hold).
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
    ...c.rules.filter((r) => r.type === "inhibit").map((r) => `rule:${r.id}`),
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
    ...c.rules.filter((r) => r.type === "inhibit").map(() => "violating".length),
  ];
  return csvHeader(c).map((h, i) => Math.max(h.length, values[i]));
}

/** The fields of each matching row from position `from`, at most `count` rows. */
function* rowFields(
  c: CompiledDesign,
  filter: RowFilter | undefined,
  opts: { from?: number; count?: number },
  stateText: string[][],
): Generator<string[]> {
  const from = Math.max(0, Math.floor(opts.from ?? 0));
  const count = opts.count === undefined ? Infinity : Math.max(0, Math.floor(opts.count));
  if (count === 0) return;
  const inhibit = c.rules.filter((r) => r.type === "inhibit").map((r) => r.index);
  let ev: WordEvaluator | undefined;
  let unsafe: number[] = [];
  let forbidden: number[] = [];
  const onWord = (e: WordEvaluator) => {
    ev = e;
    unsafe = inhibit.map((r) => e.unsafeWord(r));
    forbidden = inhibit.map((r) => e.forbiddenWord(r));
  };
  let position = 0;
  let emitted = 0;
  for (const index of matchingRows(c, filter, onWord)) {
    if (position++ < from) continue;
    const e = ev!;
    const j = index - e.wordIndex * WORD;
    const bit = (x: number) => ((x >>> j) & 1 ? "1" : "0");
    const f: string[] = [String(index)];
    for (let k = 0; k < c.conditions.length; k++) {
      const cond = c.conditions[k];
      f.push(stateText[k][Math.floor(index / cond.stride) % cond.radix]);
    }
    for (const input of c.inputs) f.push(bit(e.reach[input.net]));
    f.push(
      bit(e.powered),
      bit(e.enabled),
      (e.dirForward >>> j) & 1 ? "forward" : (e.dirReverse >>> j) & 1 ? "reverse" : (e.dirNeutral >>> j) & 1 ? "neutral" : "conflict",
      bit(e.braking),
      THROTTLE_CLASSES[(e.thrReleased >>> j) & 1 ? 0 : (e.thrApplied >>> j) & 1 ? 1 : 2],
      bit(e.drive),
    );
    for (let k = 0; k < inhibit.length; k++) {
      f.push(!((unsafe[k] >>> j) & 1) ? "-" : (forbidden[k] >>> j) & 1 ? "violating" : "unsafe");
    }
    yield f;
    if (++emitted >= count) return;
  }
}

/** CSV: the header line, then matching rows from position `from` (within the filtered rows), `count` at most. */
export function* csvChunks(
  c: CompiledDesign,
  filter?: RowFilter,
  opts: { from?: number; count?: number } = {},
): Generator<string> {
  const stateText = c.conditions.map((cond) => cond.states.map(csvField));
  let chunk = csvHeader(c).map(csvField).join(",") + "\n";
  for (const f of rowFields(c, filter, opts, stateText)) {
    chunk += f.join(",") + "\n";
    if (chunk.length >= CHUNK_CHARS) {
      yield chunk;
      chunk = "";
    }
  }
  if (chunk.length > 0) yield chunk;
}

/** The same rows as an aligned, human-readable text table (header line first). */
export function* textTableChunks(
  c: CompiledDesign,
  filter?: RowFilter,
  opts: { from?: number; count?: number } = {},
): Generator<string> {
  const widths = columnWidths(c);
  const line = (f: string[]) => f.map((x, i) => (i === 0 ? x.padStart(widths[i]) : x.padEnd(widths[i]))).join("  ").trimEnd();
  const stateText = c.conditions.map((cond) => cond.states.slice());
  let chunk = line(csvHeader(c)) + "\n";
  for (const f of rowFields(c, filter, opts, stateText)) {
    chunk += line(f) + "\n";
    if (chunk.length >= CHUNK_CHARS) {
      yield chunk;
      chunk = "";
    }
  }
  if (chunk.length > 0) yield chunk;
}
