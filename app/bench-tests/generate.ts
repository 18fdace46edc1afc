// Bench-test procedure generator: from a design, an ordered list of bench steps that exercises every
// inhibit rule, every contact and every listed lockout. Pure TypeScript (no React, no Node APIs):
// every expected outcome comes from the engine (evaluateRow, replayTrace), never from a rule of our own.
// Definitions and trade-offs: docs/decisions/050-053.
import {
  compileDesign,
  decodeRow,
  evaluateRow,
  pageRows,
  replayTrace,
  type CompiledDesign,
  type Design,
  type InputFunction,
  type Lockout,
  type Predicate,
  type RowView,
  type StepView,
} from "../engine";
import { describeChanges, describeExpect, lockoutWords, type Naming } from "./words";

export type BenchExpect = {
  drive: boolean;
  /** Input id -> energized (live). */
  inputs: Record<string, boolean>;
  /** The lockout latch after this step (sequence steps only). */
  latched?: boolean;
};

export type BenchStep = {
  /** 1 for the first step. */
  n: number;
  kind: "row" | "sequence";
  /** Every condition's state in this step. */
  set: Record<string, string>;
  expect: BenchExpect;
  /** "rule:ID", "contact:ID:closed", "contact:ID:open", "lockout:NAME". */
  covers: string[];
  instruction: string;
  caution?: string;
};

export type BenchPlan = {
  design: string;
  /** The rest row the procedure starts from: no drive, throttle released, fewest live inputs. */
  start: { set: Record<string, string>; expect: BenchExpect; instruction: string };
  steps: BenchStep[];
  uncovered: Array<{ item: string; reason: string }>;
  stats: {
    steps: number;
    /** Condition states changed between consecutive steps, counted from the start row. */
    conditionChanges: number;
    /** Items to cover: inhibit rules + contacts + listed lockouts. */
    items: number;
    covered: number;
    /** Size of the one-item-at-a-time plan for the covered items (1 per rule, 2 per contact, whole sequences). */
    naiveSteps: number;
    /** Rows of the truth table, and how many of them the search looked at. */
    rows: number;
    rowsSearched: number;
  };
};

/** Up to this many rows, every row is a candidate; above it, rows near sampled drive rows (decision 053). */
export const EXHAUSTIVE_ROWS = 4096;
const ANCHOR_DRIVE_ROWS = 48;
const MAX_RELAX_COMBOS = 64;
const LOCKOUT_DRIVE_ROWS = 8;
const MAX_LOCKOUT_REPLAYS = 4000;

type Tier = 0 | 1 | 2 | 3 | 4 | 5 | 6 | 7;
/** a: row with the contact closed; b: the same row with only its condition changed, contact open. */
type ContactPair = { contact: string; a: number; b: number; tier: Tier };
type RuleInfo = { id: string; label: string; forbid: string | null; conds: number[] };
type Sequence = { lockout: Lockout; rows: number[]; steps: StepView[]; others: Lockout[] };

/** Condition ids a predicate reads. */
function predicateConditions(p: Predicate, out: Set<string>): Set<string> {
  if ("cond" in p) out.add(p.cond);
  else if ("all" in p) p.all.forEach((q) => predicateConditions(q, out));
  else if ("any" in p) p.any.forEach((q) => predicateConditions(q, out));
  else if ("not" in p) predicateConditions(p.not, out);
  return out;
}

