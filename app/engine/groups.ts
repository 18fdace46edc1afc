// Row groups and blocking reasons (spec section 4): the rows of a named set (drive, a rule's unsafe
// or violating rows, the rows a stuck contact breaks) as a few groups a reviewer can read, and why
// an inhibit rule that forbids drive holds, as the unsafe rows split by what keeps drive off.
import type { CompiledDesign } from "./compile";
import { buildDiagram, diagramGroups, type MaskGroup } from "./diagram";
import type { FaultMode } from "./schema";
import { popcount, WordEvaluator } from "./table";

export const GROUPS_FORMAT = "chainproof/groups@1";
export const WHY_FORMAT = "chainproof/why@1";

/** Rows whose states all lie in the listed subsets; a condition left out may be in any state. */
export type RowGroup = { rows: number; states: Record<string, string[]> };

export type GroupsDocument = {
  format: typeof GROUPS_FORMAT;
  set: string;
  rows: number;
  groups: RowGroup[];
  /** All groups of the set; more than `groups.length` only when the caller asked for fewer. */
  groupCount: number;
};

/** Why steady drive is off in a row: the first of these that applies (spec section 4). */
export const BLOCKING_REASONS = ["unpowered", "disabled", "neutral", "conflict", "braking", "throttle"] as const;
export type BlockingReason = (typeof BLOCKING_REASONS)[number];

export type WhyPart = { reason: BlockingReason; rows: number; groups: RowGroup[]; groupCount: number };

export type WhyDocument = {
  format: typeof WHY_FORMAT;
  rule: string;
  unsafeRows: number;
  reasons: WhyPart[];
};

/** A set that cannot be grouped (unknown or wrong-type rule or component, unknown mode or form). */
export class RowSetError extends Error {
  override name = "RowSetError";
}

export type RowSet =
  | { kind: "drive" }
  | { kind: "unsafe" | "violating"; rule: number }
  | { kind: "demand" | "failing"; rule: number }
  | { kind: "broken"; contact: number; mode: FaultMode };

const SET_FORMS = "drive, unsafe:RULE, violating:RULE, demand:RULE, failing:RULE or broken:CONTACT/MODE";

const A_RULE: Record<string, string> = {
  inhibit: "an inhibit rule",
  "require-drive": "a require-drive rule",
  "no-restart": "a no-restart rule",
};

function ruleNamed(c: CompiledDesign, id: string) {
  const rule = c.rules.find((r) => r.id === id);
  if (!rule) throw new RowSetError(`no rule with id ${JSON.stringify(id)}`);
  return rule;
}

/** Parses a set name (`drive`, `unsafe:R1`, `broken:S4/stuck-closed`, ...) against a design. */
export function parseRowSet(c: CompiledDesign, set: string): RowSet {
  if (set === "drive") return { kind: "drive" };
  const colon = set.indexOf(":");
  const kind = colon < 0 ? set : set.slice(0, colon);
  const arg = colon < 0 ? "" : set.slice(colon + 1);
  if (colon < 0 || !["unsafe", "violating", "demand", "failing", "broken"].includes(kind)) {
    throw new RowSetError(`unknown set ${JSON.stringify(set)}: use ${SET_FORMS}`);
  }
  if (kind === "broken") {
    const slash = arg.lastIndexOf("/");
    if (slash < 0) throw new RowSetError(`${JSON.stringify(set)}: write broken:CONTACT/stuck-open or broken:CONTACT/stuck-closed`);
    const id = arg.slice(0, slash);
    const mode = arg.slice(slash + 1);
    const comp = c.design.components.find((x) => x.id === id);
    if (!comp) throw new RowSetError(`no component with id ${JSON.stringify(id)}`);
    if (comp.type !== "contact") throw new RowSetError(`component ${JSON.stringify(id)} is a ${comp.type}, not a contact`);
    if (mode !== "stuck-open" && mode !== "stuck-closed") {
      throw new RowSetError(`unknown mode ${JSON.stringify(mode)}: use stuck-open or stuck-closed`);
    }
    return { kind: "broken", contact: c.contactIndex[id], mode };
  }
  const rule = ruleNamed(c, arg);
  if (kind === "unsafe" || kind === "violating") {
    if (rule.type !== "inhibit") throw new RowSetError(`${kind}: needs an inhibit rule; ${JSON.stringify(arg)} is ${A_RULE[rule.type]}`);
    return { kind, rule: rule.index };
  }
  if (rule.type !== "require-drive")
    throw new RowSetError(`${kind}: needs a require-drive rule; ${JSON.stringify(arg)} is ${A_RULE[rule.type]}`);
  return { kind: kind as "demand" | "failing", rule: rule.index };
}

