// Equipment from a planner's side, each test on its own uploaded copy of a demo network so that
// other specs sharing the server see the demos as seeded: sizing a line's conductor on the sheet
// (candidates with the reason each passes or fails, one click applies), the Details fields of a
// converter plant, a regulating tap changer and a minimum fault level, with their refusals, and
// the voltage ladder sizing each alternative's conductor.
import { readFileSync } from "node:fs";
import { expect, test, type Page } from "@playwright/test";
import { signIn } from "./accounts.ts";
import { failOnConsoleErrors } from "./consoleErrors.ts";

const demo = (file: string) => JSON.parse(readFileSync(new URL(`../../app/lib/demo/${file}`, import.meta.url), "utf8"));

/** Uploads a copy of a demo network under a name of its own and opens its sheet. */
async function uploadCopy(page: Page, file: string, name: string) {
  await page.goto("/networks");
  await page.getByRole("link", { name: "Upload a network file" }).click();
  const document = { ...demo(file), name };
  await page.getByLabel("Network file").setInputFiles({ name: "copy.json", mimeType: "application/json", buffer: Buffer.from(JSON.stringify(document)) });
  await expect(page.getByText("The file is a valid network.")).toBeVisible();
  await page.getByRole("button", { name: "Create network" }).click();
  await expect(page.getByRole("heading", { name, level: 1 })).toBeVisible();
  await expect(page.locator(".ks-checks")).toBeVisible();
  await page.keyboard.press("f");
  await expect(page.locator(".ks-canvas")).not.toHaveAttribute("data-view-moving");
}

const details = (page: Page) => page.locator(".ks-details");

async function select(page: Page, elementId: string) {
  await page.locator(`.react-flow__node[data-id="${elementId}"]`).click();
}

async function setField(page: Page, label: string, value: string) {
  const field = details(page).getByLabel(label, { exact: true });
  await field.fill(value);
  await field.press("Enter");
}

test("sizing the Tarn Head line lists every candidate with why it passes or fails, and one click applies the choice", async ({ page }, testInfo) => {
  test.setTimeout(120_000);
  const noErrors = failOnConsoleErrors(page);
  await signIn(page, "editor");
  await uploadCopy(page, "tarnHeadCalderFlats.json", `Sizing copy ${testInfo.retry}-${Date.now()}`);
  await select(page, "l-fell");
  await details(page).getByText("Size this conductor").click();
  await details(page).getByLabel("Fault clearing time (s)").fill("0.5");
  await details(page).getByRole("button", { name: "List candidates" }).click();

  const table = details(page).locator("table.ks-sizing-table");
  await expect(table).toBeVisible();
  const rows = table.locator("tbody tr");
  // Every overhead conductor of the library, and the 66 kV cables.
  expect(await rows.count()).toBeGreaterThanOrEqual(8);
  for (const row of await rows.all()) {
    await expect(row).toContainText(/loading: carries \d+ A of its \d+ A/);
    await expect(row).toContainText(/withstand: [\d.]+ kA for 0\.5 s needs \d+ mm²; it has \d+ mm²/);
    await expect(row.getByRole("cell").nth(0)).toHaveText(/passes|fails/);
  }
  // The lightest conductor fails on the voltage at the town, and says where.
  const partridge = rows.filter({ hasText: "ACSR Partridge" });
  await expect(partridge).toContainText("fails");
  await expect(partridge).toContainText(/voltage: .* is outside 0\.94–1\.06 pu/);
  const cheapest = rows.filter({ has: page.getByLabel("cheapest that passes") });
  await expect(cheapest).toHaveCount(1);
  await expect(cheapest).toContainText("passes");
  // The type's name is the row heading's own text, beside the star and the note of its source.
  const label = await cheapest.getByRole("rowheader").evaluate((cell) =>
    [...cell.childNodes]
      .filter((node) => node.nodeType === Node.TEXT_NODE)
      .map((node) => node.textContent)
      .join("")
      .trim(),
  );
  await page.screenshot({ path: testInfo.outputPath("sizing.png"), fullPage: true });

  const ampacity = Number(/carries \d+ A of its (\d+) A/.exec(await cheapest.innerText())![1]);
  await cheapest.getByRole("button", { name: "Apply" }).click();
  await expect(details(page).getByRole("status").filter({ hasText: `Applied ${label}.` })).toBeVisible();
  await expect(details(page).getByLabel("Ampacity", { exact: true })).toHaveValue(String(ampacity));
  noErrors();
});

