// @vitest-environment jsdom
// The truth table as a reviewer reads it: headings name each column by its label with the id under
// it (ids alone on paper, where the band widths are counted in ids), the drive and rule columns are
// pinned to the right edge on screen, rows have opaque backgrounds (the pinned cells inherit them),
// and a comment on a row lists its states in the table's order of conditions.
import { afterEach, describe, expect, it } from "vitest";
import { cleanup, render, screen, within } from "@testing-library/react";
import { MemoryRouter } from "react-router";
import { TruthTableGrid } from "../../../app/components/truth-table/grid";
import { CommentsView, rowStatesText } from "../../../app/components/review/comments";
import type { TableColumns, TableRow } from "../../../app/reviews/truth-table";

afterEach(cleanup);

const columns: TableColumns = {
  conditions: [
    { id: "seat", label: "Operator seat", states: ["empty", "occupied"] },
    { id: "stand", label: "Side stand", states: ["up", "down"] },
    { id: "charge", label: "Charge port", states: ["closed", "open"] },
  ],
  contacts: [{ id: "S1", label: "Seat switch", condition: "seat" }],
  inputs: [{ id: "KSI", label: "Key switch input", fn: "ksi" }],
  rules: [
    { id: "R1", label: "No drive while charging", type: "inhibit" },
    { id: "R2", label: "No drive with the stand down", type: "inhibit" },
  ],
};
const row = (index: number, states: string[], drive: boolean): TableRow =>
  ({
    index,
    states,
    contacts: [states[0] === "occupied"],
    inputs: [drive],
    powered: true,
    enabled: drive,
    direction: "neutral",
    braking: false,
    throttle: "released",
    drive,
    rules: ["-", "-"],
  }) as unknown as TableRow;
const rows = [row(0, ["empty", "up", "closed"], false), row(1, ["occupied", "up", "closed"], true)];

