// The printed report's truth table, laid out by Chromium as it prints: every column of the screen's
// table is on paper (in bands that repeat the row number and conditions), and no band is wider than
// A4's printable width, so nothing is cut off at the page's edge.
import { test, expect, signIn } from "../support/e2e";

// A4 (210 mm) less the report's 12 mm margins, at 96 CSS px per inch.
const PRINTABLE_PX = Math.floor(((210 - 24) / 25.4) * 96);

test("the printed truth table keeps every column within the page", async ({ page }) => {
  await signIn(page, "reviewer");
  const designs = (await (await page.request.get("/api/v1/designs?workspace=larkspur")).json()) as {
    designs: Array<{ id: string; name: string; latestRevision: { number: number } | null }>;
  };
  const released = designs.designs.find((d) => d.name.startsWith("Haybarn") && d.latestRevision)!;
  const base = `/w/larkspur/designs/${released.id}/revisions/${released.latestRevision!.number}`;

  // Columns by their ids (the screen heads them with labels first, paper with ids alone); the
  // screen's pinned "rules in this row" column repeats the rule columns and is not printed.
  const headings = () =>
    page.$$eval("table[data-testid=truth-table] thead", (heads) =>
      heads.map((h) =>
        [...h.querySelectorAll("th[data-col]")].map((th) => th.getAttribute("data-col")!).filter((t) => t !== "rules-summary"),
      ),
    );

  // The screen's table: all columns in one.
  await page.goto(`${base}/table`);
  await expect(page.getByTestId("truth-table")).toBeVisible();
  const onScreen = new Set((await headings()).flat());
  expect(onScreen.size).toBeGreaterThan(20);

  // The report, laid out for paper at the printable width.
  await page.setViewportSize({ width: PRINTABLE_PX, height: 1000 });
  await page.emulateMedia({ media: "print" });
  await page.goto(`${base}/report`);
  const bands = page.getByTestId("truth-table");
  expect(await bands.count()).toBeGreaterThan(1);
  const widths = await bands.evaluateAll((tables) => tables.map((t) => Math.ceil(t.getBoundingClientRect().width)));
  for (const w of widths) expect(w).toBeLessThanOrEqual(PRINTABLE_PX);
  const onPaper = new Set((await headings()).flat());
  const missing = [...onScreen].filter((h) => !onPaper.has(h));
  expect(missing).toEqual([]);
  await expect(page.getByText(/The table is printed in \d+ parts/)).toBeVisible();
});
