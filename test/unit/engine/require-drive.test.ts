// Spec 1.1 on the yard-tug example: require-drive rules, `ok` needing a drive row, and rules whose
// `when` matches no row. Expected counts are worked out by hand from the example's wiring (and the
// row-at-a-time reference agrees), not read back from the engine.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import {
  compileDesign,
  countRows,
  csvChunks,
  encodeRow,
  evaluateRow,
  prove,
  validateDesign,
  type Design,
  type Predicate,
  type RequireDriveVerdict,
} from "../../../app/engine";
import { refVerdict } from "./reference";

const yardTug = (): Design => JSON.parse(readFileSync("/work/shared/spec/examples/yard-tug.design.json", "utf8"));
const withoutNoRestart = (d: Design): Design => ({ ...d, rules: d.rules.filter((r) => r.type !== "no-restart") });

describe("require-drive rules (yard tug)", () => {
  it("count demand rows and hold when every demand row drives", () => {
    const v = prove(yardTug());
    // D1 pins key, seat, plug, pedal and the accelerator, and allows two lever positions: 2 rows.
    expect(v.rules.find((r) => r.id === "D1")).toEqual({ id: "D1", holds: true, demandRows: 2, failingRows: 0 });
  });

  it("fail with an example row that is a demand row without drive when the enable chain is open", () => {
    const d = yardTug();
    // The seat switch wired normally closed: seated, the enable line is dead.
    const seat = d.components.find((x) => x.id === "SEAT");
    if (seat?.type !== "contact") throw new Error("fixture");
    seat.closedIn = ["empty"];
    const c = compileDesign(d);
    const v = prove(c);
    const d1 = v.rules.find((r) => r.id === "D1") as RequireDriveVerdict;
    expect(d1).toMatchObject({ holds: false, demandRows: 2, failingRows: 2 });
    const row = evaluateRow(c, encodeRow(c, d1.example!));
    expect(row.demands.D1).toEqual({ demand: true, failing: true });
    expect(row.drive).toBe(false);
    expect(row.states).toMatchObject({ key: "on", seat: "occupied", plug: "free", pedal: "up", thr: "pressed" });
    expect(v.ok).toBe(false);
    expect(v).toEqual(expect.objectContaining({ ok: refVerdict(d).ok, driveRows: refVerdict(d).driveRows }));
  });

  it("are not re-checked under single faults (a stuck contact that stops the vehicle fails safe)", () => {
    const v = prove(yardTug());
    // KEY stuck open stops every drive row, so it would fail D1; it is not listed.
    expect(v.singleFaults.flatMap((f) => f.defeats)).not.toContain("D1");
    expect(v.singleFaults.map((f) => f.component)).not.toContain("KEY");
  });

  it("give the table's demand and failing rows as filters and CSV columns", () => {
    const d = yardTug();
    const seat = d.components.find((x) => x.id === "SEAT");
    if (seat?.type !== "contact") throw new Error("fixture");
    seat.closedIn = ["empty"];
    const c = compileDesign(d);
    expect(countRows(c, { only: "demand", rule: "D1" })).toBe(2);
    expect(countRows(c, { only: "failing" })).toBe(2);
    expect(() => countRows(c, { only: "failing", rule: "R1" })).toThrow(/not a require-drive rule/);
    expect(() => countRows(c, { only: "violating", rule: "D1" })).toThrow(/not an inhibit rule/);
    const csv = [...csvChunks(c, { only: "failing" })].join("").trimEnd().split("\n");
    const header = csv[0].split(",");
    expect(header.slice(-3)).toEqual(["rule:R1", "rule:R2", "rule:D1"]);
    expect(csv.slice(1).map((l) => l.split(",")[header.indexOf("rule:D1")])).toEqual(["failing", "failing"]);
  });
});

