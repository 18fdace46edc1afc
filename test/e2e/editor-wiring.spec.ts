// The editor as a new engineer uses it: a two-contact chain built by clicking terminals, a
// condition renamed through an existing id (refused at the field), the design saved; wiring that
// says why it refuses, wires that name their ends, terminals big enough at any zoom, a canvas that
// gets the window, shortcuts after a click on empty canvas, copy and paste, long messages that
// wrap, the fault view's stuck marker and an explained no-restart trace. With
// CHAINPROOF_SCREENSHOTS=1 it also writes docs/screenshots/editor-1440x900.png and editor-trace.png.
import type { Page } from "@playwright/test";
import { APP_ORIGIN, expect, signIn, test } from "../support/e2e";

const WS = "larkspur";
const SHOTS = process.env.CHAINPROOF_SCREENSHOTS === "1";
test.use({ viewport: { width: 1440, height: 900 } });

type Doc = Record<string, unknown>;

async function designWith(page: Page, name: string, document?: (name: string) => Doc): Promise<string> {
  const res = await page.request.post(`/api/v1/designs?workspace=${WS}`, { data: { name }, headers: { origin: APP_ORIGIN } });
  expect(res.status()).toBe(201);
  const body = (await res.json()) as { design: { id: string }; draft: { version: number } };
  if (document) {
    const put = await page.request.put(`/api/v1/designs/${body.design.id}/draft`, {
      data: { document: document(name), version: body.draft.version },
      headers: { origin: APP_ORIGIN },
    });
    expect(put.status()).toBe(200);
  }
  return body.design.id;
}

const THROTTLE = { condition: "throttle", released: ["released"], applied: ["applied"], fault: [] };
const empty = (name: string): Doc => ({
  format: "chainproof/design@1",
  name,
  conditions: [{ id: "throttle", label: "Throttle", states: ["released", "applied"] }],
  components: [],
  wires: [],
  controller: { throttle: THROTTLE },
  rules: [],
  layout: {},
});

/** A tow tug of our own: key, seat and brake wired to power, enable and brake; forward only. */
const towTug =
  (lockouts: string[]) =>
  (name: string): Doc => ({
    format: "chainproof/design@1",
    name,
    conditions: [
      { id: "key", label: "Key", states: ["off", "on"] },
      { id: "seat", label: "Operator seat", states: ["empty", "occupied"] },
      { id: "brake", label: "Parking brake", states: ["off", "set"] },
      { id: "throttle", label: "Throttle", states: ["released", "applied"] },
    ],
    components: [
      { id: "B1", type: "supply", label: "Pack +" },
      { id: "KEY", type: "contact", label: "Key switch", condition: "key", closedIn: ["on"] },
      { id: "SEAT", type: "contact", label: "Seat switch", condition: "seat", closedIn: ["occupied"] },
      { id: "PB", type: "contact", label: "Brake switch", condition: "brake", closedIn: ["set"] },
      { id: "PWR", type: "input", label: "Power", function: "power" },
      { id: "EN", type: "input", label: "Enable", function: "enable" },
      { id: "BRK", type: "input", label: "Brake", function: "brake" },
    ],
    wires: [
      { from: "B1.+", to: "KEY.1" },
      { from: "KEY.2", to: "PWR.in" },
      { from: "KEY.2", to: "SEAT.1" },
      { from: "SEAT.2", to: "EN.in" },
      { from: "KEY.2", to: "PB.1" },
      { from: "PB.2", to: "BRK.in" },
    ],
    controller: { throttle: THROTTLE, brakeCutsDrive: true, lockouts },
    rules: [
      { id: "R1", label: "No drive with the seat empty", type: "inhibit", when: { cond: "seat", in: ["empty"] }, forbid: "drive" },
      { id: "R2", label: "No start on a held throttle", type: "no-restart" },
    ],
    layout: {
      B1: { x: 0, y: 120 },
      KEY: { x: 240, y: 120 },
      SEAT: { x: 480, y: 0 },
      PB: { x: 480, y: 240 },
      PWR: { x: 760, y: 120 },
      EN: { x: 760, y: 0 },
      BRK: { x: 760, y: 240 },
    },
  });

const editorUrl = (id: string) => `/w/${WS}/designs/${id}/edit`;
const status = (page: Page) => page.getByTestId("proof-status");
const handle = (page: Page, t: string) => page.getByTestId(`handle-${t.replace(".", "-")}`);

async function open(page: Page, id: string) {
  const res = await page.goto(editorUrl(id));
  expect(res?.status()).toBe(200);
  await expect(status(page)).toBeVisible();
}

