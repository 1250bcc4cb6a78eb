import type { Page } from "@playwright/test";
import { DEMO_ACCOUNTS } from "../../db/demoAccounts.ts";

export function demoAccount(role: "owner" | "editor" | "viewer") {
  return DEMO_ACCOUNTS.find((a) => a.role === role)!;
}

export async function signIn(page: Page, role: "owner" | "editor" | "viewer") {
  const account = demoAccount(role);
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(account.email);
  await page.getByLabel("Password").fill(account.password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL("**/networks");
}
