import { expect, test } from "@playwright/test";
import { signIn } from "./accounts.ts";

test("a new engineer signs up, creates a team and a network, sees it listed, renames it and signs out", async ({ page }) => {
  const stamp = Date.now();
  const name = `Rowan Test ${stamp}`;

  await page.goto("/sign-up");
  await page.getByLabel("Name").fill(name);
  await page.getByLabel("E-mail").fill(`rowan.${stamp}@example.org`);
  await page.getByLabel("Password").fill("a long enough password");
  await page.getByRole("button", { name: "Create account" }).click();
  await page.waitForURL("**/networks");
  await expect(page.getByRole("heading", { name: "Networks", level: 1 })).toBeVisible();
  // Sign-up made a team of the user's own, so creating a network is possible at once.
  await expect(page.getByLabel("Team")).toContainText(`${name}'s team`);

  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Teams" }).click();
  await page.getByRole("link", { name: "New team" }).click();
  await page.getByLabel("Team name").fill(`Moorside studies ${stamp}`);
  await page.getByRole("button", { name: "Create team" }).click();
  await expect(page.getByRole("heading", { name: `Moorside studies ${stamp}`, level: 1 })).toBeVisible();
  await expect(page.getByRole("row", { name: new RegExp(`${name} \\(you\\)`) })).toContainText("owner");

  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Networks" }).click();
  await page.getByLabel("Name").fill("Moor feeder study");
  await page.getByLabel("Team").selectOption({ label: `Moorside studies ${stamp}` });
  await page.getByRole("radio", { name: /Blank/ }).check();
  await page.getByRole("button", { name: "Create network" }).click();
  await expect(page.getByRole("heading", { name: "Moor feeder study", level: 1 })).toBeVisible();
  await expect(page.getByRole("main")).toContainText("revision 1");

  await page.getByRole("link", { name: "← Networks" }).click();
  const row = page.getByRole("row", { name: /Moor feeder study/ });
  await expect(row).toContainText(`Moorside studies ${stamp}`);
  await expect(row).toContainText(`by ${name}`);

  await row.getByText("Rename").click();
  await page.getByLabel("New name for Moor feeder study").fill("Moor feeder, 33 kV option");
  await page.getByRole("button", { name: "Save name" }).click();
  await expect(page.getByRole("status")).toContainText('Renamed "Moor feeder study" to "Moor feeder, 33 kV option"');
  const renamed = page.getByRole("row", { name: /Moor feeder, 33 kV option/ });
  await expect(renamed.getByRole("cell").nth(2)).toHaveText("2");

  await page.getByRole("button", { name: "Sign out" }).click();
  await page.waitForURL((url) => url.pathname === "/");
  await expect(page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Sign in" })).toBeVisible();
  await page.goto("/networks");
  await expect(page).toHaveURL(/\/sign-in\?redirectTo=%2Fnetworks$/);
});

test("a viewer sees the demo networks without create, rename or delete, and the server refuses them by hand", async ({ page }) => {
  await signIn(page, "viewer");
  const tarnHead = page.getByRole("link", { name: "Tarn Head to Calder Flats (fictional)" });
  await expect(tarnHead).toBeVisible();
  await expect(page.getByRole("link", { name: "Hollin Moor solar export (fictional)" })).toBeVisible();
  await expect(page.getByRole("heading", { name: "Start a network" })).toHaveCount(0);
  await expect(page.getByRole("button", { name: "Create network" })).toHaveCount(0);
  await expect(page.getByText("Rename", { exact: true })).toHaveCount(0);
  await expect(page.getByRole("button", { name: /^Delete/ })).toHaveCount(0);

  const networkId = (await tarnHead.getAttribute("href"))!.split("/").pop()!;
  await tarnHead.click();
  await expect(page.getByRole("heading", { name: "Tarn Head to Calder Flats (fictional)", level: 1 })).toBeVisible();
  await expect(page.getByRole("main").locator(".role-badge")).toHaveText("viewer");

  const current = await page.request.get(`/api/networks/${networkId}`);
  expect(current.status()).toBe(200);
  const { revision, document, role } = await current.json();
  expect(role).toBe("viewer");

  const put = await page.request.put(`/api/networks/${networkId}`, { data: { revision, document: { ...document, name: "Hijacked" } } });
  expect(put.status()).toBe(403);
  expect((await put.json()).error).toMatch(/viewer/);

  const del = await page.request.delete(`/api/networks/${networkId}`);
  expect(del.status()).toBe(403);
  const create = await page.request.post("/api/networks?team=1", { data: document });
  expect(create.status()).toBe(403);
  const renameByForm = await page.request.post("/networks", { form: { intent: "rename", networkId, name: "Hijacked" } });
  expect(renameByForm.status()).toBe(403);
  const deleteByForm = await page.request.post("/networks", { form: { intent: "delete", networkId } });
  expect(deleteByForm.status()).toBe(403);

  const after = await (await page.request.get(`/api/networks/${networkId}`)).json();
  expect(after.revision).toBe(revision);
  expect(after.name).toBe("Tarn Head to Calder Flats (fictional)");
});

test("an editor's save against a stale revision is refused with 409 and nothing is overwritten", async ({ page }) => {
  await signIn(page, "editor");
  const link = page.getByRole("link", { name: "Hollin Moor solar export (fictional)" });
  const networkId = (await link.getAttribute("href"))!.split("/").pop()!;

  const { revision, document } = await (await page.request.get(`/api/networks/${networkId}`)).json();
  const first = await page.request.put(`/api/networks/${networkId}`, {
    data: { revision, document: { ...document, name: "Hollin Moor, first edit" } },
  });
  expect(first.status()).toBe(200);
  expect((await first.json()).revision).toBe(revision + 1);

  const stale = await page.request.put(`/api/networks/${networkId}`, {
    data: { revision, document: { ...document, name: "Hollin Moor, stale edit" } },
  });
  expect(stale.status()).toBe(409);
  expect(await stale.json()).toMatchObject({ currentRevision: revision + 1 });

  const now = await (await page.request.get(`/api/networks/${networkId}`)).json();
  expect(now.name).toBe("Hollin Moor, first edit");

  // Put the demo's name back for the tests that follow.
  const restore = await page.request.put(`/api/networks/${networkId}`, { data: { revision: now.revision, document } });
  expect(restore.status()).toBe(200);
});

test("a protected page sends the signed-out to sign in and back again", async ({ page }) => {
  await page.goto("/teams");
  await expect(page).toHaveURL(/\/sign-in\?redirectTo=%2Fteams$/);
  await page.getByLabel("E-mail").fill("ada.owner@kilostep.test");
  await page.getByLabel("Password").fill("not the password");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByRole("alert")).toContainText("The e-mail or password is not right.");
  await page.getByLabel("Password").fill("tarn-head-owner");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page).toHaveURL(/\/teams$/);
  await expect(page.getByRole("link", { name: "Calder Valley Planning" })).toBeVisible();
});
