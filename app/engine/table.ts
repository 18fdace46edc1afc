// Bit-sliced evaluation of the truth table: one 32-bit word holds 32 consecutive rows
// (bit j of word w is row 32*w + j). Nothing here ever holds more than one word of rows.
import type { CompiledDesign, Literal } from "./compile";
import { predicateWord, type WordPredicate } from "./predicate";
import type { FaultMode } from "./schema";

export type ContactFault = { component: string; mode: FaultMode };

export const WORD = 32;

export function popcount(x: number): number {
  x = x - ((x >>> 1) & 0x55555555);
  x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
  return (((x + (x >>> 4)) & 0x0f0f0f0f) * 0x01010101) >>> 24;
}

/** Index of the lowest set bit (x must be non-zero). */
export function lowestBit(x: number): number {
  return 31 - Math.clz32(x & -x);
}

/**
 * Computes literal words for any word of the table into `words`. A condition of stride s < 32
 * repeats with period s*radix, so its words come from a small table indexed by the word's phase; a
 * condition of stride >= 32 changes state at most once inside a word, and its words are reused
 * for as long as its state does not change (sequential scans touch them rarely).
 */
export class LiteralSource {
  readonly words: Int32Array;
  private readonly small: { period: number; outs: Int32Array; tables: Int32Array[] }[] = [];
  private readonly big: {
    stride: number;
    radix: number;
    outs: Int32Array;
    masks: Int32Array;
    /** Words [from, until) share the literal words last computed. */
    from: number;
    until: number;
  }[] = [];

  /** `conditions[i]` gives condition i's radix and stride (rows between two of its changes). */
  constructor(conditions: ReadonlyArray<{ stride: number; radix: number }>, literals: readonly Literal[]) {
    this.words = new Int32Array(literals.length);
    const byCond = new Map<number, number[]>();
    literals.forEach((l, i) => {
      const list = byCond.get(l.cond) ?? [];
      list.push(i);
      byCond.set(l.cond, list);
    });
    for (const [cond, outs] of byCond) {
      const { stride, radix } = conditions[cond];
      if (stride < WORD) {
        const period = stride * radix;
        const tables = outs.map((i) => {
          const mask = literals[i].mask;
          const t = new Int32Array(period);
          for (let ph = 0; ph < period; ph++) {
            let w = 0;
            for (let j = 0; j < WORD; j++) {
              const digit = Math.floor((ph + j) / stride) % radix;
              if ((mask >> digit) & 1) w |= 1 << j;
            }
            t[ph] = w;
          }
          return t;
        });
        this.small.push({ period, outs: Int32Array.from(outs), tables });
      } else {
        this.big.push({
          stride,
          radix,
          outs: Int32Array.from(outs),
          masks: Int32Array.from(outs.map((i) => literals[i].mask)),
          from: 0,
          until: 0,
        });
      }
    }
  }

  /** Fills `words` for word index `w`. */
  load(w: number): void {
    const out = this.words;
    const base = w * WORD;
    for (let gi = 0; gi < this.small.length; gi++) {
      const g = this.small[gi];
      const ph = base % g.period;
      const outs = g.outs;
      for (let k = 0; k < outs.length; k++) out[outs[k]] = g.tables[k][ph];
    }
    for (let gi = 0; gi < this.big.length; gi++) {
      const g = this.big[gi];
      if (w >= g.from && w < g.until) continue;
      const q = Math.floor(base / g.stride);
      const n = g.stride - (base - q * g.stride);
      const d0 = q % g.radix;
      const outs = g.outs;
      const masks = g.masks;
      g.from = w;
      if (n >= WORD) {
        g.until = Math.floor(((q + 1) * g.stride) / WORD);
        for (let k = 0; k < outs.length; k++) out[outs[k]] = (masks[k] >> d0) & 1 ? -1 : 0;
      } else {
        g.until = w + 1;
        const d1 = d0 + 1 === g.radix ? 0 : d0 + 1;
        const low = (1 << n) - 1;
        for (let k = 0; k < outs.length; k++) {
          const m = masks[k];
          out[outs[k]] = ((m >> d0) & 1 ? low : 0) | ((m >> d1) & 1 ? ~low : 0);
        }
      }
    }
  }
}

/**
 * Evaluates a compiled design 32 rows at a time. Call `evalWord(w)`, then read the public words.
 * Contact faults (stuck-open / stuck-closed) can be applied for the evaluator's whole life.
 */
