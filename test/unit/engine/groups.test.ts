// Row groups and blocking reasons (spec section 4), checked against independent references: the
// groups are expanded row by row and compared with sets computed by the row-at-a-time reference
// evaluator, and their number is compared with a decision-diagram baseline built here, top-down,
// from the rows themselves (not with the engine's diagram).
import { readFileSync } from "node:fs";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  BLOCKING_REASONS,
  compareOutcomes,
  compileDesign,
  groupBits,
  groupRows,
  RowSetError,
  whyRuleHolds,
  type BlockingReason,
  type Design,
  type GroupsDocument,
  type RowGroup,
} from "../../../app/engine";
import { is, makeDesign, randomDesign } from "./builders";
import { refDecode, refHolds, refMatchesSomeRow, refRow, refRowCount, type RefRow } from "./reference";

const SLOW = 120_000;
const EXAMPLES = "/work/shared/spec/examples";
const readJson = (name: string) => JSON.parse(readFileSync(`${EXAMPLES}/${name}`, "utf8"));

// ---------------------------------------------------------------- references

type Cond = { id: string; states: string[] };

/** Every row index a group stands for (the cartesian product of its subsets). */
function expand(conds: Cond[], g: RowGroup): number[] {
  let rows = [0];
  for (const c of conds) {
    const allowed = g.states[c.id] ?? c.states;
    rows = rows.flatMap((r) => allowed.map((s) => r * c.states.length + c.states.indexOf(s)));
  }
  return rows;
}

/**
 * The spec's baseline: paths to "in the set" of the reduced decision diagram in design order, with
 * a node's arcs to the same child merged. Built top-down on the rows' membership string: a block
 * whose sub-blocks are all equal is skipped, equal sub-blocks are one arc.
 */
function baselineGroups(radices: number[], member: string, level = 0): number {
  if (!member.includes("1")) return 0;
  if (!member.includes("0")) return 1;
  const r = radices[level];
  const size = member.length / r;
  const parts = Array.from({ length: r }, (_, k) => member.slice(k * size, (k + 1) * size));
  return [...new Set(parts)].reduce((n, p) => n + baselineGroups(radices, p, level + 1), 0);
}

/** Checks a grouping of `expected` (row indexes) against the spec's rules for groups. */
function checkGroups(conds: Cond[], groups: RowGroup[], expected: Set<number>, rowCount: number) {
  const seen = new Set<number>();
  for (const g of groups) {
    const ids = Object.keys(g.states);
    // Conditions in design order, each a non-empty, proper subset in the condition's order.
    expect(ids).toEqual(conds.map((c) => c.id).filter((id) => ids.includes(id)));
    for (const c of conds) {
      const sub = g.states[c.id];
      if (sub === undefined) continue;
      expect(sub.length).toBeGreaterThan(0);
      expect(sub.length).toBeLessThan(c.states.length);
      expect(sub).toEqual(c.states.filter((s) => sub.includes(s)));
    }
    const rows = expand(conds, g);
    expect(g.rows).toBe(rows.length);
    for (const r of rows) {
      expect(seen.has(r), `row ${r} is in two groups`).toBe(false);
      seen.add(r);
    }
  }
  expect([...seen].sort((a, b) => a - b)).toEqual([...expected].sort((a, b) => a - b));
  const member = Array.from({ length: rowCount }, (_, i) => (expected.has(i) ? "1" : "0")).join("");
  expect(groups.length).toBeLessThanOrEqual(
    baselineGroups(
      conds.map((c) => c.states.length),
      member,
    ),
  );
}

type Fault = { component: string; mode: "stuck-open" | "stuck-closed" };

function refRows(d: Design, faults: Fault[] = []): RefRow[] {
  return Array.from({ length: refRowCount(d) }, (_, i) => refRow(d, refDecode(d, i), faults));
}

function refForbidden(rule: Extract<Design["rules"][number], { type: "inhibit" }>, row: RefRow): boolean {
  return rule.forbid === "drive" ? row.drive : row.inputs[rule.forbid.energized];
}

