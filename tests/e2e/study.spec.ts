// The study from a planner's side: the demo's three operating cases with N-1 and the years of
// load growth, the envelope and the case that sets each extreme, a CSV download, and the case
// editor (a bad field named, a case added, studied and removed again). Screenshots are kept under
// test-results/ for a person to look at.
import AxeBuilder from "@axe-core/playwright";
import { readFileSync } from "node:fs";
import { expect, test, type Page } from "@playwright/test";
import { signIn } from "./accounts.ts";
import { countReactCommits, hydrated } from "./hydration.ts";

const TARN_HEAD = "Tarn Head to Calder Flats (fictional)";

async function expectNoSeriousAccessibilityProblems(page: Page) {
  const scan = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
  const serious = scan.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(" ")).join(", ")})`);
  expect(serious, `accessibility problems on ${page.url()}`).toEqual([]);
}

async function openStudy(page: Page) {
  await page.getByRole("link", { name: TARN_HEAD }).click();
  await page.waitForURL(/\/networks\/\d+$/);
  await hydrated(page);
  await page.getByRole("link", { name: "Study", exact: true }).click();
  await page.waitForURL(/\/study$/);
  await expect(page.getByRole("heading", { name: "Study", level: 1 })).toBeVisible();
}

test("the editor studies the demo's cases with N-1 and growth, downloads the N-1 table, and adds, studies and removes a case", async ({ page }, testInfo) => {
  test.setTimeout(180_000);
  await countReactCommits(page);
  await signIn(page, "editor");
  await openStudy(page);
  await expect(page.getByText(/3 operating cases: Winter peak \(2,200 h\)/)).toBeVisible();

  // The cases alone run as the page opens.
  await expect(page.getByRole("heading", { name: "Envelope across the cases" })).toBeVisible({ timeout: 30_000 });
  const buses = page.getByRole("table", { name: "Bus voltages" });
  await expect(buses.getByRole("row", { name: /Calder Flats town 11 kV/ })).toContainText(/Winter peak|Summer light|Town feeder out/);

  // N-1 and the years, asked for in the form.
  await page.getByLabel(/Outages \(N-1\)/).check();
  await page.getByLabel(/Years of load growth/).check();
  await page.getByRole("button", { name: "Run the study" }).click();
  await expect(page).toHaveURL(/outages=on/);
  await expect(page.getByRole("heading", { name: "Outages (N-1)" })).toBeVisible({ timeout: 60_000 });
  const outages = page.getByRole("table", { name: /Each line and transformer out in turn/ });
  const townOut = outages.getByRole("row", { name: /Town feeder.*Winter peak/ });
  await expect(townOut).toContainText("7");
  await expect(page.getByText(/No substation has transformers in parallel/)).toBeVisible();
  await expect(page.getByRole("heading", { name: "Years of load growth" })).toBeVisible();
  await expect(page.getByText(/Load grows 2\.0 % a year, compounded/)).toBeVisible();
  await page.screenshot({ path: testInfo.outputPath("study.png"), fullPage: true });
  await expectNoSeriousAccessibilityProblems(page);

  const [download] = await Promise.all([page.waitForEvent("download"), page.locator("section", { has: page.getByRole("heading", { name: "Outages (N-1)" }) }).getByRole("link", { name: "CSV" }).first().click()]);
  expect(download.suggestedFilename()).toMatch(/study-outages\.csv$/);
  const csv = readFileSync((await download.path())!, "utf8");
  expect(csv.split("\r\n")[0]).toMatch(/^case_id,element_out,element_out_name,kind,lost_load_MW/);
  expect(csv).toMatch(/winter-peak,l-town,[^\r\n]*,line,7,/);

  // A bad form is named field by field, and nothing is saved.
  await page.getByRole("link", { name: "Edit operating cases" }).click();
  await expect(page.getByRole("heading", { name: "Operating cases", level: 1 })).toBeVisible();
  await hydrated(page);
  await page.getByRole("link", { name: "New case" }).click();
  await page.getByLabel("Scale of every load").fill("lots");
  await page.getByRole("button", { name: "Add the case" }).click();
  const problems = page.getByRole("alert");
  await expect(problems).toContainText("Give the case a name");
  await expect(problems).toContainText("“lots” is not a number");

  await page.getByLabel(/^Name/).fill("Spring evening");
  await page.getByLabel("Scale of every load").fill("0.7");
  await page.getByRole("group", { name: "Sources" }).getByLabel(/in this case/).selectOption("set");
  await page.getByLabel(/: voltage in pu/).fill("1.01");
  await page.getByText(/^Out of service \(/).click();
  await page.getByLabel(/Calder Flats capacitor bank/).check();
  await page.getByRole("button", { name: "Add the case" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Operating case “Spring evening” added" })).toBeVisible();
  await expect(page.getByRole("row", { name: /Spring evening/ })).toContainText("× 0.7");
  await page.screenshot({ path: testInfo.outputPath("cases.png"), fullPage: true });
  await expectNoSeriousAccessibilityProblems(page);

  // The new case is studied with the others.
  await page.getByRole("link", { name: "Run the study" }).click();
  await hydrated(page);
  await expect(page.getByRole("table", { name: /in each case/ }).getByRole("columnheader", { name: "Spring evening" })).toBeVisible({ timeout: 30_000 });

  // And removed again, leaving the demo as it was.
  await page.goBack();
  await hydrated(page);
  await page.getByRole("button", { name: "Remove Spring evening" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Operating case “Spring evening” removed" })).toBeVisible();
  await expect(page.getByRole("row", { name: /Spring evening/ })).toHaveCount(0);
});

test("a viewer reads the study and the cases but is offered no editing", async ({ page }) => {
  await countReactCommits(page);
  await signIn(page, "viewer");
  await openStudy(page);
  await expect(page.getByRole("heading", { name: "Envelope across the cases" })).toBeVisible({ timeout: 30_000 });
  await expect(page.getByRole("link", { name: "Edit operating cases" })).toHaveCount(0);
  await page.goto(page.url().replace(/\/study.*$/, "/study?years=on&rate=500&horizon=20"));
  await expect(page.getByText("The growth rate must be at most 100 %.").first()).toBeVisible();
});
