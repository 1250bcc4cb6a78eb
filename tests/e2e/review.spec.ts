// Review together in the browser: an invitation through the mail fake, a forgotten password, a
// share link revoked while someone has it open, and an edit link that opens one network only.
// Each test makes its own people and networks, so the demo data stays as it was.
import AxeBuilder from "@axe-core/playwright";
import { expect, test, type APIRequestContext, type Browser, type Page, type TestInfo } from "@playwright/test";
import { readFileSync } from "node:fs";
import { countReactCommits, hydrated } from "./hydration.ts";
import { mailboxFileFor } from "./mailbox.ts";
import { signIn } from "./accounts.ts";

const stamp = () => `${Date.now()}${Math.floor(Math.random() * 1000)}`;

interface FakeMessage {
  subject: string;
  text: string;
  links: string[];
}

/** Waits for the server's mail to hold exactly `count` messages to the address, newest first. */
/** The messages to an address (with this subject, when one is named), once there are `count` of them. */
async function mailTo(request: APIRequestContext, address: string, count = 1, subject?: string): Promise<FakeMessage[]> {
  let messages: FakeMessage[] = [];
  await expect
    .poll(
      async () => {
        const mailbox = readFileSync(mailboxFileFor(process.env.E2E_PORT ?? 3111), "utf8");
        const answer = await request.get(`${mailbox}?to=${encodeURIComponent(address)}`);
        expect(answer.status()).toBe(200);
        messages = ((await answer.json()) as { messages: FakeMessage[] }).messages.filter((m) => subject === undefined || m.subject === subject);
        return messages.length;
      },
      { timeout: 10_000 },
    )
    .toBe(count);
  return messages;
}

async function signUp(page: Page, name: string, email: string, password: string) {
  await page.goto("/sign-up");
  await page.getByLabel("Name").fill(name);
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Create account" }).click();
  await page.waitForURL("**/networks");
}

async function newPage(browser: Browser): Promise<Page> {
  const context = await browser.newContext();
  return context.newPage();
}

/** A network of the demo team made for this test alone, as the demo owner. */
async function ownNetwork(page: Page, name: string): Promise<number> {
  const document = { ...JSON.parse(readFileSync("tests/fixtures/tarn-head-calder-flats.json", "utf8")), name };
  const created = await page.request.post("/api/networks?team=1", { data: document });
  expect(created.status()).toBe(201);
  return ((await created.json()) as { id: number }).id;
}

test("an owner invites by e-mail; the message arrives; the newcomer accepts and is a member with that role", async ({ page, browser }) => {
  const id = stamp();
  const ownerEmail = `olive.${id}@example.org`;
  const inviteeEmail = `ned.${id}@example.org`;
  await signUp(page, `Olive Owner ${id}`, ownerEmail, "olive's long password");
  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Teams" }).click();
  await page.getByRole("link", { name: `Olive Owner ${id}'s team` }).click();

  const invite = page.getByRole("region", { name: "Invite by e-mail" });
  await invite.getByLabel("E-mail").fill(inviteeEmail);
  await invite.getByLabel("Role").selectOption("editor");
  await invite.getByRole("button", { name: "Send invitation" }).click();
  await expect(invite.getByRole("status")).toContainText(`Invitation sent to ${inviteeEmail} (editor)`);
  await expect(invite.getByRole("listitem").filter({ hasText: inviteeEmail })).toContainText("editor");

  const [message] = await mailTo(page.request, inviteeEmail);
  expect(message.subject).toBe(`Olive Owner ${id} invites you to the team "Olive Owner ${id}'s team" on Kilostep`);
  const acceptLink = message.links.find((l) => l.includes("/invitations/"))!;
  expect(acceptLink).toMatch(/\/invitations\/[A-Za-z0-9_-]{43}$/);

  const newcomer = await newPage(browser);
  await newcomer.goto(new URL(acceptLink).pathname);
  await expect(newcomer.getByRole("heading", { name: `Join Olive Owner ${id}'s team`, level: 1 })).toBeVisible();
  await newcomer.getByLabel("Name").fill(`Ned Newcomer ${id}`);
  await newcomer.getByLabel("Password").fill("ned's long password");
  await newcomer.getByRole("button", { name: "Create account and join" }).click();
  await expect(newcomer.getByRole("heading", { name: `Olive Owner ${id}'s team`, level: 1 })).toBeVisible();
  await expect(newcomer.getByRole("region", { name: "Members" }).getByRole("row", { name: new RegExp(`Ned Newcomer ${id} \\(you\\)`) })).toContainText("editor");

  // The link worked once.
  await newcomer.goto(new URL(acceptLink).pathname);
  await expect(newcomer.getByRole("heading", { name: "This invitation no longer works" })).toBeVisible();

  await page.reload();
  await expect(page.getByRole("region", { name: "Members" }).getByRole("row", { name: new RegExp(`Ned Newcomer ${id}`) })).toContainText("editor");
  await expect(page.getByRole("region", { name: "Audit log", exact: true })).toContainText(`Ned Newcomer ${id} (${inviteeEmail}) accepted the invitation and joined as editor.`);
  await newcomer.context().close();
});