/** Row views, cached, plus the row-index arithmetic of spec 1.1 (mixed radix, last condition fastest). */
class RowBook {
  private readonly views = new Map<number, RowView>();
  private readonly approach = new Map<number, StepView>();
  readonly releasedState: number;
  constructor(readonly c: CompiledDesign) {
    this.releasedState = c.throttle.classOf.indexOf(0);
  }
  view(i: number): RowView {
    let v = this.views.get(i);
    if (!v) this.views.set(i, (v = evaluateRow(this.c, i)));
    return v;
  }
  remember(v: RowView): void {
    this.views.set(v.index, v);
  }
  digit(i: number, cond: number): number {
    const k = this.c.conditions[cond];
    return Math.floor(i / k.stride) % k.radix;
  }
  withState(i: number, cond: number, state: number): number {
    return i + (state - this.digit(i, cond)) * this.c.conditions[cond].stride;
  }
  hamming(i: number, j: number): number {
    let d = 0;
    for (let k = 0; k < this.c.conditions.length; k++) if (this.digit(i, k) !== this.digit(j, k)) d++;
    return d;
  }
  released(i: number): number {
    return this.releasedState < 0 ? i : this.withState(i, this.c.throttle.cond, this.releasedState);
  }
  /**
   * A row step is reached by setting every condition with the throttle released, then setting the
   * throttle last (decision 052): the drive that approach shows, from replayTrace.
   */
  benchDrive(i: number): boolean {
    return this.approachStep(i).drive;
  }
  approachStep(i: number): StepView {
    let last = this.approach.get(i);
    if (last === undefined) {
      const trace = this.releasedState < 0 ? [i] : [this.released(i), i];
      const steps = replayTrace(this.c, trace.map((r) => decodeRow(this.c, r)));
      last = steps[steps.length - 1];
      this.approach.set(i, last);
    }
    return last;
  }
  /** The approach shows the row's steady drive (no lockout latches on the way in). */
  approachOk(i: number): boolean {
    return this.benchDrive(i) === this.view(i).drive;
  }
}

const latchedBy = (armed: Lockout[]) =>
  armed.length === 0 ? "A lockout latches" : `The ${armed.map((l) => `"${l}"`).join(" and ")} lockout latches`;

const sameInputs = (a: RowView, b: RowView) => Object.keys(a.inputs).every((k) => a.inputs[k] === b.inputs[k]);

