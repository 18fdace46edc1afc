// The printed truth table's bands: every column printed exactly once, most important first, and no
// band wider than the page by the same character arithmetic the printed table uses.
import { describe, expect, it } from "vitest";
import { describeBand, PAGE_CHARS, printBands, wholeTable } from "../../../app/reviews/print-bands";
import type { TableColumns } from "../../../app/reviews/truth-table";

function columnsOf(n: {
  conditions: number;
  contacts: number;
  inputs: number;
  rules: number;
  ruleId?: (i: number) => string;
}): TableColumns {
  return {
    conditions: Array.from({ length: n.conditions }, (_, i) => ({ id: `c${i}`, label: `C${i}`, states: ["released", "pressed"] })),
    contacts: Array.from({ length: n.contacts }, (_, i) => ({ id: `K${i}`, label: `K${i}`, condition: `c${i % n.conditions}` })),
    inputs: Array.from({ length: n.inputs }, (_, i) => ({ id: `IN${i}`, label: `In ${i}`, fn: "enable" })),
    rules: Array.from({ length: n.rules }, (_, i) => ({
      id: n.ruleId?.(i) ?? `rule-${i}`,
      label: `Rule ${i}`,
      type: i % 2 ? ("require-drive" as const) : ("inhibit" as const),
    })),
  };
}

const flatten = (bands: ReturnType<typeof printBands>) => ({
  drive: bands.filter((b) => b.drive).length,
  controller: bands.filter((b) => b.controller).length,
  rules: bands.flatMap((b) => b.rules),
  contacts: bands.flatMap((b) => b.contacts),
  inputs: bands.flatMap((b) => b.inputs),
});

describe("printBands", () => {
  it("prints a small table in one band: the screen's table", () => {
    const cols = columnsOf({ conditions: 2, contacts: 2, inputs: 1, rules: 1 });
    expect(printBands(cols, 4)).toEqual([wholeTable(cols)]);
  });

  it("prints every column once, in order, the drive and the rules first", () => {
    const cols = columnsOf({ conditions: 7, contacts: 12, inputs: 6, rules: 9, ruleId: (i) => `no-drive-when-${i}` });
    const bands = printBands(cols, 192);
    expect(bands.length).toBeGreaterThan(1);
    expect(flatten(bands)).toEqual({
      drive: 1,
      controller: 1,
      rules: [...Array(9).keys()],
      contacts: [...Array(12).keys()],
      inputs: [...Array(6).keys()],
    });
    expect(bands[0]!.drive).toBe(true);
    expect(bands.at(-1)!.controller).toBe(true);
  });

  it("keeps each band within the page, measured as the printed table is (9 px monospace, 4 px padding)", () => {
    const cols = columnsOf({ conditions: 7, contacts: 12, inputs: 6, rules: 9 });
    const pad = 8 / 5.4;
    // Row number, conditions: "released" is the longest state (8 characters).
    const key = 3 + pad + 7 * (8 + pad);
    for (const b of printBands(cols, 192)) {
      const width =
        key +
        (b.drive ? 7 + pad : 0) +
        b.rules.length * (Math.max(6, 11) + pad) +
        b.contacts.length * (8 + pad) +
        b.inputs.length * ("IN0 enable".length + pad) +
        (b.controller ? 5 * (9 + pad) : 0);
      expect(width).toBeLessThanOrEqual(PAGE_CHARS);
    }
  });

  it("still gives each band one column when the conditions alone fill the page", () => {
    const cols = columnsOf({ conditions: 16, contacts: 2, inputs: 1, rules: 2 });
    const bands = printBands(cols, 65_536);
    expect(bands).toHaveLength(1 + 2 + 2 + 1 + 1);
    expect(flatten(bands).contacts).toEqual([0, 1]);
  });

  it("names what each band holds", () => {
    const cols = columnsOf({ conditions: 3, contacts: 8, inputs: 3, rules: 8 });
    expect(describeBand({ drive: true, rules: [0, 1, 2, 3, 4, 5, 6, 7], contacts: [], inputs: [], controller: false }, cols)).toBe(
      "drive, rules",
    );
    expect(describeBand({ drive: false, rules: [], contacts: [4, 5, 6, 7], inputs: [0, 1, 2], controller: false }, cols)).toBe(
      "contacts 5–8, inputs",
    );
    expect(describeBand({ drive: false, rules: [7], contacts: [], inputs: [], controller: true }, cols)).toBe("rules 8, controller view");
  });
});