test("a forgotten password: the same answer for any address, one link by mail, and the new password ends the other sessions", async ({ page, browser }) => {
  const id = stamp();
  const email = `fern.${id}@example.org`;
  await signUp(page, `Fern Forgetful ${id}`, email, "the first long password");
  // `page` stays signed in: the other session that a reset must end.

  const asker = await newPage(browser);
  await asker.goto("/sign-in");
  await asker.getByRole("link", { name: "Forgotten your password?" }).click();
  await expect(asker.getByRole("heading", { name: "Forgotten password", level: 1 })).toBeVisible();
  await asker.getByLabel("E-mail").fill(`nobody.${id}@example.org`);
  await asker.getByRole("button", { name: "Send the link" }).click();
  const answerForNobody = await asker.getByRole("status").innerText();
  await asker.goto("/forgot-password");
  await asker.getByLabel("E-mail").fill(email);
  await asker.getByRole("button", { name: "Send the link" }).click();
  await expect(asker.getByRole("status")).toHaveText(answerForNobody);

  // A new account also gets the message that confirms its address; the reset is the one asked for here.
  const [message] = await mailTo(asker.request, email, 1, "Choose a new Kilostep password");
  const resetLink = message.links.find((l) => l.includes("/reset-password?token="))!;
  const resetPath = `${new URL(resetLink).pathname}${new URL(resetLink).search}`;
  await mailTo(asker.request, `nobody.${id}@example.org`, 0);

  await asker.goto(resetPath);
  await asker.getByLabel("New password", { exact: true }).fill("the second long password");
  await asker.getByLabel("The same again").fill("the second long password");
  await asker.getByRole("button", { name: "Save the new password" }).click();
  await asker.waitForURL("**/networks");
  await expect(asker.getByRole("heading", { name: "Networks", level: 1 })).toBeVisible();

  // The session that was open elsewhere has ended.
  await page.goto("/networks");
  await expect(page).toHaveURL(/\/sign-in\?redirectTo=%2Fnetworks$/);
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill("the first long password");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByRole("alert")).toContainText("The e-mail or password is not right.");
  await page.getByLabel("Password").fill("the second long password");
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL("**/networks");

  // The link worked once.
  await asker.goto(resetPath);
  await expect(asker.getByRole("alert")).toContainText("already been used");
  await asker.context().close();
});

