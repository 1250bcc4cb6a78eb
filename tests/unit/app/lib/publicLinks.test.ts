// Issue #13, finding 1: links in mail were built from the request's Host header, so a forged Host
// mailed a live reset token to an attacker's site, and behind TLS every link said http://. Every
// link now starts with the configured APP_ORIGIN (http://kilostep.test in the unit tests).
import { afterEach, describe, expect, it, vi } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { mailSettled, receivedMail } from "#app/lib/mail.server.ts";
import { action as forgotAction } from "#app/routes/auth/forgot-password.tsx";
import { action as invitationsAction } from "#app/routes/teams/invitations.ts";
import { action as sharesApi } from "#app/routes/api/network-shares.ts";
import { action as notesAction } from "#app/routes/networks/notes.ts";
import { insertTeamWithOwner } from "#db/teams.ts";
import { call, cookieFor, makeUser } from "../routes/harness.ts";
import { freshWorld, makePeople } from "../routes/reviewWorld.ts";

const APP_ORIGIN = "http://kilostep.test";
const forged = { Host: "attacker.example", "X-Forwarded-Host": "attacker.example", "X-Forwarded-Proto": "http" };

function forgedForm(path: string, fields: Record<string, string>, cookie?: string) {
  return new Request(`http://attacker.example${path}`, {
    method: "POST",
    headers: { ...forged, ...(cookie ? { Cookie: cookie } : {}) },
    body: new URLSearchParams(fields),
  });
}

async function linksTo(email: string): Promise<string[]> {
  await mailSettled();
  return (await receivedMail({ to: email })).flatMap((m) => m.links);
}

describe("links the product writes", () => {
  it("a password reset asked for with a forged Host still points at APP_ORIGIN", async () => {
    const user = await makeUser("Rhoda Reset");
    expect((await call(forgotAction, forgedForm("/forgot-password", { email: user.email }))).status).toBe(200);
    const [link] = await linksTo(user.email);
    expect(link).toMatch(new RegExp(`^${APP_ORIGIN}/reset-password\\?token=[A-Za-z0-9_-]{43}$`));
  });

  it("invitations, share links and review-note alerts point at APP_ORIGIN too", async () => {
    const owner = await makeUser("Ines Inviter");
    const team = await (await getDb()).transaction().execute((trx) => insertTeamWithOwner(trx, "Forged host team", owner.id));
    const cookie = await cookieFor(owner);
    const invited = `invited.${Date.now()}@example.org`;
    const sent = await call(invitationsAction, forgedForm(`/teams/${team.id}/invitations`, { intent: "invite", email: invited, role: "viewer" }, cookie), {
      teamId: String(team.id),
    });
    expect(sent.body).toMatchObject({ ok: true });
    expect(await linksTo(invited)).toEqual([expect.stringMatching(new RegExp(`^${APP_ORIGIN}/invitations/`))]);

    const people = await makePeople("Forged");
    const world = await freshWorld(people, "Forged host");
    const made = await call(
      sharesApi,
      new Request(`http://attacker.example/api/networks/${world.networkId}/shares`, {
        method: "POST",
        headers: { ...forged, "Content-Type": "application/json", Cookie: people.cookies.owner! },
        body: JSON.stringify({ role: "viewer", expiresInDays: 3 }),
      }),
      { networkId: String(world.networkId) },
    );
    expect(made.status).toBe(201);
    expect(made.body.url).toMatch(new RegExp(`^${APP_ORIGIN}/s/`));

    const note = await call(
      notesAction,
      forgedForm(`/networks/${world.networkId}/notes`, { intent: "start", body: "Is the route length surveyed?" }, people.cookies.editor),
      { networkId: String(world.networkId) },
    );
    expect(note.body).toMatchObject({ ok: true });
    expect(await linksTo(people.owner.email)).toEqual([`${APP_ORIGIN}/networks/${world.networkId}`]);
  });
});

describe("APP_ORIGIN", () => {
  const saved = { ...process.env };
  afterEach(() => {
    process.env = { ...saved };
    vi.resetModules();
  });

  async function envWith(extra: Record<string, string | undefined>) {
    vi.resetModules();
    process.env = { ...saved, ...extra } as NodeJS.ProcessEnv;
    for (const [key, value] of Object.entries(extra)) if (value === undefined) delete process.env[key];
    return (await import("#app/lib/env.server.ts")).env;
  }

  it("is required in production, where the server refuses to start without it", async () => {
    await expect(envWith({ NODE_ENV: "production", SESSION_SECRET: "x".repeat(40), PASSWORD_HASH_COST: undefined, APP_ORIGIN: undefined })).rejects.toThrow(
      /APP_ORIGIN is required in production/,
    );
  });

  it("must be an origin; outside production it defaults to the local server", async () => {
    await expect(envWith({ APP_ORIGIN: "https://kilostep.example.org/app" })).rejects.toThrow(/APP_ORIGIN must be an origin only/);
    await expect(envWith({ APP_ORIGIN: "javascript:alert(1)" })).rejects.toThrow(/APP_ORIGIN must be an http/);
    expect((await envWith({ APP_ORIGIN: "https://kilostep.example.org/" })).appOrigin).toBe("https://kilostep.example.org");
    expect((await envWith({ APP_ORIGIN: undefined, PORT: "3304" })).appOrigin).toBe("http://localhost:3304");
  });

  it("TRUST_PROXY is off unless set, and the server listens on loopback unless HOST says otherwise", async () => {
    const plain = await envWith({ TRUST_PROXY: undefined, HOST: undefined });
    expect(plain.trustProxy).toBe(false);
    expect(plain.host).toBe("127.0.0.1");
    expect((await envWith({ TRUST_PROXY: "1" })).trustProxy).toBe(1);
    expect((await envWith({ TRUST_PROXY: "loopback" })).trustProxy).toBe("loopback");
  });
});
