// Model-based test of the editor store (fast-check commands): random sequences of edits (adding,
// wiring, renaming conditions, states, components and rules, removing, copying, pasting), undo
// and redo, starting from every design the project ships. After every command:
// - no reference in the document is broken (an independent checker below, not the engine), and
//   where the user typed an invalid value (a contact left closed in no state) the engine reports
//   the problem at that very field;
// - a refused edit changes nothing and leaves no undo step; an accepted edit is exactly one step;
// - undo gives back exactly the document before the edit, and redo the one after.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { TERMINALS, validateDesign, type Design, type Predicate } from "../../../app/engine";
import { createEditorStore, type EditorStore } from "../../../app/canvas/store";
import { BASE_DESIGNS } from "../../support/fuzz-designs";
import { refMatchesSomeRow } from "../engine/reference";

// ---------------------------------------------------------------- the independent reference checker

const tests = (p: Predicate | undefined, out: Array<{ cond: string; in: string[] }> = []) => {
  if (!p || typeof p !== "object") return out;
  if ("cond" in p) out.push(p);
  else if ("all" in p) p.all.forEach((q) => tests(q, out));
  else if ("any" in p) p.any.forEach((q) => tests(q, out));
  else if ("not" in p) tests(p.not, out);
  return out;
};

/** Every broken reference or duplicate in `d`, in words (empty: all references hold). */
function brokenReferences(d: Design): string[] {
  const out: string[] = [];
  const dup = (xs: string[], what: string) => xs.forEach((x, i) => xs.indexOf(x) !== i && out.push(`${what} ${x} twice`));
  const conditions = new Map(d.conditions.map((c) => [c.id, c.states]));
  dup(
    d.conditions.map((c) => c.id),
    "condition",
  );
  dup(
    d.components.map((c) => c.id),
    "component",
  );
  dup(
    d.rules.map((r) => r.id),
    "rule",
  );
  for (const c of d.components) if (conditions.has(c.id)) out.push(`${c.id} is a condition and a component`);
  for (const c of d.conditions) {
    dup(c.states, `state of ${c.id}`);
    if (c.states.length < 2 || c.states.length > 8) out.push(`${c.id} has ${c.states.length} states`);
  }
  const types = new Map(d.components.map((c) => [c.id, c.type]));
  const functions: string[] = [];
  for (const c of d.components) {
    if (c.type === "contact") {
      const states = conditions.get(c.condition);
      if (!states) out.push(`${c.id} on missing condition ${c.condition}`);
      else for (const s of c.closedIn) if (!states.includes(s)) out.push(`${c.id} closes in missing state ${s}`);
    }
    if (c.type === "input") functions.push(c.function);
  }
  dup(functions, "input function");
  for (const w of d.wires) {
    for (const end of [w.from, w.to]) {
      const dot = end.lastIndexOf(".");
      const type = types.get(end.slice(0, dot));
      if (!type || !(TERMINALS[type] as readonly string[]).includes(end.slice(dot + 1))) out.push(`wire end ${end} missing`);
    }
  }
  const t = d.controller.throttle;
  const ts = conditions.get(t.condition);
  if (!ts) out.push(`throttle on missing condition ${t.condition}`);
  else for (const s of [...t.released, ...t.applied, ...(t.fault ?? [])]) if (!ts.includes(s)) out.push(`throttle state ${s} missing`);
  for (const r of d.rules) {
    for (const x of tests((r as { when?: Predicate }).when)) {
      const states = conditions.get(x.cond);
      if (!states) out.push(`rule ${r.id} tests missing condition ${x.cond}`);
      else for (const s of x.in) if (!states.includes(s)) out.push(`rule ${r.id} tests missing state ${s}`);
    }
    const forbid = (r as { forbid?: unknown }).forbid;
    if (typeof forbid === "object" && forbid !== null) {
      const id = (forbid as { energized: string }).energized;
      if (types.get(id) !== "input") out.push(`rule ${r.id} forbids missing input ${id}`);
    }
  }
  if (d.name.trim() === "") out.push("empty design name");
  return out;
}

/**
 * Invalid values the user chose, each with the field it belongs to: a contact closed in no state, and
 * an inhibit or require-drive rule whose situation holds in no row (spec 1.1), found by brute force
 * over every row (the reference of test/unit/engine/reference.ts, not the engine's own check).
 */
