// Review and sign-off end to end: an engineer asks for a review, the reviewer follows the mail from
// the outbox, pins a comment to a truth-table row and requests changes; the engineer saves revision 2
// and asks again; the reviewer sees the diff and approves; the report shows the signature.
import { readFileSync } from "node:fs";
import type { Browser, Page } from "@playwright/test";
import { test, expect, signIn } from "../support/e2e";

const PROVEN = JSON.parse(readFileSync(new URL("../../drizzle/demo-designs/haybarn-campus-hauler.json", import.meta.url), "utf8")) as {
  components: Array<Record<string, unknown>>;
};

const pageErrors: string[] = [];

async function asRole(browser: Browser, role: "engineer" | "reviewer"): Promise<Page> {
  const context = await browser.newContext({ extraHTTPHeaders: { "x-forwarded-for": `198.19.200.${role === "engineer" ? 11 : 12}` } });
  const page = await context.newPage();
  page.on("pageerror", (err) => pageErrors.push(`${role}: ${err.message}`));
  await signIn(page, role);
  return page;
}

/** Records a disposition for every single fault on the review page, one form at a time. */
async function disposeAll(page: Page) {
  const faults = page.getByTestId("fault-reading");
  const count = await faults.count();
  expect(count).toBeGreaterThan(0);
  for (let i = 0; i < count; i++) {
    const fault = faults.nth(i);
    const form = fault.getByRole("form");
    await form.getByLabel("Disposition").selectOption("accepted");
    await form.getByLabel("Justification").fill(`Two-channel contact, monitored by the controller (${i + 1}).`);
    await form.getByRole("button", { name: "Save" }).click();
    await expect(fault.getByTestId("disposition")).toContainText(`Accepted: Two-channel contact, monitored by the controller (${i + 1}).`);
  }
  await expect(page.getByTestId("fault-readings")).toContainText("every fault has a disposition");
}

async function requestReview(page: Page, designId: string, number: number) {
  await page.goto(`/w/larkspur/designs/${designId}/revisions/${number}/review`);
  const form = page.getByRole("form", { name: "Request review" });
  await form.getByLabel(/Odile Ferrand/).check();
  await form.getByLabel("Note for the reviewers (optional)").fill(`Please check revision ${number}.`);
  await form.getByRole("button", { name: "Request review" }).click();
  await expect(page.getByText("Review requested; each reviewer got an e-mail.")).toBeVisible();
}

async function openMailLink(page: Page, subject: string) {
  await page.goto("/outbox");
  const mail = page.getByTestId("mail").filter({ hasText: subject }).first();
  await expect(mail).toBeVisible();
  await mail.getByRole("link").first().click();
}