export function generateBenchPlan(design: Design): BenchPlan {
  const c = compileDesign(design);
  const book = new RowBook(c);
  const naming = namingOf(c);

  // ------------------------------------------------------------ rest row and search pool
  const rest = restRow(c, book);
  const { pool, exhaustive, anchors } = searchPool(c, book, rest);
  const inPool = new Set(pool);
  const poolNote = exhaustive ? "" : ` (searched ${pool.length} of ${c.rows} rows, those near ${anchors} sampled drive rows)`;

  const uncovered: BenchPlan["uncovered"] = [];

  // ------------------------------------------------------------ inhibit rules (decision 050)
  const rules: RuleInfo[] = [];
  for (const r of c.design.rules) {
    if (r.type !== "inhibit") continue;
    const conds = [...predicateConditions(r.when, new Set())].map((id) => c.conditionIndex[id]);
    rules.push({ id: r.id, label: r.label ?? r.id, forbid: r.forbid === "drive" ? null : r.forbid.energized, conds });
  }
  const outcome = (v: RowView, r: RuleInfo) => (r.forbid === null ? v.drive : v.inputs[r.forbid]);
  /** Row index with the rule's own condition digits zeroed: rows sharing it differ only in those. */
  const restOf = (i: number, r: RuleInfo) => {
    let k = i;
    for (const ci of r.conds) k -= book.digit(i, ci) * c.conditions[ci].stride;
    return k;
  };
  const testRowsOf = new Map<string, number[]>();
  for (const r of rules) {
    const fires = new Set<number>();
    let unsafeRows = 0;
    let outsideOutcome = false;
    for (const i of pool) {
      const v = book.view(i);
      if (v.rules[r.id].unsafe) unsafeRows++;
      else if (outcome(v, r)) {
        outsideOutcome = true;
        fires.add(restOf(i, r));
      }
    }
    const test = pool.filter((i) => book.view(i).rules[r.id].unsafe && fires.has(restOf(i, r)) && book.approachOk(i));
    if (test.length > 0) {
      testRowsOf.set(r.id, test);
      continue;
    }
    const what = r.forbid === null ? "lets drive run" : `energizes ${naming.input(r.forbid)}`;
    let reason: string;
    if (unsafeRows === 0) reason = "its condition never holds, so there is no row to test it in";
    else if (unsafeRows === pool.length && exhaustive) reason = "its condition holds in every row, so there is no row to compare against";
    else if (!outsideOutcome) {
      reason = `no row outside its condition ${what}, so the rule's own conditions are never what stops it`;
    } else reason = "every row where it applies latches a lockout on the way in, so its steady outcome can't be shown";
    uncovered.push({ item: `rule:${r.id}`, reason: reason + poolNote });
  }

  // ------------------------------------------------------------ contacts (decision 051)
  const pairsOf = new Map<string, ContactPair[]>();
  for (const k of c.contacts) {
    const cond = c.conditions[k.cond];
    const openStates = cond.states.map((_, s) => s).filter((s) => ((k.closedMask >> s) & 1) === 0);
    if (openStates.length === 0) {
      uncovered.push({
        item: `contact:${k.id}`,
        reason: `it closes in every state of ${naming.condition(k.cond)}, so it can never be opened on the bench`,
      });
      continue;
    }
    const found: ContactPair[] = [];
    for (const pass of ["isolated", "shared"] as const) {
      for (const a of pool) {
        const va = book.view(a);
        if (!va.contacts[k.id]) continue;
        for (const s of openStates) {
          const b = book.withState(a, k.cond, s);
          if (!inPool.has(b)) continue;
          const vb = book.view(b);
          if (sameInputs(va, vb)) continue;
          const isolated = c.contacts.every((o) => o.id === k.id || va.contacts[o.id] === vb.contacts[o.id]);
          if ((pass === "isolated") !== isolated) continue;
          if (!isolated) {
            // Other contacts on the same condition switch too: keep the pair only when this contact's own
            // faults would show in it (stuck open in the closed row, stuck closed in the open row).
            const openFault = evaluateRow(c, a, [{ component: k.id, mode: "stuck-open" }]);
            const closedFault = evaluateRow(c, b, [{ component: k.id, mode: "stuck-closed" }]);
            if (sameInputs(openFault, va) || sameInputs(closedFault, vb)) continue;
          }
          // Rows whose approach latches a lockout still show the inputs; they come last (decision 051).
          const latches = !book.approachOk(a) || !book.approachOk(b);
          const driveDiffers = book.benchDrive(a) !== book.benchDrive(b);
          const tier = ((latches ? 4 : 0) + (isolated ? 0 : 2) + (driveDiffers ? 0 : 1)) as Tier;
          found.push({ contact: k.id, a, b, tier });
        }
      }
      if (found.length > 0) break;
    }
    if (found.length === 0) {
      uncovered.push({
        item: `contact:${k.id}`,
        reason: `not observable from the controller inputs: changing ${naming.condition(k.cond)} alone never changes which inputs are live while the contact opens or closes${poolNote}`,
      });
      continue;
    }
    const best = Math.min(...found.map((p) => p.tier));
    pairsOf.set(k.id, found.filter((p) => p.tier === best));
  }

  // ------------------------------------------------------------ greedy cover (decision 053)
  const chosen = chooseRows(book, rest, testRowsOf, pairsOf);

  // ------------------------------------------------------------ lockouts (decision 052)
  const sequences: Sequence[] = [];
  if (c.lockouts.length > 0) {
    const drives = pool
      .filter((i) => book.view(i).drive && book.approachOk(i))
      // Drive rows already in the plan first: a sequence ending there can stand in for that row's step.
      .sort((x, y) => +!chosen.has(x) - +!chosen.has(y) || book.hamming(x, rest) - book.hamming(y, rest) || x - y)
      .slice(0, LOCKOUT_DRIVE_ROWS);
    for (const l of c.lockouts) {
      const seq = lockoutSequence(c, book, l, drives);
      if (seq) sequences.push(seq);
      else {
        const steady = pool.some((i) => book.view(i).drive);
        const live = (fn: InputFunction) => c.inputOf[fn] >= 0 && pool.every((i) => book.view(i).inputs[c.inputs[c.inputOf[fn]].id]);
        const always = l === "power-on" && live("power") ? "power" : l === "enable-restore" && live("enable") ? "enable" : null;
        const reason = always
          ? `the ${always} input ${naming.input(c.inputs[c.inputOf[always]].id)} is live in every row, so it never comes on`
          : lockoutReason(c, l, steady, drives.length > 0);
        uncovered.push({ item: `lockout:${l}`, reason: reason + poolNote });
      }
    }
  }

  // ------------------------------------------------------------ order: nearest neighbour from rest
  // A sequence step showing a row's steady outcome (not latched) stands in for that row's own step.
  const absorbed = new Set<number>();
  for (const seq of sequences) {
    seq.steps.forEach((s, pos) => {
      const row = seq.rows[pos];
      if (chosen.has(row) && !s.latched && s.drive === book.view(row).drive) absorbed.add(row);
    });
  }
  type Unit = { kind: "row"; row: number } | { kind: "sequence"; seq: Sequence };
  const units: Unit[] = [
    ...[...chosen].filter((i) => !absorbed.has(i)).sort((x, y) => x - y).map((row): Unit => ({ kind: "row", row })),
    ...sequences.map((seq): Unit => ({ kind: "sequence", seq })),
  ];
  const first = (u: Unit) => (u.kind === "row" ? u.row : u.seq.rows[0]);
  const last = (u: Unit) => (u.kind === "row" ? u.row : u.seq.rows[u.seq.rows.length - 1]);
  const ordered: Unit[] = [];
  let at = rest;
  while (units.length > 0) {
    let bi = 0;
    for (let i = 1; i < units.length; i++) {
      if (book.hamming(at, first(units[i])) < book.hamming(at, first(units[bi]))) bi = i;
    }
    const [u] = units.splice(bi, 1);
    ordered.push(u);
    at = last(u);
  }

  // ------------------------------------------------------------ steps
  type Draft = { kind: "row" | "sequence"; row: number; expect: BenchExpect; covers: string[]; notes: string[]; seq?: Sequence; pos?: number };
  const drafts: Draft[] = [];
  for (const u of ordered) {
    if (u.kind === "row") {
      const v = book.view(u.row);
      const latched = !book.approachOk(u.row);
      drafts.push({
        kind: "row",
        row: u.row,
        expect: { drive: book.benchDrive(u.row), inputs: { ...v.inputs }, ...(latched ? { latched } : {}) },
        covers: [],
        notes: latched
          ? [
              `${latchedBy(book.approachStep(u.row).armed)} as the throttle is applied here, so drive stays off although the wiring alone would let it run.`,
            ]
          : [],
      });
    } else {
      u.seq.steps.forEach((s, pos) =>
        drafts.push({
          kind: "sequence",
          row: u.seq.rows[pos],
          expect: { drive: s.drive, inputs: { ...s.row.inputs }, latched: s.latched },
          covers: [`lockout:${u.seq.lockout}`],
          notes: [],
          seq: u.seq,
          pos,
        }),
      );
    }
  }
  /** Row -> the step that shows its steady outcome (its row step, or the sequence step standing in). */
  const rowStepAt = new Map<number, number>();
  drafts.forEach((d, i) => {
    if (d.kind === "row" || (absorbed.has(d.row) && !d.expect.latched && !rowStepAt.has(d.row))) rowStepAt.set(d.row, i);
  });

  for (const r of rules) {
    const test = testRowsOf.get(r.id);
    if (!test) continue;
    const at = Math.min(...test.filter((i) => rowStepAt.has(i)).map((i) => rowStepAt.get(i)!));
    const d = drafts[at];
    d.covers.push(`rule:${r.id}`);
    const forbidden = r.forbid === null ? "drive running" : `${naming.input(r.forbid)} live`;
    const kept = r.forbid === null ? "drive off" : `${naming.input(r.forbid)} dead`;
    d.notes.push(
      outcome(book.view(d.row), r)
        ? `Rule "${r.label}" is BROKEN here: the design gives ${forbidden} although the rule forbids it.`
        : `Checks rule "${r.label}": only its own conditions keep ${kept} here.`,
    );
  }
  for (const k of c.contacts) {
    const pairs = pairsOf.get(k.id);
    if (!pairs) continue;
    // The chosen pair: both rows in the plan, closest together in the order.
    let best: ContactPair | null = null;
    let gap = Infinity;
    for (const p of pairs) {
      if (!rowStepAt.has(p.a) || !rowStepAt.has(p.b)) continue;
      const g = Math.abs(rowStepAt.get(p.a)! - rowStepAt.get(p.b)!);
      if (g < gap) [best, gap] = [p, g];
    }
    if (!best) throw new Error(`internal: no chosen pair for contact ${k.id}`);
    const ia = rowStepAt.get(best.a)!;
    const ib = rowStepAt.get(best.b)!;
    drafts[ia].covers.push(`contact:${k.id}:closed`);
    drafts[ib].covers.push(`contact:${k.id}:open`);
    const shared = best.tier % 4 >= 2 ? " (other contacts on the same condition switch with it)" : "";
    drafts[ia].notes.push(`Contact ${naming.contact(k.id)} is closed here; step ${ib + 1} has it open${shared}.`);
    drafts[ib].notes.push(`Contact ${naming.contact(k.id)} is open here; step ${ia + 1} has it closed${shared}.`);
  }

  let conditionChanges = 0;
  let prev = rest;
  const steps: BenchStep[] = drafts.map((d, i) => {
    conditionChanges += book.hamming(prev, d.row);
    const set = decodeRow(c, d.row);
    const throttleClass = book.view(d.row).controller.throttle;
    let instruction: string;
    let caution: string | undefined;
    if (d.kind === "row") {
      instruction = [
        describeChanges(naming, (i, ci) => book.digit(i, ci), prev, d.row, { approach: book.releasedState >= 0 }),
        describeExpect(naming, d.expect),
        ...d.notes,
      ].join(" ");
      if (throttleClass !== "released") {
        // Common practice: drive wheels off the ground whenever the throttle is applied on the bench.
        caution = "Lift the drive wheels clear of the ground (or otherwise stop the vehicle moving) before applying the throttle.";
      }
    } else {
      const seq = d.seq!;
      const role = lockoutWords(seq.lockout, d.pos!, seq.steps.length, seq.others);
      instruction = [role, describeChanges(naming, (i, ci) => book.digit(i, ci), prev, d.row, { approach: false }), describeExpect(naming, d.expect), ...d.notes].join(" ");
      // Common practice: the whole lockout sequence runs with the drive wheels lifted or the vehicle blocked.
      caution = "Lift the drive wheels clear of the ground (or otherwise stop the vehicle moving): this sequence applies the throttle.";
    }
    prev = d.row;
    return { n: i + 1, kind: d.kind, set, expect: d.expect, covers: d.covers, instruction, ...(caution ? { caution } : {}) };
  });

  const coveredRules = rules.filter((r) => testRowsOf.has(r.id)).length;
  const coveredContacts = pairsOf.size;
  const restView = book.view(rest);
  const restExpect = { drive: restView.drive, inputs: { ...restView.inputs } };
  return {
    design: c.design.name,
    start: {
      set: decodeRow(c, rest),
      expect: restExpect,
      instruction: `Start with ${naming.states((ci) => book.digit(rest, ci))}. ${describeExpect(naming, restExpect)}`,
    },
    steps,
    uncovered,
    stats: {
      steps: steps.length,
      conditionChanges,
      items: rules.length + c.contacts.length + c.lockouts.length,
      covered: coveredRules + coveredContacts + sequences.length,
      naiveSteps: coveredRules + 2 * coveredContacts + sequences.reduce((n, s) => n + s.rows.length, 0),
      rows: c.rows,
      rowsSearched: pool.length,
    },
  };
}

