// Single stuck contacts as bench items (decision 131). A bench observes drive, every controller
// input and the latch; with the inputs unchanged in every row the controller sees the same thing at
// every step, so a fault is revealable exactly when some row's inputs differ with it applied (the
// engine's rowsWhereFaultShows and evaluateRows). For a fault no row reveals, the reason says why, in
// the wiring's terms, from the nets around the contact in the rows where it would matter.
import { faultRows, glimpseRows, type CompiledDesign, type FaultMode, type RowGlimpse, type RowView } from "../engine";
import type { RowBook } from "./book";

export type FaultItem = {
  /** "fault:CONTACT:MODE" */
  id: string;
  contact: string;
  mode: FaultMode;
  /** Candidate rows (of the search) in which the fault changes an input. */
  rows: number[];
  revealable: boolean;
  /** Why no observation reveals it (unrevealable faults only). */
  reason?: string;
};

export const FAULT_MODES: FaultMode[] = ["stuck-open", "stuck-closed"];
const WITNESSES = 4;

export const faultId = (contact: string, mode: FaultMode) => `fault:${contact}:${mode}`;

/**
 * Every contact in both modes: the candidate rows that reveal it. Small tables: every row. Large:
 * the given rows plus the first rows of the whole table where the fault shows (a full scan proves
 * that none exists).
 */
export function faultItems(
  c: CompiledDesign,
  book: RowBook,
  rows: number[],
  exhaustive: boolean,
  naming: (id: string) => string,
): FaultItem[] {
  const faults = c.contacts.flatMap((k) => FAULT_MODES.map((mode) => ({ component: k.id, mode })));
  // Every row of a small table; of a large one the first rows anywhere (none: it shows in no row).
  const found = faultRows(c, faults, exhaustive ? Infinity : WITNESSES);
  const plain = exhaustive ? [] : glimpseRows(c, rows);
  return faults.map((fault, k): FaultItem => {
    const hits = found[k];
    if (!exhaustive && hits.length > 0) {
      // Rows near the sampled drive rows too, so the cover can pick rows that do several jobs.
      const faulty = glimpseRows(c, rows, [fault]);
      const seen = new Set(hits);
      rows.forEach((r, j) => {
        if (!seen.has(r) && !sameInputs(plain[j], faulty[j])) hits.push(r);
      });
      book.load(hits);
    }
    const item: FaultItem = {
      id: faultId(fault.component, fault.mode),
      contact: fault.component,
      mode: fault.mode,
      rows: hits,
      revealable: hits.length > 0,
    };
    if (!item.revealable) item.reason = whyHidden(c, book, rows, exhaustive, fault.component, fault.mode, naming);
    return item;
  });
}

export const sameInputs = (a: RowGlimpse, b: RowGlimpse) => Object.keys(a.inputs).every((k) => a.inputs[k] === b.inputs[k]);

type Why = "bypassed" | "both-fed" | "unfed" | "no-input";

const list = (xs: string[], last = "and") => (xs.length <= 1 ? xs.join("") : `${xs.slice(0, -1).join(", ")} ${last} ${xs[xs.length - 1]}`);

/**
 * Why a stuck contact changes no input in any row. In each row where the fault would change the
 * contact (closed rows for stuck open, open rows for stuck closed), the contact's two ends are
 * already joined through other closed contacts, or both are fed from a supply, or neither is, or the
 * side that would lose or gain supply reaches no input. The reason names what applies and the
 * contacts responsible.
 */