test("a view link opens the study without an account, and stops at the next request once revoked", async ({ page, browser }) => {
  await signIn(page, "owner");
  const networkId = await ownNetwork(page, `Shared study ${stamp()}`);
  await page.goto(`/networks/${networkId}/share`);
  await page.getByLabel("Who it is for (optional)").fill("Protection review");
  await page.getByRole("button", { name: "Make link" }).click();
  const url = await page.getByLabel("The new link").inputValue();
  expect(url).toMatch(/\/s\/[A-Za-z0-9_-]{43}$/);
  const sharedPath = new URL(url).pathname;

  const reviewer = await newPage(browser);
  await countReactCommits(reviewer);
  await reviewer.goto(sharedPath);
  await expect(reviewer.getByRole("heading", { name: /^Shared study/, level: 1 })).toBeVisible();
  await expect(reviewer.getByRole("main")).toContainText("view only");
  await expect(reviewer.getByRole("heading", { name: "Review notes" })).toBeVisible();
  await expect(reviewer.getByRole("link", { name: "Sign in" }).last()).toBeVisible();
  // A reviewer without an account signs a note with a name.
  await hydrated(reviewer);
  await reviewer.getByLabel("Your name").fill("Rhona Pike");
  await reviewer.getByLabel("Note", { exact: true }).fill("Which relay curve protects the 66 kV line?");
  await reviewer.getByRole("button", { name: "Add note" }).click();
  await expect(reviewer.getByRole("status").filter({ hasText: "Note pinned to the sheet." })).toBeVisible();
  await expect(reviewer.locator(".ks-thread-list")).toContainText("Rhona Pike (no account)");
  const csv = await reviewer.request.get(`${sharedPath}/results.csv?table=buses`);
  expect(csv.status()).toBe(200);
  expect((await csv.text()).split("\r\n")[0]).toContain("bus_id");
  // Nothing else opens for the link holder: the team's own pages still want an account.
  const api = await reviewer.request.get(`/api/networks/${networkId}`);
  expect(api.status()).toBe(401);

  await page.reload();
  const entry = page.getByRole("listitem").filter({ hasText: "Protection review" });
  await expect(entry).toContainText("Used 1 time");
  await entry.getByRole("button", { name: /^Revoke link/ }).click();
  await expect(page.getByRole("status")).toContainText("is revoked");

  // The reviewer's open page asks the server on its next step and is refused.
  await reviewer.getByRole("link", { name: "Study report" }).click();
  await expect(reviewer.getByRole("main")).toContainText("revoked this share link");
  await expect(reviewer.getByText("Fell crossing 66 kV")).toHaveCount(0);
  expect((await reviewer.request.get(`${sharedPath}/results.csv?table=buses`)).status()).toBe(410);
  await reviewer.goto(sharedPath);
  await expect(reviewer.getByRole("heading", { name: "This link was revoked", level: 1 })).toBeVisible();
  await reviewer.context().close();
});

test("an edit link asks for an account, then edits that network and no other", async ({ page, browser }) => {
  await signIn(page, "owner");
  const demo = (await (await page.request.get("/api/networks")).json()) as { networks: { id: number; name: string }[] };
  const other = demo.networks.find((n) => n.name === "Hollin Moor solar export (fictional)")!;
  const networkId = await ownNetwork(page, `Edit-linked study ${stamp()}`);
  const made = await page.request.post(`/api/networks/${networkId}/shares`, { data: { role: "editor", expiresInDays: 2 } });
  expect(made.status()).toBe(201);
  const { url } = (await made.json()) as { url: string };

  const id = stamp();
  const holder = await newPage(browser);
  await holder.goto(new URL(url).pathname);
  await expect(holder.getByRole("heading", { name: "Sign in to edit" })).toBeVisible();
  await holder.getByRole("main").getByRole("link", { name: "Create an account" }).click();
  await expect(holder.getByRole("heading", { name: "Create an account", level: 1 })).toBeVisible();
  await holder.getByLabel("Name").fill(`Esme External ${id}`);
  await holder.getByLabel("E-mail").fill(`esme.${id}@example.org`);
  await holder.getByLabel("Password").fill("esme's long password");
  await holder.getByRole("button", { name: "Create account" }).click();
  await holder.waitForURL(`**/networks/${networkId}`);
  await expect(holder.getByRole("main").locator(".role-badge").first()).toHaveText("editor");

  await holder.goto("/networks");
  await expect(holder.getByRole("region", { name: "Shared with you" }).getByRole("listitem")).toContainText(["Edit-linked study"]);
  await expect(holder.getByRole("region", { name: "Shared with you" })).toContainText("editor");

  const current = (await (await holder.request.get(`/api/networks/${networkId}`)).json()) as { revision: number; document: { name: string } };
  const saved = await holder.request.put(`/api/networks/${networkId}`, { data: { revision: current.revision, document: { ...current.document, name: `${current.document.name}, reviewed` } } });
  expect(saved.status()).toBe(200);

  expect((await holder.request.get(`/api/networks/${other.id}`)).status()).toBe(404);
  await holder.goto(`/networks/${other.id}`);
  await expect(holder.getByRole("heading", { name: "Not found" })).toBeVisible();
  expect((await holder.request.delete(`/api/networks/${networkId}`)).status()).toBe(403);
  await holder.context().close();
});

