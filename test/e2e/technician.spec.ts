// A technician on a phone: why the hauler won't drive (seat empty), a live enable reading that
// points at a stuck seat switch, and a generated bench test with a failed step and a photo whose
// mail reaches the design's engineer. The demo seed releases the approved hauler revision.
import { expect, signIn, test } from "../support/e2e";

// A 1×1 PNG (PNG signature per ISO/IEC 15948:2004, 5.2).
const PNG = Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAQAAAC1HAwCAAAAC0lEQVR42mNkYAAAAAYAAjCB0C8AAAAASUVORK5CYII=", "base64");

test.use({ viewport: { width: 390, height: 844 }, hasTouch: true });

async function openHauler(page: import("@playwright/test").Page) {
  await page.goto("/w/larkspur/vehicles");
  await page.getByRole("link", { name: /Haybarn campus hauler #3/ }).click();
  await expect(page.getByRole("heading", { name: "Haybarn campus hauler #3" })).toBeVisible();
}

test("the seat contact is named when the seat is empty, and a live enable points at it stuck closed", async ({ page }) => {
  await signIn(page, "technician");
  await openHauler(page);
  await page.getByRole("link", { name: "Why won't it drive?" }).click();
  await expect(page.getByRole("heading", { name: "Why won't it drive?" })).toBeVisible();
  await expect(page.getByRole("complementary", { name: "Safety caution" })).toBeVisible();

  const condition = (id: string) => page.locator(`fieldset[data-condition="${id}"]`);
  await condition("key").getByRole("button", { name: "on", exact: true }).tap();
  await condition("park").getByRole("button", { name: "released", exact: true }).tap();
  await condition("seat").getByRole("button", { name: "empty", exact: true }).tap();
  await condition("pedal").getByRole("button", { name: "down", exact: true }).tap();

  // Large touch targets on a phone.
  const box = await condition("seat").getByRole("button", { name: "occupied", exact: true }).boundingBox();
  expect(box!.height).toBeGreaterThanOrEqual(44);

  const verdict = page.getByTestId("verdict");
  await expect(verdict).toHaveAttribute("data-drive", "no");
  await expect(verdict).toContainText("Drive should not run");
  const blocker = page.getByTestId("blocker").first();
  await expect(blocker).toHaveAttribute("data-code", "not-enabled");
  const seat = blocker.locator('[data-testid="contact-check"][data-contact="SEAT"]');
  await expect(seat).toContainText("Seat switch");
  await expect(seat).toContainText("closes when Driver seat is occupied");
  await expect(seat).toContainText("SEAT.1");
  await expect(page.locator('[data-testid="wiring-diagram"][data-layout="stacked"] [data-contact="SEAT"]')).toHaveAttribute(
    "data-ring",
    "check",
  );
  // The advice is a change of conditions the technician can make, not a set of contacts.
  await expect(page.getByTestId("restore")).toContainText("Set Driver seat from empty to occupied.");

  // Measured mode: the enable input reads live although the seat is empty.
  await page.getByRole("button", { name: "EN reads live" }).tap();
  await expect(page.getByTestId("readings-verdict")).toHaveAttribute("data-kind", "faults");
  const first = page.getByTestId("suspect").first();
  await expect(first).toHaveAttribute("data-contact", "SEAT");
  await expect(first).toHaveAttribute("data-mode", "stuck-closed");
  await expect(first).toContainText("stuck closed");

  // Sitting down with the pedal held: the enable-return lockout holds the drive off until the pedal
  // goes back to rest and is pressed again.
  await condition("seat").getByRole("button", { name: "occupied", exact: true }).tap();
  await expect(verdict).toHaveAttribute("data-drive", "no");
  await expect(page.getByTestId("blocker").first()).toHaveAttribute("data-code", "lockout-latched");
  await expect(page.getByTestId("blocker").first()).toContainText("Return Accelerator pedal to up");
  await expect(page.getByTestId("blocker").first()).toContainText("enable-restore lockout");
  const restore = page.getByTestId("restore");
  await expect(restore).toContainText("return Accelerator pedal to rest and apply it again");
  await restore.getByRole("button", { name: "Make this change" }).tap();
  await expect(verdict).toHaveAttribute("data-drive", "yes");
  await expect(condition("pedal").getByRole("button", { name: "down", exact: true })).toHaveAttribute("aria-pressed", "true");
});

test("a generated bench test with a failed step and a photo; progress survives a reload; the engineer is mailed", async ({ page }) => {
  await signIn(page, "technician");
  await openHauler(page);
  await page.getByRole("button", { name: "Start a bench test" }).tap();
  await expect(page).toHaveURL(/\/w\/larkspur\/bench-tests\/[0-9a-f-]{36}$/);
  const runId = page.url().split("/bench-tests/")[1];
  await expect(page.getByRole("complementary", { name: "Safety caution" })).toBeVisible();

  const step = (n: number) => page.locator(`article[data-step="${n}"]`);
  await step(1).getByRole("button", { name: "Pass" }).tap();
  await expect(step(1)).toHaveAttribute("data-outcome", "pass");
  await expect(step(1).getByText("Saved")).toBeVisible();
  await step(2).getByRole("button", { name: "Fail" }).tap();
  await expect(step(2)).toHaveAttribute("data-outcome", "fail");
  await expect(step(2).getByText("Saved")).toBeVisible();
  await step(2).getByLabel("Note").fill("Drive ran with the key off");
  await step(2).getByRole("button", { name: "Save note" }).tap();
  await expect(step(2).getByRole("button", { name: "Save note" })).toBeDisabled();
  await step(2).getByLabel("Photo for step 2").setInputFiles({ name: "key-switch.png", mimeType: "image/png", buffer: PNG });
  await expect(step(2).getByRole("img", { name: "key-switch.png" })).toBeVisible();

  // Nothing is lost on a reload (a phone that slept).
  await page.reload();
  await expect(step(1)).toHaveAttribute("data-outcome", "pass");
  await expect(step(1).getByRole("button", { name: "Pass" })).toHaveAttribute("aria-pressed", "true");
  await expect(step(2)).toHaveAttribute("data-outcome", "fail");
  await expect(step(2).getByLabel("Note")).toHaveValue("Drive ran with the key off");
  await expect(step(2).getByRole("img", { name: "key-switch.png" })).toBeVisible();
  await expect(page.getByTestId("progress")).toContainText("1 failed");
  // The mail waits for the note and photo: it goes when the technician moves on.
  await expect(step(2).getByTestId("failure-mail")).toHaveAttribute("data-mailed", "no");
  await step(3).getByRole("button", { name: "Pass" }).tap();
  await expect(step(2).getByTestId("failure-mail")).toHaveAttribute("data-mailed", "yes");

  // The vehicle needs attention now.
  await page.goto("/w/larkspur/vehicles");
  await openHauler(page);
  await expect(page.getByTestId("needs-attention")).toBeVisible();

  // The design's engineer got a mail with a link to this run.
  await page.goto("/outbox");
  const mail = page.getByTestId("mail").filter({ hasText: `/w/larkspur/bench-tests/${runId}#step-2` });
  await expect(mail).toHaveCount(1);
  await expect(mail).toContainText("engineer@example.com");
  await expect(mail).toContainText("Bench step 2 failed on Haybarn campus hauler #3");
  await expect(mail).toContainText("Drive ran with the key off");
  await expect(mail).toContainText("key-switch.png");
  await expect(mail).toContainText("Isolate the traction pack first");
});