describe("truth-table grid", () => {
  it("heads each column with its label first and its id second on screen", () => {
    render(<TruthTableGrid columns={columns} rows={rows} />);
    const head = screen.getByTestId("truth-table").querySelector("thead")!;
    for (const [id, label] of [
      ["seat", "Operator seat"],
      ["stand", "Side stand"],
      ["S1", "Seat switch"],
      ["KSI", "Key switch input"],
      ["R1", "No drive while charging"],
    ]) {
      const th = head.querySelector(`th[data-col="${id}"]`)!;
      const parts = [...th.querySelectorAll("span")].map((s) => s.textContent);
      expect(parts[0]).toBe(label);
      expect(parts[1]).toContain(id);
      expect(th.textContent!.indexOf(label)).toBeLessThan(th.textContent!.indexOf(id === "S1" ? "S1" : id));
    }
  });

  it("keeps the ids alone on paper, as the printed bands are counted", () => {
    render(<TruthTableGrid columns={columns} rows={rows} dense sticky={false} />);
    const th = screen.getByTestId("truth-table").querySelector('th[data-col="seat"]')!;
    expect(th.textContent).toBe("seat");
  });

  it("pins the drive and every rule to the right edge, offset by the columns to their right", () => {
    render(<TruthTableGrid columns={columns} rows={rows} />);
    const table = screen.getByTestId("truth-table");
    const drive = table.querySelector<HTMLElement>('th[data-col="drive"]')!;
    const r1 = table.querySelector<HTMLElement>('th[data-col="R1"]')!;
    const r2 = table.querySelector<HTMLElement>('th[data-col="R2"]')!;
    expect(drive.className).toContain("md:sticky");
    expect(r2.style.right).toBe("0rem");
    expect(r1.style.right).toBe("7rem");
    expect(drive.style.right).toBe("14rem");
    // Each body row pins the same cells at the same offsets.
    const cells = [...table.querySelectorAll("tbody tr")[1]!.querySelectorAll<HTMLElement>("td")].slice(-3);
    expect(cells.map((c) => c.style.right)).toEqual(["14rem", "7rem", "0rem"]);
    for (const c of cells) expect(c.className).toContain("bg-inherit");
  });

  it("past four rules pins the drive and a column naming the row's rules, and lets the rule columns scroll", () => {
    const many: TableColumns = {
      ...columns,
      rules: ["R1", "R2", "R3", "R4", "R5"].map((id) => ({
        id,
        label: `Rule ${id}`,
        type: id === "R4" ? ("require-drive" as const) : ("inhibit" as const),
      })),
    };
    const cells = (drive: boolean, rs: string[]) => ({ ...row(0, ["empty", "up", "closed"], drive), rules: rs }) as unknown as TableRow;
    const rs = [
      { ...cells(true, ["-", "violating", "-", "demand", "violating"]), index: 0 },
      { ...cells(false, ["-", "-", "unsafe", "failing", "-"]), index: 1 },
      { ...cells(false, ["unsafe", "-", "-", "demand", "-"]), index: 2 },
      { ...cells(false, ["-", "-", "-", "-", "-"]), index: 3 },
    ];
    render(<TruthTableGrid columns={many} rows={rs} />);
    const table = screen.getByTestId("truth-table");
    expect(table.querySelector<HTMLElement>('th[data-col="rules-summary"]')!.style.right).toBe("0px");
    expect(table.querySelector<HTMLElement>('th[data-col="drive"]')!.style.right).toBe("10rem");
    expect(table.querySelector<HTMLElement>('th[data-col="R5"]')!.className).not.toContain("sticky");
    expect(screen.getAllByTestId("rules-summary").map((c) => c.textContent)).toEqual([
      "✕ breaks R2, R5",
      "✕ breaks R4",
      "▲ unsafe for R1▷ must drive for R4",
      "none applies",
    ]);
  });

  it("gives rows only opaque backgrounds, so the pinned cells hide what scrolls under them", () => {
    render(<TruthTableGrid columns={columns} rows={rows} selected={1} onSelect={() => {}} />);
    for (const tr of screen.getByTestId("truth-table").querySelectorAll("tbody tr")) {
      // Tailwind's "/NN" suffix is a see-through colour.
      for (const cls of tr.className.split(/\s+/)) if (/(^|:)bg-/.test(cls)) expect(cls).not.toMatch(/\/\d+$/);
    }
    const rowHeader = screen.getByRole("button", { name: /Row 1:/ }).closest("th")!;
    expect(rowHeader.className).toContain("sticky");
    expect(rowHeader.className).toContain("bg-inherit");
  });
});

describe("row comments", () => {
  it("lists a row's states in the table's order, whatever order the database kept them in", () => {
    // PostgreSQL's jsonb keeps keys shortest first: {"seat","stand","charge"} comes back as below.
    const stored = { seat: "occupied", stand: "up", charge: "open" };
    const reordered = { seat: stored.seat, stand: stored.stand, charge: stored.charge };
    const fromDb = JSON.parse(JSON.stringify({ seat: "occupied", charge: "open", stand: "up" })) as Record<string, string>;
    expect(rowStatesText(fromDb, ["seat", "stand", "charge"])).toBe("seat=occupied, stand=up, charge=open");
    expect(rowStatesText(reordered, ["charge", "seat", "stand"])).toBe("charge=open, seat=occupied, stand=up");
    // A condition the revision does not have stays visible, last.
    expect(rowStatesText({ gone: "x", seat: "empty" }, ["seat"])).toBe("seat=empty, gone=x");
    render(
      <MemoryRouter>
        <CommentsView
          comments={[
            {
              id: "c1",
              authorName: "Rhea",
              anchor: "row",
              rowIndex: 5,
              rowStates: fromDb,
              componentId: null,
              body: "Check this one",
              createdAt: "2026-01-02T03:04:05Z",
            },
          ]}
          slug="ws"
          designId="d1"
          number={3}
          labels={{}}
          conditionOrder={["seat", "stand", "charge"]}
        />
      </MemoryRouter>,
    );
    const comment = screen.getByTestId("comment");
    expect(within(comment).getByTestId("comment-row-states").textContent).toBe("(seat=occupied, stand=up, charge=open)");
    expect(within(comment).getByRole("link", { name: "row 5" }).getAttribute("href")).toContain("row=5");
  });
});