async function commitField(scope: Page | ReturnType<Page["locator"]>, label: string, value: string) {
  const field = scope.getByLabel(label, { exact: true });
  await field.fill(value);
  await field.press("Enter");
}

async function addCondition(page: Page, id: string, states: [string, string]) {
  await page.getByRole("tab", { name: "Conditions" }).click();
  await page.getByRole("button", { name: "+ Condition" }).click();
  const card = page.getByRole("group", { name: /^Condition c\d+$/ }).last();
  const cid = (await card.getAttribute("aria-label"))!.slice("Condition ".length);
  await commitField(card, `State 1 of ${cid}`, states[0]);
  await commitField(card, `State 2 of ${cid}`, states[1]);
  await commitField(card, "Id", id);
  await expect(page.getByTestId(`condition-${id}`)).toBeVisible();
}

async function clickWire(page: Page, from: string, to: string) {
  await handle(page, from).click();
  await expect(page.getByTestId("canvas-note")).toContainText(`Wiring from ${from}`);
  await handle(page, to).click();
  await expect(page.getByTestId("canvas-note")).toContainText(`Wired ${from} to ${to}`);
}

async function setContact(page: Page, id: string, condition: string, closedIn: string) {
  await page.getByTestId(`node-${id}`).click();
  await page.getByRole("tab", { name: "Properties" }).click();
  await page.getByLabel("Condition", { exact: true }).selectOption(condition);
  const chips = page.getByRole("group", { name: "Closed in states" });
  for (const b of await chips.getByRole("button", { pressed: true }).all()) await b.click();
  await chips.getByRole("button", { name: closedIn }).click();
}

test("an engineer builds a two-contact chain by clicking terminals, is refused a colliding condition id at the field, and saves", async ({
  page,
}) => {
  test.setTimeout(150_000);
  await signIn(page, "engineer");
  const id = await designWith(page, `Tow tug T-4 chain ${Date.now()}`, empty);
  await open(page, id);
  await addCondition(page, "park", ["set", "off"]);
  await addCondition(page, "seat", ["empty", "occupied"]);

  for (const item of ["supply", "contact", "contact", "input-enable"]) await page.getByTestId(`palette-${item}`).click();
  await expect(page.locator(".react-flow__node")).toHaveCount(4);
  // New parts land in free space: no two nodes overlap.
  const boxes = await page.locator(".react-flow__node").evaluateAll((els) => els.map((e) => e.getBoundingClientRect().toJSON() as DOMRect));
  for (const [i, a] of boxes.entries())
    for (const b of boxes.slice(i + 1)) expect(a.right <= b.left || b.right <= a.left || a.bottom <= b.top || b.bottom <= a.top).toBe(true);

  await clickWire(page, "B1.+", "K1.1");
  await clickWire(page, "K1.2", "K2.1");
  await clickWire(page, "K2.2", "EN.in");
  await expect(page.locator(".react-flow__edge")).toHaveCount(3);
  // A refused wire says why.
  await handle(page, "K1.1").click();
  await handle(page, "K1.2").click();
  await expect(page.getByTestId("canvas-note")).toHaveText(
    /No wire from K1\.1 to K1\.2: a wire across one component's own terminals is not allowed\./,
  );

  await setContact(page, "K1", "park", "off");
  await setContact(page, "K2", "seat", "occupied");

  // Renaming "seat" on the way to "park2" passes through "park": Enter there is refused at the field.
  await page.getByRole("tab", { name: "Conditions" }).click();
  const seat = page.getByTestId("condition-seat");
  await seat.getByLabel("Id", { exact: true }).fill("park");
  await seat.getByLabel("Id", { exact: true }).press("Enter");
  await expect(seat.getByRole("alert")).toContainText("Not changed: another condition is already called “park”");
  await expect(page.getByTestId("condition-park")).toHaveCount(1);
  await seat.getByLabel("Id", { exact: true }).fill("park2");
  await seat.getByLabel("Id", { exact: true }).press("Enter");
  await expect(page.getByTestId("condition-park2")).toBeVisible();
  await expect(page.getByTestId("node-K2")).toContainText("park2");
  await expect(page.getByTestId("node-K1")).toContainText("park:");
  // One undo step takes the rename back, references and all.
  await page.getByRole("button", { name: "Undo" }).click();
  await expect(page.getByTestId("node-K2")).toContainText("seat");
  await page.getByRole("button", { name: "Redo" }).click();
  await expect(page.getByTestId("node-K2")).toContainText("park2");

  await page.getByRole("tab", { name: "Rules" }).click();
  await page.getByRole("button", { name: "+ Inhibit rule" }).click();
  const rule = page.getByTestId("rule-R1");
  await commitField(rule, "Label", "No drive with the seat empty");
  await rule.getByLabel("Condition", { exact: true }).selectOption("park2");
  await rule.getByRole("button", { name: "empty" }).click();
  await expect(status(page)).toContainText("Proven");

  await page.getByLabel("Revision message").fill("Park and seat switches in series");
  await page.getByRole("button", { name: "Save revision" }).click();
  const banner = page.getByTestId("editor-banner");
  await expect(banner).toContainText("Revision 1 saved", { timeout: 30_000 });
  await expect(banner).toContainText("common-cause failures");
  await expect(banner).toContainText("not a category or performance-level claim");
  await expect(page.getByTestId("revision-status")).toHaveText("Revision 1, proven");
  // The confirmation describes the saved document; the next change takes it away.
  await page.getByTestId("node-K2").click();
  await commitField(page, "Label", "Seat switch");
  await expect(banner).toHaveCount(0);
});

