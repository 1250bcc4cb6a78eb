// The voltage ladder from a planner's side: from the demo network to the three alternatives side
// by side, the recommendation, the saved study and the printed report. Screenshots (screen and
// print) and the report as a PDF are kept under test-results/ for a person to look at.
import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page } from "@playwright/test";
import { signIn } from "./accounts.ts";

const TARN_HEAD = "Tarn Head to Calder Flats (fictional)";

async function expectNoSeriousAccessibilityProblems(page: Page) {
  const scan = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
  const serious = scan.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(" ")).join(", ")})`);
  expect(serious, `accessibility problems on ${page.url()}`).toEqual([]);
}

function voltageChip(page: Page, voltageKV: number) {
  return page.getByRole("group", { name: /IEC 60038 voltages/ }).getByRole("button", { name: new RegExp(`^${voltageKV} kV`) });
}

async function chooseVoltages(page: Page, wanted: number[]) {
  const chips = page.getByRole("group", { name: /IEC 60038 voltages/ }).getByRole("button");
  for (const chip of await chips.all()) {
    const voltageKV = Number((await chip.innerText()).match(/([\d.]+) kV/)![1]);
    const pressed = (await chip.getAttribute("aria-pressed")) === "true";
    if (pressed !== wanted.includes(voltageKV)) await chip.click();
  }
  for (const kv of wanted) await expect(voltageChip(page, kv)).toHaveAttribute("aria-pressed", "true");
}

async function chartsDrawn(page: Page, count: number) {
  // recharts draws its surface once the page has hydrated and measured its container.
  await expect(page.locator("figure.ks-plot svg.recharts-surface")).toHaveCount(count);
  await page.evaluate(() => document.fonts.ready);
}

test("the editor runs the Tarn Head ladder at 33, 66 and 132 kV from the network, saves it and prints the study report", async ({ page }, testInfo) => {
  test.setTimeout(180_000);
  await signIn(page, "editor");
  await page.getByRole("link", { name: TARN_HEAD }).click();
  await page.getByRole("link", { name: "Voltage ladder" }).click();
  await expect(page.getByRole("heading", { name: "Voltage ladder", level: 1 })).toBeVisible();

  // The section is picked by clicking one of its buses on the drawing.
  await page.getByRole("button", { name: "Re-rate the section of Calder Flats 66 kV" }).click();
  await expect(page.getByLabel("Bus of the section")).toHaveValue("b-calder-66");
  await expect(page.getByText("HV of Tarn Head step-up, HV of Calder Flats step-down")).toBeVisible();
  await chooseVoltages(page, [33, 66, 132]);

  await page.getByRole("button", { name: "Run the ladder" }).click();
  const results = page.getByRole("region", { name: "Alternatives side by side" });
  await expect(results.getByRole("heading", { name: "Alternatives side by side" })).toBeVisible({ timeout: 30_000 });
  await expect(results.getByRole("columnheader", { name: /^33 kV.*Cannot carry the load/ })).toBeVisible();
  await expect(results.getByRole("columnheader", { name: /^66 kV.*Within limits.*Lowest total cost/ })).toBeVisible();
  // 132 kV re-taps its regulating transformer and keeps every limit: it loses on money alone.
  await expect(results.getByRole("columnheader", { name: /^132 kV.*Within limits/ })).toBeVisible();
  await expect(results.getByText(/The network cannot carry its load/)).toBeVisible();
  await expect(results.getByRole("status").filter({ hasText: "Recommended: 66 kV" })).toContainText("lowest total cost");
  await expect(results.getByRole("status").filter({ hasText: "Recommended: 66 kV" })).toContainText("Decided by the case Winter peak");
  await chartsDrawn(page, 3);
  await page.screenshot({ path: testInfo.outputPath("ladder.png"), fullPage: true });
  await expectNoSeriousAccessibilityProblems(page);

  await page.getByRole("button", { name: "Save the study" }).click();
  await expect(page.getByRole("status").filter({ hasText: "The study as saved by Ewan Pickles" })).toBeVisible();

  await page.getByRole("link", { name: "Study report" }).click();
  await expect(page.getByRole("heading", { name: TARN_HEAD, level: 1 })).toBeVisible();
  await expect(page.getByText("Kilostep study report")).toBeVisible();
  const ladder = page.getByRole("region", { name: "6. Voltage ladder" });
  await expect(ladder.getByText("Recommended: 66 kV")).toBeVisible();
  await expect(ladder.getByRole("columnheader", { name: /^33 kV.*Cannot carry the load/ })).toBeVisible();
  await expect(page.getByRole("img", { name: `Single-line drawing of ${TARN_HEAD}` })).toBeVisible();
  await expect(page.getByRole("region", { name: "8. Cautions" })).toContainText("not a protection study");
  const studyPart = page.getByRole("region", { name: "5. Operating cases, outages and years" });
  await expect(studyPart.getByRole("heading", { name: "Outages (N-1)" })).toBeVisible();
  await expect(studyPart.getByText(/The network stops carrying its load in year \d+|carries its load in every case/)).toBeVisible();
  await expect(page.getByRole("button", { name: "Print" })).toBeVisible();
  await chartsDrawn(page, 3);
  await page.screenshot({ path: testInfo.outputPath("report.png"), fullPage: true });
  await expectNoSeriousAccessibilityProblems(page);

  await page.emulateMedia({ media: "print" });
  await expect(page.getByRole("button", { name: "Print" })).toBeHidden();
  await expect(page.getByRole("navigation", { name: "Main" })).toBeHidden();
  await page.screenshot({ path: testInfo.outputPath("report-print.png"), fullPage: true });
  const pdf = await page.pdf({ format: "A4", printBackground: true, path: testInfo.outputPath("report-a4.pdf") });
  expect(pdf.subarray(0, 5).toString()).toBe("%PDF-");
  await page.pdf({ format: "Letter", printBackground: true, path: testInfo.outputPath("report-letter.pdf") });
});

test("a viewer runs the ladder but is offered no save, and may open the report", async ({ page }) => {
  test.setTimeout(120_000);
  await signIn(page, "viewer");
  await page.getByRole("link", { name: TARN_HEAD }).click();
  await page.getByRole("link", { name: "Voltage ladder" }).click();
  await expect(page.getByRole("heading", { name: "Voltage ladder", level: 1 })).toBeVisible();
  await expect(page.getByRole("button", { name: "Save the study" })).toHaveCount(0);
  await expect(page.getByText(/saving needs an editor/)).toBeVisible();

  await page.getByLabel("Another voltage").fill("33000");
  await page.getByRole("button", { name: "Add voltage" }).click();
  await expect(page.getByText("33000 kV is above 1200 kV; enter kilovolts (33, not 33000).")).toBeVisible();

  await page.getByRole("button", { name: "Run the ladder" }).click();
  await expect(page.getByRole("region", { name: "Alternatives side by side" }).getByRole("columnheader", { name: /^66 kV.*Within limits/ })).toBeVisible({
    timeout: 30_000,
  });
  await page.getByRole("link", { name: "Study report" }).click();
  await expect(page.getByRole("heading", { name: TARN_HEAD, level: 1 })).toBeVisible();
});
