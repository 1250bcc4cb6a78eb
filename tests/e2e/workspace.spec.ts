// The workspace at three window sizes: no sideways page scroll anywhere, the drawing taking most
// of the window, undo that owns Ctrl+Z even in a Details field, and a draft that the server
// keeps (a cleared browser still opens it). Screenshots of each size are kept for a person.
import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page } from "@playwright/test";
import { signIn } from "./accounts.ts";
import { failOnConsoleErrors } from "./consoleErrors.ts";

const DEMO = "Tarn Head to Calder Flats (fictional)";
const sizes = [
  { width: 390, height: 844 },
  { width: 1280, height: 720 },
  { width: 1440, height: 900 },
];

const sidewaysScroll = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);

async function openDemo(page: Page) {
  await page.getByRole("link", { name: DEMO }).click();
  await expect(page.getByRole("heading", { name: DEMO, level: 1 })).toBeVisible();
  await expect(page.locator(".ks-checks")).toBeVisible();
  await expect(page.locator('.react-flow__node[data-id="b-town"] .ks-readings')).toBeVisible();
}

async function seriousAccessibilityProblems(page: Page) {
  const scan = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
  return scan.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(" ")).join(", ")})`);
}

for (const size of sizes) {
  test(`the sheet at ${size.width}×${size.height}: no sideways scroll, the drawing in view, readings at Fit`, async ({ page }, testInfo) => {
    const noErrors = failOnConsoleErrors(page);
    await page.setViewportSize(size);
    await signIn(page, "owner");
    await openDemo(page);
    await page.evaluate(() => document.fonts.ready);
    expect(await sidewaysScroll(page)).toBeLessThanOrEqual(0);
    const canvas = await page.locator(".ks-canvas").boundingBox();
    expect(canvas!.width).toBeGreaterThan(size.width * 0.5);
    if (size.width >= 1280) {
      expect(canvas!.height / size.height).toBeGreaterThanOrEqual(0.6);
      // Results sit beside the drawing's lower edge, on screen with it.
      const results = await page.locator(".ks-results").boundingBox();
      expect(results!.y).toBeLessThan(size.height);
      // Results open tall enough for several whole rows, not one, before the splitter is touched.
      const wholeRows = await page.evaluate(() => {
        const panel = document.querySelector(".ks-results-panel")!.getBoundingClientRect();
        return [...document.querySelectorAll(".ks-results-panel tbody tr")].filter((row) => row.getBoundingClientRect().bottom <= panel.bottom + 1).length;
      });
      expect(wholeRows).toBeGreaterThanOrEqual(3);
    }
    if (size.width < 768) {
      // On a phone Results are a list of cards, those beyond or near a limit first, under Checks.
      const cards = page.locator(".ks-result-card");
      await expect(cards.first()).toBeVisible();
      expect(await page.locator(".ks-results-panel table").count()).toBe(0);
      await expect(cards.first()).toContainText(/near a limit|beyond a limit/);
      const checksTop = (await page.locator(".ks-checks").boundingBox())!.y;
      expect(checksTop).toBeLessThan((await page.locator(".ks-results").boundingBox())!.y);
    }
    // At Fit a reading's first line (the one kept when zoomed out) is drawn at least 9 px high.
    const readingPx = await page
      .locator('.react-flow__node[data-id="b-town"] .ks-readings > div')
      .first()
      .evaluate((el) => el.getBoundingClientRect().height);
    expect(readingPx).toBeGreaterThanOrEqual(9);
    await page.screenshot({ path: testInfo.outputPath(`workspace-${size.width}x${size.height}.png`) });
    expect(await seriousAccessibilityProblems(page)).toEqual([]);
    noErrors();
  });
}

test("every page keeps to a phone's width", async ({ page }) => {
  test.setTimeout(180_000);
  await page.setViewportSize({ width: 390, height: 844 });
  await page.goto("/");
  expect(await sidewaysScroll(page), "/").toBeLessThanOrEqual(0);
  await page.goto("/sign-in");
  expect(await sidewaysScroll(page), "/sign-in").toBeLessThanOrEqual(0);
  await signIn(page, "owner");
  expect(await sidewaysScroll(page), "/networks").toBeLessThanOrEqual(0);
  await openDemo(page);
  const network = new URL(page.url()).pathname;
  for (const path of [
    network,
    `${network}/ladder`,
    `${network}/report`,
    `${network}/revisions`,
    `${network}/share`,
    `${network}/loads-import`,
    "/networks/upload",
    "/teams",
    "/teams/new",
    "/account",
    "/docs/api",
  ]) {
    await page.goto(path);
    await page.waitForLoadState("networkidle");
    expect(await sidewaysScroll(page), path).toBeLessThanOrEqual(0);
  }
  await page.goto("/teams");
  await page.getByRole("link", { name: "Calder Valley Planning" }).first().click();
  await page.waitForLoadState("networkidle");
  expect(await sidewaysScroll(page), "team").toBeLessThanOrEqual(0);
  const team = new URL(page.url()).pathname;
  await page.goto(`${team}/library`);
  expect(await sidewaysScroll(page), "library").toBeLessThanOrEqual(0);
});

test("Ctrl+Z after a Tab puts the value back in the field and the next Tab saves nothing else", async ({ page }) => {
  const noErrors = failOnConsoleErrors(page);
  await page.setViewportSize({ width: 1440, height: 900 });
  await signIn(page, "editor");
  await openDemo(page);
  await page.locator('.react-flow__node[data-id="ld-town"]').click();
  const p = page.locator(".ks-details").getByLabel("Active power P", { exact: true });
  await expect(p).toHaveValue("7");
  await p.fill("400 MW");
  await page.keyboard.press("Tab");
  await expect(p).toHaveValue("400");
  await page.keyboard.press("Control+z");
  await expect(p).toHaveValue("7");
  await page.keyboard.press("Tab");
  await expect(p).toHaveValue("7");
  await expect(page.locator(".ks-save")).toContainText("Saved", { timeout: 15_000 });
  const saved = await (await page.request.get(page.url().replace("/networks/", "/api/networks/"))).json();
  expect(saved.document.loads.find((load: { id: string }) => load.id === "ld-town").pMW).toBe(7);
  // Ctrl+Y (and Ctrl+Shift+Z) redo from a field too.
  await p.focus();
  await page.keyboard.press("Control+y");
  await expect(p).toHaveValue("400");
  await page.keyboard.press("Control+Shift+z");
  await page.keyboard.press("Control+z");
  await expect(p).toHaveValue("7");
  noErrors();
});

test("an unfinished drawing is kept by the server: a cleared browser opens it, its complete part still reads", async ({ browser }) => {
  test.setTimeout(150_000);
  const first = await browser.newContext({ viewport: { width: 1440, height: 900 } });
  const page = await first.newPage();
  await signIn(page, "editor");
  await openDemo(page);
  // Key 7 places a load in the middle of the view, connected to nothing.
  await page.keyboard.press("7");
  await expect(page.locator(".ks-save")).toContainText("Saved as a draft", { timeout: 15_000 });
  await expect(page.locator(".ks-left-out")).toHaveCount(1);
  await expect(page.locator('.react-flow__node[data-id="b-town"] .ks-readings')).toBeVisible();
  const url = page.url();
  const saved = await (await page.request.get(url.replace("/networks/", "/api/networks/"))).json();
  const solved = await page.request.post(url.replace("/networks/", "/api/networks/") + "/solve");
  expect(solved.status()).toBe(422);
  expect((await solved.json()).problems.length).toBeGreaterThan(0);
  await first.close();

  // A fresh browser: nothing in its storage, the draft comes from the server.
  const second = await browser.newContext({ viewport: { width: 1440, height: 900 } });
  const fresh = await second.newPage();
  await signIn(fresh, "editor");
  await fresh.goto(url);
  await expect(fresh.locator(".ks-save")).toContainText("Saved as a draft");
  await expect(fresh.locator(".ks-left-out")).toHaveCount(1);
  expect(await fresh.evaluate(() => Object.keys(localStorage).filter((k) => k.startsWith("kilostep:draft")).length)).toBe(0);
  expect(saved.document.loads.length + saved.document.shunts.length + saved.document.sources.length).toBeGreaterThan(3);
  await second.close();
});
