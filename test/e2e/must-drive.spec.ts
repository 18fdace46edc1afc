// "Must drive when …" end to end: an engineer adds a require-drive rule through the rule picker to a
// copy of the Haybarn hauler, sees it shown at the rule while it matches no row, then failing with a
// row where the hauler does not drive, completes it until it holds, and saves the revision. With
// CHAINPROOF_SCREENSHOTS=1 it also writes docs/screenshots/editor-must-drive-failing.png and
// editor-must-drive-rule.png (the completed rule in the Rules panel).
import type { Locator, Page } from "@playwright/test";
import { APP_ORIGIN, expect, signIn, test } from "../support/e2e";

const WS = "larkspur";
const SHOTS = process.env.CHAINPROOF_SCREENSHOTS === "1";
test.use({ viewport: { width: 1440, height: 900 } });

const status = (page: Page) => page.getByTestId("proof-status");

/** Picks one test of the rule's "all of these hold": its condition, then its states. */
async function setTest(card: Locator, path: string, cond: string, states: string[]) {
  const test_ = card.locator(`[data-path="${path}"]`);
  await test_.getByLabel("Condition", { exact: true }).selectOption(cond);
  for (const s of states) await test_.getByRole("button", { name: s, exact: true }).click();
}

test("an engineer adds a 'Must drive when' rule through the picker, sees it fail, completes it until it holds, and saves", async ({
  page,
}) => {
  test.setTimeout(150_000);
  await signIn(page, "engineer");
  const made = await page.request.post(`/api/v1/designs?workspace=${WS}`, {
    data: { name: `Haybarn must-drive ${Date.now()}`, start: "haybarn" },
    headers: { origin: APP_ORIGIN },
  });
  expect(made.status()).toBe(201);
  const id = ((await made.json()) as { design: { id: string } }).design.id;
  await page.goto(`/w/${WS}/designs/${id}/edit`);
  await expect(status(page)).toContainText("Proven", { timeout: 30_000 });

  await page.getByRole("tab", { name: "Rules" }).click();
  await page.getByRole("button", { name: "+ Must drive when …" }).click();
  const card = page.getByTestId("rule-D1");
  await expect(card).toBeVisible();
  // No state picked yet: the rule demands drive in no row, and the problem is shown at the rule.
  await expect(card.getByRole("alert")).toContainText("holds in no row");
  await expect(status(page)).toContainText("1 problem to fix");

  // "Must drive whenever the key is on" is too much: the hauler does not drive seated-off, parked, in neutral...
  await card.getByLabel("Label").fill("Drives when keyed, seated, unplugged, released, in gear, pedal down");
  await card.getByLabel("Label").press("Enter");
  await card.getByRole("button", { name: "on", exact: true }).click();
  await expect(card.getByRole("alert")).toHaveCount(0);
  await expect(status(page)).toContainText("1 of 9 rules fail");
  await page.getByRole("tab", { name: "Problems" }).click();
  const failing = page.getByTestId("failing-D1");
  await expect(failing).toContainText("rows where it must drive have the drive off");
  await expect(failing).toContainText("key = on");
  if (SHOTS) await page.screenshot({ path: "docs/screenshots/editor-must-drive-failing.png" });
  // Its counterexample opens on the canvas: the vehicle must drive there and does not.
  await failing.getByRole("button", { name: "Show this row on the canvas" }).click();
  await expect(page.getByText(/says the vehicle must drive in this row, and the drive is off/)).toBeVisible();
  await expect(page.getByTestId("sim-drive")).toContainText("Drive OFF");
  await page.getByRole("button", { name: "Back to editing" }).click();

  // Complete it: all of key on, seat occupied, plug free, park released, lever forward or reverse, brake up, pedal down.
  await page.getByRole("tab", { name: "Rules" }).click();
  await card.getByLabel("Must drive when").selectOption("all");
  const more: Array<[string, string[]]> = [
    ["seat", ["occupied"]],
    ["plug", ["free"]],
    ["park", ["released"]],
    ["lever", ["forward", "reverse"]],
    ["brake", ["up"]],
    ["pedal", ["down"]],
  ];
  for (const [i, [cond, states]] of more.entries()) {
    await card.getByRole("button", { name: "+ Condition test" }).click();
    await setTest(card, `rules[8].when.all[${i + 1}]`, cond, states);
  }
  await expect(status(page)).toContainText("Proven: every rule holds");
  if (SHOTS) await page.screenshot({ path: "docs/screenshots/editor-must-drive-rule.png" });

  await page.getByLabel("Revision message").fill("Must drive when keyed, seated, unplugged, released, in gear, pedal down");
  await page.getByRole("button", { name: "Save revision" }).click();
  await expect(page.getByTestId("editor-banner")).toContainText("Revision 1 saved", { timeout: 30_000 });

  // The saved revision holds the rule as built, and the server's verdict says it holds.
  const rev = await page.request.get(`/api/v1/designs/${id}/revisions/1`, { headers: { origin: APP_ORIGIN } });
  const { revision } = (await rev.json()) as {
    revision: { document: { rules: Array<Record<string, unknown>> }; verdict: { ok: boolean; rules: Array<Record<string, unknown>> } };
  };
  expect(revision.document.rules.at(-1)).toMatchObject({
    id: "D1",
    type: "require-drive",
    when: {
      all: [
        { cond: "key", in: ["on"] },
        { cond: "seat", in: ["occupied"] },
        { cond: "plug", in: ["free"] },
        { cond: "park", in: ["released"] },
        { cond: "lever", in: ["forward", "reverse"] },
        { cond: "brake", in: ["up"] },
        { cond: "pedal", in: ["down"] },
      ],
    },
  });
  // 2 lever states of 3, the other six conditions fixed: 2 demand rows of 192, none failing.
  expect(revision.verdict.ok).toBe(true);
  expect(revision.verdict.rules.find((r) => r.id === "D1")).toMatchObject({ holds: true, demandRows: 2, failingRows: 0 });
});
