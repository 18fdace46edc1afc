// CSV export of the truth table, streamed in chunks (never the whole table in memory).
import type { CompiledDesign } from "./compile";
import { THROTTLE_CLASSES } from "./compile";
import { matchingRows, type RowFilter } from "./rows";
import type { WordEvaluator } from "./table";
import { WORD } from "./table";

const CHUNK_CHARS = 1 << 16;

function csvField(s: string): string {
  return /[",\r\n]/.test(s) || s.trim() !== s ? `"${s.replace(/"/g, '""')}"` : s;
}

/**
 * Columns: `row`, one per condition (its id), `input:ID` per input (1 energized / 0),
 * `powered`, `enabled`, `direction`, `braking`, `throttle`, `drive` (steady drive, 1/0),
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

/** Header line, then the matching rows from position `from` (within the filtered rows), `count` at most. */
export function* csvChunks(
  c: CompiledDesign,
  filter?: RowFilter,
  opts: { from?: number; count?: number } = {},
): Generator<string> {
  const from = Math.max(0, Math.floor(opts.from ?? 0));
  const count = opts.count === undefined ? Infinity : Math.max(0, Math.floor(opts.count));
  const header = csvHeader(c).map(csvField).join(",") + "\n";
  const stateText = c.conditions.map((cond) => cond.states.map(csvField));
  const inhibit = c.rules.filter((r) => r.type === "inhibit").map((r) => r.index);
  let ev: WordEvaluator | null = null;
  // Per-word columns that do not depend on the lane are recomputed lazily per word.
  let unsafe: number[] = [];
  let forbidden: number[] = [];
  const onWord = (e: WordEvaluator) => {
    ev = e;
    unsafe = inhibit.map((r) => e.unsafeWord(r));
    forbidden = inhibit.map((r) => e.forbiddenWord(r));
  };
  let chunk = header;
  let position = 0;
  let emitted = 0;
  if (count > 0) {
    for (const index of matchingRows(c, filter, onWord)) {
      if (position++ < from) continue;
      const e = ev as unknown as WordEvaluator;
      const j = index - e.wordIndex * WORD;
      let line = String(index);
      for (let k = 0; k < c.conditions.length; k++) {
        const cond = c.conditions[k];
        line += "," + stateText[k][Math.floor(index / cond.stride) % cond.radix];
      }
      for (const input of c.inputs) line += (e.reach[input.net] >>> j) & 1 ? ",1" : ",0";
      const dir =
        (e.dirForward >>> j) & 1 ? "forward" : (e.dirReverse >>> j) & 1 ? "reverse" : (e.dirNeutral >>> j) & 1 ? "neutral" : "conflict";
      const thr = (e.thrReleased >>> j) & 1 ? 0 : (e.thrApplied >>> j) & 1 ? 1 : 2;
      line +=
        ((e.powered >>> j) & 1 ? ",1" : ",0") +
        ((e.enabled >>> j) & 1 ? ",1" : ",0") +
        "," +
        dir +
        ((e.braking >>> j) & 1 ? ",1" : ",0") +
        "," +
        THROTTLE_CLASSES[thr] +
        ((e.drive >>> j) & 1 ? ",1" : ",0");
      for (let k = 0; k < inhibit.length; k++) {
        line += !((unsafe[k] >>> j) & 1) ? ",-" : (forbidden[k] >>> j) & 1 ? ",violating" : ",unsafe";
      }
      chunk += line + "\n";
      if (chunk.length >= CHUNK_CHARS) {
        yield chunk;
        chunk = "";
      }
      if (++emitted >= count) break;
    }
  }
  if (chunk.length > 0) yield chunk;
}