// ---------------------------------------------------------------- rest row and pool

/** No drive, throttle released, fewest live inputs, then the lowest row (first states). */
function restRow(c: CompiledDesign, book: RowBook): number {
  const tc = c.conditions[c.throttle.cond];
  const released = tc.states.filter((_, s) => c.throttle.classOf[s] === 0);
  const filter = released.length > 0 ? { where: { [tc.id]: released } } : undefined;
  const { rows } = pageRows(c, { filter, count: EXHAUSTIVE_ROWS });
  let best: RowView | null = null;
  const live = (v: RowView) => Object.values(v.inputs).filter(Boolean).length;
  for (const v of rows) {
    book.remember(v);
    if (v.drive) continue;
    if (!best || live(v) < live(best)) best = v;
  }
  return (best ?? rows[0]).index;
}

function searchPool(c: CompiledDesign, book: RowBook, rest: number): { pool: number[]; exhaustive: boolean; anchors: number } {
  if (c.rows <= EXHAUSTIVE_ROWS) {
    const { rows } = pageRows(c, { count: c.rows });
    rows.forEach((v) => book.remember(v));
    return { pool: rows.map((v) => v.index), exhaustive: true, anchors: 0 };
  }
  // Large tables: sampled drive rows, their single-condition neighbours, and their variations over
  // each rule's own conditions (so rule test rows and contact pairs near drive are found).
  const anchors = new Set<number>([rest]);
  const total = pageRows(c, { filter: { only: "drive" }, count: 0 }).total;
  for (let k = 0; k < Math.min(ANCHOR_DRIVE_ROWS, total); k++) {
    const from = Math.floor((k * total) / Math.min(ANCHOR_DRIVE_ROWS, total));
    const v = pageRows(c, { filter: { only: "drive" }, from, count: 1 }).rows[0];
    book.remember(v);
    anchors.add(v.index);
  }
  const pool = new Set<number>(anchors);
  for (const a of anchors) {
    c.conditions.forEach((cond, ci) => {
      for (let s = 0; s < cond.radix; s++) pool.add(book.withState(a, ci, s));
    });
    for (const r of c.design.rules) {
      if (r.type !== "inhibit") continue;
      const conds = [...predicateConditions(r.when, new Set())].map((id) => c.conditionIndex[id]);
      const combos = conds.reduce((n, ci) => n * c.conditions[ci].radix, 1);
      if (combos > MAX_RELAX_COMBOS) continue;
      let rows = [a];
      for (const ci of conds) rows = rows.flatMap((i) => c.conditions[ci].states.map((_, s) => book.withState(i, ci, s)));
      rows.forEach((i) => pool.add(i));
    }
  }
  return { pool: [...pool].sort((x, y) => x - y), exhaustive: false, anchors: anchors.size - 1 };
}

