// The sheet in a browser: drawing a chain with the UI only, editing and undoing, a conflicting
// save from a second browser, a viewer's read-only sheet, and an accessibility scan.
import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page, type TestInfo } from "@playwright/test";
import { solveNetwork } from "../../solver/index.ts";
import { readingNumber } from "../../app/lib/format.ts";
import { signIn } from "./accounts.ts";
import { countReactCommits } from "./hydration.ts";
import { failOnConsoleErrors } from "./consoleErrors.ts";

async function openNetwork(page: Page, name: string) {
  await page.getByRole("link", { name }).click();
  await expect(page.getByRole("heading", { name, level: 1 })).toBeVisible();
  await expect(page.locator(".ks-checks")).toBeVisible();
}

const saveState = (page: Page) => page.locator(".ks-save");

async function waitSaved(page: Page) {
  // "Saved as a draft" is a save too, but these tests wait for a complete network.
  await expect(saveState(page)).toContainText(/Saved · revision/, { timeout: 15_000 });
  await expect(saveState(page)).not.toContainText("Not saved");
}

async function busReadingKV(page: Page, busId: string): Promise<number> {
  const text = await page.locator(`.react-flow__node[data-id="${busId}"] .ks-readings`).innerText();
  return Number(/([\d.]+) kV/.exec(text)![1]);
}

/** Fits the sheet to the view ("f") and waits until the view has come to rest. */
async function fitView(page: Page) {
  await page.keyboard.press("f");
  await expect(page.locator(".ks-canvas")).not.toHaveAttribute("data-view-moving");
}

async function setField(page: Page, label: string, value: string) {
  const field = page.locator(".ks-details").getByLabel(label, { exact: true });
  await field.fill(value);
  await field.press("Enter");
}

async function keep(page: Page, testInfo: TestInfo, file: string) {
  await page.screenshot({ path: testInfo.outputPath(file), fullPage: true });
}