describe("ok needs at least one drive row", () => {
  it("a design that never drives satisfies its inhibit rules and is still not ok", () => {
    const d = withoutNoRestart(yardTug());
    d.rules = d.rules.filter((r) => r.type === "inhibit");
    d.wires = d.wires.filter((w) => w.to !== "EN.in"); // the enable input wired to nothing
    const v = prove(d);
    expect(v.driveRows).toBe(0);
    expect(v.rules.every((r) => r.holds)).toBe(true);
    expect(v.ok).toBe(false);
  });

  it("a design with no rules is ok exactly when it drives somewhere", () => {
    const d = { ...yardTug(), rules: [] };
    expect(prove(d)).toMatchObject({ ok: true, driveRows: 2 });
    d.wires = d.wires.filter((w) => w.to !== "EN.in");
    expect(prove(d)).toMatchObject({ ok: false, driveRows: 0 });
  });
});

describe("a rule whose when matches no row makes the design invalid", () => {
  const withWhen = (when: unknown, type: "inhibit" | "require-drive" = "inhibit") => {
    const d = yardTug() as unknown as { rules: Array<Record<string, unknown>> };
    const at = d.rules.findIndex((r) => r.type === type);
    d.rules[at] = { ...d.rules[at], when };
    return { d, path: `rules[${at}].when` };
  };
  const empties: Array<[string, Predicate]> = [
    ["an empty state list", { cond: "plug", in: [] }],
    ['an "any" of nothing', { any: [] }],
    [
      "a contradiction",
      {
        all: [
          { cond: "key", in: ["on"] },
          { cond: "key", in: ["off"] },
        ],
      },
    ],
    ["not always", { not: { always: true } }],
    ["every state excluded", { not: { cond: "dir", in: ["forward", "neutral", "reverse"] } }],
  ];

  it.each(empties)("%s, at rules[i].when, for inhibit and require-drive rules", (_, when) => {
    for (const type of ["inhibit", "require-drive"] as const) {
      const { d, path } = withWhen(when, type);
      const checked = validateDesign(d);
      expect(checked.ok).toBe(false);
      if (checked.ok) continue;
      expect(checked.problems).toEqual([{ path, message: expect.stringMatching(/holds in no row/) }]);
    }
  });

  it("an empty state list is legal inside an any or a not that can hold", () => {
    expect(
      validateDesign(
        withWhen({
          any: [
            { cond: "plug", in: [] },
            { cond: "plug", in: ["inserted"] },
          ],
        }).d,
      ).ok,
    ).toBe(true);
    expect(validateDesign(withWhen({ not: { cond: "plug", in: [] } }).d).ok).toBe(true);
  });

  it("a when naming an unknown condition or state is reported for that, not also as matching no row", () => {
    const unknownCond = validateDesign(withWhen({ all: [{ cond: "hitch", in: ["open"] }, { any: [] }] }).d);
    expect(unknownCond.ok).toBe(false);
    if (!unknownCond.ok) expect(unknownCond.problems.map((p) => p.path)).toEqual(["rules[0].when.all[0].cond"]);
    const unknownState = validateDesign(withWhen({ all: [{ cond: "plug", in: ["half"] }, { any: [] }] }).d);
    expect(unknownState.ok).toBe(false);
    if (!unknownState.ok) expect(unknownState.problems.map((p) => p.path)).toEqual(["rules[0].when.all[0].in[0]"]);
    const badShape = validateDesign(withWhen({ any: [], all: [] }).d);
    expect(badShape.ok).toBe(false);
    if (!badShape.ok) expect(badShape.problems.every((p) => !/holds in no row/.test(p.message))).toBe(true);
  });

  it("is still reported beside other problems elsewhere in the design", () => {
    const { d, path } = withWhen({ any: [] });
    (d as unknown as { wires: Array<{ from: string; to: string }> }).wires.push({ from: "PACK.+", to: "NOPE.1" });
    const checked = validateDesign(d);
    expect(checked.ok).toBe(false);
    if (!checked.ok) expect(checked.problems.map((p) => p.path).sort()).toEqual([path, "wires[13].to"].sort());
  });
});