// ---------------------------------------------------------------- greedy cover

/**
 * Greedy weighted set cover: candidates are single test rows (for rules) and closed/open row pairs
 * (for contacts); each pick maximises (rules + 2 x contacts newly covered) / rows newly added, so
 * the plan never exceeds one row per rule plus two per contact.
 */
function chooseRows(
  book: RowBook,
  rest: number,
  testRowsOf: Map<string, number[]>,
  pairsOf: Map<string, ContactPair[]>,
): Set<number> {
  const rulesOfRow = new Map<number, string[]>();
  for (const [id, rows] of testRowsOf) for (const i of rows) (rulesOfRow.get(i) ?? rulesOfRow.set(i, []).get(i)!).push(id);
  const pairsOfRow = new Map<number, ContactPair[]>();
  for (const pairs of pairsOf.values()) {
    for (const p of pairs) {
      (pairsOfRow.get(p.a) ?? pairsOfRow.set(p.a, []).get(p.a)!).push(p);
      (pairsOfRow.get(p.b) ?? pairsOfRow.set(p.b, []).get(p.b)!).push(p);
    }
  }
  const chosen = new Set<number>();
  const doneRules = new Set<string>();
  const doneContacts = new Set<string>();
  const gainOf = (rows: number[]) => {
    const rules = new Set<string>();
    const contacts = new Set<string>();
    const has = (i: number) => chosen.has(i) || rows.includes(i);
    for (const i of rows) {
      for (const id of rulesOfRow.get(i) ?? []) if (!doneRules.has(id)) rules.add(id);
      for (const p of pairsOfRow.get(i) ?? []) if (!doneContacts.has(p.contact) && has(p.a) && has(p.b)) contacts.add(p.contact);
    }
    return { rules, contacts, value: rules.size + 2 * contacts.size };
  };
  for (;;) {
    const candidates: number[][] = [];
    for (const [id, rows] of testRowsOf) if (!doneRules.has(id)) for (const i of rows) candidates.push([i]);
    for (const [id, pairs] of pairsOf) if (!doneContacts.has(id)) for (const p of pairs) candidates.push([p.a, p.b]);
    if (candidates.length === 0) break;
    let best: { rows: number[]; value: number; ratio: number; dist: number } | null = null;
    for (const cand of candidates) {
      const rows = cand.filter((i) => !chosen.has(i));
      if (rows.length === 0) continue;
      const { value } = gainOf(rows);
      if (value === 0) continue;
      const ratio = value / rows.length;
      const dist = Math.min(...rows.map((i) => book.hamming(i, rest)));
      if (
        !best ||
        ratio > best.ratio ||
        (ratio === best.ratio && (value > best.value || (value === best.value && dist < best.dist)))
      ) {
        best = { rows, value, ratio, dist };
      }
    }
    if (!best) break;
    const { rules, contacts } = gainOf(best.rows);
    best.rows.forEach((i) => chosen.add(i));
    rules.forEach((id) => doneRules.add(id));
    contacts.forEach((id) => doneContacts.add(id));
  }
  return chosen;
}