function whyHidden(
  c: CompiledDesign,
  book: RowBook,
  rows: number[],
  exhaustive: boolean,
  id: string,
  mode: FaultMode,
  naming: (id: string) => string,
): string {
  const ki = c.contactIndex[id];
  const k = c.contacts[ki];
  const cond = c.conditions[k.cond];
  const stuck = mode === "stuck-open" ? "stuck open" : "stuck closed";
  const head = `No combination of conditions changes any controller input with ${naming(id)} ${stuck}`;
  const measure = " Only a meter across its terminals (with the traction pack isolated) can find this fault.";
  if (mode === "stuck-closed" && k.closedMask === (1 << cond.radix) - 1) {
    return `${head}: it is closed in every state of "${cond.label}", so stuck closed it behaves as drawn.${measure}`;
  }
  const relevant = rows.filter((i) => book.view(i).contacts[id] === (mode === "stuck-open"));
  const found = new Map<Why, Set<string>>();
  const note = (why: Why, names: string[]) => {
    const s = found.get(why) ?? new Set<string>();
    names.forEach((n) => s.add(n));
    found.set(why, s);
  };
  const done = new Set<string>();
  for (const i of relevant) {
    const v = book.view(i);
    // Rows with the same contacts closed wire the same way: look at each pattern once.
    const pattern = c.contacts.map((o) => (v.contacts[o.id] ? "1" : "0")).join("");
    if (done.has(pattern)) continue;
    done.add(pattern);
    const parent = c.nets.map((_, n) => n);
    const find = (x: number): number => {
      while (parent[x] !== x) x = parent[x] = parent[parent[x]];
      return x;
    };
    c.contacts.forEach((o, j) => {
      if (j !== ki && v.contacts[o.id]) parent[find(o.netA)] = find(o.netB);
    });
    const a = find(k.netA);
    const b = find(k.netB);
    const fed = (root: number) => c.supplyNets.some((s) => find(s) === root);
    if (a === b) {
      note("bypassed", bypass(c, v, ki));
      continue;
    }
    const fa = fed(a);
    const fb = fed(b);
    const feedsInput = (root: number) => c.inputs.some((x) => find(x.net) === root);
    if (fa && fb) note("both-fed", []);
    // Name the open contacts that cut the contact off from a supply, or its far side off from an input.
    else if (!fa && !fb)
      note(
        "unfed",
        boundary(c, v, ki, find, (n) => find(n) === a || find(n) === b, fed),
      );
    else {
      const dark = fa ? b : a;
      note(
        "no-input",
        boundary(c, v, ki, find, (n) => find(n) === dark, feedsInput),
      );
    }
  }
  const when = mode === "stuck-open" ? "closed" : "open";
  const parts: string[] = [];
  const named = (why: Why) => [...(found.get(why) ?? [])].sort().slice(0, 4).map(naming);
  if (found.has("bypassed")) {
    const by = named("bypassed");
    parts.push(by.length > 0 ? `its two ends are joined through ${list(by)} (in parallel with it)` : "its two ends are wired together");
  }
  if (found.has("both-fed")) parts.push("both of its ends are fed from a supply anyway");
  if (found.has("unfed")) {
    const by = named("unfed");
    parts.push(`no supply reaches either of its ends${by.length > 0 ? ` (${list(by, "or")} open)` : ""}`);
  }
  if (found.has("no-input")) {
    const by = named("no-input");
    parts.push(`the wire beyond it leads to no controller input${by.length > 0 ? ` (${list(by, "or")} in series beyond it open)` : ""}`);
  }
  const scope = exhaustive
    ? ""
    : ` (every row was checked for a changed input; the explanation is from the ${relevant.length} rows searched)`;
  if (parts.length === 0) return `${head}${scope}: it is never ${when} in the rows searched.${measure}`;
  return `${head}${scope}: whenever it is ${when}, ${list(parts, "or")}.${measure}`;
}

/** Closed contacts (other than `ki`) on one path joining the contact's two ends. */
function bypass(c: CompiledDesign, v: RowView, ki: number): string[] {
  const k = c.contacts[ki];
  if (k.netA === k.netB) return [];
  const via = new Map<number, number>([[k.netA, -1]]);
  const queue = [k.netA];
  for (let h = 0; h < queue.length && !via.has(k.netB); h++) {
    const n = queue[h];
    c.contacts.forEach((o, j) => {
      if (j === ki || !v.contacts[o.id] || (o.netA !== n && o.netB !== n)) return;
      const m = o.netA === n ? o.netB : o.netA;
      if (!via.has(m)) {
        via.set(m, j);
        queue.push(m);
      }
    });
  }
  const out: string[] = [];
  for (let n = k.netB; via.get(n)! >= 0;) {
    const j = via.get(n)!;
    out.push(c.contacts[j].id);
    n = c.contacts[j].netA === n ? c.contacts[j].netB : c.contacts[j].netA;
  }
  return out;
}

/** Open contacts (other than `ki`) joining the region to a component `beyond` accepts (by its root under `find`). */
function boundary(
  c: CompiledDesign,
  v: RowView,
  ki: number,
  find: (net: number) => number,
  inside: (net: number) => boolean,
  beyond: (root: number) => boolean,
): string[] {
  return c.contacts
    .filter((o, j) => j !== ki && !v.contacts[o.id] && inside(o.netA) !== inside(o.netB) && beyond(find(inside(o.netA) ? o.netB : o.netA)))
    .map((o) => o.id);
}
