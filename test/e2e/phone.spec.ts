// A technician's phone (390 × 844): the verdict follows the meter readings, the fixed bars stay under
// 90 px and never cover the result, text is at least 16 px, tap targets at least 44 px (common
// practice for touch targets; WCAG 2.2 SC 2.5.5 asks 44 CSS px at level AAA, from memory), and the
// wiring diagram fits the screen's width with labels at reading size.
import type { Locator, Page } from "@playwright/test";
import { expect, signIn, test } from "../support/e2e";

test.use({ viewport: { width: 390, height: 844 }, hasTouch: true });

async function openHauler(page: Page) {
  await page.goto("/w/larkspur/vehicles");
  await page.getByRole("link", { name: /Haybarn campus hauler #3/ }).click();
  await expect(page.getByRole("heading", { name: "Haybarn campus hauler #3" })).toBeVisible();
}

/** The lowest edge of anything fixed or sticky that is on screen at the top, in px. */
async function fixedBottom(page: Page): Promise<number> {
  return page.evaluate(() => {
    let bottom = 0;
    for (const el of document.querySelectorAll<HTMLElement>("body *")) {
      const pos = getComputedStyle(el).position;
      if (pos !== "fixed" && pos !== "sticky") continue;
      const r = el.getBoundingClientRect();
      if (r.height === 0 || r.bottom <= 0 || r.top > 10) continue;
      bottom = Math.max(bottom, r.bottom);
    }
    return bottom;
  });
}

/** Font sizes (px) of every visible element inside `root` that holds text of its own. */
async function smallestText(root: Locator): Promise<{ size: number; text: string }> {
  return root.evaluate((el) => {
    let min = { size: Infinity, text: "" };
    for (const e of [el, ...el.querySelectorAll<HTMLElement>("*")]) {
      if (e.closest("svg")) continue;
      const own = [...e.childNodes].some((n) => n.nodeType === Node.TEXT_NODE && n.textContent!.trim() !== "");
      if (!own) continue;
      const r = e.getBoundingClientRect();
      const style = getComputedStyle(e);
      if (r.width === 0 || r.height === 0 || style.visibility === "hidden" || e.classList.contains("sr-only")) continue;
      const size = parseFloat(style.fontSize);
      if (size < min.size) min = { size, text: e.textContent!.trim().slice(0, 60) };
    }
    return min;
  });
}

async function height(l: Locator): Promise<number> {
  const box = await l.boundingBox();
  return box!.height;
}

test("why won't it drive on a phone: the verdict follows the readings, bars stay small, text and taps are large, the diagram fits", async ({
  page,
}) => {
  await signIn(page, "technician");
  await openHauler(page);
  await page.getByRole("link", { name: "Why won't it drive?" }).click();
  const condition = (id: string) => page.locator(`fieldset[data-condition="${id}"]`);
  for (const [id, state] of [
    ["key", "on"],
    ["park", "released"],
    ["seat", "occupied"],
    ["lever", "forward"],
    ["pedal", "down"],
  ] as const) {
    await condition(id).getByRole("button", { name: state, exact: true }).tap();
  }
  await page.getByRole("checkbox", { name: /Follow my taps in order/ }).uncheck();
  const verdict = page.getByTestId("verdict");
  await expect(verdict).toHaveAttribute("data-drive", "yes");
  await expect(verdict).toHaveText("Drive should run");

  // The meter says the enable line is dead where the design drives: the banner says fault, never "Drive should run".
  await page.getByRole("button", { name: "EN reads dead" }).tap();
  await expect(verdict).toHaveAttribute("data-drive", "fault");
  await expect(verdict).toContainText("Readings show a fault");
  await expect(verdict).not.toContainText("Drive should run");
  await expect(page.getByTestId("readings-verdict")).toHaveAttribute("data-kind", "faults");

  // Scrolled to the result, the bars above it stay under 90 px and do not cover its first line.
  const result = page.getByTestId("readings-verdict");
  await result.evaluate((e) => e.scrollIntoView({ block: "start" }));
  const barBottom = await fixedBottom(page);
  expect(barBottom).toBeGreaterThan(0);
  expect(barBottom).toBeLessThan(90);
  expect((await result.boundingBox())!.y).toBeGreaterThanOrEqual(barBottom);

  // Text of the checklist and the readings is 16 px or more.
  await condition("seat").getByRole("button", { name: "empty", exact: true }).tap();
  await page.getByRole("button", { name: "EN not measured" }).tap();
  for (const part of [
    page.getByTestId("blocker").first(),
    page.locator('fieldset[data-input="EN"]'),
    page.getByTestId("restore"),
    verdict,
  ]) {
    const min = await smallestText(part);
    expect(min.size, `"${min.text}"`).toBeGreaterThanOrEqual(16);
  }
  // Tap targets.
  expect(await height(page.getByRole("link", { name: /← Haybarn campus hauler #3/ }))).toBeGreaterThanOrEqual(44);
  expect(await height(page.getByTestId("restore").getByRole("button", { name: "Make this change" }).first())).toBeGreaterThanOrEqual(44);

  // The diagram fits the width, and its labels are drawn at 14 px or more on screen.
  const diagram = page.locator('[data-testid="wiring-diagram"]:visible');
  await expect(diagram).toHaveCount(1);
  await expect(diagram).toHaveAttribute("data-layout", "stacked");
  const box = (await diagram.boundingBox())!;
  expect(box.x).toBeGreaterThanOrEqual(0);
  expect(box.x + box.width).toBeLessThanOrEqual(390);
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
  const smallestLabel = await diagram.evaluate((svg) => {
    const scale = (svg as SVGSVGElement).getBoundingClientRect().width / (svg as SVGSVGElement).viewBox.baseVal.width;
    return Math.min(...[...svg.querySelectorAll("text")].map((t) => parseFloat(t.getAttribute("font-size") ?? "16") * scale));
  });
  expect(smallestLabel).toBeGreaterThanOrEqual(14);
  await expect(diagram.locator('[data-contact="SEAT"]')).toHaveAttribute("data-ring", "check");
});

test("a bench run on a phone: a small status bar, large text and taps", async ({ page }) => {
  await signIn(page, "technician");
  await openHauler(page);
  await page.getByRole("button", { name: "Start a bench test" }).tap();
  await expect(page).toHaveURL(/\/bench-tests\/[0-9a-f-]{36}$/);
  const step = (n: number) => page.locator(`article[data-step="${n}"]`);
  await step(1).getByRole("button", { name: "Fail" }).tap();
  await expect(step(1).getByTestId("failure-mail")).toHaveAttribute("data-mailed", "no");

  await step(3).evaluate((e) => e.scrollIntoView({ block: "start" }));
  const barBottom = await fixedBottom(page);
  expect(barBottom).toBeLessThan(90);
  expect((await step(3).boundingBox())!.y).toBeGreaterThanOrEqual(barBottom);

  for (const n of [1, 2]) {
    const min = await smallestText(step(n));
    expect(min.size, `step ${n}: "${min.text}"`).toBeGreaterThanOrEqual(16);
  }
  expect(await height(step(1).getByRole("button", { name: "Save note" }))).toBeGreaterThanOrEqual(44);
  expect(await height(step(1).getByRole("button", { name: "Send to the engineer now" }))).toBeGreaterThanOrEqual(44);
  expect(await height(step(1).getByText("Every condition in this step"))).toBeGreaterThanOrEqual(44);
  for (const name of ["All bench tests", "Haybarn campus hauler #3"]) {
    expect(await height(page.getByTestId("breadcrumbs").getByRole("link", { name }))).toBeGreaterThanOrEqual(44);
  }
  expect(await height(page.getByRole("link", { name: "Download the results (CSV)" }))).toBeGreaterThanOrEqual(44);
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
});