/** The rows where `each` sets a bit, word by word over the whole table. */
function scan(c: CompiledDesign, each: (ev: WordEvaluator) => number): Int32Array {
  const ev = new WordEvaluator(c);
  const bits = new Int32Array(ev.wordCount);
  for (let w = 0; w < ev.wordCount; w++) {
    ev.evalWord(w);
    bits[w] = each(ev) & ev.valid;
  }
  return bits;
}

/** The rows of a set as a bitmap: bit j of word w is row 32*w + j. */
export function rowSetBits(c: CompiledDesign, set: RowSet): Int32Array {
  switch (set.kind) {
    case "drive":
      return scan(c, (ev) => ev.drive);
    case "unsafe":
      return scan(c, (ev) => ev.unsafeWord(set.rule));
    case "violating":
      return scan(c, (ev) => ev.unsafeWord(set.rule) & ev.forbiddenWord(set.rule));
    case "demand":
      return scan(c, (ev) => ev.demandWord(set.rule));
    case "failing":
      return scan(c, (ev) => ev.failingWord(set.rule));
    case "broken":
      return brokenBits(c, c.contacts[set.contact].id, set.mode).bits;
  }
}

/**
 * With one contact stuck: the inhibit rules it defeats (they hold fault-free and fail with it,
 * spec 1.7) and the union of their violating rows under the fault. One scan of the fault-free
 * table; the nets are settled again with the fault only in words where the fault changes a net in a
 * row where a rule still holding is unsafe. The faulted violating rows are kept per rule until it
 * is known which rules hold fault-free.
 */
export function brokenBits(c: CompiledDesign, contact: string, mode: FaultMode): { defeats: string[]; bits: Int32Array } {
  const k = c.contactIndex[contact];
  if (k === undefined) throw new RowSetError(`no contact with id ${JSON.stringify(contact)}`);
  const { netA, netB } = c.contacts[k];
  const closed = mode === "stuck-closed";
  const ev = new WordEvaluator(c);
  const inhibit = c.rules.filter((r) => r.type === "inhibit").map((r) => r.index);
  const failsClean = new Set<number>();
  const perRule = new Map<number, Int32Array>();
  const faulted = new Int32Array(c.nets.length);
  for (let w = 0; w < ev.wordCount; w++) {
    ev.evalWord(w);
    let live = 0;
    for (const r of inhibit) {
      if (failsClean.has(r)) continue;
      const unsafe = ev.unsafeWord(r);
      if ((unsafe & ev.forbiddenWord(r)) !== 0) {
        failsClean.add(r);
        perRule.delete(r);
      } else live |= unsafe;
    }
    const cw = ev.cw[k];
    const reach = ev.reach;
    // Rows the fault can change: closing an open contact between a live and a dead net, or opening
    // a closed contact that carries current.
    const changed = closed ? ~cw & (reach[netA] ^ reach[netB]) & live : cw & (reach[netA] | reach[netB]) & live;
    if (changed === 0) continue;
    ev.cw[k] = closed ? -1 : 0;
    ev.settle(faulted, false);
    ev.cw[k] = cw;
    const drive = ev.driveFrom(faulted);
    for (const r of inhibit) {
      if (failsClean.has(r)) continue;
      const bad = ev.unsafeWord(r) & ev.forbiddenWord(r, faulted, drive);
      if (bad === 0) continue;
      let words = perRule.get(r);
      if (!words) perRule.set(r, (words = new Int32Array(ev.wordCount)));
      words[w] = bad;
    }
  }
  const bits = new Int32Array(ev.wordCount);
  const defeats: string[] = [];
  for (const r of inhibit) {
    const words = perRule.get(r);
    if (!words) continue;
    defeats.push(c.rules[r].id);
    for (let w = 0; w < bits.length; w++) bits[w] |= words[w];
  }
  return { defeats, bits };
}

