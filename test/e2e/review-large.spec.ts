// A reviewer signs a 98,304-row revision by what they can read: the drive rows as a few groups, why a
// rule holds (reasons with their groups, each group one click from its rows in the truth table), a
// disposition for every single fault that defeats a rule. Approval is refused until every fault has one.
import { test, expect, signIn, APP_ORIGIN } from "../support/e2e";
import { accessoryHauler } from "../support/accessory-hauler";
import { compileDesign, prove } from "../../app/engine";

const SHOTS = ".data/test-results/screens";

test("a reviewer reads why a rule holds on a 98,304-row revision, records each fault's disposition, then approves", async ({
  page,
  browser,
}) => {
  test.setTimeout(300_000);
  const design = accessoryHauler();
  const verdict = prove(compileDesign(design));
  expect(verdict.rows).toBe(98_304);

  // The engineer saves the revision through the API.
  await signIn(page, "engineer");
  const headers = { origin: APP_ORIGIN };
  const made = await page.request.post("/api/v1/designs?workspace=larkspur", {
    data: { name: `Accessory hauler ${Date.now()}`, start: "blank" },
    headers,
  });
  expect(made.status()).toBe(201);
  const designId = (await made.json()).design.id as string;
  const saved = await page.request.post(`/api/v1/designs/${designId}/revisions`, {
    data: { document: design, baseRevision: 0, message: "accessories on the enable line" },
    headers,
  });
  expect(saved.status()).toBe(201);

  const context = await browser.newContext({
    extraHTTPHeaders: { "x-forwarded-for": "198.19.201.12" },
    viewport: { width: 1280, height: 900 },
  });
  const reviewer = await context.newPage();
  await signIn(reviewer, "reviewer");
  const review = `/w/larkspur/designs/${designId}/revisions/1/review`;
  await reviewer.goto(review);
  await expect(reviewer.getByRole("heading", { name: "Review of revision 1" })).toBeVisible();

  // Drive in words: the verdict's drive rows, in a few groups.
  const drive = reviewer.getByTestId("drive-groups");
  await expect(drive).toContainText(`${verdict.driveRows} rows of 98,304 drive`);
  expect(await drive.getByTestId("row-group").count()).toBeLessThanOrEqual(4);
  await reviewer.screenshot({ path: `${SHOTS}/large-review-top.png` });

  // Why "No drive in service mode" holds: every unsafe row is explained by a reason with its groups.
  const rule = reviewer.locator('[data-testid=rule-reading][data-rule="service"]');
  await expect(rule).toContainText("Forbids drive in 49,152 unsafe rows");
  await expect(rule).toContainText("None of them violates it.");
  const why = rule.getByTestId("why");
  await expect(why.getByTestId("why-reason")).not.toHaveCount(0);
  await expect(why.locator('[data-reason="disabled"]')).toContainText("the enable input is dead");
  await rule.scrollIntoViewIfNeeded();
  await reviewer.screenshot({ path: `${SHOTS}/large-review-why.png` });
  // One click from a group to exactly its rows in the truth table.
  const firstGroup = why.locator('[data-reason="disabled"]').getByTestId("row-group").first();
  const groupRows = Number((await firstGroup.getByRole("link").innerText()).replace(/[^0-9]/g, ""));
  await firstGroup.getByRole("link").click();
  await expect(reviewer.getByTestId("match-count")).toHaveText(new RegExp(`^${groupRows.toLocaleString("en-US")} of 98,304 rows match`), {
    timeout: 30_000,
  });
  await reviewer.screenshot({ path: `${SHOTS}/large-table-group.png` });
  await reviewer.goto(review);

  // Approval is refused while faults are open, naming them.
  const decide = reviewer.getByRole("form", { name: "Decide" });
  await decide.getByLabel("Comment with your decision").fill("Checked the accessory chain.");
  await decide.getByRole("button", { name: "Approve revision" }).click();
  const refusal = reviewer.getByText(`Approval refused: these ${verdict.singleFaults.length} single faults have no disposition yet`);
  await expect(refusal).toBeVisible();
  await expect(reviewer.getByText(/SERVICE_SW stuck closed \(defeats service\)/).first()).toBeVisible();
  await expect(reviewer.getByTestId("decision")).toHaveCount(0);

  // Each defeating fault shows the rows it breaks, as groups, and gets a disposition.
  const faults = reviewer.getByTestId("fault-reading");
  await expect(faults).toHaveCount(verdict.singleFaults.length);
  await expect(reviewer.locator('[data-fault="SERVICE_SW/stuck-closed"]')).toContainText("No drive in service mode");
  await reviewer.locator('[data-fault="SERVICE_SW/stuck-closed"]').scrollIntoViewIfNeeded();
  await reviewer.screenshot({ path: `${SHOTS}/large-review-fault.png` });
  for (let i = 0; i < verdict.singleFaults.length; i++) {
    const fault = faults.nth(i);
    const form = fault.getByRole("form");
    await form.getByLabel("Disposition").selectOption(i % 2 === 0 ? "accepted" : "fix-next-revision");
    await form.getByLabel("Justification").fill(`Checked on the loom: fault ${i + 1} is covered by the controller's monitoring.`);
    await form.getByRole("button", { name: "Save" }).click();
    await expect(fault.getByTestId("disposition")).toContainText(`fault ${i + 1} is covered`);
  }
  await expect(reviewer.getByTestId("fault-readings")).toContainText("every fault has a disposition");

  await decide.getByLabel("Comment with your decision").fill("Checked the accessory chain; every fault has a disposition.");
  await decide.getByRole("button", { name: "Approve revision" }).click();
  await expect(reviewer.getByTestId("decision").first()).toContainText("Approved");
  await reviewer.screenshot({ path: `${SHOTS}/large-review-approved.png`, fullPage: true });
  await context.close();
});
