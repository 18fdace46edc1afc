// The design editor end to end: build a design by mouse from an empty one, prove it, save it as a
// revision, have an unsafe save refused with its counterexample, and open it read-only as a reviewer
// or once it is archived. With CHAINPROOF_SCREENSHOTS=1 it writes docs/screenshots/design-archived.png.
import type { Page } from "@playwright/test";
import { APP_ORIGIN, expect, signIn, test } from "../support/e2e";

const WS = "larkspur";
test.use({ viewport: { width: 1440, height: 900 } });

async function newDesign(page: Page, name: string, { empty = false } = {}): Promise<string> {
  const res = await page.request.post(`/api/v1/designs?workspace=${WS}`, { data: { name }, headers: { origin: APP_ORIGIN } });
  expect(res.status()).toBe(201);
  const body = (await res.json()) as { design: { id: string }; draft: { version: number } };
  if (empty) {
    // Truly empty: the blank template's battery removed, so everything on the canvas is drawn by the test.
    const document = {
      format: "chainproof/design@1",
      name,
      conditions: [{ id: "throttle", label: "Throttle", states: ["released", "applied"] }],
      components: [],
      wires: [],
      controller: { throttle: { condition: "throttle", released: ["released"], applied: ["applied"], fault: [] } },
      rules: [],
      layout: {},
    };
    const put = await page.request.put(`/api/v1/designs/${body.design.id}/draft`, {
      data: { document, version: body.draft.version },
      headers: { origin: APP_ORIGIN },
    });
    expect(put.status()).toBe(200);
  }
  return body.design.id;
}

const editorUrl = (id: string) => `/w/${WS}/designs/${id}/edit`;

async function openEditor(page: Page, id: string) {
  const res = await page.goto(editorUrl(id));
  expect(res?.status(), "the editor route answers").toBe(200);
}

export async function dropFromPalette(page: Page, item: string, x: number, y: number) {
  await page.getByTestId(`palette-${item}`).dragTo(page.locator(".react-flow__pane"), { targetPosition: { x, y } });
}

/** Drags a wire from one terminal handle to another, as a person does with the mouse. */
export async function wire(page: Page, from: string, to: string) {
  const a = (await page.getByTestId(`handle-${from.replace(".", "-")}`).boundingBox())!;
  const b = (await page.getByTestId(`handle-${to.replace(".", "-")}`).boundingBox())!;
  await page.mouse.move(a.x + a.width / 2, a.y + a.height / 2);
  await page.mouse.down();
  await page.mouse.move(b.x + b.width / 2 - 6, b.y + b.height / 2, { steps: 8 });
  await page.mouse.move(b.x + b.width / 2, b.y + b.height / 2, { steps: 2 });
  await page.mouse.up();
}

async function addCondition(page: Page, id: string, states: [string, string]) {
  await page.getByRole("tab", { name: "Conditions" }).click();
  await page.getByRole("button", { name: "+ Condition" }).click();
  const card = page.getByRole("group", { name: /^Condition c\d+$/ }).last();
  // Ids and state names change when the field is committed (Enter), as one undo step.
  await card.getByLabel("State 1 of", { exact: false }).fill(states[0]);
  await card.getByLabel("State 1 of", { exact: false }).press("Enter");
  await card.getByLabel("State 2 of", { exact: false }).fill(states[1]);
  await card.getByLabel("State 2 of", { exact: false }).press("Enter");
  await card.getByLabel("Id").fill(id);
  await card.getByLabel("Id").press("Enter");
  await expect(page.getByTestId(`condition-${id}`)).toBeVisible();
}

async function setContact(page: Page, id: string, condition: string, closedIn: string) {
  await page.getByTestId(`node-${id}`).click();
  await page.getByRole("tab", { name: "Properties" }).click();
  await page.getByLabel("Condition", { exact: true }).selectOption(condition);
  const chips = page.getByRole("group", { name: "Closed in states" });
  for (const b of await chips.getByRole("button", { pressed: true }).all()) await b.click();
  await chips.getByRole("button", { name: closedIn }).click();
}

const status = (page: Page) => page.getByTestId("proof-status");

/** Auto-layout (elkjs in its worker, loaded on first use), waited for, then Fit view. */
export async function layout(page: Page) {
  await page.getByRole("button", { name: "Auto-layout" }).click();
  await expect(page.getByRole("button", { name: "Auto-layout" })).toBeEnabled({ timeout: 20_000 });
  await page.getByRole("button", { name: "Fit view" }).first().click();
}