test("an editor draws the hydro chain from a blank sheet with the UI only; the load bus reads what the solver reads", async ({ page }, testInfo) => {
  const noErrors = failOnConsoleErrors(page);
  // The terminal drags below aim at screen points: a window tall enough for the whole sheet and
  // Details means no scroll or refit moves a target between measuring it and dropping on it.
  await page.setViewportSize({ width: 1440, height: 1100 });
  await signIn(page, "editor");
  const name = `Drawn hydro chain ${Date.now()}`;
  await page.getByLabel("Name", { exact: true }).fill(name);
  await page.getByRole("radio", { name: /Blank/ }).check();
  await page.getByRole("button", { name: "Create network" }).click();
  await expect(page.getByRole("heading", { name, level: 1 })).toBeVisible();
  const networkId = /\/networks\/(\d+)/.exec(page.url())![1];

  // The blank sheet has a 33 kV busbar fed by a grid infeed: make it the 11 kV station bus and
  // replace the infeed by the hydro generator.
  await page.locator('.react-flow__node[data-id="g-1"]').click();
  await page.keyboard.press("Delete");
  await page.locator('.react-flow__node[data-id="b-1"]').click();
  await setField(page, "Name", "Tarn Head 11 kV");
  await setField(page, "Nominal voltage", "11 kV");

  const sheet = page.locator(".ks-canvas");
  await sheet.click({ position: { x: 10, y: 10 } });
  await page.keyboard.press("3"); // generator
  await setField(page, "Name", "Tarn Head hydro");
  await page.locator(".ks-details").getByLabel("Busbar", { exact: true }).selectOption({ label: "Tarn Head 11 kV · 11 kV" });
  await setField(page, "Voltage set point", "1.03");
  await setField(page, "Rated power", "24 MVA");
  await setField(page, "Subtransient reactance x″d", "17 %");

  for (const [busName, kv] of [
    ["Tarn Head 66 kV", "66 kV"],
    ["Calder Flats 66 kV", "66000 V"],
    ["Calder Flats 11 kV", "11"],
  ]) {
    await sheet.click({ position: { x: 10, y: 10 } });
    await page.keyboard.press("1");
    await setField(page, "Name", busName);
    await setField(page, "Nominal voltage", kv);
  }

  await sheet.click({ position: { x: 10, y: 10 } });
  await page.keyboard.press("4"); // step-up transformer, terminals connected with the mouse below
  await setField(page, "Name", "Tarn Head step-up");
  await setField(page, "Rated power", "25 MVA");
  await setField(page, "Short-circuit impedance uₖ", "8.5 %");
  await setField(page, "Load (copper) loss at rated current", "118 kW");
  await setField(page, "Vector group", "YNd11");
  await sheet.click({ position: { x: 10, y: 10 } });
  await fitView(page);
  // The drags below aim at screen points: the whole sheet must be on screen, whichever field the
  // page last scrolled to.
  await sheet.scrollIntoViewIfNeeded();
  const stepUp = page.locator(".react-flow__node-transformer").first();
  const stepUpId = await stepUp.getAttribute("data-id");
  for (const [terminal, busName] of [
    ["hv", "Tarn Head 66 kV"],
    ["lv", "Tarn Head 11 kV"],
  ]) {
    const handle = stepUp.locator(`.react-flow__handle[data-handleid="${terminal}"]`);
    const from = (await handle.boundingBox())!;
    const busNode = page.locator(".react-flow__node-bus", { hasText: busName });
    const bar = (await busNode.locator(".ks-bar").boundingBox())!;
    await page.mouse.move(from.x + from.width / 2, from.y + from.height / 2);
    await page.mouse.down();
    await page.mouse.move(from.x + 20, from.y + 20, { steps: 4 });
    await page.mouse.move(bar.x + bar.width / 2, bar.y + bar.height / 2, { steps: 12 });
    await page.mouse.up();
  }
  await page.locator(`.react-flow__node[data-id="${stepUpId}"]`).click();
  await expect(page.locator(".ks-details").getByLabel("HV busbar", { exact: true })).toHaveValue(/.+/);
  await expect(page.locator(".ks-details").getByLabel("LV busbar", { exact: true })).toHaveValue(/.+/);

  await sheet.click({ position: { x: 10, y: 10 } });
  await page.keyboard.press("5"); // overhead line
  await setField(page, "Name", "Fell crossing 66 kV");
  await page.locator(".ks-details").getByLabel("From busbar", { exact: true }).selectOption({ label: "Tarn Head 66 kV · 66 kV" });
  await page.locator(".ks-details").getByLabel("To busbar", { exact: true }).selectOption({ label: "Calder Flats 66 kV · 66 kV" });
  await setField(page, "Length", "48 km");
  await setField(page, "Resistance r", "0.105 ohm/km");
  await setField(page, "Reactance x", "0.365 Ω/km");
  await setField(page, "Shunt susceptance b", "3.1 uS/km");

  await sheet.click({ position: { x: 10, y: 10 } });
  await page.keyboard.press("4"); // step-down transformer
  await setField(page, "Name", "Calder Flats step-down");
  await page.locator(".ks-details").getByLabel("HV busbar", { exact: true }).selectOption({ label: "Calder Flats 66 kV · 66 kV" });
  await page.locator(".ks-details").getByLabel("LV busbar", { exact: true }).selectOption({ label: "Calder Flats 11 kV · 11 kV" });
  await setField(page, "Rated power", "25 MVA");
  await setField(page, "Short-circuit impedance uₖ", "8.5 %");
  await setField(page, "Load (copper) loss at rated current", "115 kW");
  await setField(page, "Tap (HV winding)", "-7.5 %");

  await sheet.click({ position: { x: 10, y: 10 } });
  await page.keyboard.press("7"); // load
  await setField(page, "Name", "Calder Flats town");
  await page.locator(".ks-details").getByLabel("Busbar", { exact: true }).selectOption({ label: "Calder Flats 11 kV · 11 kV" });
  await setField(page, "Active power P", "7 MW");
  await setField(page, "Reactive power Q", "2301 kvar");

  await sheet.click({ position: { x: 10, y: 10 } });
  await page.keyboard.press("Shift+L"); // arrange, then the view fits the arranged chain
  await waitSaved(page);
  await expect(page.locator(".ks-checks")).toContainText("Solved in the browser");
  await keep(page, testInfo, "sheet-drawn-hydro-chain.png");

  // The saved document is the network file; the solver (as `npm run solve` runs it) reads the
  // same voltage at the load bus as the sheet shows.
  const saved = await (await page.request.get(`/api/networks/${networkId}`)).json();
  const outcome = solveNetwork(saved.document);
  expect(outcome.ok).toBe(true);
  if (!outcome.ok) return;
  const loadBus = saved.document.buses.find((b: { name: string }) => b.name === "Calder Flats 11 kV");
  const solved = outcome.result.loadFlow.buses.find((b) => b.id === loadBus.id)!;
  expect(await busReadingKV(page, loadBus.id)).toBeCloseTo(solved.vKV, 2);
  await page.getByRole("tab", { name: "Buses" }).click();
  await expect(page.getByRole("row", { name: /Calder Flats 11 kV/ })).toContainText(readingNumber(solved.vKV, "kV"));
  noErrors();
});

