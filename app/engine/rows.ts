// Row access: decode/encode row indexes, view one row, and filtered counting / paging / searching,
// all through the bit-sliced evaluator (a filtered scan touches one word at a time).
import type { CompiledDesign, Literal, ThrottleClass } from "./compile";
import { THROTTLE_CLASSES } from "./compile";
import { ExtraLiterals, lowestBit, popcount, WORD, WordEvaluator, type ContactFault } from "./table";

export type Direction = "forward" | "neutral" | "reverse" | "conflict";

export type ControllerState = {
  powered: boolean;
  enabled: boolean;
  direction: Direction;
  braking: boolean;
  throttle: ThrottleClass;
};

export type RowView = {
  index: number;
  states: Record<string, string>;
  /** Contact id -> conducting (closed) in this row, faults applied. */
  contacts: Record<string, boolean>;
  /** Input id -> energized. */
  inputs: Record<string, boolean>;
  nets: {
    /** Indexes of energized nets (see CompiledDesign.nets). */
    energized: number[];
    /** Every terminal ("COMP.term") on an energized net, for highlighting wires. */
    energizedTerminals: string[];
  };
  controller: ControllerState;
  /** Steady drive (spec 1.4). */
  drive: boolean;
  /** Inhibit rule id -> whether this row is unsafe / violating for it. */
  rules: Record<string, { unsafe: boolean; violating: boolean }>;
  /** Require-drive rule id -> whether this row is a demand row / a failing row (demand without drive). */
  demands: Record<string, { demand: boolean; failing: boolean }>;
};

export const ROW_FILTERS = ["unsafe", "violating", "drive", "demand", "failing"] as const;

export type RowFilter = {
  only?: (typeof ROW_FILTERS)[number];
  /**
   * Rule id: an inhibit rule for unsafe/violating, a require-drive rule for demand/failing; default:
   * any rule of that type.
   */
  rule?: string;
  /** Condition id -> allowed states. */
  where?: Record<string, string[]>;
};

export function rowCount(c: CompiledDesign): number {
  return c.rows;
}

/** Condition id -> state of row `index` (mixed radix, first condition most significant). */
export function decodeRow(c: CompiledDesign, index: number): Record<string, string> {
  if (!Number.isInteger(index) || index < 0 || index >= c.rows) {
    throw new RangeError(`row ${index} is outside 0..${c.rows - 1}`);
  }
  const out: Record<string, string> = Object.create(null); // ids like "__proto__" are legal
  for (const cond of c.conditions) {
    out[cond.id] = cond.states[Math.floor(index / cond.stride) % cond.radix];
  }
  return out;
}

/** Row index of a full assignment; -1 when a condition is missing or a state is unknown. */
export function encodeRow(c: CompiledDesign, states: Record<string, string>): number {
  let index = 0;
  for (const cond of c.conditions) {
    const k = cond.states.indexOf(states[cond.id]);
    if (k < 0) return -1;
    index += k * cond.stride;
  }
  return index;
}

/** Names the conditions missing from `states` and the states that are not of their condition. */
export function rowProblems(c: CompiledDesign, states: Record<string, string>): string[] {
  const out: string[] = [];
  for (const cond of c.conditions) {
    const s = states[cond.id];
    if (s === undefined) out.push(`condition ${JSON.stringify(cond.id)} has no state`);
    else if (!cond.states.includes(s)) {
      out.push(`${JSON.stringify(s)} is not a state of condition ${JSON.stringify(cond.id)} (${cond.states.join(", ")})`);
    }
  }
  for (const k of Object.keys(states)) {
    if (!(k in c.conditionIndex)) out.push(`no condition with id ${JSON.stringify(k)}`);
  }
  return out;
}

const DIRECTIONS: Direction[] = ["forward", "neutral", "reverse", "conflict"];

/** Builds the view of row `index` from an evaluator that has evaluated that row's word. */
export function viewOfLane(ev: WordEvaluator, index: number): RowView {
  const c = ev.c;
  const j = index - ev.wordIndex * WORD;
  const bit = (x: number) => ((x >>> j) & 1) === 1;
  const contacts: Record<string, boolean> = Object.create(null); // ids like "__proto__" are legal
  c.contacts.forEach((k, i) => (contacts[k.id] = bit(ev.cw[i])));
  const inputs: Record<string, boolean> = Object.create(null); // ids like "__proto__" are legal
  c.inputs.forEach((x) => (inputs[x.id] = bit(ev.reach[x.net])));
  const energized: number[] = [];
  const energizedTerminals: string[] = [];
  c.nets.forEach((terms, n) => {
    if (bit(ev.reach[n])) {
      energized.push(n);
      energizedTerminals.push(...terms);
    }
  });
  const dirWords = [ev.dirForward, ev.dirNeutral, ev.dirReverse, ev.dirConflict];
  const thrWords = [ev.thrReleased, ev.thrApplied, ev.thrFault];
  const rules: RowView["rules"] = Object.create(null); // ids like "__proto__" are legal
  const demands: RowView["demands"] = Object.create(null);
  c.rules.forEach((r, i) => {
    if (r.type === "inhibit") {
      const unsafe = bit(ev.unsafeWord(i));
      rules[r.id] = { unsafe, violating: unsafe && bit(ev.forbiddenWord(i)) };
    } else if (r.type === "require-drive") {
      const demand = bit(ev.demandWord(i));
      demands[r.id] = { demand, failing: demand && !bit(ev.drive) };
    }
  });
  return {
    index,
    states: decodeRow(c, index),
    contacts,
    inputs,
    nets: { energized, energizedTerminals },
    controller: {
      powered: bit(ev.powered),
      enabled: bit(ev.enabled),
      direction: DIRECTIONS[dirWords.findIndex(bit)],
      braking: bit(ev.braking),
      throttle: THROTTLE_CLASSES[thrWords.findIndex(bit)],
    },
    drive: bit(ev.drive),
    rules,
    demands,
  };
}