export class WordEvaluator {
  readonly c: CompiledDesign;
  readonly wordCount: number;
  private readonly lastValid: number;
  private readonly source: LiteralSource;
  private readonly faultAnd: Int32Array;
  private readonly faultOr: Int32Array;
  private readonly contactLit: Int32Array;
  readonly whenOf: (WordPredicate | null)[];
  private readonly flowC: Int32Array;
  private readonly flowNear: Int32Array;
  private readonly flowFar: Int32Array;
  private readonly supply: Int32Array;
  private readonly inputNet: Int32Array;
  private readonly fnNet: { power: number; enable: number; forward: number; reverse: number; brake: number };

  /** Literal words of the current word, indexed like `c.literals`. */
  readonly lit: Int32Array;
  /** Conduction word of every contact (faults applied). */
  readonly cw: Int32Array;
  /** Energized word of every net. */
  readonly reach: Int32Array;
  /** Rows of the current word that exist (the last word may be partial). */
  valid = 0;
  wordIndex = -1;
  powered = 0;
  enabled = 0;
  dirForward = 0;
  dirReverse = 0;
  dirNeutral = 0;
  dirConflict = 0;
  braking = 0;
  thrReleased = 0;
  thrApplied = 0;
  thrFault = 0;
  drive = 0;

  constructor(c: CompiledDesign, faults: readonly ContactFault[] = []) {
    this.c = c;
    this.wordCount = Math.ceil(c.rows / WORD);
    const rem = c.rows % WORD;
    this.lastValid = rem === 0 ? -1 : (1 << rem) - 1;
    this.source = new LiteralSource(c.conditions, c.literals);
    this.lit = this.source.words;
    this.cw = new Int32Array(c.contacts.length);
    this.reach = new Int32Array(c.nets.length);
    this.contactLit = Int32Array.from(c.contacts.map((k) => k.lit));
    this.faultAnd = new Int32Array(c.contacts.length).fill(-1);
    this.faultOr = new Int32Array(c.contacts.length);
    for (const f of faults) {
      const i = c.contactIndex[f.component];
      if (i === undefined) throw new Error(`no contact with id ${JSON.stringify(f.component)}`);
      if (f.mode === "stuck-open") {
        this.faultAnd[i] = 0;
        this.faultOr[i] = 0;
      } else {
        this.faultAnd[i] = -1;
        this.faultOr[i] = -1;
      }
    }
    this.whenOf = c.rules.map((r) => (r.type === "no-restart" ? null : predicateWord(r.when)));
    this.flowC = Int32Array.from(c.flow.map((f) => f.contact));
    this.flowNear = Int32Array.from(c.flow.map((f) => f.near));
    this.flowFar = Int32Array.from(c.flow.map((f) => f.far));
    this.supply = Int32Array.from(c.supplyNets);
    this.inputNet = Int32Array.from(c.inputs.map((x) => x.net));
    const net = (i: number) => (i < 0 ? -1 : c.inputs[i].net);
    this.fnNet = {
      power: net(c.inputOf.power),
      enable: net(c.inputOf.enable),
      forward: net(c.inputOf.forward),
      reverse: net(c.inputOf.reverse),
      brake: net(c.inputOf.brake),
    };
  }

  /** Evaluates word `w`: literals, contacts, nets, controller view and steady drive. */
  evalWord(w: number): void {
    this.wordIndex = w;
    this.valid = w === this.wordCount - 1 ? this.lastValid : -1;
    const lit = this.lit;
    this.source.load(w);
    const cw = this.cw;
    const contactLit = this.contactLit;
    const fa = this.faultAnd;
    const fo = this.faultOr;
    for (let i = 0; i < cw.length; i++) cw[i] = (lit[contactLit[i]] & fa[i]) | fo[i];
    this.settle(this.reach, false);
    const t = this.c.throttle;
    this.thrReleased = lit[t.released];
    this.thrApplied = lit[t.applied];
    this.thrFault = lit[t.fault];
    this.drive = this.controller(this.reach);
  }

  /**
   * Computes energized nets into `reach` from the contact words. With `fromCurrent`, `reach` already
   * holds a lower bound (e.g. the fault-free nets before a contact is forced closed).
   */
  settle(reach: Int32Array, fromCurrent: boolean): void {
    const cw = this.cw;
    const fc = this.flowC;
    const near = this.flowNear;
    const far = this.flowFar;
    const n = fc.length;
    if (!fromCurrent) {
      reach.fill(0);
      for (let s = 0; s < this.supply.length; s++) reach[this.supply[s]] = -1;
    }
    if (this.c.singlePass) {
      for (let k = 0; k < n; k++) reach[far[k]] |= reach[near[k]] & cw[fc[k]];
      return;
    }
    let changed = true;
    while (changed) {
      changed = false;
      for (let k = 0; k < n; k++) {
        const a = near[k];
        const b = far[k];
        const ra = reach[a];
        const rb = reach[b];
        const t = (ra | rb) & cw[fc[k]];
        if ((t & ~ra) | (t & ~rb)) {
          reach[a] = ra | t;
          reach[b] = rb | t;
          changed = true;
        }
      }
    }
  }