test("editing a load changes the readings in one render, undo brings them back, and both are saved", async ({ page }, testInfo) => {
  const noErrors = failOnConsoleErrors(page);
  await countReactCommits(page);
  await signIn(page, "editor");
  await openNetwork(page, "Hollin Moor solar export (fictional)");
  await waitSaved(page);
  const revision = Number(/revision (\d+)/.exec(await saveState(page).innerText())![1]);
  const before = await busReadingKV(page, "b-hollin-132");

  await page.locator('.react-flow__node[data-id="ld-aux"]').click();
  // One render per edit: the first commit after Enter already draws the new Readings (the solve
  // runs in the edit's own store update, with no debounce and no second render for the numbers).
  await page.evaluate(() => {
    const readings = () => document.querySelector('.react-flow__node[data-id="b-hollin-132"] .ks-readings')?.textContent ?? "";
    const seen: { before: string; commits: string[] } = { before: "", commits: [] };
    (window as unknown as { __edit: typeof seen }).__edit = seen;
    document.addEventListener("keydown", (event) => {
      if (event.key !== "Enter") return;
      seen.before = readings();
      window.__kilostepOnCommit = () => seen.commits.push(readings());
    }, { capture: true, once: true });
  });
  await setField(page, "Active power P", "25 MW");
  await expect.poll(() => busReadingKV(page, "b-hollin-132")).not.toBe(before);
  const edit = await page.evaluate(() => (window as unknown as { __edit: { before: string; commits: string[] } }).__edit);
  expect(edit.commits.length).toBeGreaterThan(0);
  expect(edit.commits[0]).not.toBe(edit.before);
  await waitSaved(page);
  // The edit starts the next revision, or folds into this one when the same person's editing
  // session (an earlier test's, within 30 minutes) is still open.
  const edited = Number(/revision (\d+)/.exec(await saveState(page).innerText())![1]);
  expect([revision, revision + 1]).toContain(edited);
  await keep(page, testInfo, "sheet-edited-load.png");

  await page.locator(".ks-canvas").click({ position: { x: 10, y: 10 } });
  await page.keyboard.press("Control+z");
  await expect.poll(() => busReadingKV(page, "b-hollin-132")).toBe(before);
  await waitSaved(page);
  // One editing session is one revision: the undo is folded into the edit's revision.
  await expect(saveState(page)).toContainText(`revision ${edited}`);
  noErrors();
});