test("Details sets a converter plant, a regulating tap changer and a minimum fault level, and refuses what the file would not take", async ({ page }, testInfo) => {
  test.setTimeout(120_000);
  const noErrors = failOnConsoleErrors(page);
  await signIn(page, "editor");
  await uploadCopy(page, "hollinMoorSolar.json", `Equipment copy ${testInfo.retry}-${Date.now()}`);

  // The converter plant: its kind, its fault current and the SCR the planner asks of its connection.
  await select(page, "g-solar");
  await expect(details(page).getByLabel("Kind")).toHaveValue("converter");
  await expect(details(page).getByLabel("Maximum short-circuit current (of rated)", { exact: true })).toHaveValue("120");
  await setField(page, "Lowest short-circuit ratio asked", "0.01");
  await expect(details(page).getByText("Lowest short-circuit ratio asked must be 0.1 or more")).toBeVisible();
  await setField(page, "Lowest short-circuit ratio asked", "60");
  const checks = page.locator(".ks-checks");
  await expect(checks).toContainText(/short-circuit ratio [\d.]+ at its bus is below 60 asked of it/);
  await setField(page, "Lowest short-circuit ratio asked", "");
  await expect(checks).not.toContainText("asked of it, a weak connection");
  await details(page).getByLabel("Control").selectOption("pf");
  await expect(details(page).getByLabel("Power factor (+ supplies Q, − absorbs)", { exact: true })).toBeVisible();
  await setField(page, "Power factor (+ supplies Q, − absorbs)", "0.95");

  // The minimum fault level asked of the collector bus.
  await select(page, "b-hollin-33");
  await setField(page, "Minimum fault level asked S″k3 min", "100000 MVA");
  await expect(checks).toContainText(/minimum fault level S"k3min = \d+ MVA is below the 100000 MVA asked of it/);
  await setField(page, "Minimum fault level asked S″k3 min", "150 MVA");

  // The export transformer gains an on-load tap changer holding the collector bus.
  await select(page, "t-hollin");
  const regulates = details(page).getByLabel("Regulates the voltage of");
  await expect(regulates).toHaveValue("");
  await regulates.selectOption("b-hollin-33");
  await expect(details(page).getByLabel("Target voltage", { exact: true })).toHaveValue("1");
  await expect(details(page).getByLabel("Band (whole width)", { exact: true })).toHaveValue("0.025");
  await expect(details(page).getByRole("status").filter({ hasText: "Holds Hollin Moor 33 kV collector at 1 ± 0.0125 pu" })).toBeVisible();
  await setField(page, "Band (whole width)", "0.6");
  await expect(details(page).getByText("Band (whole width) must be 0.5 or less")).toBeVisible();
  await setField(page, "Band (whole width)", "0.005");
  await expect(details(page).getByText(/narrower than one tap step \(about 0\.0125 pu\)/)).toBeVisible();
  await setField(page, "Target voltage", "1.9");
  await expect(details(page).getByText("Target voltage must be 1.5 or less")).toBeVisible();
  await setField(page, "Target voltage", "1.02");
  await setField(page, "Highest tap", "-12");
  await expect(details(page)).toContainText("its highest tap -12 % must be above its lowest -10 %");
  await setField(page, "Highest tap", "10");
  await expect(details(page)).not.toContainText("must be above its lowest");
  await page.getByRole("tab", { name: "Branches" }).click();
  await expect(page.getByRole("row").filter({ hasText: "Hollin Moor export transformer" })).toContainText(/regulat/);
  await page.screenshot({ path: testInfo.outputPath("equipment-details.png"), fullPage: true });

  await regulates.selectOption("");
  await expect(details(page).getByLabel("Target voltage", { exact: true })).toHaveCount(0);
  noErrors();
});

test("the ladder sizes each alternative's conductor and says which one and why", async ({ page }, testInfo) => {
  test.setTimeout(240_000);
  const noErrors = failOnConsoleErrors(page);
  await signIn(page, "editor");
  await uploadCopy(page, "tarnHeadCalderFlats.json", `Ladder sizing copy ${testInfo.retry}-${Date.now()}`);
  await page.getByRole("link", { name: "Voltage ladder" }).click();
  await expect(page.getByRole("heading", { name: "Voltage ladder", level: 1 })).toBeVisible();
  await page.getByRole("button", { name: "Re-rate the section of Calder Flats 66 kV" }).click();
  const chips = page.getByRole("group", { name: /IEC 60038 voltages/ }).getByRole("button");
  for (const chip of await chips.all()) {
    const voltageKV = Number((await chip.innerText()).match(/([\d.]+) kV/)![1]);
    if (((await chip.getAttribute("aria-pressed")) === "true") !== [66, 132].includes(voltageKV)) await chip.click();
  }
  await page.getByLabel(/Size the section's conductor for each voltage/).check();
  await page.getByLabel("Fault clearing time, s").fill("none");
  await page.getByRole("button", { name: "Run the ladder" }).click();
  await expect(page.getByRole("alert")).toContainText('"none" is not a number');
  await page.getByLabel("Fault clearing time, s").fill("0.5");
  await page.getByRole("button", { name: "Run the ladder" }).click();

  const results = page.getByRole("region", { name: "Alternatives side by side" });
  await expect(results.getByRole("rowgroup").filter({ hasText: "Section conductor" })).toBeVisible({ timeout: 60_000 });
  const conductorRow = results.getByRole("row").filter({ has: page.getByRole("rowheader", { name: "Conductor", exact: true }) });
  await expect(conductorRow.getByRole("cell")).toHaveCount(2);
  for (const cell of await conductorRow.getByRole("cell").all()) await expect(cell).toContainText(/^ACSR /);
  const why = results.getByRole("row").filter({ has: page.getByRole("rowheader", { name: "Why this one" }) });
  await expect(why.getByRole("cell").first()).toContainText(/the cheapest over its life of the \d+ library overhead conductors that pass at 66 kV/);
  await expect(why.getByRole("cell").nth(1)).toContainText(/needs \d+ mm²; it has \d+ mm²/);
  await expect(results.getByText("from unit costs, line by its sized conductor").first()).toBeVisible();
  await expect(results.getByRole("status").filter({ hasText: "Recommended:" })).toBeVisible();
  await page.screenshot({ path: testInfo.outputPath("ladder-sizing.png"), fullPage: true });
  noErrors();
});