/** Every groupable set of a design with its rows, computed row by row from the spec. */
function referenceSets(d: Design): Map<string, Set<number>> {
  const n = refRowCount(d);
  const clean = refRows(d);
  const states = Array.from({ length: n }, (_, i) => refDecode(d, i));
  const sets = new Map<string, Set<number>>();
  const where = (f: (i: number) => boolean) => new Set(Array.from({ length: n }, (_, i) => i).filter(f));
  sets.set(
    "drive",
    where((i) => clean[i].drive),
  );
  const inhibit = d.rules.flatMap((r) => (r.type === "inhibit" ? [r] : []));
  for (const r of d.rules) {
    if (r.type !== "require-drive") continue;
    sets.set(
      `demand:${r.id}`,
      where((i) => refHolds(r.when, states[i])),
    );
    sets.set(
      `failing:${r.id}`,
      where((i) => refHolds(r.when, states[i]) && !clean[i].drive),
    );
  }
  for (const r of inhibit) {
    sets.set(
      `unsafe:${r.id}`,
      where((i) => refHolds(r.when, states[i])),
    );
    sets.set(
      `violating:${r.id}`,
      where((i) => refHolds(r.when, states[i]) && refForbidden(r, clean[i])),
    );
  }
  for (const comp of d.components) {
    if (comp.type !== "contact") continue;
    for (const mode of ["stuck-open", "stuck-closed"] as const) {
      const faulted = refRows(d, [{ component: comp.id, mode }]);
      const violates = (r: (typeof inhibit)[number], rows: RefRow[], i: number) => refHolds(r.when, states[i]) && refForbidden(r, rows[i]);
      const defeated = inhibit.filter(
        (r) => !clean.some((_, i) => violates(r, clean, i)) && faulted.some((_, i) => violates(r, faulted, i)),
      );
      sets.set(
        `broken:${comp.id}/${mode}`,
        where((i) => defeated.some((r) => violates(r, faulted, i))),
      );
    }
  }
  return sets;
}

/** The blocking reason of a row without steady drive, from the reference's controller view. */
function refReason(d: Design, row: RefRow): BlockingReason {
  const v = row.view;
  if (!v.powered) return "unpowered";
  if (!v.enabled) return "disabled";
  if (v.direction === "neutral") return "neutral";
  if (v.direction === "conflict") return "conflict";
  if (v.braking && (d.controller.brakeCutsDrive ?? true)) return "braking";
  return "throttle";
}

// ---------------------------------------------------------------- the spec's example

describe("groups of the yard-tug example", () => {
  // The example computes groups with the spec's baseline; another grouping of the same rows with no
  // more groups is equally right, so rows and counts are compared, not the groups themselves.
  const design = readJson("yard-tug.design.json") as Design;
  const c = compileDesign(design);
  const conds = design.conditions;

  it("drive: the same rows as the example, in no more groups", () => {
    const example = readJson("yard-tug.groups-drive.json") as GroupsDocument;
    const doc = groupRows(c, "drive");
    expect(doc.format).toBe("chainproof/groups@1");
    expect(doc.set).toBe("drive");
    expect(doc.rows).toBe(example.rows);
    expect(doc.groups.length).toBeLessThanOrEqual(example.groups.length);
    const rows = (gs: RowGroup[]) => gs.flatMap((g) => expand(conds, g)).sort((a, b) => a - b);
    expect(rows(doc.groups)).toEqual(rows(example.groups));
  });

  it("why R1 holds: the same reasons, rows and groups as the example", () => {
    const example = readJson("yard-tug.why-R1.json");
    const doc = whyRuleHolds(c, "R1");
    expect(doc.format).toBe("chainproof/why@1");
    expect(doc.rule).toBe("R1");
    expect(doc.unsafeRows).toBe(example.unsafeRows);
    expect(doc.reasons.map((r) => [r.reason, r.rows])).toEqual(
      example.reasons.map((r: { reason: string; rows: number }) => [r.reason, r.rows]),
    );
    doc.reasons.forEach((part, k) => {
      const rows = (gs: RowGroup[]) => gs.flatMap((g) => expand(conds, g)).sort((a, b) => a - b);
      expect(part.groups.length).toBeLessThanOrEqual(example.reasons[k].groups.length);
      expect(rows(part.groups)).toEqual(rows(example.reasons[k].groups));
    });
  });

  it("broken: the stuck-closed charge-inlet switch breaks exactly the plugged-in drive rows", () => {
    const doc = groupRows(c, "broken:PLUG/stuck-closed");
    expect(doc.rows).toBe(2);
    expect(doc.groups).toEqual([
      {
        rows: 2,
        states: { key: ["on"], seat: ["occupied"], plug: ["inserted"], dir: ["forward", "reverse"], pedal: ["up"], thr: ["pressed"] },
      },
    ]);
    expect(groupRows(c, "broken:KEY/stuck-open")).toMatchObject({ rows: 0, groups: [], groupCount: 0 });
  });

  it("demand and failing rows of the require-drive rule", () => {
    expect(groupRows(c, "demand:D1").groups).toEqual(readJson("yard-tug.groups-drive.json").groups);
    expect(groupRows(c, "failing:D1")).toMatchObject({ rows: 0, groups: [] });
    expect(() => groupRows(c, "unsafe:D1")).toThrow(/needs an inhibit rule; "D1" is a require-drive rule/);
    expect(() => groupRows(c, "demand:R1")).toThrow(/needs a require-drive rule; "R1" is an inhibit rule/);
  });
});

