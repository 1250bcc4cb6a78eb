import { describe, expect, it } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { endSession, getSessionUser, sessionCookie, startSession } from "#app/lib/session.server.ts";
import { action as signOut } from "#app/routes/auth/sign-out.tsx";
import { insertSession } from "#db/sessions.ts";
import { call, cookieFor, cookieFromSetCookie, formRequest, getRequest, makeUser } from "../harness.ts";

describe("sessions", () => {
  it("start with a signed cookie that names a row in the sessions table", async () => {
    const user = await makeUser("Sam Session");
    const setCookie = await startSession(user.id);
    expect(setCookie).toMatch(/^kilostep_session=/);
    expect(setCookie).toMatch(/HttpOnly/i);
    expect(setCookie).toMatch(/SameSite=Lax/i);
    expect(setCookie).toMatch(/Path=\//);
    expect(setCookie).not.toMatch(/Secure/i);
    const found = await getSessionUser(getRequest("/", cookieFromSetCookie(setCookie)));
    expect(found?.id).toBe(user.id);
    const rows = await (await getDb()).selectFrom("sessions").selectAll().where("user_id", "=", user.id).execute();
    expect(rows).toHaveLength(1);
  });

  it("are read as nobody without a cookie, with a forged one, or once expired", async () => {
    const user = await makeUser("Fay Forged");
    expect(await getSessionUser(getRequest("/"))).toBeNull();

    const cookie = await cookieFor(user);
    const [name, value] = cookie.split("=");
    const tampered = `${name}=${value.slice(0, -3)}abc`;
    expect(await getSessionUser(getRequest("/", tampered))).toBeNull();

    const unsigned = `kilostep_session=${encodeURIComponent(btoa(JSON.stringify("made-up-id")))}`;
    expect(await getSessionUser(getRequest("/", unsigned))).toBeNull();

    const longAgo = new Date(Date.now() - 40 * 86_400_000);
    const expired = await insertSession(await getDb(), user.id, longAgo);
    const expiredCookie = cookieFromSetCookie(await sessionCookie.serialize(expired.id));
    expect(await getSessionUser(getRequest("/", expiredCookie))).toBeNull();
  });

  it("end on the server: the row goes and the cookie is cleared", async () => {
    const user = await makeUser("Ed Ending");
    const cookie = await cookieFor(user);
    const clearing = await endSession(getRequest("/", cookie));
    expect(clearing).toMatch(/Max-Age=0|Expires=Thu, 01 Jan 1970/);
    expect(await getSessionUser(getRequest("/", cookie))).toBeNull();
  });

  it("end with POST /sign-out, which redirects home", async () => {
    const user = await makeUser("Olive Out");
    const cookie = await cookieFor(user);
    const outcome = await call(signOut, formRequest("/sign-out", {}, { cookie }));
    expect(outcome.status).toBe(302);
    expect(outcome.headers.get("Location")).toBe("/");
    expect(outcome.headers.get("Set-Cookie")).toMatch(/^kilostep_session=;/);
    const remaining = await (await getDb()).selectFrom("sessions").selectAll().where("user_id", "=", user.id).execute();
    expect(remaining).toEqual([]);
  });
});