export async function buildInletDesign(page: Page) {
  await expect(status(page)).toBeVisible();
  await addCondition(page, "key", ["off", "on"]);
  await addCondition(page, "seat", ["empty", "occupied"]);
  await addCondition(page, "plug", ["free", "inserted"]);

  await expect(page.locator(".react-flow__node")).toHaveCount(0);
  await dropFromPalette(page, "supply", 40, 40);
  await dropFromPalette(page, "contact", 40, 160);
  await dropFromPalette(page, "contact", 40, 280);
  await dropFromPalette(page, "contact", 40, 400);
  await dropFromPalette(page, "input-enable", 40, 520);
  await expect(page.locator(".react-flow__node")).toHaveCount(5);
  // Spread them out (elkjs) and fit them in view, so every terminal is clear to grab.
  await layout(page);
  await wire(page, "B1.+", "K1.1");
  await wire(page, "K1.2", "K2.1");
  await wire(page, "K2.2", "K3.1");
  await wire(page, "K3.2", "EN.in");
  await expect(page.locator(".react-flow__edge")).toHaveCount(4);

  await setContact(page, "K1", "key", "on");
  await setContact(page, "K2", "seat", "occupied");
  await setContact(page, "K3", "plug", "free");

  await page.getByRole("tab", { name: "Rules" }).click();
  await page.getByRole("button", { name: "+ Inhibit rule" }).click();
  const rule = page.getByTestId("rule-R1");
  await rule.getByLabel("Label").fill("No drive while charging");
  await rule.getByLabel("Label").press("Enter");
  await rule.getByLabel("Condition", { exact: true }).selectOption("plug");
  await rule.getByRole("button", { name: "inserted" }).click();
}

test("an engineer builds, proves and saves a design from an empty one; an unsafe save is refused", async ({ page }) => {
  // Many steps by hand (three conditions, five parts, four wires, a rule, two saves): more than a minute on a busy machine.
  test.setTimeout(150_000);
  await signIn(page, "engineer");
  const id = await newDesign(page, `Meadowline deck mower M-11 canvas ${Date.now()}`, { empty: true });
  await openEditor(page, id);
  await buildInletDesign(page);
  // In series the inlet contact cuts drive while charging.
  await expect(status(page)).toContainText("Proven");

  // With a key contact in parallel across it, the inlet contact no longer cuts drive while charging.
  await page.getByTestId("node-K3").click();
  await page.getByRole("button", { name: "Add in parallel" }).first().click();
  await layout(page);
  await setContact(page, "K4", "key", "on");
  await expect(status(page)).toContainText("1 of 1 rule fails");
  await page.getByRole("tab", { name: "Problems" }).click();
  await expect(page.getByTestId("failing-R1")).toContainText("plug = inserted");

  // Saving the unsafe design is refused with its counterexample.
  await page.getByLabel("Revision message").fill("Key contact across the inlet switch");
  await page.getByRole("button", { name: "Save revision" }).click();
  // The server proves the design again before answering: on a busy machine that takes a while.
  await expect(page.getByText("Revision refused")).toBeVisible({ timeout: 30_000 });
  await expect(page.getByText("Not proven: only a design whose every rule holds")).toBeVisible();
  await page.getByRole("button", { name: "Show this row on the canvas" }).first().click();
  await expect(page.getByTestId("sim-drive")).toContainText("Drive ON");
  await page.getByRole("button", { name: "Back to editing" }).click();

  // Back to the inlet contact alone in series (undo the parallel contact), then save revision 1.
  for (let i = 0; i < 12 && !(await status(page).textContent())?.includes("Proven"); i++) {
    await page.getByRole("button", { name: "Undo" }).click();
    await expect(status(page)).not.toContainText("Checking");
  }
  await expect(status(page)).toContainText("Proven");
  await page.getByLabel("Revision message").fill("Inlet switch in series");
  await page.getByRole("button", { name: "Save revision" }).click();
  await expect(page.getByText("Revision 1 saved")).toBeVisible({ timeout: 30_000 });
  await expect(page.getByTestId("revision-status")).toHaveText("Revision 1, proven");
  await expect(page.getByText("Draft saved")).toBeVisible();

  await page.reload();
  await expect(page.getByTestId("revision-status")).toHaveText("Revision 1, proven");
  await expect(status(page)).toContainText("Proven");
  await expect(page.getByTestId("node-K3")).toBeVisible();
});

test("a reviewer sees the canvas read-only but may simulate", async ({ page }) => {
  await signIn(page, "engineer");
  const id = await newDesign(page, `Scree trail bike prototype P2 canvas ${Date.now()}`);
  await page.context().clearCookies();
  await signIn(page, "reviewer");
  await openEditor(page, id);
  await expect(page.getByText("Read only")).toBeVisible();
  await expect(page.getByRole("navigation", { name: "Component palette" })).toHaveCount(0);
  await expect(page.getByRole("button", { name: "Save revision" })).toHaveCount(0);
  await expect(page.getByRole("button", { name: "Undo" })).toHaveCount(0);
  await page.getByRole("tab", { name: "Conditions" }).click();
  await expect(page.getByRole("button", { name: "+ Condition" })).toBeDisabled();
});