// ---------------------------------------------------------------- bad sets

describe("sets that cannot be grouped", () => {
  const c = compileDesign(
    makeDesign({
      conditions: [
        ["seat", ["empty", "occupied"]],
        ["thr", ["rest", "pressed"]],
      ],
      contacts: [["S", "seat", ["occupied"]]],
      junctions: ["J"],
      inputs: [["EN", "enable"]],
      wires: [
        ["BAT.+", "S.1"],
        ["S.2", "EN.in"],
      ],
      throttle: { condition: "thr", released: ["rest"], applied: ["pressed"] },
      rules: [
        { id: "R1", type: "inhibit", when: is("seat", "empty"), forbid: "drive" },
        { id: "R2", type: "inhibit", when: is("seat", "empty"), forbid: { energized: "EN" } },
        { id: "N", type: "no-restart" },
      ],
    }),
  );
  it.each([
    ["everything", /unknown set/],
    ["unsafe:R9", /no rule with id "R9"/],
    ["violating:N", /needs an inhibit rule/],
    ["demand:R1", /needs a require-drive rule/],
    ["failing:N", /needs a require-drive rule/],
    ["broken:X/stuck-open", /no component with id "X"/],
    ["broken:J/stuck-open", /is a junction, not a contact/],
    ["broken:BAT/stuck-open", /is a supply, not a contact/],
    ["broken:S/stuck", /unknown mode "stuck"/],
    ["broken:S", /broken:CONTACT\/stuck-open/],
  ])("%s is refused with a message", (set, message) => {
    expect(() => groupRows(c, set)).toThrow(RowSetError);
    expect(() => groupRows(c, set)).toThrow(message);
  });
  it("why is refused for a rule that is not an inhibit rule forbidding drive", () => {
    expect(() => whyRuleHolds(c, "R2")).toThrow(/forbids energizing "EN"/);
    expect(() => whyRuleHolds(c, "N")).toThrow(/no-restart rule/);
    expect(() => whyRuleHolds(c, "R7")).toThrow(/no rule with id "R7"/);
  });
});

// ---------------------------------------------------------------- random designs

const designs = fc.gen().map((g) => randomDesign(g, { maxConditions: 6, maxStates: 4, maxContacts: 9 }));
const faultProne = fc.gen().map((g) => randomDesign(g, { meshed: true, maxContacts: 9, cutRules: true, maxConditions: 5 }));

describe("groups of every set of random designs", () => {
  const check = (d: Design) => {
    const c = compileDesign(d);
    const n = refRowCount(d);
    for (const [set, expected] of referenceSets(d)) {
      const doc = groupRows(c, set);
      expect(doc.set).toBe(set);
      expect(doc.rows).toBe(expected.size);
      expect(doc.groupCount).toBe(doc.groups.length);
      checkGroups(d.conditions, doc.groups, expected, n);
      expect(groupRows(c, set)).toEqual(doc); // deterministic
    }
  };
  it(
    "are exact, disjoint and no more than the decision-diagram baseline",
    () => {
      fc.assert(fc.property(designs, check), { numRuns: 60 });
    },
    SLOW,
  );
  it(
    "do the same where single faults defeat rules (broken sets)",
    () => {
      fc.assert(fc.property(faultProne, check), { numRuns: 60 });
    },
    SLOW,
  );
});

