// Exchange and hardening in the browser, against the built app: uploading a network file,
// importing loads, the team library, API tokens, the security headers and the content security
// policy (no page may trip it), and writes from other sites refused.
import { readFileSync } from "node:fs";
import { join } from "node:path";
import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page } from "@playwright/test";
import { signIn } from "./accounts.ts";
import { countReactCommits, hydrated } from "./hydration.ts";

const fixtures = join(import.meta.dirname, "..", "fixtures");
const tarnHead = readFileSync(join(fixtures, "tarn-head-calder-flats.json"), "utf8");

/** Console errors and CSP violations a page reports while the test uses it. */
function watchConsole(page: Page): string[] {
  const problems: string[] = [];
  page.on("console", (message) => {
    if (message.type() === "error") problems.push(message.text());
  });
  page.on("pageerror", (error) => problems.push(error.message));
  return problems;
}

async function noSeriousAccessibilityProblems(page: Page) {
  const scan = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
  const serious = scan.violations.filter((v) => v.impact === "serious" || v.impact === "critical").map((v) => `${v.id}: ${v.help}`);
  expect(serious, `accessibility problems on ${page.url()}`).toEqual([]);
}

/** Uploads a network file through the page and returns the new network's id. */
async function uploadNetwork(page: Page, name: string): Promise<number> {
  await page.goto("/networks");
  await page.getByRole("link", { name: "Upload a network file" }).click();
  const document = { ...JSON.parse(tarnHead), name };
  await page.getByLabel("Network file").setInputFiles({ name: "study.json", mimeType: "application/json", buffer: Buffer.from(JSON.stringify(document)) });
  await expect(page.getByText("The file is a valid network.")).toBeVisible();
  await page.getByRole("button", { name: "Create network" }).click();
  await expect(page.getByRole("heading", { name, level: 1 })).toBeVisible();
  return Number(new URL(page.url()).pathname.split("/").pop());
}

test("pages carry the security headers and a nonce policy, and no page trips it", async ({ page }) => {
  const problems = watchConsole(page);
  await countReactCommits(page);
  const response = await page.goto("/sign-in");
  const headers = response!.headers();
  expect(headers["content-security-policy"]).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]+'/);
  expect(headers["content-security-policy"]).toContain("frame-ancestors 'none'");
  expect(headers["x-frame-options"]).toBe("DENY");
  expect(headers["x-content-type-options"]).toBe("nosniff");
  expect(headers["referrer-policy"]).toBe("same-origin");
  await signIn(page, "editor");
  for (const path of ["/networks", "/networks/upload", "/account", "/docs/api", "/teams"]) {
    await page.goto(path);
    await hydrated(page);
  }
  await page.goto("/networks");
  await hydrated(page);
  await page.getByRole("link", { name: "Tarn Head to Calder Flats (fictional)" }).first().click();
  // The sheet's client-side work is done once the solved readings are drawn.
  await expect(page.locator(".react-flow__node .ks-readings").first()).toContainText("kV");
  expect(problems, "console errors (a CSP violation shows here)").toEqual([]);
});