function countBits(bits: Int32Array): number {
  let n = 0;
  for (let w = 0; w < bits.length; w++) if (bits[w] !== 0) n += popcount(bits[w]);
  return n;
}

function toRowGroup(c: CompiledDesign, g: MaskGroup): RowGroup {
  const states: Record<string, string[]> = Object.create(null); // ids like "__proto__" are legal
  for (const [level, mask] of [...g.masks].sort((a, b) => a[0] - b[0])) {
    const cond = c.conditions[level];
    states[cond.id] = cond.states.filter((_, k) => (mask >> k) & 1);
  }
  return { rows: g.rows, states };
}

/** Groups of any bitmap of rows (bits past the last row clear), at most `limit` of them. */
export function groupBits(c: CompiledDesign, bits: Int32Array, limit = Infinity): { rows: number; groups: RowGroup[]; groupCount: number } {
  const rows = countBits(bits);
  if (rows === 0) return { rows, groups: [], groupCount: 0 };
  const { groups, groupCount } = diagramGroups(buildDiagram(c, bits), limit);
  return { rows, groups: groups.map((g) => toRowGroup(c, g)), groupCount };
}

/** The groups document of a set (spec section 4); throws RowSetError for a set that cannot be grouped. */
export function groupRows(c: CompiledDesign, set: string, opts: { limit?: number } = {}): GroupsDocument {
  const bits = rowSetBits(c, parseRowSet(c, set));
  return { format: GROUPS_FORMAT, set, ...groupBits(c, bits, opts.limit) };
}

/** The inhibit rule `ruleId` if it forbids drive; RowSetError otherwise. */
function driveRule(c: CompiledDesign, ruleId: string): number {
  const rule = ruleNamed(c, ruleId);
  if (rule.type !== "inhibit") {
    throw new RowSetError(`why: needs an inhibit rule that forbids drive; ${JSON.stringify(ruleId)} is ${A_RULE[rule.type]}`);
  }
  if (rule.forbidInput >= 0) {
    const input = c.inputs[rule.forbidInput].id;
    throw new RowSetError(
      `why: needs an inhibit rule that forbids drive; ${JSON.stringify(ruleId)} forbids energizing ${JSON.stringify(input)}`,
    );
  }
  return rule.index;
}

/**
 * Why an inhibit rule forbidding drive holds: its unsafe rows without drive, split by blocking
 * reason (the first that applies, in BLOCKING_REASONS order), each part as groups.
 */
export function whyRuleHolds(c: CompiledDesign, ruleId: string, opts: { limit?: number } = {}): WhyDocument {
  const r = driveRule(c, ruleId);
  const ev = new WordEvaluator(c);
  const parts = BLOCKING_REASONS.map(() => new Int32Array(ev.wordCount));
  let unsafeRows = 0;
  for (let w = 0; w < ev.wordCount; w++) {
    ev.evalWord(w);
    const unsafe = ev.unsafeWord(r);
    if (unsafe === 0) continue;
    unsafeRows += popcount(unsafe);
    let left = unsafe & ~ev.drive;
    if (left === 0) continue;
    const cut = c.brakeCutsDrive ? ev.braking : 0;
    const tests = [~ev.powered, ~ev.enabled, ev.dirNeutral, ev.dirConflict, cut, ~ev.thrApplied];
    for (let k = 0; k < tests.length && left !== 0; k++) {
      const part = left & tests[k];
      parts[k][w] = part;
      left &= ~part;
    }
  }
  const reasons: WhyPart[] = [];
  BLOCKING_REASONS.forEach((reason, k) => {
    const grouped = groupBits(c, parts[k], opts.limit);
    if (grouped.rows > 0) reasons.push({ reason, ...grouped });
  });
  return { format: WHY_FORMAT, rule: ruleId, unsafeRows, reasons };
}