test("the editor gets the window; wires name their ends; terminals stay 24 px at any zoom; Fit view stays readable", async ({ page }) => {
  await signIn(page, "engineer");
  const id = await designWith(page, `Tow tug T-4 layout ${Date.now()}`, towTug(["power-on"]));
  await open(page, id);
  await expect(page.getByRole("complementary", { name: "Workspace navigation (collapsed)" })).toBeVisible();
  const pane = (await page.locator(".react-flow").boundingBox())!;
  expect(pane.width).toBeGreaterThanOrEqual(0.6 * 1440);
  if (SHOTS) await page.screenshot({ path: "docs/screenshots/editor-1440x900.png" });

  // Fit view never goes below readable label size.
  await page.getByRole("button", { name: "Fit view" }).first().click();
  const zoom = async () => page.locator(".react-flow__viewport").evaluate((el) => new DOMMatrix(getComputedStyle(el).transform).a);
  expect(await zoom()).toBeGreaterThanOrEqual(0.75);

  // Zoomed all the way out, every terminal still offers at least 24 px to click.
  const zoomOut = page.getByRole("button", { name: "zoom out" });
  for (let i = 0; i < 20 && !(await zoomOut.isDisabled()); i++) await zoomOut.click();
  expect(await zoom()).toBeLessThan(0.3);
  for (const t of ["B1.+", "KEY.1", "KEY.2", "EN.in"]) {
    const box = (await handle(page, t).boundingBox())!;
    expect(Math.min(box.width, box.height)).toBeGreaterThanOrEqual(24);
  }
  await page.getByRole("button", { name: "Fit view" }).first().click();

  // A selected wire names its two ends, on the canvas and in Properties.
  await page.locator(".react-flow__edge").first().click({ force: true });
  await expect(page.getByTestId("wire-label")).toHaveText("B1.+ – KEY.1");
  await expect(page.getByTestId("wire-ends")).toHaveText("From B1.+ to KEY.1");

  // Dragging still wires: from the seat switch's free side to the brake input is refused (already one net? no: a new net) and joins.
  const before = await page.locator(".react-flow__edge").count();
  const a = (await handle(page, "SEAT.2").boundingBox())!;
  const b = (await handle(page, "BRK.in").boundingBox())!;
  await page.mouse.move(a.x + a.width / 2, a.y + a.height / 2);
  await page.mouse.down();
  await page.mouse.move(b.x + b.width / 2 - 6, b.y + b.height / 2, { steps: 8 });
  await page.mouse.move(b.x + b.width / 2, b.y + b.height / 2, { steps: 2 });
  await page.mouse.up();
  await expect(page.locator(".react-flow__edge")).toHaveCount(before + 1);
});

