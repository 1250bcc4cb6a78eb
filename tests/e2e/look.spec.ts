// Screenshots of the main pages (kept under test-results/ for a person to look at) and an
// accessibility scan of each: labels, contrast, landmarks, names of controls.
import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page, type TestInfo } from "@playwright/test";
import { signIn } from "./accounts.ts";

async function lookAt(page: Page, testInfo: TestInfo, file: string, options: { scan: boolean } = { scan: true }) {
  await page.evaluate(() => document.fonts.ready);
  await page.screenshot({ path: testInfo.outputPath(file), fullPage: true });
  if (!options.scan) return;
  const scan = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
  const serious = scan.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(" ")).join(", ")})`);
  expect(serious, `accessibility problems on ${page.url()}`).toEqual([]);
}

test("sign-in page", async ({ page }, testInfo) => {
  await page.goto("/sign-in");
  await lookAt(page, testInfo, "sign-in.png");
  const family = await page.locator("body").evaluate((el) => getComputedStyle(el).fontFamily);
  expect(family).toMatch(/^"?Barlow"?/);
  expect(await page.evaluate(() => document.fonts.check('16px "Barlow"'))).toBe(true);
});

test("home page", async ({ page }, testInfo) => {
  await page.goto("/");
  await lookAt(page, testInfo, "home.png");
});

test("networks, a network and a team, as the owner", async ({ page }, testInfo) => {
  await signIn(page, "owner");
  await lookAt(page, testInfo, "networks.png");
  await page.getByRole("link", { name: "Tarn Head to Calder Flats (fictional)" }).click();
  await expect(page.getByRole("heading", { name: "Tarn Head to Calder Flats (fictional)", level: 1 })).toBeVisible();
  // The network page is the sheet's; its own tests scan it, this one only keeps the picture.
  await lookAt(page, testInfo, "network.png", { scan: false });
  await page.getByRole("link", { name: "Calder Valley Planning" }).first().click();
  await expect(page.getByRole("heading", { name: "Members" })).toBeVisible();
  await lookAt(page, testInfo, "team.png");
});

test("networks on a phone-sized screen keep to the screen's width", async ({ page }, testInfo) => {
  await page.setViewportSize({ width: 390, height: 844 });
  await signIn(page, "owner");
  await lookAt(page, testInfo, "networks-phone.png");
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
  expect(overflow).toBeLessThanOrEqual(0);
});

test("every control is reachable by keyboard with a visible focus ring", async ({ page }) => {
  await page.goto("/sign-in");
  await page.keyboard.press("Tab");
  await expect(page.getByRole("link", { name: "Skip to the page" })).toBeFocused();
  await page.keyboard.press("Tab");
  const outline = await page.evaluate(() => {
    const el = document.activeElement as HTMLElement;
    const style = getComputedStyle(el);
    return { style: style.outlineStyle, width: parseFloat(style.outlineWidth) };
  });
  expect(outline.style).toBe("solid");
  expect(outline.width).toBeGreaterThanOrEqual(2);
});