test("an engineer archives a design after confirming: its page says so, the list hides it, the editor is read-only", async ({ page }) => {
  await signIn(page, "engineer");
  const name = `Archived canvas check ${Date.now()}`;
  const id = await newDesign(page, name);
  await page.goto(`/w/${WS}/designs/${id}`);
  await page.getByRole("button", { name: "Archive", exact: true }).click();
  const dialog = page.getByRole("dialog", { name: `Archive “${name}”?` });
  await expect(dialog).toContainText("Nothing is deleted");
  await dialog.getByRole("button", { name: "Archive the design" }).click();
  await expect(page.getByTestId("archived-notice")).toContainText("Archived by");
  await expect(page.getByRole("dialog")).toHaveCount(0);
  await expect(page.getByRole("button", { name: "Bring back from the archive" })).toBeVisible();
  if (process.env.CHAINPROOF_SCREENSHOTS === "1") await page.screenshot({ path: "docs/screenshots/design-archived.png", fullPage: true });

  await page.goto(`/w/${WS}/designs`);
  await expect(page.getByRole("link", { name, exact: true })).toHaveCount(0);
  await page.getByLabel("Show archived").check();
  await expect(page).toHaveURL(/archived=include/);
  await expect(page.getByRole("link", { name, exact: true })).toBeVisible();

  await openEditor(page, id);
  await expect(page.getByText("Read only")).toBeVisible();
  await expect(page.getByRole("button", { name: "Save revision" })).toHaveCount(0);
});

type Revision = { document: { conditions: Array<{ id: string; label?: string; states: string[] }> } };
type TableRowBody = { index: number; states: string[]; drive: boolean };

async function demoDesignId(page: Page, name: string): Promise<string> {
  const res = await page.request.get(`/api/v1/designs?workspace=${WS}`, { headers: { origin: APP_ORIGIN } });
  expect(res.status()).toBe(200);
  const { designs } = (await res.json()) as { designs: Array<{ id: string; name: string }> };
  const found = designs.find((d) => d.name === name);
  if (!found) throw new Error(`the demo design "${name}" is not in this workspace`);
  return found.id;
}

test("a truth-table row link opens the revision simulating that row; a bad row is ignored with a notice", async ({ page }) => {
  await signIn(page, "reviewer");
  const id = await demoDesignId(page, "Haybarn hauler #3, drive inhibit");
  const api = `/api/v1/designs/${id}/revisions/1`;
  const { revision } = (await (await page.request.get(api, { headers: { origin: APP_ORIGIN } })).json()) as { revision: Revision };
  // The rows to open come from the truth-table API (the server's engine), not from the canvas.
  const pick = async (only?: string): Promise<TableRowBody> => {
    const res = await page.request.get(`${api}/rows?from=0&count=50${only ? `&only=${only}` : ""}`, { headers: { origin: APP_ORIGIN } });
    expect(res.status()).toBe(200);
    const { rows } = (await res.json()) as { rows: TableRowBody[] };
    const row = only ? rows[0] : rows.find((r) => !r.drive && r.index > 0);
    expect(row).toBeTruthy();
    return row!;
  };

  for (const row of [await pick("drive"), await pick()]) {
    await page.goto(`${editorUrl(id)}?revision=1&row=${row.index}`);
    await expect(page.getByText("Read only")).toBeVisible();
    await expect(page.getByRole("tab", { name: "Simulate" })).toHaveAttribute("aria-selected", "true");
    await expect(page.getByTestId("sim-row")).toHaveText(`Row ${row.index} of the truth table.`);
    await expect(page.getByTestId("sim-drive")).toContainText(row.drive ? "Drive ON" : "Drive OFF");
    for (const [i, c] of revision.document.conditions.entries()) {
      const group = page.getByRole("group", { name: `State of ${c.label || c.id}`, exact: true });
      await expect(group.getByRole("button", { pressed: true })).toHaveText(row.states[i]);
    }
  }

  // Out of range and not a number: the revision opens as usual, with a notice.
  await page.goto(`${editorUrl(id)}?revision=1&row=999999`);
  await expect(page.getByText("This design has no row 999999")).toBeVisible();
  await expect(page.getByTestId("sim-drive")).toHaveCount(0);
  await page.goto(`${editorUrl(id)}?revision=1&row=first`);
  await expect(page.getByText("“first” is not a row number")).toBeVisible();
  await expect(page.getByTestId("proof-status")).toContainText("Proven");
});
