// The bench-run page is live: a tap shows its result at once (before the save answers), a refused
// save rolls back with a message, and results recorded elsewhere appear when the tab regains focus.
import type { Page, Route } from "@playwright/test";
import { APP_ORIGIN, expect, signIn, test } from "../support/e2e";

test.use({ viewport: { width: 390, height: 844 }, hasTouch: true });

/** Starts a bench run on the demo hauler through the API and opens its page. */
async function openNewRun(page: Page): Promise<string> {
  const list = await page.request.get("/api/v1/vehicles?workspace=larkspur&limit=100");
  const { vehicles } = (await list.json()) as { vehicles: Array<{ id: string; name: string }> };
  const hauler = vehicles.find((v) => v.name === "Haybarn campus hauler #3")!;
  const started = await page.request.post(`/api/v1/vehicles/${hauler.id}/bench-runs`, { headers: { origin: APP_ORIGIN } });
  expect(started.status()).toBe(201);
  const { run } = (await started.json()) as { run: { id: string } };
  await page.goto(`/w/larkspur/bench-tests/${run.id}`);
  await expect(page.getByTestId("progress")).toContainText("0 of");
  return run.id;
}

const step = (page: Page, n: number) => page.locator(`article[data-step="${n}"]`);

test("a tap shows at once, while its save is still on the way, and counts in the progress", async ({ page }) => {
  await signIn(page, "technician");
  const runId = await openNewRun(page);
  // Hold the save until the page has shown the new state.
  let release!: () => void;
  const held = new Promise<void>((r) => (release = r));
  let seen!: () => void;
  const arrived = new Promise<void>((r) => (seen = r));
  await page.route(`**/api/v1/bench-runs/${runId}/steps/1`, async (route: Route) => {
    seen();
    await held;
    await route.continue();
  });
  await step(page, 1).getByRole("button", { name: "Pass" }).tap();
  await arrived;
  await expect(step(page, 1)).toHaveAttribute("data-outcome", "pass");
  await expect(step(page, 1).getByRole("button", { name: "Pass" })).toHaveAttribute("aria-pressed", "true");
  await expect(page.getByTestId("progress")).toContainText("1 of");
  await expect(step(page, 1).getByText("Saving…")).toBeVisible();
  release();
  await expect(step(page, 1).getByText("Saved")).toBeVisible();
  await page.unroute(`**/api/v1/bench-runs/${runId}/steps/1`);
  // It was saved through the API.
  const saved = await page.request.get(`/api/v1/bench-runs/${runId}`);
  const { run } = (await saved.json()) as { run: { steps: Array<{ n: number; status: string | null }> } };
  expect(run.steps.find((s) => s.n === 1)?.status).toBe("pass");
});

test("a refused save rolls the step back and says why", async ({ page }) => {
  await signIn(page, "technician");
  const runId = await openNewRun(page);
  await page.route(`**/api/v1/bench-runs/${runId}/steps/2`, (route: Route) =>
    route.fulfill({
      status: 409,
      contentType: "application/json",
      body: JSON.stringify({
        error: { code: "run_completed", message: "This run is completed and signed; its results can no longer change.", fields: [] },
      }),
    }),
  );
  await step(page, 2).getByRole("button", { name: "Skip" }).tap();
  await expect(step(page, 2).getByRole("alert")).toContainText("Not saved: This run is completed and signed");
  await expect(step(page, 2)).toHaveAttribute("data-outcome", "none");
  await expect(step(page, 2).getByRole("button", { name: "Skip" })).toHaveAttribute("aria-pressed", "false");
  await expect(page.getByTestId("progress")).toContainText("0 of");
});

test("results recorded elsewhere appear when the tab regains focus", async ({ page }) => {
  await signIn(page, "technician");
  const runId = await openNewRun(page);
  // Another technician's phone records step 3 through the API.
  const put = await page.request.put(`/api/v1/bench-runs/${runId}/steps/3`, { data: { status: "skip" }, headers: { origin: APP_ORIGIN } });
  expect(put.status()).toBe(200);
  await expect(step(page, 3)).toHaveAttribute("data-outcome", "none");
  await page.waitForLoadState("networkidle");
  const refetch = page.waitForRequest((r) => r.method() === "GET" && r.url().endsWith(`/api/v1/bench-runs/${runId}`));
  await page.evaluate(() => window.dispatchEvent(new Event("focus")));
  await refetch;
  await expect(step(page, 3)).toHaveAttribute("data-outcome", "skip");
  await expect(page.getByTestId("progress")).toContainText("1 of");
});