function typedInvalid(d: Design): string[] {
  const contacts = d.components.flatMap((c, i) => (c.type === "contact" && c.closedIn.length === 0 ? [`components[${i}].closedIn`] : []));
  const rules = d.rules.flatMap((r, i) =>
    (r.type === "inhibit" || r.type === "require-drive") && !refMatchesSomeRow(d, r.when) ? [`rules[${i}].when`] : [],
  );
  return [...contacts, ...rules];
}

// ---------------------------------------------------------------- model and commands

type Model = { past: Design[]; future: Design[] };
type Real = { store: EditorStore };
const doc = (r: Real) => r.store.getState().document();
const clone = <T>(x: T): T => JSON.parse(JSON.stringify(x)) as T;
const pick = <T>(xs: readonly T[], n: number): T | undefined => (xs.length ? xs[n % xs.length] : undefined);

/** Applies an edit and checks it against the model: refused = unchanged, accepted = one undo step. */
function edit(m: Model, r: Real, act: () => string | null | void) {
  const before = doc(r);
  const depth = r.store.getState().past.length;
  const why = act();
  const after = doc(r);
  const grew = r.store.getState().past.length - depth;
  if (typeof why === "string") {
    expect(after, `refused (${why}) yet changed`).toEqual(before);
    expect(grew).toBe(0);
  } else if (JSON.stringify(after) !== JSON.stringify(before)) {
    expect(grew, "an accepted edit is one undo step").toBe(1);
    expect(r.store.getState().past.at(-1)).toEqual(before);
    expect(r.store.getState().future).toHaveLength(0);
  }
  if (grew > 0) {
    m.past.push(before);
    m.future = [];
  }
  check(after);
}

function check(d: Design) {
  expect(brokenReferences(d)).toEqual([]);
  const invalid = typedInvalid(d);
  if (invalid.length > 0) {
    const v = validateDesign(d);
    const paths = v.ok ? [] : v.problems.map((p) => p.path);
    for (const field of invalid) expect(paths, `the problem is shown at ${field}`).toContain(field);
  }
}

type Cmd = fc.Command<Model, Real>;
const cmd = (name: string, run: (m: Model, r: Real) => void): Cmd => ({ check: () => true, run, toString: () => name });

// Names that pass through existing ones ("park" on the way to "park2"), collide, or are invalid.
const typed = fc.oneof(
  fc.constantFrom(
    "park",
    "park2",
    "on",
    "on2",
    "off",
    "K1",
    "K2",
    "B1",
    "EN",
    "seat",
    "throttle",
    "key",
    "R1",
    "",
    " ",
    "has space",
    "x".repeat(65),
    "ok.1",
  ),
  fc.stringMatching(/^[a-z][a-z0-9]{0,5}$/),
);
/** A typed name: one of the design's existing names (maybe with a character added or dropped), or anything. */
const typedFrom = (existing: (d: Design) => string[]) =>
  fc.tuple(typed, fc.nat(), fc.constantFrom("same", "extend", "shorten", "free")).map(([free, n, how]) => (d: Design) => {
    const base = pick(existing(d), n);
    if (base === undefined || how === "free") return free;
    return how === "same" ? base : how === "extend" ? `${base}2` : base.slice(0, -1);
  });
const allNames = (d: Design) => [
  ...d.conditions.map((c) => c.id),
  ...d.components.map((c) => c.id),
  ...d.conditions.flatMap((c) => c.states),
  ...d.rules.map((r) => r.id),
];