test("writes sent from another site's page are refused and change nothing", async ({ page }) => {
  await signIn(page, "editor");
  const before = await (await page.request.get("/api/networks")).json();
  const elsewhere = { Origin: "https://elsewhere.example" };
  // A page's form: React Router's own origin check answers first (400), ours stands behind it.
  const form = await page.request.post("/networks", { headers: elsewhere, form: { intent: "create", teamId: "1", template: "blank", name: "Forged" } });
  expect([400, 403]).toContain(form.status());
  // The API's resource routes have only ours: 403 with a sentence.
  const api = await page.request.post("/api/networks", { headers: elsewhere, data: JSON.parse(tarnHead) });
  expect(api.status()).toBe(403);
  expect((await api.json()).error).toMatch(/another site's page/);
  const after = await (await page.request.get("/api/networks")).json();
  expect(after.networks.length).toBe(before.networks.length);
});

test("upload: a valid file is previewed and created; a broken one lists its problems and saves nothing", async ({ page }) => {
  await countReactCommits(page);
  await signIn(page, "editor");
  const networkId = await uploadNetwork(page, "Uploaded Tarn Head study");
  expect(networkId).toBeGreaterThan(0);

  // The same file again: the page asks instead of making a twin, and can save it as the next revision.
  await page.goto("/networks/upload");
  await hydrated(page);
  const again = { ...JSON.parse(tarnHead), name: "Uploaded Tarn Head study" };
  await page.getByLabel("Network file").setInputFiles({ name: "study.json", mimeType: "application/json", buffer: Buffer.from(JSON.stringify(again)) });
  await expect(page.getByText("The team already has a network named “Uploaded Tarn Head study”")).toBeVisible();
  await page.getByLabel(/Save the file as its next revision/).check();
  await page.getByRole("button", { name: "Save", exact: true }).click();
  await expect(page).toHaveURL(new RegExp(`/networks/${networkId}$`));
  await expect(page.getByRole("main")).toContainText("revision 2");

  await page.goto("/networks/upload");
  await noSeriousAccessibilityProblems(page);
  const broken = JSON.parse(tarnHead);
  broken.loads[0].bus = "b-nowhere";
  await page.getByLabel("Network file").setInputFiles({ name: "broken.json", mimeType: "application/json", buffer: Buffer.from(JSON.stringify(broken)) });
  await expect(page.getByRole("alert")).toContainText("not a valid network: 1 problem found");
  await expect(page.getByRole("cell", { name: "loads[0].bus" })).toBeVisible();
  await expect(page.getByRole("button", { name: "Create network" })).toBeDisabled();
  // The server says the same when asked.
  await page.getByRole("button", { name: "Check the file" }).click();
  await expect(page.getByRole("alert")).toContainText("Nothing has been saved");

  const download = page.waitForEvent("download");
  await page.goto(`/networks/${networkId}`);
  await page.getByRole("link", { name: "Download network file" }).click();
  const file = await download;
  expect(file.suggestedFilename()).toBe("uploaded-tarn-head-study-r2.json");
});

test("loads import: preview, then apply as one new revision", async ({ page }) => {
  await signIn(page, "editor");
  const networkId = await uploadNetwork(page, "Loads import study");
  await page.getByRole("link", { name: "Import loads" }).click();
  await expect(page.getByRole("heading", { name: "Import loads from a CSV file" })).toBeVisible();
  await noSeriousAccessibilityProblems(page);
  const csv = Buffer.from("bus;name;P (kW);power factor\nb-town;Calder Flats school;400;0,95\nb-mine;Sallow Rigg mine;9500;0,85\n");
  await page.getByLabel("Loads file (CSV, at most 5 MB)").setInputFiles({ name: "loads.csv", mimeType: "text/csv", buffer: csv });
  await page.getByRole("button", { name: "Preview" }).click();
  await expect(page.getByText("1 new, 1 updated")).toBeVisible();
  await page.getByLabel("Loads file (CSV, at most 5 MB)").setInputFiles({ name: "loads.csv", mimeType: "text/csv", buffer: csv });
  await page.getByRole("button", { name: "Apply as a new revision" }).click();
  await expect(page.getByText("Saved as revision 2")).toBeVisible();
  const saved = await (await page.request.get(`/api/networks/${networkId}`)).json();
  expect(saved.revision).toBe(2);
  expect(saved.document.loads.map((l: { name: string }) => l.name)).toContain("Calder Flats school");
});

test("team library: the owner adds a type, a viewer only reads", async ({ page, browser }) => {
  await signIn(page, "owner");
  await page.goto("/teams");
  await page.getByRole("link", { name: "Calder Valley Planning" }).first().click();
  await page.getByRole("link", { name: "Equipment library" }).click();
  const section = page.getByRole("region", { name: "Add a type" });
  await section.getByLabel("Name").fill("Calder 20 MVA");
  await section.getByLabel("Rated power (MVA)").fill("20 MVA");
  await section.getByLabel("HV winding (kV)").fill("66");
  await section.getByLabel("LV winding (kV)").fill("11");
  await section.getByLabel("Short-circuit impedance uₖ (%)").fill("10");
  await section.getByRole("button", { name: "Add type" }).click();
  await expect(page.getByText('Saved "Calder 20 MVA".')).toBeVisible();
  await expect(page.getByRole("cell", { name: "Calder 20 MVA", exact: true })).toBeVisible();
  await noSeriousAccessibilityProblems(page);

  const viewer = await browser.newPage();
  await signIn(viewer, "viewer");
  const libraryUrl = new URL(page.url()).pathname;
  await viewer.goto(libraryUrl);
  await expect(viewer.getByRole("cell", { name: "Calder 20 MVA", exact: true })).toBeVisible();
  await expect(viewer.getByRole("button", { name: "Add type" })).toHaveCount(0);
  const refused = await viewer.request.post(libraryUrl, { form: { intent: "delete-type", typeId: "1" } });
  expect(refused.status()).toBe(403);
  await viewer.close();
});

test("API tokens: created once, used as Bearer with the scope's limits, revoked at once", async ({ page, playwright, baseURL }) => {
  await signIn(page, "editor");
  await page.goto("/account");
  await page.getByLabel("Token name").fill("e2e read script");
  await page.getByLabel("Scope").selectOption("read");
  await page.getByRole("button", { name: "Create token" }).click();
  const token = (await page.getByLabel("The new token").textContent())!.trim();
  expect(token).toMatch(/^kst_[A-Za-z0-9_-]{43}$/);
  await noSeriousAccessibilityProblems(page);

  const api = await playwright.request.newContext({ baseURL, extraHTTPHeaders: { Authorization: `Bearer ${token}` } });
  const listed = await api.get("/api/networks");
  expect(listed.status()).toBe(200);
  const first = (await listed.json()).networks[0];
  const current = await (await api.get(`/api/networks/${first.id}`)).json();
  const put = await api.put(`/api/networks/${first.id}`, { data: { revision: current.revision, document: current.document } });
  expect(put.status()).toBe(403);

  await page.reload();
  const row = page.getByRole("row", { name: /e2e read script/ });
  await expect(row).not.toContainText("never");
  await row.getByRole("button", { name: "Revoke e2e read script" }).click();
  await expect(page.getByText('Revoked "e2e read script": it no longer works.')).toBeVisible();
  expect((await api.get("/api/networks")).status()).toBe(401);
  await api.dispose();
});