/** A full-page picture for a person to look at, and an accessibility scan (serious or worse fails). */
async function lookAt(page: Page, testInfo: TestInfo, file: string) {
  await page.evaluate(() => document.fonts.ready);
  await page.screenshot({ path: testInfo.outputPath(file), fullPage: true });
  const scan = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
  const serious = scan.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(" ")).join(", ")})`);
  expect(serious, `accessibility problems on ${page.url()}`).toEqual([]);
}

test("Share, the shared view, Review notes, Revisions and the mail fake pass an accessibility scan", async ({ page, browser }, testInfo) => {
  await signIn(page, "owner");
  const networkId = await ownNetwork(page, `Looked-at study ${stamp()}`);
  const current = (await (await page.request.get(`/api/networks/${networkId}`)).json()) as { revision: number; document: { lines: { id: string; lengthKm: number }[] } };
  current.document.lines.find((l) => l.id === "l-fell")!.lengthKm = 47.6;
  expect((await page.request.put(`/api/networks/${networkId}`, { data: { revision: current.revision, document: current.document, message: "Surveyed route length" } })).status()).toBe(200);

  await countReactCommits(page);
  await page.goto(`/networks/${networkId}`);
  // The pin is a controlled select: chosen before hydration, React would put it back to the sheet.
  await hydrated(page);
  const notes = page.getByRole("region", { name: "Review notes" });
  await notes.getByLabel("Pin to").selectOption({ label: "Overhead line: Fell crossing 66 kV" });
  await notes.getByLabel("Note", { exact: true }).fill("Is 47.6 km the surveyed route length?");
  await notes.getByRole("button", { name: "Add note" }).click();
  await expect(notes.getByRole("status")).toHaveText("Note pinned to Fell crossing 66 kV.");
  await expect(page.getByRole("button", { name: /1 open review note on Fell crossing 66 kV/ })).toBeVisible();
  await expect(notes.locator(".ks-panel-sub")).toHaveText("1 open · 0 resolved");
  await lookAt(page, testInfo, "review-notes.png");

  await page.goto(`/networks/${networkId}/share`);
  await page.getByRole("button", { name: "Make link" }).click();
  const url = await page.getByLabel("The new link").inputValue();
  await lookAt(page, testInfo, "share.png");

  const reviewer = await newPage(browser);
  await reviewer.goto(new URL(url).pathname);
  await expect(reviewer.getByRole("heading", { name: /^Looked-at study/, level: 1 })).toBeVisible();
  await expect(reviewer.getByRole("region", { name: "Review notes" })).toContainText("Is 47.6 km the surveyed route length?");
  await lookAt(reviewer, testInfo, "shared-view.png");
  await reviewer.context().close();

  await page.goto(`/networks/${networkId}/revisions`);
  await expect(page.getByRole("status").filter({ hasText: "Revision 1 → revision 2" })).toContainText("1 changed");
  await expect(page.getByRole("row", { name: /Length/ })).toContainText("48 km");
  await lookAt(page, testInfo, "revisions.png");

});
