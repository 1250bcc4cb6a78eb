import { afterEach, describe, expect, it, vi } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { getSessionUser } from "#app/lib/session.server.ts";
import { action as signIn, loader as signInPage } from "#app/routes/auth/sign-in.tsx";
import { action as signUp } from "#app/routes/auth/sign-up.tsx";
import { call, cookieFor, cookieFromSetCookie, formRequest, getRequest, makeUser } from "../harness.ts";

const PASSWORD = "a long enough password";

function attempt(email: string, password: string, address?: string, redirectTo?: string) {
  const fields: Record<string, string> = { email, password };
  if (redirectTo !== undefined) fields.redirectTo = redirectTo;
  return call(signIn, formRequest("/sign-in", fields), {}, { clientAddress: address ?? null });
}

afterEach(() => {
  vi.useRealTimers();
});

describe("sign-in", () => {
  it("with the right password starts a session and goes to the networks", async () => {
    const user = await makeUser("Rita Right", { password: PASSWORD });
    const outcome = await attempt(user.email, PASSWORD);
    expect(outcome.status).toBe(302);
    expect(outcome.headers.get("Location")).toBe("/networks");
    const cookie = cookieFromSetCookie(outcome.headers.get("Set-Cookie"));
    expect((await getSessionUser(getRequest("/", cookie)))?.id).toBe(user.id);
  });

  it("accepts the e-mail in any case and with spaces around it", async () => {
    const user = await makeUser("Cass Case", { password: PASSWORD });
    expect((await attempt(`  ${user.email.toUpperCase()} `, PASSWORD)).status).toBe(302);
  });

  it("goes back to a local redirectTo, never to another site", async () => {
    const user = await makeUser("Reda Rect", { password: PASSWORD });
    expect((await attempt(user.email, PASSWORD, undefined, "/teams/1")).headers.get("Location")).toBe("/teams/1");
    expect((await attempt(user.email, PASSWORD, undefined, "https://evil.example/")).headers.get("Location")).toBe("/networks");
    expect((await attempt(user.email, PASSWORD, undefined, "//evil.example/")).headers.get("Location")).toBe("/networks");
  });

  it("says the same for a wrong password and an unknown account", async () => {
    const user = await makeUser("Wes Wrong", { password: PASSWORD });
    const wrongPassword = await attempt(user.email, "not the password");
    const unknownAccount = await attempt("nobody.here@example.org", "not the password");
    expect(wrongPassword.status).toBe(400);
    expect(unknownAccount.status).toBe(400);
    expect(wrongPassword.body).toEqual(unknownAccount.body);
    expect(wrongPassword.headers.get("Set-Cookie")).toBeNull();
  });

  it("names missing fields without checking anything", async () => {
    const outcome = await attempt("", "");
    expect(outcome.status).toBe(400);
    expect(outcome.body.fieldErrors).toEqual({ email: "Enter your e-mail address.", password: "Enter your password." });
  });

  it("sends someone already signed in on to where they were going", async () => {
    const user = await makeUser("Sid Signed");
    const outcome = await call(signInPage, getRequest("/sign-in?redirectTo=%2Fteams", await cookieFor(user)));
    expect(outcome.status).toBe(302);
    expect(outcome.headers.get("Location")).toBe("/teams");
  });
});

describe("sign-up", () => {
  const signUpWith = (fields: Record<string, string>) => call(signUp, formRequest("/sign-up", fields));

  it("creates the account, a team it owns, and a session", async () => {
    const outcome = await signUpWith({ name: "Nia New", email: "Nia.New@Example.org", password: "ten chars!!" });
    expect(outcome.status).toBe(302);
    const db = await getDb();
    const user = await db.selectFrom("users").selectAll().where("email", "=", "nia.new@example.org").executeTakeFirstOrThrow();
    expect(user.password_hash).toMatch(/^\$2[aby]\$/);
    expect(user.password_hash).not.toContain("ten chars");
    const teams = await db
      .selectFrom("memberships as m")
      .innerJoin("teams as t", "t.id", "m.team_id")
      .select(["t.name", "m.role"])
      .where("m.user_id", "=", user.id)
      .execute();
    expect(teams).toEqual([{ name: "Nia New's team", role: "owner" }]);
    const cookie = cookieFromSetCookie(outcome.headers.get("Set-Cookie"));
    expect((await getSessionUser(getRequest("/", cookie)))?.id).toBe(user.id);
  });

  it("refuses a second account for the same e-mail, whatever its case, and changes nothing", async () => {
    const existing = await makeUser("Dora Duplicate");
    const db = await getDb();
    const usersBefore = await db.selectFrom("users").select("id").execute();
    const outcome = await signUpWith({ name: "Other", email: existing.email.toUpperCase(), password: "another long one" });
    expect(outcome.status).toBe(400);
    expect(outcome.body.fieldErrors.email).toMatch(/already exists/);
    expect(await db.selectFrom("users").select("id").execute()).toEqual(usersBefore);
  });

  it("refuses a password under 10 characters, a missing name and a malformed e-mail, each beside its field", async () => {
    const outcome = await signUpWith({ name: " ", email: "not-an-email", password: "short" });
    expect(outcome.status).toBe(400);
    expect(outcome.body.fieldErrors).toEqual({
      name: "Enter your name.",
      email: "Enter an e-mail address such as ada@example.org.",
      password: "Choose a password of at least 10 characters.",
    });
  });
});