/** The full view of one row, optionally with contact faults applied. */
export function evaluateRow(c: CompiledDesign, index: number, faults: readonly ContactFault[] = []): RowView {
  decodeRow(c, index); // range check
  const ev = new WordEvaluator(c, faults);
  ev.evalWord(Math.floor(index / WORD));
  return viewOfLane(ev, index);
}

// ---------------------------------------------------------------- filters

export type CompiledFilter = {
  key: string;
  only: RowFilter["only"];
  rules: number[];
  where: Literal[];
};

/** The rule type a row filter's `rule` must have: require-drive for demand/failing, else inhibit. */
export function filterRuleType(only: RowFilter["only"]): "inhibit" | "require-drive" {
  return only === "demand" || only === "failing" ? "require-drive" : "inhibit";
}

export function compileFilter(c: CompiledDesign, filter: RowFilter = {}): CompiledFilter {
  if (filter.only !== undefined && !(ROW_FILTERS as readonly string[]).includes(filter.only)) {
    throw new Error(`unknown row filter ${JSON.stringify(filter.only)} (use ${ROW_FILTERS.join(", ")})`);
  }
  const type = filterRuleType(filter.only);
  let rules: number[];
  if (filter.rule !== undefined) {
    const r = c.rules.find((x) => x.id === filter.rule);
    if (!r) throw new Error(`no rule with id ${JSON.stringify(filter.rule)}`);
    if (r.type !== type)
      throw new Error(`rule ${JSON.stringify(filter.rule)} is not ${type === "inhibit" ? "an inhibit" : "a require-drive"} rule`);
    rules = [r.index];
  } else {
    rules = c.rules.filter((r) => r.type === type).map((r) => r.index);
  }
  const where: Literal[] = [];
  for (const [condId, states] of Object.entries(filter.where ?? {})) {
    const ci = c.conditionIndex[condId];
    if (ci === undefined) throw new Error(`no condition with id ${JSON.stringify(condId)}`);
    let mask = 0;
    for (const s of states) {
      const k = c.conditions[ci].states.indexOf(s);
      if (k < 0) throw new Error(`${JSON.stringify(s)} is not a state of condition ${JSON.stringify(condId)}`);
      mask |= 1 << k;
    }
    where.push({ cond: ci, mask });
  }
  const key = JSON.stringify([filter.only ?? "", rules, where.map((l) => [l.cond, l.mask])]);
  return { key, only: filter.only, rules, where };
}

/** Scans matching rows word by word. */
export class FilterScanner {
  readonly ev: WordEvaluator;
  private readonly extra: ExtraLiterals | null;
  constructor(
    readonly c: CompiledDesign,
    readonly f: CompiledFilter,
  ) {
    this.ev = new WordEvaluator(c);
    this.extra = f.where.length > 0 ? new ExtraLiterals(c, f.where) : null;
  }

  /** Matching rows of word `w` as a bit mask; the evaluator holds word `w` when it returns non-zero. */
  word(w: number): number {
    const ev = this.ev;
    let mask = -1;
    if (this.extra) {
      this.extra.load(w);
      for (const x of this.extra.words) mask &= x;
      if (mask === 0) return 0;
    }
    ev.evalWord(w);
    mask &= ev.valid;
    switch (this.f.only) {
      case undefined:
        return mask;
      case "drive":
        return mask & ev.drive;
      case "unsafe": {
        let m = 0;
        for (const r of this.f.rules) m |= ev.unsafeWord(r);
        return mask & m;
      }
      case "violating": {
        let m = 0;
        for (const r of this.f.rules) m |= ev.unsafeWord(r) & ev.forbiddenWord(r);
        return mask & m;
      }
      case "demand": {
        let m = 0;
        for (const r of this.f.rules) m |= ev.demandWord(r);
        return mask & m;
      }
      case "failing": {
        let m = 0;
        for (const r of this.f.rules) m |= ev.failingWord(r);
        return mask & m;
      }
    }
  }
}