describe("why an inhibit rule holds, on random designs", () => {
  it(
    "splits the unsafe rows without drive by their first blocking reason, each part exact",
    () => {
      fc.assert(
        fc.property(designs, (d) => {
          const c = compileDesign(d);
          const n = refRowCount(d);
          const rows = refRows(d);
          for (const rule of d.rules) {
            if (rule.type !== "inhibit" || rule.forbid !== "drive") continue;
            const unsafe = Array.from({ length: n }, (_, i) => i).filter((i) => refHolds(rule.when, refDecode(d, i)));
            const doc = whyRuleHolds(c, rule.id);
            expect(doc.unsafeRows).toBe(unsafe.length);
            const parts = new Map<BlockingReason, Set<number>>();
            for (const i of unsafe) {
              if (rows[i].drive) continue;
              const reason = refReason(d, rows[i]);
              parts.set(reason, (parts.get(reason) ?? new Set()).add(i));
            }
            expect(doc.reasons.map((p) => p.reason)).toEqual(BLOCKING_REASONS.filter((r) => parts.has(r)));
            for (const part of doc.reasons) {
              expect(part.rows).toBe(parts.get(part.reason)!.size);
              checkGroups(d.conditions, part.groups, parts.get(part.reason)!, n);
            }
          }
        }),
        { numRuns: 80 },
      );
    },
    SLOW,
  );
});

// ---------------------------------------------------------------- arbitrary sets of rows

/** Random condition shapes up to ~6,000 rows, with sets that are unions of random groups or random bits. */
const shapedSets = fc
  .array(fc.integer({ min: 2, max: 8 }), { minLength: 1, maxLength: 7 })
  .filter((radices) => radices.reduce((a, b) => a * b, 1) <= 6_000)
  .chain((radices) => {
    const rows = radices.reduce((a, b) => a * b, 1);
    const cube = fc.tuple(...radices.map((r) => fc.integer({ min: 1, max: (1 << r) - 1 })));
    const byCubes = fc.array(cube, { maxLength: 6 }).map((cubes) =>
      Array.from({ length: rows }, (_, i) => {
        const digits: number[] = [];
        for (let k = radices.length - 1, x = i; k >= 0; k--) {
          digits[k] = x % radices[k];
          x = Math.floor(x / radices[k]);
        }
        return cubes.some((m) => digits.every((dg, k) => (m[k] >> dg) & 1));
      }),
    );
    const byBits = fc.array(fc.boolean(), { minLength: rows, maxLength: rows });
    return fc.tuple(fc.constant(radices), fc.oneof(byCubes, byBits, fc.constant(Array(rows).fill(true))));
  });

describe("groups of arbitrary sets of rows", () => {
  it(
    "are exact, disjoint and no more than the decision-diagram baseline, for any condition shape",
    () => {
      fc.assert(
        fc.property(shapedSets, ([radices, member]) => {
          const conditions = radices.map((r, k): [string, string[]] => [`c${k}`, Array.from({ length: r }, (_, s) => `s${s}`)]);
          const d = makeDesign({
            conditions,
            wires: [],
            throttle: { condition: "c0", released: ["s0"], applied: ["s1"], fault: conditions[0][1].slice(2) },
          });
          const c = compileDesign(d);
          const bits = new Int32Array(Math.ceil(member.length / 32));
          member.forEach((m, i) => {
            if (m) bits[i >>> 5] |= 1 << (i & 31);
          });
          const out = groupBits(c, bits);
          const expected = new Set(member.flatMap((m, i) => (m ? [i] : [])));
          expect(out.rows).toBe(expected.size);
          checkGroups(d.conditions, out.groups, expected, member.length);
          const limited = groupBits(c, bits, 2);
          expect(limited.groupCount).toBe(out.groupCount);
          expect(limited.groups).toEqual(out.groups.slice(0, 2));
        }),
        { numRuns: 150 },
      );
    },
    SLOW,
  );
});

