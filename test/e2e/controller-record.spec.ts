// A technician on a phone records a vehicle's controller settings that drop a lockout its released
// revision assumes; the vehicle is then marked "the proof does not hold for this controller's settings"
// on the vehicle list and the vehicle page, with the difference in words.
import { expect, signIn, test } from "../support/e2e";

test.use({ viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true });

const SHOTS = ".data/test-results/e2e-artifacts";

test("a technician on a phone records settings without the brake-release lockout and the vehicle is marked", async ({ page }) => {
  test.setTimeout(120_000);
  const name = `Phone cart ${Date.now()}`;

  // An engineer adds the vehicle and releases the approved Haybarn revision to it (which assumes the
  // power-on, enable-restore, direction-engage and brake-release lockouts).
  await signIn(page, "engineer");
  await page.goto("/w/larkspur/vehicles");
  await page.getByLabel("Name").fill(name);
  await page.getByRole("button", { name: "Add vehicle" }).click();
  await page.getByRole("link", { name: new RegExp(name) }).click();
  await expect(page.getByRole("heading", { name })).toBeVisible();
  await expect(page.getByTestId("controller-summary")).toContainText("Not recorded yet");
  const revision = page.getByLabel("Revision");
  const option = await revision
    .locator("option", { hasText: "Haybarn hauler #3, drive inhibit · revision 1 · approved" })
    .getAttribute("value");
  await revision.selectOption(option!);
  await page.getByRole("button", { name: "Release", exact: true }).click();
  await expect(page.getByTestId("current-release")).toContainText("Revision 1 of");
  await expect(page.getByTestId("proof-mark")).toHaveCount(0);

  // The technician, on a phone.
  await page.context().clearCookies();
  await signIn(page, "technician");
  await page.goto("/w/larkspur/vehicles");
  await page.getByRole("link", { name: new RegExp(name) }).click();
  await page.getByRole("link", { name: "Record the controller settings" }).click();
  await expect(page.getByRole("heading", { name: "Controller settings", level: 1 })).toBeVisible();
  await expect(page.getByTestId("record-caution")).toContainText("not what the controller holds");
  await expect(page.getByTestId("record-caution")).toContainText("controller maker's documentation and local practice");

  const fill = async (label: string, value: string) => page.getByLabel(label, { exact: label === "Controller" }).fill(value);
  await page.getByLabel("Cell chemistry").selectOption("lead-acid");
  await fill("Cells in series", "24");
  await fill("Capacity", "150");
  await fill("Continuous discharge rate", "1");
  await fill("Main fuse rating", "200");
  await fill("Controller", "48 V drive controller, 300 A, as read off its label");
  await fill("Rated current", "300");
  await fill("Lowest rated supply voltage", "36");
  await fill("Highest rated supply voltage", "63");
  await fill("Low-voltage cut-back", "43");
  await fill("Over-voltage cut-off", "61");
  await fill("Battery current limit", "40");
  await fill("Motor current limit", "100");
  await page.getByLabel("Throttle sensor").selectOption("hall");
  await fill("Reading at rest", "4.5"); // a slip: above the reading fully applied
  await fill("Reading fully applied", "4.2");
  await fill("Counts as released below", "1,0"); // a comma works as the decimal point
  await fill("Counts as applied from", "1.2");
  await fill("Wiring fault below", "0.5");
  await fill("Wiring fault above", "4.6");
  await page.getByLabel("Yes, braking cuts drive").check();
  for (const l of ["power-on", "enable-restore", "direction-engage"])
    await page.getByRole("checkbox", { name: new RegExp(`^${l} lockout:`, "i") }).check();
  await expect(page.getByRole("checkbox", { name: /^brake-release lockout:/i })).not.toBeChecked();
  await fill("Precharge resistor", "100");
  await fill("Controller input capacitance", "2200");
  await fill("Precharge time before the main contactor closes", "800");

  // The unit sits beside every number.
  const capacity = page.getByLabel("Capacity");
  const unitBox = await capacity.locator("xpath=following-sibling::span[1]").boundingBox();
  const fieldBox = await capacity.boundingBox();
  expect(await capacity.locator("xpath=following-sibling::span[1]").textContent()).toBe("Ah");
  expect(Math.abs(unitBox!.y - fieldBox!.y)).toBeLessThan(4);
  await page.screenshot({ path: `${SHOTS}/controller-form-phone.png`, fullPage: true });

  // The slip is named at its field and nothing is sent.
  await page.getByRole("button", { name: "Save the first version" }).click();
  const restError = page.locator("#cr-settings-throttle-restV-error");
  await expect(restError).toContainText("The reading at rest must be below the reading fully applied");
  await expect(page.getByLabel("Reading at rest")).toHaveAttribute("aria-invalid", "true");
  await restError.scrollIntoViewIfNeeded();
  await page.screenshot({ path: `${SHOTS}/controller-form-phone-error.png` });
  await fill("Reading at rest", "0.8");
  await page.getByRole("button", { name: "Save the first version" }).click();

  await expect(page.getByText("Saved as version 1.")).toBeVisible();
  const mark = page.getByTestId("proof-mark");
  await expect(mark).toContainText("The proof does not hold for this controller's settings");
  await expect(mark).toContainText("The proof assumes the brake-release lockout");
  await page.screenshot({ path: `${SHOTS}/controller-saved-phone.png` });

  // Marked on the vehicle list, with the difference in words.
  await page.goto("/w/larkspur/vehicles");
  const card = page.getByRole("link", { name: new RegExp(name) });
  await expect(card.getByTestId("proof-mark")).toContainText("The proof does not hold for this controller's settings");
  await expect(card.getByTestId("proof-mark")).toContainText("brake-release");
  await card.scrollIntoViewIfNeeded();
  await page.screenshot({ path: `${SHOTS}/controller-marked-list-phone.png` });

  // And on the vehicle page.
  await card.click();
  await expect(page.getByRole("heading", { name })).toBeVisible();
  await expect(page.getByTestId("proof-mark")).toContainText("The proof does not hold for this controller's settings");
  await expect(page.getByTestId("proof-mark")).toContainText("brake-release");
  await expect(page.getByTestId("controller-summary")).toContainText("Version 1");
  await page.screenshot({ path: `${SHOTS}/controller-marked-vehicle-phone.png` });
});
