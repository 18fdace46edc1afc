// The truth table of a 98,304-row revision as a reviewer moves through it in Chromium: "Jump to row"
// brings the row into view, the page label gives the printed row numbers, the frozen row number
// hides what scrolls under it, and the drive and the row's rules stay on screen while the table
// scrolls sideways. Headings give the label a person knows first, the id second.
import { test, expect, signIn, APP_ORIGIN } from "../support/e2e";
import { accessoryHauler } from "../support/accessory-hauler";

const SHOTS = ".data/test-results/screens";

test("a reviewer jumps to a row, reads its number, and keeps the drive and rules in view while scrolling sideways", async ({
  page,
  browser,
}) => {
  test.setTimeout(180_000);
  const design = accessoryHauler();
  await signIn(page, "engineer");
  const headers = { origin: APP_ORIGIN };
  const made = await page.request.post("/api/v1/designs?workspace=larkspur", {
    data: { name: `Table reading ${Date.now()}`, start: "blank" },
    headers,
  });
  expect(made.status()).toBe(201);
  const designId = (await made.json()).design.id as string;
  const saved = await page.request.post(`/api/v1/designs/${designId}/revisions`, {
    data: { document: design, baseRevision: 0, message: "for the table" },
    headers,
  });
  expect(saved.status()).toBe(201);

  // A laptop-sized window: the table is far wider than its box.
  const context = await browser.newContext({
    extraHTTPHeaders: { "x-forwarded-for": "198.19.201.13" },
    viewport: { width: 1100, height: 800 },
  });
  const reviewer = await context.newPage();
  await signIn(reviewer, "reviewer");
  await reviewer.goto(`/w/larkspur/designs/${designId}/revisions/1/table`);
  const table = reviewer.getByTestId("truth-table");
  await expect(table).toBeVisible();
  await expect(reviewer.getByTestId("page-label")).toHaveText("Rows 0–99 of 98,304");

  // Headings: the label first, the id second.
  const bed = table.locator('th[data-col="bed"]');
  await expect(bed.locator("span").first()).toHaveText("Cargo bed");
  await expect(bed.locator("span").nth(1)).toHaveText("bed");

  // Jump to a row far down: it is on screen, opened, and the label names rows by their numbers.
  await reviewer.getByRole("textbox", { name: "Jump to row" }).fill("50123");
  await reviewer.getByRole("form", { name: "Jump to row" }).getByRole("button", { name: "Go" }).click();
  await expect(reviewer.getByTestId("page-label")).toHaveText("Rows 50,100–50,199 of 98,304", { timeout: 30_000 });
  const target = table.locator('tr[data-row="50123"]');
  await expect(target).toBeInViewport();
  await expect(reviewer.getByTestId("row-drawer")).toContainText("Row 50123");
  await reviewer.screenshot({ path: `${SHOTS}/table-jump.png` });
  await reviewer.getByTestId("row-drawer").getByRole("button", { name: "Close" }).click();

  // Sideways: scroll halfway across; what is drawn at the frozen cells' centres is those cells.
  const scroller = reviewer.getByTestId("table-scroller");
  const widths = await scroller.evaluate((el) => ({ scroll: el.scrollWidth, client: el.clientWidth }));
  expect(widths.scroll).toBeGreaterThan(widths.client * 1.3);
  const onTop = (selector: string) =>
    reviewer.evaluate((sel) => {
      const box = document.querySelector('[data-testid="table-scroller"]')!.getBoundingClientRect();
      const cell = document.querySelector<HTMLElement>(sel)!;
      const r = cell.getBoundingClientRect();
      const x = r.left + r.width / 2;
      const y = r.top + r.height / 2;
      const hit = document.elementFromPoint(x, y);
      const bg = getComputedStyle(cell).backgroundColor;
      const alpha = bg.startsWith("rgba") ? Number(bg.slice(5, -1).split(",")[3]) : bg.startsWith("rgb(") ? 1 : 0;
      return { inBox: r.left >= box.left - 1 && r.right <= box.right + 1, hitsItself: hit !== null && cell.contains(hit), alpha };
    }, selector);
  for (const at of [0.5, 0]) {
    await scroller.evaluate((el, f) => (el.scrollLeft = (el.scrollWidth - el.clientWidth) * f), at);
    for (const sel of [
      'tr[data-row="50123"] th',
      "thead th:first-child",
      'th[data-col="drive"]',
      'th[data-col="rules-summary"]',
      'tr[data-row="50123"] [data-testid="rules-summary"]',
    ]) {
      const seen = await onTop(sel);
      expect(seen, `${sel} at ${at}`).toEqual({ inBox: true, hitsItself: true, alpha: 1 });
    }
  }
  await scroller.evaluate((el) => (el.scrollLeft = (el.scrollWidth - el.clientWidth) * 0.5));
  await reviewer.screenshot({ path: `${SHOTS}/table-sideways.png` });
  await context.close();
});