test("a save that meets a newer revision from another browser gets the banner and loses nothing", async ({ browser }, testInfo) => {
  const first = await browser.newContext();
  const second = await browser.newContext();
  const mine = await first.newPage();
  const theirs = await second.newPage();
  await signIn(mine, "editor");
  await signIn(theirs, "owner");
  await openNetwork(mine, "Tarn Head to Calder Flats (fictional)");
  await openNetwork(theirs, "Tarn Head to Calder Flats (fictional)");

  await theirs.locator('.react-flow__node[data-id="c-calder"]').click();
  await setField(theirs, "Reactive power at 1 pu", "3 Mvar");
  await waitSaved(theirs);

  await mine.locator('.react-flow__node[data-id="ld-mine"]').click();
  await setField(mine, "Active power P", "8.5 MW");
  const banner = mine.getByRole("alert").filter({ hasText: "Someone saved a newer revision" });
  await expect(banner).toBeVisible({ timeout: 15_000 });
  await expect(saveState(mine)).toContainText("Not saved");
  await keep(mine, testInfo, "sheet-conflict.png");

  await banner.getByRole("button", { name: "Keep mine as a new revision" }).click();
  await waitSaved(mine);
  const saved = await (await mine.request.get(`${mine.url().replace(/\/networks\//, "/api/networks/")}`)).json();
  expect(saved.document.loads.find((l: { id: string }) => l.id === "ld-mine").pMW).toBe(8.5);
  // Their revision is still in the history: keeping mine made a new revision after it.
  expect(saved.revision).toBeGreaterThanOrEqual(3);
  await first.close();
  await second.close();
});

test("a viewer sees the sheet, readings and results but cannot edit", async ({ page }, testInfo) => {
  const noErrors = failOnConsoleErrors(page);
  await signIn(page, "viewer");
  await openNetwork(page, "Tarn Head to Calder Flats (fictional)");
  await expect(page.getByRole("navigation", { name: "Parts shelf" })).toHaveCount(0);
  await expect(page.getByRole("button", { name: "Undo" })).toHaveCount(0);
  await expect(saveState(page)).toContainText("Read only");
  await expect(page.locator('.react-flow__node[data-id="b-town"] .ks-readings')).toContainText("kV");

  // Dragging a busbar moves nothing (the view may pan, so positions are compared to a neighbour).
  const bus = page.locator('.react-flow__node[data-id="b-town"]');
  const neighbour = page.locator('.react-flow__node[data-id="b-mine"]');
  const offset = async () => {
    const [a, b] = [(await bus.boundingBox())!, (await neighbour.boundingBox())!];
    return { x: a.x - b.x, y: a.y - b.y };
  };
  const before = await offset();
  const bar = (await bus.locator(".ks-bar").boundingBox())!;
  await page.mouse.move(bar.x + bar.width / 2, bar.y + bar.height / 2);
  await page.mouse.down();
  await page.mouse.move(bar.x + 200, bar.y + 120, { steps: 10 });
  await page.mouse.up();
  // The drag may have panned the view (and the sheet draws only what is in view): fit it again.
  await fitView(page);
  const after = await offset();
  // A moved bus would have shifted by at least one 20 px grid step; refitting alone shifts a fraction of a pixel.
  expect(Math.abs(after.x - before.x)).toBeLessThan(2);
  expect(Math.abs(after.y - before.y)).toBeLessThan(2);

  await bus.click();
  await expect(page.locator(".ks-details input, .ks-details select")).toHaveCount(0);
  await expect(page.locator(".ks-details")).toContainText("Nominal voltage");
  await page.getByRole("tab", { name: "Branches" }).click();
  await expect(page.getByRole("row", { name: /Fell crossing 66 kV/ })).toBeVisible();
  await keep(page, testInfo, "sheet-viewer.png");

  // The server refuses the viewer's write even when sent by hand.
  const id = /\/networks\/(\d+)/.exec(page.url())![1];
  const current = await (await page.request.get(`/api/networks/${id}`)).json();
  const refused = await page.request.put(`/api/networks/${id}`, { data: { revision: current.revision, document: current.document } });
  expect(refused.status()).toBe(403);
  noErrors();
});

test("the sheet has no serious or critical accessibility problems", async ({ page }, testInfo) => {
  await signIn(page, "owner");
  await openNetwork(page, "Tarn Head to Calder Flats (fictional)");
  await page.getByRole("button", { name: "Fault levels (kA)" }).click();
  await page.locator('.react-flow__node[data-id="t-calder"]').click();
  await page.evaluate(() => document.fonts.ready);
  await keep(page, testInfo, "sheet-owner.png");
  const scan = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
  const serious = scan.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(" ")).join(", ")})`);
  expect(serious).toEqual([]);
});