test("shortcuts work after a click on empty canvas: select all, copy, paste, undo, delete; 'Add in series' right after an id change", async ({
  page,
}) => {
  await signIn(page, "engineer");
  const id = await designWith(page, `Tow tug T-4 keys ${Date.now()}`, towTug(["power-on"]));
  await open(page, id);
  const nodes = page.locator(".react-flow__node");
  await expect(nodes).toHaveCount(7);
  const paneBox = (await page.locator(".react-flow__pane").boundingBox())!;
  await page.mouse.click(paneBox.x + paneBox.width - 220, paneBox.y + 40);
  await page.keyboard.press("Control+a");
  await expect(page.locator(".react-flow__node.selected")).toHaveCount(7);
  await page.keyboard.press("Control+c");
  await page.mouse.click(paneBox.x + paneBox.width - 220, paneBox.y + 40);
  await page.keyboard.press("Control+v");
  // The three inputs are not pasted (one input per function): four parts are, and stay selected.
  await expect(nodes).toHaveCount(11);
  await expect(page.getByTestId("canvas-note")).toContainText("3 inputs were not pasted");
  await expect(page.locator(".react-flow__node.selected")).toHaveCount(4);
  await page.keyboard.press("Delete");
  await expect(nodes).toHaveCount(7);
  await page.mouse.click(paneBox.x + paneBox.width - 220, paneBox.y + 40);
  await page.keyboard.press("Control+z");
  await expect(nodes).toHaveCount(11);
  await page.keyboard.press("Control+z");
  await expect(nodes).toHaveCount(7);
  await page.keyboard.press("Control+y");
  await expect(nodes).toHaveCount(11);

  // Type a new id and press "Add in series" straight away: the rename is kept and the contact added.
  await page.getByTestId("node-SEAT").click();
  await page.getByLabel("Id", { exact: true }).fill("SEAT1");
  await page.getByRole("complementary", { name: "Design details" }).getByRole("button", { name: "Add in series" }).click();
  await expect(nodes).toHaveCount(12);
  await expect(page.getByTestId("node-SEAT1")).toBeVisible();
  await expect(page.getByTestId("node-SEAT")).toHaveCount(0);
});

test("a 5,000-character message wraps instead of widening the page", async ({ page }) => {
  await signIn(page, "engineer");
  const id = await designWith(page, `Tow tug T-4 message ${Date.now()}`, towTug(["power-on", "enable-restore", "brake-release"]));
  await open(page, id);
  const long = "x".repeat(5000);
  await page.route(`**/api/v1/designs/${id}/revisions`, (route) =>
    route.fulfill({
      status: 500,
      contentType: "application/json",
      body: JSON.stringify({ error: { code: "internal", message: long, fields: [] } }),
    }),
  );
  await page.getByRole("button", { name: "Save revision" }).click();
  await expect(page.getByTestId("editor-banner")).toContainText("xxxxxxxx");
  const width = () => page.evaluate(() => document.documentElement.scrollWidth);
  expect(await width()).toBeLessThanOrEqual(1440);

  // A message pasted into "What changed?" keeps its first 500 characters; saved, it wraps wherever it is shown.
  await page.unroute(`**/api/v1/designs/${id}/revisions`);
  await expect(status(page)).toContainText("Proven");
  await page.getByLabel("Revision message").fill(long.slice(0, 500));
  await page.getByRole("button", { name: "Save revision" }).click();
  await expect(page.getByTestId("editor-banner")).toContainText("Revision 1 saved", { timeout: 30_000 });
  for (const path of [`/w/${WS}/designs/${id}`, `/w/${WS}/designs/${id}/revisions/1/review`]) {
    await page.goto(path);
    await expect(page.getByText("xxxxxxxxxx").first()).toBeVisible();
    expect(await width(), path).toBeLessThanOrEqual(1440);
  }
});

test("the fault view marks the stuck contact; a failing no-restart trace explains each step", async ({ page }) => {
  await signIn(page, "engineer");
  const id = await designWith(page, `Tow tug T-4 trace ${Date.now()}`, towTug(["power-on", "enable-restore"]));
  await open(page, id);
  await expect(status(page)).toContainText(/1 of 2 rules fail/);
  await page.getByRole("tab", { name: "Problems" }).click();
  await expect(page.getByTestId("common-cause-note").first()).toContainText("ISO 13849-1:2006, Annex F");

  // SEAT stuck closed defeats R1: the fault view says so on the contact itself.
  await page.getByRole("button", { name: "Show", exact: true }).first().click();
  await expect(page.getByTestId("stuck-SEAT")).toHaveText(/Stuck (closed|open)/);
  await page.getByRole("button", { name: "Back to editing" }).click();

  // Letting the parking brake off on a held throttle starts the tug: the brake-release lockout would catch it.
  await page.getByRole("tab", { name: "Problems" }).click();
  await page.getByRole("button", { name: "Play the steps on the canvas" }).click();
  const steps = page.getByRole("list", { name: "Steps of the counterexample" }).getByRole("listitem");
  const n = await steps.count();
  expect(n).toBeGreaterThan(1);
  await steps.last().getByRole("button").click();
  await expect(page.getByTestId("sim-drive")).toHaveAttribute("data-violating", "true");
  await expect(page.getByTestId("sim-drive")).toHaveClass(/bg-brick-600/);
  await expect(steps.last()).toContainText("Changed:");
  await expect(steps.last()).toContainText("brake-release lockout");
  await expect(page.getByText(/The brake-release lockout is off: with it on, the latch would set here/)).toBeVisible();
  if (SHOTS) await page.screenshot({ path: "docs/screenshots/editor-trace.png" });
});