test("request review, comment on a row, request changes, revise, approve, and read the signature in the report", async ({
  page,
  browser,
}) => {
  test.setTimeout(150_000); // seven dispositions are recorded through the page before approval
  const name = `Hauler review ${Date.now()}`;
  await signIn(page, "engineer");
  // Cookie-authenticated API writes must say they come from the app's own origin.
  const headers = { origin: new URL(page.url()).origin };
  const made = await page.request.post("/api/v1/designs?workspace=larkspur", { data: { name, start: "blank" }, headers });
  expect(made.status()).toBe(201);
  const designId = (await made.json()).design.id as string;
  const r1 = await page.request.post(`/api/v1/designs/${designId}/revisions`, {
    data: { document: PROVEN, baseRevision: 0, message: "first wiring" },
    headers,
  });
  expect(r1.status()).toBe(201);

  // The engineer asks the demo reviewer.
  await requestReview(page, designId, 1);

  // The reviewer follows the mail to the review page.
  const reviewer = await asRole(browser, "reviewer");
  await openMailLink(reviewer, `Review requested: ${name}, revision 1`);
  await expect(reviewer.getByRole("heading", { name: "Review of revision 1" })).toBeVisible();

  // From the truth table: only the rows that drive; open row 157 and comment on it.
  await reviewer.getByRole("link", { name: "Truth table" }).click();
  await expect(reviewer.getByRole("heading", { name: "Truth table, revision 1" })).toBeVisible();
  await reviewer.waitForLoadState("networkidle"); // the filters act once the page is interactive
  await reviewer.getByLabel("Rows", { exact: true }).selectOption("drive");
  await expect(reviewer.getByTestId("match-count")).toHaveText(/^2 of 192 rows match/);
  await reviewer.getByRole("button", { name: "Row 157: open its diagnosis" }).click();
  const drawer = reviewer.getByTestId("row-drawer");
  await expect(drawer).toContainText("Steady drive");
  await expect(drawer.getByRole("link", { name: "Simulate this row on the canvas" })).toHaveAttribute(
    "href",
    new RegExp(`/edit\\?revision=1&row=157$`),
  );
  await drawer.getByRole("link", { name: "Comment on this row" }).click();
  const commentForm = reviewer.getByRole("form", { name: "Add a comment" });
  await expect(commentForm.getByLabel("Anchor")).toHaveValue("row");
  await expect(commentForm.getByLabel(/^Row/)).toHaveValue("157");
  await commentForm.getByLabel("Comment").fill("This row drives with the lever forward: label the lever contacts.");
  await commentForm.getByRole("button", { name: "Add comment" }).click();
  const comment = reviewer.getByTestId("comment").first();
  await expect(comment).toContainText("row 157");
  await expect(comment).toContainText("key=on");

  // Changes requested.
  const decide = reviewer.getByRole("form", { name: "Decide" });
  await decide.getByLabel("Comment with your decision").fill("Label the direction lever contacts, then ask again.");
  await decide.getByRole("button", { name: "Request changes" }).click();
  await expect(reviewer.getByTestId("decision").first()).toContainText("Changes requested");

  // The engineer sees it, saves revision 2 through the API and asks again.
  await page.goto(`/w/larkspur/designs/${designId}`);
  await expect(page.getByText("Changes requested").first()).toBeVisible();
  const changed = structuredClone(PROVEN);
  const lf = changed.components.find((c) => c.id === "LF")!;
  lf.label = "Direction lever, forward contact (blue)";
  const r2 = await page.request.post(`/api/v1/designs/${designId}/revisions`, {
    data: { document: changed, baseRevision: 1, message: "labelled lever contacts" },
    headers,
  });
  expect(r2.status()).toBe(201);
  await requestReview(page, designId, 2);

  // The reviewer opens the new request, sees the diff and approves.
  await openMailLink(reviewer, `Review requested: ${name}, revision 2`);
  await expect(reviewer.getByRole("heading", { name: "Review of revision 2" })).toBeVisible();
  const diff = reviewer.getByTestId("review-diff");
  await expect(diff).toContainText("Compared with revision 1");
  await expect(diff).toContainText("LF: label");
  await expect(diff).toContainText("No row changed its drive");
  // Approval waits for a disposition of every single fault that defeats a rule.
  await reviewer.getByRole("form", { name: "Decide" }).getByLabel("Comment with your decision").fill("Labels match the loom now.");
  await reviewer.getByRole("form", { name: "Decide" }).getByRole("button", { name: "Approve revision" }).click();
  await expect(reviewer.getByText(/Approval refused: these \d+ single faults have no disposition yet/)).toBeVisible();
  await disposeAll(reviewer);
  await reviewer.getByRole("form", { name: "Decide" }).getByLabel("Comment with your decision").fill("Labels match the loom now.");
  await reviewer.getByRole("form", { name: "Decide" }).getByRole("button", { name: "Approve revision" }).click();
  await expect(reviewer.getByTestId("decision").first()).toContainText("Approved");

  // The report of revision 2 carries the signature.
  await reviewer.goto(`/w/larkspur/designs/${designId}/revisions/2/report`);
  await expect(reviewer.getByTestId("report-status")).toHaveText("Approved");
  const signoff = reviewer.getByTestId("signoff").first();
  await expect(signoff).toContainText("Odile Ferrand");
  await expect(signoff).toContainText("Approved");
  // Too wide for readable labels on A4 as drawn on screen: the report prints the one-column drawing,
  // and the wiring list as always (decisions 165 and 166).
  await expect(reviewer.getByTestId("report-diagram")).toHaveAttribute("data-layout", "stacked");
  await expect(reviewer.getByTestId("diagram-left-out")).toHaveCount(0);
  await expect(reviewer.getByTestId("wiring-list")).toBeVisible();

  // Revision 1 keeps its own outcome; the engineer was told of both decisions.
  await page.goto("/outbox");
  await expect(page.getByTestId("mail").filter({ hasText: `Approved: ${name}, revision 2` })).toHaveCount(1);
  await expect(page.getByTestId("mail").filter({ hasText: `Changes requested: ${name}, revision 1` })).toHaveCount(1);
  await reviewer.context().close();
  expect(pageErrors).toEqual([]);
});