  /** Sets the controller view words from `reach` and returns the steady drive word. */
  controller(reach: Int32Array): number {
    const f = this.fnNet;
    const powered = f.power < 0 ? -1 : reach[f.power];
    const enabled = f.enable < 0 ? -1 : reach[f.enable];
    const fwd = f.forward < 0 ? 0 : reach[f.forward];
    const rev = f.reverse < 0 ? 0 : reach[f.reverse];
    let dF: number, dR: number, dN: number, dC: number;
    if (f.forward < 0 && f.reverse < 0) {
      dF = -1;
      dR = dN = dC = 0;
    } else if (f.reverse < 0) {
      dF = fwd;
      dN = ~fwd;
      dR = dC = 0;
    } else if (f.forward < 0) {
      dR = rev;
      dF = ~rev;
      dN = dC = 0;
    } else {
      dF = fwd & ~rev;
      dR = rev & ~fwd;
      dN = ~(fwd | rev);
      dC = fwd & rev;
    }
    const braking = f.brake < 0 ? 0 : reach[f.brake];
    this.powered = powered;
    this.enabled = enabled;
    this.dirForward = dF;
    this.dirReverse = dR;
    this.dirNeutral = dN;
    this.dirConflict = dC;
    this.braking = braking;
    const cut = this.c.brakeCutsDrive ? braking : 0;
    return powered & enabled & (dF | dR) & ~cut & this.thrApplied;
  }

  /** Steady drive computed from another set of net words (used by fault checks), no side effects on the view. */
  driveFrom(reach: Int32Array): number {
    const f = this.fnNet;
    const powered = f.power < 0 ? -1 : reach[f.power];
    const enabled = f.enable < 0 ? -1 : reach[f.enable];
    const fwd = f.forward < 0 ? 0 : reach[f.forward];
    const rev = f.reverse < 0 ? 0 : reach[f.reverse];
    let dir: number;
    if (f.forward < 0 && f.reverse < 0) dir = -1;
    else if (f.reverse < 0) dir = fwd;
    else if (f.forward < 0) dir = -1;
    else dir = fwd ^ rev;
    const cut = this.c.brakeCutsDrive && f.brake >= 0 ? reach[f.brake] : 0;
    return powered & enabled & dir & ~cut & this.thrApplied;
  }

  inputWord(input: number): number {
    return this.reach[this.inputNet[input]];
  }

  /** Rows of the current word where the `when` of rule `r` (inhibit or require-drive) holds. */
  whenWord(r: number): number {
    return this.whenOf[r]!(this.lit) & this.valid;
  }

  /** Rows of the current word where inhibit rule `r` is unsafe (its `when` holds). */
  unsafeWord(r: number): number {
    return this.whenOf[r]!(this.lit) & this.valid;
  }

  /** Rows of the current word that are demand rows of require-drive rule `r` (its `when` holds). */
  demandWord(r: number): number {
    return this.whenOf[r]!(this.lit) & this.valid;
  }

  /** Demand rows of require-drive rule `r` without steady drive (failing rows), in the current word. */
  failingWord(r: number): number {
    return this.whenOf[r]!(this.lit) & this.valid & ~this.drive;
  }

  /** Rows of the current word where the forbidden outcome of inhibit rule `r` is true. */
  forbiddenWord(r: number, reach: Int32Array = this.reach, drive: number = this.drive): number {
    const rule = this.c.rules[r];
    if (rule.type !== "inhibit") return 0;
    return rule.forbidInput < 0 ? drive : reach[this.inputNet[rule.forbidInput]];
  }
}

/** Literal words for ad-hoc state sets (row filters), evaluated alongside a WordEvaluator. */
export class ExtraLiterals {
  readonly words: Int32Array;
  private readonly source: LiteralSource;
  constructor(c: CompiledDesign, literals: Literal[]) {
    this.source = new LiteralSource(c.conditions, literals);
    this.words = this.source.words;
  }
  load(w: number): void {
    this.source.load(w);
  }
}