// ---------------------------------------------------------------- lockout sequences

/**
 * Sequence [B released, B, D, D released, D]: from a row B (throttle held) to a drive row D the
 * lockout's event happens with the throttle held, so drive must stay off; releasing and re-applying
 * the throttle brings drive back. B differs from D in the throttle and at most two other conditions;
 * a B that sets off no other listed lockout is preferred (decision 052). Outcomes come from replayTrace.
 */
function lockoutSequence(c: CompiledDesign, book: RowBook, lockout: Lockout, drives: number[]): Sequence | null {
  if (book.releasedState < 0 || drives.length === 0) return null;
  const tc = c.throttle.cond;
  const held = c.conditions[tc].states.map((_, s) => s).filter((s) => c.throttle.classOf[s] !== 0);
  const others = c.conditions.map((_, i) => i).filter((i) => i !== tc);
  let best: Sequence | null = null;
  let replays = 0;
  for (let level = 0; level <= 2; level++) {
    const changeSets: number[][] =
      level === 0 ? [[]] : level === 1 ? others.map((i) => [i]) : others.flatMap((i, k) => others.slice(k + 1).map((j) => [i, j]));
    for (const d of drives) {
      for (const set of changeSets) {
        let variants = [d];
        for (const ci of set) {
          const here = book.digit(d, ci);
          variants = variants.flatMap((i) =>
            c.conditions[ci].states.map((_, s) => s).filter((s) => s !== here).map((s) => book.withState(i, ci, s)),
          );
        }
        for (const v of variants) {
          for (const t of held) {
            const b = book.withState(v, tc, t);
            if (b === d) continue;
            if (++replays > MAX_LOCKOUT_REPLAYS) return best;
            const rows = [book.released(b), b, d, book.released(d), d];
            const steps = replayTrace(c, rows.map((i) => decodeRow(c, i)));
            const armed = new Set([...steps[1].armed, ...steps[2].armed]);
            const ok = armed.has(lockout) && steps[2].latched && !steps[2].drive && steps[2].row.drive && steps[4].drive;
            if (!ok) continue;
            const extra = [...armed].filter((x) => x !== lockout);
            if (!best || extra.length < best.others.length) best = { lockout, rows, steps, others: extra };
            if (extra.length === 0) return best;
          }
        }
      }
    }
    if (best) return best;
  }
  return best;
}