// ---------------------------------------------------------------- comparing two revisions

/** A second revision of a design: a contact closes in other states, a wire goes, a rule changes. */
const revisedPairs = fc.gen().map((g) => {
  const before = randomDesign(g, { maxConditions: 5, maxStates: 3, maxContacts: 8 });
  const after = JSON.parse(JSON.stringify(before)) as Design;
  const contacts = after.components.flatMap((x) => (x.type === "contact" ? [x] : []));
  const k = contacts[g(fc.integer, { min: 0, max: contacts.length - 1 })];
  const states = after.conditions.find((x) => x.id === k.condition)!.states;
  k.closedIn = g(fc.subarray, states, { minLength: 1 });
  if (after.wires.length > 0 && g(fc.boolean)) after.wires.splice(g(fc.integer, { min: 0, max: after.wires.length - 1 }), 1);
  const inhibit = after.rules.flatMap((r) => (r.type === "inhibit" ? [r] : []));
  if (inhibit.length > 1 && g(fc.boolean)) after.rules = after.rules.filter((r) => r !== inhibit[0]);
  // Negated only when the negation still holds somewhere (spec 1.1: a rule matching no row is invalid).
  else if (g(fc.boolean) && refMatchesSomeRow(after, { not: inhibit[0].when })) inhibit[0].when = { not: inhibit[0].when };
  return { before, after };
});

describe("rows whose outcome changed between two revisions", () => {
  it(
    "are, per kind of change, exactly the rows the reference finds, as groups",
    () => {
      fc.assert(
        fc.property(revisedPairs, ({ before, after }) => {
          const out = compareOutcomes(compileDesign(before), compileDesign(after));
          if (!out.comparable) throw new Error("same conditions must be comparable");
          const n = refRowCount(after);
          const rowsA = refRows(before);
          const rowsB = refRows(after);
          const violates = (d: Design, rows: RefRow[], id: string, i: number) => {
            const r = d.rules.find((x) => x.id === id);
            if (r === undefined || r.type === "no-restart" || !refHolds(r.when, refDecode(d, i))) return false;
            return r.type === "require-drive" ? !rows[i].drive : refForbidden(r, rows[i]);
          };
          const kindOf = (id: string) =>
            [...after.rules, ...before.rules].find((r) => r.id === id)!.type === "require-drive" ? "failing" : "violating";
          const expected = new Map<string, Set<number>>();
          const put = (key: string, i: number) => expected.set(key, (expected.get(key) ?? new Set()).add(i));
          const changed = new Set<number>();
          const ids = new Set([...before.rules, ...after.rules].filter((r) => r.type !== "no-restart").map((r) => r.id));
          for (let i = 0; i < n; i++) {
            if (rowsB[i].drive && !rowsA[i].drive) put("drive-on", i);
            if (rowsA[i].drive && !rowsB[i].drive) put("drive-off", i);
            if (rowsA[i].drive !== rowsB[i].drive) changed.add(i);
            for (const id of ids) {
              const va = violates(before, rowsA, id, i);
              const vb = violates(after, rowsB, id, i);
              if (vb && !va) put(`now-${kindOf(id)} ${id}`, i);
              if (va && !vb) put(`no-longer-${kindOf(id)} ${id}`, i);
              if (va !== vb) changed.add(i);
            }
          }
          expect(out.changedRows).toBe(changed.size);
          const keys = out.changes.map((ch) => (ch.rule === undefined ? ch.kind : `${ch.kind} ${ch.rule}`));
          expect(new Set(keys)).toEqual(new Set(expected.keys()));
          out.changes.forEach((ch, k) => checkGroups(after.conditions, ch.groups, expected.get(keys[k])!, n));
        }),
        { numRuns: 60 },
      );
    },
    SLOW,
  );

  it("are not comparable when the conditions differ", () => {
    const d = readJson("yard-tug.design.json") as Design;
    const e = JSON.parse(JSON.stringify(d)) as Design;
    e.conditions[3].states = ["forward", "neutral", "reverse", "tow"];
    expect(compareOutcomes(compileDesign(d), compileDesign(e))).toMatchObject({ comparable: false });
  });
});