const commands: Array<fc.Arbitrary<Cmd>> = [
  fc
    .tuple(
      fc.constantFrom("supply", "contact", "junction", "input"),
      fc.constantFrom("power", "enable", "forward", "reverse", "brake"),
      fc.integer({ min: -400, max: 800 }),
      fc.integer({ min: -400, max: 800 }),
    )
    .map(([kind, fn, x, y]) =>
      cmd(`add ${kind}`, (m, r) => {
        const taken = r.store.getState().nodes.some((n) => n.type === "input" && n.data.function === fn);
        if (kind === "input" && taken) return;
        edit(m, r, () => void r.store.getState().addComponent(kind as "supply", { x, y }, fn as "enable"));
      }),
    ),
  fc.tuple(fc.nat(), fc.nat(), fc.nat(), fc.nat()).map(([a, ta, b, tb]) =>
    cmd("wire", (m, r) => {
      const nodes = r.store.getState().nodes;
      const x = pick(nodes, a);
      const y = pick(nodes, b);
      if (!x || !y) return;
      edit(m, r, () =>
        r.store
          .getState()
          .connect({ source: x.id, sourceHandle: pick(TERMINALS[x.type], ta)!, target: y.id, targetHandle: pick(TERMINALS[y.type], tb)! }),
      );
    }),
  ),
  fc.tuple(fc.nat(), fc.nat(), fc.nat()).map(([a, ta, b]) =>
    cmd("click-wire", (m, r) => {
      const nodes = r.store.getState().nodes;
      const x = pick(nodes, a);
      const y = pick(nodes, b);
      if (!x || !y) return;
      r.store.getState().clickTerminal({ component: x.id, terminal: pick(TERMINALS[x.type], ta)! });
      edit(m, r, () => r.store.getState().clickTerminal({ component: y.id, terminal: pick(TERMINALS[y.type], ta + 1)! }));
    }),
  ),
  fc.nat().map((i) => cmd(`select ${i}`, (_m, r) => r.store.getState().select(pick(r.store.getState().nodes, i)?.id ?? null))),
  fc.constant(cmd("select all", (_m, r) => r.store.getState().selectAll())),
  fc.constant(cmd("delete", (m, r) => edit(m, r, () => r.store.getState().deleteSelected()))),
  fc.tuple(fc.nat(), fc.constantFrom("power", "enable", "forward", "reverse", "brake")).map(([i, fn]) =>
    cmd(`input function ${fn}`, (m, r) => {
      const n = pick(
        r.store.getState().nodes.filter((x) => x.type === "input"),
        i,
      );
      if (n) edit(m, r, () => r.store.getState().updateComponent(n.id, { function: fn as "enable" }));
    }),
  ),
  fc.constant(
    cmd("cut+paste", (m, r) => {
      r.store.getState().cutSelected();
      check(doc(r));
      // Cut is a copy and a delete (one step); the model learns of it from the store's history.
      m.past = r.store.getState().past.slice();
      m.future = [];
      edit(m, r, () => void r.store.getState().paste());
    }),
  ),
  fc.constant(cmd("duplicate", (m, r) => edit(m, r, () => r.store.getState().duplicateSelected()))),
  fc.constant(cmd("copy+paste", (m, r) => (r.store.getState().copySelected(), edit(m, r, () => void r.store.getState().paste())))),
  fc.tuple(fc.constantFrom("series", "parallel"), fc.nat()).map(([mode, i]) =>
    cmd(`add in ${mode}`, (m, r) => {
      const c = pick(
        r.store.getState().nodes.filter((n) => n.type === "contact"),
        i,
      );
      if (c) edit(m, r, () => void r.store.getState().addBeside(mode as "series", c.id));
    }),
  ),
  fc.tuple(fc.nat(), typedFrom(allNames)).map(([i, name]) =>
    cmd("rename component", (m, r) => {
      const n = pick(r.store.getState().nodes, i);
      if (n) edit(m, r, () => r.store.getState().renameComponent(n.id, name(doc(r))));
    }),
  ),
  fc.tuple(fc.nat(), typedFrom(allNames)).map(([i, name]) =>
    cmd("rename condition", (m, r) => {
      const k = r.store.getState().rest.conditions.length;
      if (k) edit(m, r, () => r.store.getState().renameCondition(i % k, name(doc(r))));
    }),
  ),
  fc
    .tuple(
      fc.nat(),
      fc.nat(),
      typedFrom((d) => d.conditions.flatMap((c) => c.states)),
    )
    .map(([i, j, name]) =>
      cmd("rename state", (m, r) => {
        const c = pick(r.store.getState().rest.conditions, i);
        if (c)
          edit(m, r, () =>
            r.store.getState().renameState(i % r.store.getState().rest.conditions.length, j % c.states.length, name(doc(r))),
          );
      }),
    ),
  fc
    .tuple(
      fc.nat(),
      typedFrom((d) => d.conditions.flatMap((c) => c.states)),
    )
    .map(([i, name]) =>
      cmd("add state", (m, r) => {
        const k = r.store.getState().rest.conditions.length;
        if (k) edit(m, r, () => r.store.getState().addState(i % k, name(doc(r))));
      }),
    ),
  fc.tuple(fc.nat(), fc.nat()).map(([i, j]) =>
    cmd("remove state", (m, r) => {
      const c = pick(r.store.getState().rest.conditions, i);
      if (c) edit(m, r, () => r.store.getState().removeState(i % r.store.getState().rest.conditions.length, j % c.states.length));
    }),
  ),
  fc.constant(cmd("add condition", (m, r) => edit(m, r, () => r.store.getState().addCondition()))),
  fc.nat().map((i) =>
    cmd("remove condition", (m, r) => {
      const k = r.store.getState().rest.conditions.length;
      if (k) edit(m, r, () => r.store.getState().removeCondition(i % k));
    }),
  ),
  fc.tuple(fc.nat(), typedFrom(allNames)).map(([i, name]) =>
    cmd("rename rule", (m, r) => {
      const k = r.store.getState().rest.rules.length;
      if (k) edit(m, r, () => r.store.getState().renameRule(i % k, name(doc(r))));
    }),
  ),
  fc.tuple(fc.nat(), fc.nat(), fc.nat()).map(([i, j, mask]) =>
    cmd("contact condition and states", (m, r) => {
      const s = r.store.getState();
      const c = pick(
        s.nodes.filter((n) => n.type === "contact"),
        i,
      );
      const cond = pick(s.rest.conditions, j);
      if (!c || !cond) return;
      // The states picked by a bit mask: possibly none (an invalid choice the field must show).
      edit(m, r, () => s.updateComponent(c.id, { condition: cond.id, closedIn: cond.states.filter((_, k) => (mask >> k) & 1) }));
    }),
  ),
  fc.tuple(fc.nat(), fc.nat()).map(([i, mask]) =>
    cmd("add rule", (m, r) => {
      const cond = pick(r.store.getState().rest.conditions, i);
      if (!cond) return;
      edit(m, r, () =>
        r.store.getState().addRule((rest) => ({
          id: `R${rest.rules.length + 1}x${i % 7}`,
          type: "inhibit",
          when: { cond: cond.id, in: cond.states.filter((_, k) => (mask >> k) & 1) },
          forbid: "drive",
        })),
      );
    }),
  ),
  fc.tuple(fc.nat(), fc.nat()).map(([i, mask]) =>
    cmd("add require-drive rule", (m, r) => {
      // "Must drive when …": a when over one condition, possibly with no state (the field shows it).
      const cond = pick(r.store.getState().rest.conditions, i);
      if (!cond) return;
      edit(m, r, () =>
        r.store.getState().addRule((rest) => ({
          id: `D${rest.rules.length + 1}x${i % 7}`,
          type: "require-drive",
          when: { all: [{ cond: cond.id, in: cond.states.filter((_, k) => (mask >> k) & 1) }] },
        })),
      );
    }),
  ),
  fc.nat().map((i) =>
    cmd("remove rule", (m, r) => {
      const k = r.store.getState().rest.rules.length;
      if (k) edit(m, r, () => r.store.getState().removeRule(i % k));
    }),
  ),
  typed.map((name) => cmd(`rename design ${JSON.stringify(name)}`, (m, r) => edit(m, r, () => r.store.getState().setDesignName(name)))),
  fc.tuple(fc.nat(), fc.integer({ min: -300, max: 300 })).map(([i, dx]) =>
    cmd("drag", (m, r) => {
      const n = pick(r.store.getState().nodes, i);
      if (n) edit(m, r, () => r.store.getState().setPositions({ [n.id]: { x: n.position.x + dx, y: n.position.y } }, { commit: true }));
    }),
  ),
  fc.constant(
    cmd("undo", (m, r) => {
      const now = doc(r);
      r.store.getState().undo();
      const expected = m.past.pop();
      if (!expected) return expect(doc(r)).toEqual(now);
      m.future.unshift(now);
      expect(doc(r), "undo gives back exactly the document before").toEqual(expected);
      check(doc(r));
    }),
  ),
  fc.constant(
    cmd("redo", (m, r) => {
      const now = doc(r);
      r.store.getState().redo();
      const expected = m.future.shift();
      if (!expected) return expect(doc(r)).toEqual(now);
      m.past.push(now);
      expect(doc(r), "redo gives back exactly the document after").toEqual(expected);
      check(doc(r));
    }),
  ),
];

describe("editor store, model-based", () => {
  it("never breaks a reference, refuses without changing, and undoes each edit exactly", () => {
    const starts = [...BASE_DESIGNS.map((d) => clone(d) as unknown), {}];
    fc.assert(
      fc.property(fc.nat({ max: starts.length - 1 }), fc.commands(commands, { maxCommands: 60 }), (start, cmds) => {
        const store = createEditorStore({
          initial: clone(starts[start]),
          readOnly: false,
          designName: "Haybarn campus hauler #3",
          baseRevision: 0,
        });
        check(store.getState().document());
        fc.modelRun(() => ({ model: { past: [], future: [] }, real: { store } }), cmds);
      }),
      { numRuns: Number(process.env.EDITOR_MODEL_RUNS ?? 150) },
    );
  });
});