function lockoutReason(c: CompiledDesign, l: Lockout, steadyDrive: boolean, benchDrive: boolean): string {
  if (c.throttle.classOf.indexOf(0) < 0) return "the throttle has no released state, so a latched lockout can't be cleared to show drive coming back";
  if (!steadyDrive) return "drive never runs in any row, so holding it off can't be seen";
  if (!benchDrive) {
    return "every row where drive could run latches a lockout as the throttle is applied, so drive can never be shown coming back";
  }
  const missing: Partial<Record<Lockout, string>> = {
    "power-on": c.inputOf.power < 0 ? "the design has no power input, so the controller is powered whenever the supply is" : "",
    "enable-restore": c.inputOf.enable < 0 ? "the design has no enable input, so enable never comes back" : "",
    "direction-engage": c.inputOf.forward < 0 ? "the design has no forward input, so a direction is always selected" : "",
    "brake-release": c.inputOf.brake < 0 ? "the design has no brake input, so the brake is never released" : "",
    "throttle-fault": !c.throttle.classOf.includes(2) ? "the throttle has no fault state" : "",
  };
  return (
    missing[l] ||
    "no change of at most two conditions from a drive row sets it off with the throttle held and drive otherwise able to run"
  );
}

// ---------------------------------------------------------------- naming

function namingOf(c: CompiledDesign): Naming {
  return {
    conditionLabel: (ci) => c.conditions[ci].label,
    stateName: (ci, s) => c.conditions[ci].states[s],
    conditionCount: c.conditions.length,
    throttleCond: c.throttle.cond,
    releasedState: c.throttle.classOf.indexOf(0),
    condition: (ci) => `"${c.conditions[ci].label}"`,
    input: (id) => {
      const x = c.inputs[c.inputIndex[id]];
      return x && x.label !== id ? `${x.label} (${id})` : id;
    },
    inputIds: c.inputs.map((x) => x.id),
    contact: (id) => {
      const k = c.contacts[c.contactIndex[id]];
      return k && k.label !== id ? `${id} (${k.label})` : id;
    },
    states: (digit) => c.conditions.map((k, ci) => `${k.label} ${k.states[digit(ci)]}`).join(", "),
  };
}