/** Words per block of the per-filter count index. */
const BLOCK_WORDS = 1024;
const countIndex = new WeakMap<CompiledDesign, Map<string, Float64Array>>();

/** Matching rows per block of BLOCK_WORDS words, computed once per design and filter. */
function blockCounts(c: CompiledDesign, f: CompiledFilter, scanner?: FilterScanner): Float64Array {
  let perDesign = countIndex.get(c);
  if (!perDesign) countIndex.set(c, (perDesign = new Map()));
  const hit = perDesign.get(f.key);
  if (hit) return hit;
  const s = scanner ?? new FilterScanner(c, f);
  const words = s.ev.wordCount;
  const counts = new Float64Array(Math.ceil(words / BLOCK_WORDS));
  for (let w = 0; w < words; w++) {
    const m = s.word(w);
    if (m !== 0) counts[(w / BLOCK_WORDS) | 0] += popcount(m);
  }
  perDesign.set(f.key, counts);
  return counts;
}

function isUnfiltered(f: CompiledFilter): boolean {
  return f.only === undefined && f.where.length === 0;
}

export function countRows(c: CompiledDesign, filter?: RowFilter): number {
  const f = compileFilter(c, filter);
  if (isUnfiltered(f)) return c.rows;
  let total = 0;
  for (const n of blockCounts(c, f)) total += n;
  return total;
}

/** A page of matching rows: `from` is a position within the filtered sequence. */
export function pageRows(
  c: CompiledDesign,
  opts: { filter?: RowFilter; from?: number; count: number },
): { total: number; rows: RowView[] } {
  const f = compileFilter(c, opts.filter);
  const from = Math.max(0, Math.floor(opts.from ?? 0));
  const count = Math.max(0, Math.floor(opts.count));
  const scanner = new FilterScanner(c, f);
  const rows: RowView[] = [];
  if (isUnfiltered(f)) {
    const end = Math.min(c.rows, from + count);
    for (let i = from; i < end; i++) {
      const w = Math.floor(i / WORD);
      if (scanner.ev.wordIndex !== w) scanner.ev.evalWord(w);
      rows.push(viewOfLane(scanner.ev, i));
    }
    return { total: c.rows, rows };
  }
  const counts = blockCounts(c, f, scanner);
  let total = 0;
  for (const n of counts) total += n;
  if (count === 0 || from >= total) return { total, rows };
  // Skip whole blocks before `from`, then scan word by word.
  let seen = 0;
  let block = 0;
  while (block < counts.length && seen + counts[block] <= from) seen += counts[block++];
  for (let w = block * BLOCK_WORDS; w < scanner.ev.wordCount && rows.length < count; w++) {
    let m = scanner.word(w);
    if (m === 0) continue;
    const n = popcount(m);
    if (seen + n <= from) {
      seen += n;
      continue;
    }
    while (m !== 0 && rows.length < count) {
      const j = lowestBit(m);
      m &= m - 1;
      if (seen++ >= from) rows.push(viewOfLane(scanner.ev, w * WORD + j));
    }
  }
  return { total, rows };
}

/** The first matching row index >= fromIndex, or -1. */
export function findRow(c: CompiledDesign, filter: RowFilter | undefined, fromIndex: number): number {
  const f = compileFilter(c, filter);
  const start = Math.max(0, Math.floor(fromIndex));
  if (start >= c.rows) return -1;
  if (isUnfiltered(f)) return start;
  const counts = countIndex.get(c)?.get(f.key);
  const scanner = new FilterScanner(c, f);
  for (let w = Math.floor(start / WORD); w < scanner.ev.wordCount; w++) {
    if (counts && counts[(w / BLOCK_WORDS) | 0] === 0) {
      w = ((w / BLOCK_WORDS) | 0) * BLOCK_WORDS + BLOCK_WORDS - 1;
      continue;
    }
    let m = scanner.word(w);
    if (w === Math.floor(start / WORD)) m &= -1 << (start % WORD);
    if (m !== 0) return w * WORD + lowestBit(m);
  }
  return -1;
}

/** Iterates matching row indexes in order, word by word (for streaming consumers). */
export function* matchingRows(
  c: CompiledDesign,
  filter: RowFilter | undefined,
  onWord: (ev: WordEvaluator) => void = () => {},
): Generator<number> {
  const f = compileFilter(c, filter);
  const scanner = new FilterScanner(c, f);
  for (let w = 0; w < scanner.ev.wordCount; w++) {
    let m = scanner.word(w);
    if (m === 0) continue;
    if (scanner.ev.wordIndex !== w) scanner.ev.evalWord(w);
    onWord(scanner.ev);
    while (m !== 0) {
      const j = lowestBit(m);
      m &= m - 1;
      yield w * WORD + j;
    }
  }
}
