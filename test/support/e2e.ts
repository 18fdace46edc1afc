// Playwright fixtures: sign in as a demo role; every test context gets its own client address.
import { expect, test as base, type Page } from "@playwright/test";

import { DEMO, DEMO_PASSWORD, type DemoRole } from "./demo";
export { DEMO, DEMO_PASSWORD, type DemoRole };

let n = 0;
export const test = base.extend({
  context: async ({ context }, use) => {
    n += 1;
    await context.setExtraHTTPHeaders({ "x-forwarded-for": `198.19.${process.pid % 250}.${n % 250}` });
    await use(context);
  },
  // Every test fails if the page reports a Content-Security-Policy violation or an uncaught error.
  page: async ({ page }, use) => {
    const problems: string[] = [];
    page.on("console", (msg) => {
      if (msg.type() === "error" && /Content Security Policy|Refused to/i.test(msg.text())) problems.push(msg.text());
    });
    page.on("pageerror", (err) => problems.push(`uncaught: ${err.message}`));
    await use(page);
    expect(problems, "page errors").toEqual([]);
  },
});
export { expect };

export async function signIn(page: Page, role: DemoRole | { email: string; password: string }) {
  const email = typeof role === "string" ? DEMO[role] : role.email;
  const password = typeof role === "string" ? DEMO_PASSWORD : role.password;
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"));
}

/** Our origin, for API calls made with page.request (browsers add it to their own POSTs). */
export const APP_ORIGIN = new URL(process.env.CHAINPROOF_URL ?? process.env.BASE_URL ?? "http://127.0.0.1:3100").origin;