// ---------------------------------------------------------------- comparing two tables

export type OutcomeChangeKind = "drive-on" | "drive-off" | "now-violating" | "no-longer-violating" | "now-failing" | "no-longer-failing";

/** Rows of two revisions' tables whose outcome changed one way, as groups. */
export type OutcomeChange = { kind: OutcomeChangeKind; rule?: string; rows: number; groups: RowGroup[]; groupCount: number };

export type OutcomeComparison =
  { comparable: false; reason: string } | { comparable: true; rows: number; changedRows: number; changes: OutcomeChange[] };

/** Same condition ids and states in the same order: row N is the same situation in both tables. */
export function sameRowNumbering(before: CompiledDesign, after: CompiledDesign): boolean {
  return (
    before.conditions.length === after.conditions.length &&
    before.conditions.every((x, i) => x.id === after.conditions[i].id && x.states.join("\n") === after.conditions[i].states.join("\n"))
  );
}

/**
 * The rows whose steady drive changed (on, off) and, per inhibit or require-drive rule id in either
 * design (in the order of `after`, then rules only `before` has), the rows that became or stopped
 * being violating (inhibit) or failing (require-drive). A rule one design does not have breaks no row
 * there. Needs the same row numbering.
 */
export function compareOutcomes(before: CompiledDesign, after: CompiledDesign, opts: { limit?: number } = {}): OutcomeComparison {
  if (!sameRowNumbering(before, after)) {
    return { comparable: false, reason: "The two revisions have different conditions or states, so their rows do not match one to one." };
  }
  const a = new WordEvaluator(before);
  const b = new WordEvaluator(after);
  const inhibitOf = (c: CompiledDesign) => new Map(c.rules.flatMap((r) => (r.type !== "no-restart" ? [[r.id, r.index] as const] : [])));
  const ra = inhibitOf(before);
  const rb = inhibitOf(after);
  const ids = [...new Set([...rb.keys(), ...ra.keys()])];
  const words = a.wordCount;
  const on = new Int32Array(words);
  const off = new Int32Array(words);
  const now = ids.map(() => new Int32Array(words));
  const noLonger = ids.map(() => new Int32Array(words));
  const any = new Int32Array(words);
  const violating = (ev: WordEvaluator, r: number | undefined) =>
    r === undefined ? 0 : ev.c.rules[r]!.type === "require-drive" ? ev.failingWord(r) : ev.unsafeWord(r) & ev.forbiddenWord(r);
  for (let w = 0; w < words; w++) {
    a.evalWord(w);
    b.evalWord(w);
    const valid = a.valid;
    on[w] = b.drive & ~a.drive & valid;
    off[w] = a.drive & ~b.drive & valid;
    let changed = on[w] | off[w];
    for (let k = 0; k < ids.length; k++) {
      const va = violating(a, ra.get(ids[k]));
      const vb = violating(b, rb.get(ids[k]));
      now[k][w] = vb & ~va;
      noLonger[k][w] = va & ~vb;
      changed |= va ^ vb;
    }
    any[w] = changed;
  }
  const changes: OutcomeChange[] = [];
  const add = (kind: OutcomeChangeKind, bits: Int32Array, rule?: string) => {
    const grouped = groupBits(after, bits, opts.limit);
    if (grouped.rows > 0) changes.push({ kind, ...(rule === undefined ? {} : { rule }), ...grouped });
  };
  add("drive-on", on);
  add("drive-off", off);
  ids.forEach((id, k) => {
    const at = rb.get(id) ?? ra.get(id)!;
    const requires = (rb.has(id) ? after : before).rules[at]!.type === "require-drive";
    add(requires ? "now-failing" : "now-violating", now[k], id);
    add(requires ? "no-longer-failing" : "no-longer-violating", noLonger[k], id);
  });
  return { comparable: true, rows: after.rows, changedRows: countBits(any), changes };
}
