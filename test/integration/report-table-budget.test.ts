// The report prints the full truth table only when it fits its page budget (24 pages), and decides
// from an estimate (each band starts a page; rows per page by paper size; app/reviews/print-bands.ts).
// Checked here on the PDF Chromium prints, read back with poppler's pdfinfo and pdftotext (not code of
// ours): a revision whose A4 estimate is just within the budget prints every row of its table on no more
// pages than the report states; on US Letter the same revision is just over, and the report prints the
// groups summary and the CSV's absolute URL instead. (A Letter table estimated at 24 pages, 864 rows,
// printed on 22 when measured for decision 168; not rendered here, to keep this test under a minute.)
import { execFileSync } from "node:child_process";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { DEMO, signIn, type Client } from "../support/http";
import { csvApiPath } from "../../app/reviews/paths";
import { fiveParts } from "../support/five-parts";

const WS = "larkspur";
let engineer: Client;
let dir: string;

/** The five-part design with load conditions of the given numbers of states: 8 × their product rows. */
function design(loads: number[]) {
  const base = fiveParts();
  return {
    ...base,
    name: `Table of ${rowsOf(loads)} rows`,
    conditions: [
      ...base.conditions,
      ...loads.map((n, c) => ({ id: `load${c + 1}`, label: `Load ${c + 1}`, states: Array.from({ length: n }, (_, i) => `w${i + 1}`) })),
    ],
  };
}

const rowsOf = (loads: number[]) => loads.reduce((a, b) => a * b, 8);

async function revisionOf(loads: number[]): Promise<string> {
  const made = await engineer.fetch(`/api/v1/designs?workspace=${WS}`, {
    method: "POST",
    body: JSON.stringify({ name: `Table budget ${loads} ${Date.now()}`, start: "blank" }),
    headers: { "content-type": "application/json" },
  });
  expect(made.status).toBe(201);
  const id = ((await made.json()) as { design: { id: string } }).design.id;
  const saved = await engineer.fetch(`/api/v1/designs/${id}/revisions`, {
    method: "POST",
    body: JSON.stringify({ document: design(loads), baseRevision: 0, message: `${rowsOf(loads)} rows` }),
    headers: { "content-type": "application/json" },
  });
  expect(saved.status, await saved.clone().text()).toBe(201);
  return id;
}

/** The PDF's pages as poppler reads them: count, size in points, and each page's text (pdftotext -layout). */
async function pdf(path: string, name: string) {
  const res = await engineer.fetch(path);
  expect(res.status).toBe(200);
  const file = join(dir, `${name}.pdf`);
  writeFileSync(file, Buffer.from(await res.arrayBuffer()));
  const info = execFileSync("pdfinfo", [file], { encoding: "utf8" });
  const text = execFileSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8", maxBuffer: 64 * 1024 * 1024 });
  return {
    pages: Number(/^Pages:\s+(\d+)/m.exec(info)![1]),
    size: /^Page size:\s+([\d.]+ x [\d.]+) pts/m.exec(info)![1],
    // pdftotext ends every page with a form feed.
    pageTexts: text.split("\f").slice(0, -1),
  };
}

/** Pages carrying rows of the table, and the row numbers printed: a row line is the number, then the states of key, seat, grip and the first load. */
function tableRows(pageTexts: string[]) {
  const pages: number[] = [];
  const rows: number[] = [];
  pageTexts.forEach((t, i) => {
    const found = [...t.matchAll(/^\s*(\d+)\s+(off|on)\s+(empty|occupied)\s+(closed|open)\s+w\d\b/gm)].map((m) => Number(m[1]));
    if (found.length > 0) pages.push(i + 1);
    rows.push(...found);
  });
  return { pages, rows };
}

beforeAll(async () => {
  engineer = await signIn(DEMO.engineer);
  dir = mkdtempSync(join(tmpdir(), "chainproof-table-budget-"));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** The report's page budget for the full table, and what it says it takes (the report's own claim, checked against paper). */
const BUDGET = 24;

/** What the printed report says of its table: the pages it says the table takes, or, not printed, the pages it would. */
function reportSays(text: string) {
  const t = text.replace(/\s+/g, " ");
  const printed = /on at most (\d+) (A4|Letter) pages/.exec(t);
  return {
    printed: printed ? Number(printed[1]) : null,
    notPrinted: /The full table is not printed: it would take about (\d+)/.exec(t)?.[1],
  };
}

describe("the printed table's page budget, on paper", () => {
  // 896 rows (8 × 8 × 7 × 2) print in two bands (the conditions with the drive and the rule, then the
  // contacts, inputs and controller), each starting a page. Estimated on A4: 12 + 12 = 24 pages, just within
  // the budget; on Letter: 13 + 13 = 26, just over. One revision, two papers: the estimate is the paper's.
  it("a table estimated just within the budget prints every row within the stated pages; just over, the summary and the CSV's URL", async () => {
    const id = await revisionOf([8, 7, 2]);
    const rows = 896;
    const a4 = await pdf(`/w/${WS}/designs/${id}/revisions/1/report.pdf?size=a4`, "a4");
    // A4 is 210 × 297 mm (ISO 216): 595.28 × 841.89 pt at 72 pt to the inch.
    const [w, h] = a4.size.split(" x ").map(Number) as [number, number];
    expect(Math.abs(w - (210 * 72) / 25.4)).toBeLessThan(1);
    expect(Math.abs(h - (297 * 72) / 25.4)).toBeLessThan(1);
    const says = reportSays(a4.pageTexts.join("\n"));
    expect(says.printed).toBe(BUDGET);
    const t = tableRows(a4.pageTexts);
    // Every row, once in each of the two bands, on consecutive pages, and no more pages than the report says.
    const counts = new Map<number, number>();
    for (const r of t.rows) counts.set(r, (counts.get(r) ?? 0) + 1);
    expect(counts.size).toBe(rows);
    for (let r = 0; r < rows; r++) expect(counts.get(r), `row ${r}`).toBe(2);
    expect(t.pages.at(-1)! - t.pages[0]! + 1).toBe(t.pages.length);
    expect(t.pages.length).toBeLessThanOrEqual(says.printed!);

    // On Letter (8.5 × 11 in: 612 × 792 pt) the same table is over the budget: the groups summary and the CSV's absolute URL instead.
    const letter = await pdf(`/w/${WS}/designs/${id}/revisions/1/report.pdf?size=letter`, "letter");
    expect(letter.size).toBe("612 x 792");
    const over = reportSays(letter.pageTexts.join("\n"));
    expect(over.printed).toBeNull();
    expect(over.notPrinted).toBe("26");
    expect(tableRows(letter.pageTexts).rows).toEqual([]);
    const text = letter.pageTexts.join("\n");
    expect(text).toContain("What the table says, in groups");
    // pdftotext may break the long URL across lines: compare without whitespace. Absolute: scheme and host.
    expect(text.replace(/\s+/g, "")).toMatch(new RegExp(`https?://[^/]+${csvApiPath(id, 1).replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}`));
  }, 120_000);
});
