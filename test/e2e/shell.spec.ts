// Each demo role signs in and sees the app shell; a new user signs up, verifies by mail and signs in.
import { DEMO, expect, signIn, test, type DemoRole } from "../support/e2e";

const ROLE_LABEL: Record<DemoRole, string> = { admin: "Admin", engineer: "Engineer", technician: "Technician", reviewer: "Reviewer" };

for (const role of Object.keys(DEMO) as DemoRole[]) {
  test(`${role} signs in and sees the shell`, async ({ page }) => {
    await signIn(page, role);
    await expect(page).toHaveURL(/\/w\/larkspur$/);
    const nav = page.getByRole("navigation", { name: "Sections" });
    for (const section of ["Vehicles", "Designs", "Reviews", "Bench tests", "Settings"]) {
      await expect(nav.getByRole("link", { name: section })).toBeVisible();
    }
    await expect(page.getByRole("heading", { name: "Larkspur Light Vehicles" })).toBeVisible();
    await expect(page.getByText(ROLE_LABEL[role], { exact: true }).filter({ visible: true }).first()).toBeVisible();
    await expect(page.getByRole("note")).toContainText("Demo data");
    await nav.getByRole("link", { name: "Vehicles" }).click();
    await expect(page.getByRole("heading", { name: "Vehicles" })).toBeVisible();
    await expect(page.getByRole("main").getByText("Haybarn campus hauler #3", { exact: true })).toBeVisible();
  });
}

test("a new user signs up, confirms the address from the outbox, and signs in", async ({ page }) => {
  const email = `new-user-${Date.now()}@example.com`;
  const password = "a-long-password-9";
  await page.goto("/sign-up");
  await page.getByLabel("Your name").fill("Wren Okafor");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Create account" }).click();
  await expect(page.getByRole("heading", { name: "Check your mail" })).toBeVisible();

  // Unverified: sign-in is refused with a hint.
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByRole("alert")).toContainText("Confirm your e-mail address first");

  await page.goto("/outbox");
  const mail = page.getByTestId("mail").filter({ hasText: email }).filter({ hasText: "Confirm your e-mail address" }).first();
  await expect(mail).toBeVisible();
  await mail.getByRole("link", { name: /verify-email/ }).click();
  await expect(page).toHaveURL(/\/sign-in\?verified=1/);
  await expect(page.getByText("Your address is confirmed")).toBeVisible();

  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByRole("heading", { name: "Welcome, Wren Okafor" })).toBeVisible();
  await page.getByLabel("Workspace name").fill("Okafor Mowers");
  await page.getByRole("button", { name: "Create workspace" }).click();
  await expect(page).toHaveURL(/\/w\/okafor-mowers/);
  await expect(page.getByText("You are admin here")).toBeVisible();
});

test("a forgotten password is reset through the mailed link", async ({ page }) => {
  // A user of our own, so the demo accounts keep their password.
  const email = `reset-${Date.now()}@example.com`;
  await page.goto("/sign-up");
  await page.getByLabel("Your name").fill("Ash Lindqvist");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill("first-password-1");
  await page.getByRole("button", { name: "Create account" }).click();
  await expect(page.getByRole("heading", { name: "Check your mail" })).toBeVisible();

  await page.goto("/forgot-password");
  await page.getByLabel("E-mail").fill(email);
  await page.getByRole("button", { name: "Send the link" }).click();
  await expect(page.getByText("a reset link is on its way")).toBeVisible();
  await page.goto("/outbox");
  await page
    .getByTestId("mail")
    .filter({ hasText: "Reset your Chainproof password" })
    .filter({ hasText: email })
    .first()
    .getByRole("link")
    .click();
  await expect(page.getByRole("heading", { name: "Choose a new password" })).toBeVisible();
  await page.getByLabel("New password").fill("second-password-2");
  await page.getByRole("button", { name: "Save the new password" }).click();
  await expect(page.getByText("Your password was changed")).toBeVisible();
});

test("on a phone the menu opens and the sections are reachable by keyboard", async ({ page }) => {
  await page.setViewportSize({ width: 390, height: 844 });
  await signIn(page, "technician");
  const menu = page.getByRole("button", { name: "Open menu" });
  await expect(menu).toBeVisible();
  await menu.focus();
  await page.keyboard.press("Enter");
  const nav = page.locator("#mobile-nav").getByRole("navigation", { name: "Sections" });
  await expect(nav.getByRole("link", { name: "Bench tests" })).toBeVisible();
  await nav.getByRole("link", { name: "Bench tests" }).click();
  await expect(page.getByRole("heading", { name: "Bench tests" })).toBeVisible();
  await expect(page.getByLabel("Safety caution")).toBeVisible();
});

test("an unknown page shows a friendly error without a stack trace", async ({ page }) => {
  await signIn(page, "engineer");
  const res = await page.goto("/w/no-such-workspace");
  expect(res?.status()).toBe(404);
  await expect(page.getByRole("heading", { name: "Not found" })).toBeVisible();
  await expect(page.locator("pre")).toHaveCount(0);
});

test("a missing page inside a workspace keeps the workspace navigation", async ({ page }) => {
  await signIn(page, "engineer");
  const res = await page.goto("/w/larkspur/designs/00000000-0000-4000-8000-000000000000");
  expect(res?.status()).toBe(404);
  await expect(page.getByRole("heading", { name: "Not found" })).toBeVisible();
  const nav = page.getByRole("navigation", { name: "Sections" }).filter({ visible: true }).first();
  await expect(nav.getByRole("link", { name: "Designs" })).toBeVisible();
  await expect(page.locator("pre")).toHaveCount(0);

  // The editor's own boundary: a revision that does not exist, said so, with the way back.
  const list = await page.request.get("/api/v1/designs?workspace=larkspur");
  const { designs } = (await list.json()) as { designs: Array<{ id: string; name: string }> };
  const editor = await page.goto(`/w/larkspur/designs/${designs[0].id}/edit?revision=999`);
  expect(editor?.status()).toBe(404);
  await expect(page.getByText("This design has no revision 999.")).toBeVisible();
  await expect(page.getByRole("link", { name: "Back to the design" })).toBeVisible();
  await page
    .getByRole("navigation", { name: "Sections" })
    .filter({ visible: true })
    .first()
    .getByRole("link", { name: "Vehicles" })
    .click();
  await expect(page.getByRole("heading", { name: "Vehicles" })).toBeVisible();
});
