// The sheet's case picker on the demo hydro study: each operating case's readings on the drawing
// and in Results are the study's own numbers for that case (checked against the study API), a
// case's outage is marked on the sheet, and the envelope shows each bus's lowest and highest
// voltage with the case that sets it.
import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page } from "@playwright/test";
import { readingNumber } from "../../app/lib/format.ts";
import { signIn } from "./accounts.ts";
import { failOnConsoleErrors } from "./consoleErrors.ts";
import { countReactCommits, hydrated } from "./hydration.ts";

const TARN_HEAD = "Tarn Head to Calder Flats (fictional)";

const busReadings = (page: Page, busId: string) => page.locator(`.react-flow__node[data-id="${busId}"] .ks-readings`);

test("the case picker shows one operating case, marks what it takes out, and shows the envelope", async ({ page }, testInfo) => {
  test.setTimeout(120_000);
  const noErrors = failOnConsoleErrors(page);
  await countReactCommits(page);
  await signIn(page, "viewer");
  await page.getByRole("link", { name: TARN_HEAD }).click();
  await page.waitForURL(/\/networks\/\d+$/);
  await hydrated(page);
  const networkId = /\/networks\/(\d+)$/.exec(page.url())![1];
  await expect(page.locator(".ks-checks")).toContainText("Solved in the browser");

  const picker = page.getByLabel("Case", { exact: true });
  await expect(picker).toHaveValue("as-drawn");
  await expect(picker.locator("option")).toHaveText([
    "As drawn",
    "Winter peak",
    "Summer light load, capacitor in",
    "Town feeder out, mine at peak",
    "Envelope of all cases",
  ]);
  const asDrawn = await busReadings(page, "b-calder-11").innerText();

  // The study of the saved revision, as the study page and the API run it: the reference.
  const study = await (await page.request.post(`/api/networks/${networkId}/study`, { data: {} })).json();
  const caseBus = (caseId: string, busId: string) =>
    study.cases.find((c: { id: string }) => c.id === caseId).loadFlow.buses.find((b: { id: string }) => b.id === busId);

  await picker.selectOption({ label: "Summer light load, capacitor in" });
  await expect(page.locator("#ks-results-title")).toHaveText("Results · Summer light load, capacitor in");
  const light = caseBus("summer-light", "b-calder-11");
  await expect(busReadings(page, "b-calder-11")).toContainText(`${readingNumber(light.vKV, "kV")} kV`);
  expect(await busReadings(page, "b-calder-11").innerText()).not.toBe(asDrawn);
  await page.getByRole("tab", { name: "Buses" }).click();
  await expect(page.getByRole("row", { name: /Calder Flats 11 kV/ })).toContainText(readingNumber(light.vKV, "kV"));
  await expect(page.locator(".ks-checks")).toContainText("Operating case “Summer light load, capacitor in”");

  await picker.selectOption({ label: "Town feeder out, mine at peak" });
  await expect(page.locator(".ks-left-out-mark", { hasText: "out in this case" })).toHaveCount(3);
  await expect(page.locator('.react-flow__node[data-id="l-town"] .ks-left-out-mark')).toHaveText("out in this case");
  await expect(page.locator(".ks-checks")).toContainText(/3 elements are out of service or without supply .*7(\.0+)? MW of load without supply/);
  const mineBus = caseBus("town-feeder-out", "b-mine");
  await expect(busReadings(page, "b-mine")).toContainText(`${readingNumber(mineBus.vKV, "kV")} kV`);
  await page.screenshot({ path: testInfo.outputPath("case-town-feeder-out.png") });

  await picker.selectOption({ label: "Envelope of all cases" });
  await expect(page.locator("#ks-results-title")).toHaveText("Results · envelope of all cases");
  const envelope = study.envelope.buses.find((b: { id: string }) => b.id === "b-town");
  const caseName = (id: string) => study.cases.find((c: { id: string }) => c.id === id).name;
  await expect(busReadings(page, "b-town")).toContainText(`lowest ${readingNumber(envelope.vMinPu, "pu")} pu · ${caseName(envelope.vMinCase)}`);
  await expect(busReadings(page, "b-town")).toContainText(`highest ${readingNumber(envelope.vMaxPu, "pu")} pu · ${caseName(envelope.vMaxCase)}`);
  const envelopeTable = page.getByRole("table", { name: /Bus voltage envelope/ });
  await expect(envelopeTable.getByRole("row", { name: /Calder Flats town 11 kV/ })).toContainText(caseName(envelope.vMinCase));
  await page.getByRole("tab", { name: "Branches" }).click();
  await expect(page.getByRole("table", { name: /Branch loading envelope/ }).getByRole("row", { name: /Calder Flats/ }).first()).toContainText(
    /Winter peak|Summer light|Town feeder out/,
  );
  await expect(page.locator(".ks-checks")).toContainText(/in all 3 cases|in \d of 3 cases/);
  await page.screenshot({ path: testInfo.outputPath("case-envelope.png") });
  const scan = await new AxeBuilder({ page }).include(".ks-toolbar").include(".ks-results").withTags(["wcag2a", "wcag2aa"]).analyze();
  expect(scan.violations.filter((v) => v.impact === "serious" || v.impact === "critical").map((v) => v.id)).toEqual([]);

  await picker.selectOption({ label: "As drawn" });
  await expect(page.locator("#ks-results-title")).toHaveText("Results");
  await expect.poll(() => busReadings(page, "b-calder-11").innerText()).toBe(asDrawn);
  noErrors();
});
