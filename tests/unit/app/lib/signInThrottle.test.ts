// Issue #13, finding 4: sign-in as a weapon. bcrypt on the main thread let a burst of wrong
// sign-ins stall every page; five wrong passwords locked the real owner out; the first
// X-Forwarded-For entry was believed with no proxy; 25 parallel guesses got 9 checked against a
// limit of 5; sign-up had no limit at all.
import { performance } from "node:perf_hooks";
import { afterEach, describe, expect, it, vi } from "vitest";
import { SIGN_UPS_PER_ADDRESS_PER_HOUR } from "#app/lib/accounts.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { bcryptCompare, bcryptHash } from "#app/lib/passwordHashing.server.ts";
import { ALLOWANCES, FIRST_WAIT_MS, LONGEST_WAIT_MS, waitAfter } from "#app/lib/signInThrottle.server.ts";
import { action as signIn } from "#app/routes/auth/sign-in.tsx";
import { action as signUp } from "#app/routes/auth/sign-up.tsx";
import { call, cookieFromSetCookie, formRequest, makeUser } from "../routes/harness.ts";

const PASSWORD = "a long enough password";

function attempt(email: string, password: string, clientAddress: string | null, options: { cookie?: string; headers?: Record<string, string> } = {}) {
  return call(signIn, formRequest("/sign-in", { email, password }, options), {}, { clientAddress });
}

/** The cookies a browser keeps from a sign-in answer (session and known-browser). */
function cookiesOf(outcome: { headers: Headers }): string {
  return outcome.headers.getSetCookie().map((c) => cookieFromSetCookie(c)).join("; ");
}

afterEach(() => {
  vi.useRealTimers();
});

describe("the wait after failed sign-ins", () => {
  it("is nothing within the free failures, then doubles from one second up to a cap: backoff, not a lock-out", () => {
    const { free } = ALLOWANCES.accountFromAddress;
    expect(waitAfter(free - 1, ALLOWANCES.accountFromAddress)).toBe(0);
    expect(waitAfter(free, ALLOWANCES.accountFromAddress)).toBe(FIRST_WAIT_MS);
    expect(waitAfter(free + 1, ALLOWANCES.accountFromAddress)).toBe(2 * FIRST_WAIT_MS);
    expect(waitAfter(free + 3, ALLOWANCES.accountFromAddress)).toBe(8 * FIRST_WAIT_MS);
    expect(waitAfter(free + 1000, ALLOWANCES.accountFromAddress)).toBe(LONGEST_WAIT_MS);
  });
});

describe("sign-in limits", () => {
  it("one address guessing at one account waits, growing, and the owner gets in once the wait is over", async () => {
    vi.useFakeTimers({ toFake: ["Date"] });
    vi.setSystemTime(new Date("2026-06-01T10:00:00.000Z"));
    const user = await makeUser("Tia Throttle", { password: PASSWORD });
    for (let i = 0; i < ALLOWANCES.accountFromAddress.free; i++) expect((await attempt(user.email, `guess ${i}`, "203.0.113.5")).status).toBe(400);
    const blocked = await attempt(user.email, PASSWORD, "203.0.113.5");
    expect(blocked.status).toBe(429);
    expect(blocked.headers.get("Retry-After")).toBe("1");
    expect(blocked.headers.get("Set-Cookie")).toBeNull();
    expect(blocked.body.formError).toMatch(/Wait 1 seconds/);
    vi.setSystemTime(new Date("2026-06-01T10:00:01.000Z"));
    expect((await attempt(user.email, "guess again", "203.0.113.5")).status).toBe(400);
    expect((await attempt(user.email, PASSWORD, "203.0.113.5")).headers.get("Retry-After")).toBe("2");
    // The owner at another desk is not held up by this guesser.
    expect((await attempt(user.email, PASSWORD, "198.51.100.20")).status).toBe(302);
  });

  it("one address guessing across many accounts waits too", async () => {
    const user = await makeUser("Ada Address", { password: PASSWORD });
    for (let i = 0; i < ALLOWANCES.address.free; i++) expect((await attempt(`someone.${i}@example.org`, "guess", "192.0.2.77")).status).toBe(400);
    expect((await attempt(user.email, PASSWORD, "192.0.2.77")).status).toBe(429);
    expect((await attempt(user.email, PASSWORD, "192.0.2.78")).status).toBe(302);
  });

  it("many addresses at one account slow a new browser, never the owner's known one", async () => {
    const user = await makeUser("Owen Owner", { password: PASSWORD });
    const usual = await attempt(user.email, PASSWORD, "198.51.100.1");
    expect(usual.status).toBe(302);
    const knownBrowser = cookiesOf(usual);
    expect(knownBrowser).toMatch(/kilostep_known=/);
    for (let i = 0; i < ALLOWANCES.account.free; i++) expect((await attempt(user.email, "guess", `10.9.${i}.1`)).status).toBe(400);
    expect((await attempt(user.email, PASSWORD, "10.9.200.1")).status).toBe(429);
    expect((await attempt(user.email, PASSWORD, "198.51.100.1", { cookie: knownBrowser })).status).toBe(302);
  });

  it("believes the socket's address, not X-Forwarded-For (the server only trusts a proxy named in TRUST_PROXY)", async () => {
    const user = await makeUser("Fay Forged", { password: PASSWORD });
    for (let i = 0; i < ALLOWANCES.accountFromAddress.free; i++) {
      await attempt(user.email, "guess", "203.0.113.66", { headers: { "X-Forwarded-For": `10.0.0.${i}`, "X-Real-IP": `10.1.0.${i}` } });
    }
    expect((await attempt(user.email, PASSWORD, "203.0.113.66", { headers: { "X-Forwarded-For": "10.0.0.99" } })).status).toBe(429);
  });

  it("25 wrong guesses in parallel: no more are checked than the limit allows", async () => {
    const user = await makeUser("Pam Parallel", { password: PASSWORD });
    const outcomes = await Promise.all(Array.from({ length: 25 }, (_, i) => attempt(user.email, `parallel guess ${i}`, "203.0.113.25")));
    const checked = outcomes.filter((o) => o.status === 400).length;
    expect(checked).toBe(ALLOWANCES.accountFromAddress.free);
    expect(outcomes.filter((o) => o.status === 429)).toHaveLength(25 - checked);
    const rows = await (await getDb()).selectFrom("sign_in_failures").select("id").where("account", "=", user.email).execute();
    expect(rows).toHaveLength(ALLOWANCES.accountFromAddress.free);
  });
});

describe("password hashing", () => {
  it("leaves the main thread idle while bcrypt works, and reads hashes made the old way", async () => {
    const before = performance.eventLoopUtilization();
    const hashes = await Promise.all([bcryptHash("one password", 10), bcryptHash("two password", 10)]);
    expect(await bcryptCompare("one password", hashes[0])).toBe(true);
    expect(await bcryptCompare("not it", hashes[1])).toBe(false);
    // bcryptjs on this thread (sync, or async in slices) keeps the loop busy nearly all the time.
    expect(performance.eventLoopUtilization(before).utilization).toBeLessThan(0.5);
    const bcrypt = (await import("bcryptjs")).default;
    expect(await bcryptCompare("made by bcryptjs", bcrypt.hashSync("made by bcryptjs", 4))).toBe(true);
    expect(hashes[0]).toMatch(/^\$2b\$10\$/);
  });
});

describe("sign-up limits", () => {
  it(`allows ${SIGN_UPS_PER_ADDRESS_PER_HOUR} new accounts an hour from one address, then asks it to wait`, async () => {
    const signUpFrom = (clientAddress: string, i: number) =>
      call(signUp, formRequest("/sign-up", { name: `Newcomer ${i}`, email: `newcomer.${i}.${Date.now()}@example.org`, password: PASSWORD }), {}, { clientAddress });
    for (let i = 0; i < SIGN_UPS_PER_ADDRESS_PER_HOUR; i++) expect((await signUpFrom("203.0.113.200", i)).status).toBe(302);
    const refused = await signUpFrom("203.0.113.200", 99);
    expect(refused.status).toBe(429);
    expect(refused.body.fieldErrors.form).toMatch(/Too many new accounts/);
    expect((await signUpFrom("203.0.113.201", 100)).status).toBe(302);
  });
});
