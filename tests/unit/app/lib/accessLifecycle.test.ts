// Issue #13, findings 6 and 7: unlimited mail from any free account (invitations and review
// requests to any address, with the sender's words); access that outlived its reason (a removed
// member kept an edit link's grant, a restored network silently revived its old links, and a
// member could be added by an address nobody had proven).
import { describe, expect, it } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { mailSettled, PERSONAL_MAIL_PER_HOUR, receivedMail } from "#app/lib/mail.server.ts";
import { loader as networkApi } from "#app/routes/api/network.ts";
import { action as signUp } from "#app/routes/auth/sign-up.tsx";
import { loader as verifyEmailPage } from "#app/routes/auth/verify-email.tsx";
import { action as networksAction } from "#app/routes/networks/list.tsx";
import { action as shareAction } from "#app/routes/networks/share.tsx";
import { loader as sharedNetwork } from "#app/routes/share/shared-network.tsx";
import { action as invitationsAction } from "#app/routes/teams/invitations.ts";
import { action as teamAction } from "#app/routes/teams/team.tsx";
import { findRole, insertTeamWithOwner } from "#db/teams.ts";
import { findUserByEmail } from "#db/users.ts";
import { call, cookieFor, formRequest, getRequest, jsonRequest, makeUser } from "../routes/harness.ts";
import { freshWorld, makePeople } from "../routes/reviewWorld.ts";

describe("mail a person makes the product send", () => {
  it(`is limited to ${PERSONAL_MAIL_PER_HOUR} invitations and review requests an hour per account`, async () => {
    const owner = await makeUser("Moira Mailer");
    const team = await (await getDb()).transaction().execute((trx) => insertTeamWithOwner(trx, "Mail limit team", owner.id));
    const cookie = await cookieFor(owner);
    const invite = (i: number) =>
      call(invitationsAction, formRequest(`/teams/${team.id}/invitations`, { intent: "invite", email: `stranger.${i}.${Date.now()}@example.org`, role: "viewer" }, { cookie }), {
        teamId: String(team.id),
      });
    for (let i = 0; i < PERSONAL_MAIL_PER_HOUR; i++) expect((await invite(i)).body).toMatchObject({ ok: true });
    const refused = await invite(999);
    expect(refused.body).toMatchObject({ ok: false, message: expect.stringMatching(/most one account may/) });

    const people = await makePeople("Mailer");
    const world = await freshWorld(people, "Mail limit");
    const ask = (i: number) =>
      call(
        shareAction,
        formRequest(`/networks/${world.networkId}/share`, { intent: "review", role: "viewer", expiresInDays: "3", email: `reviewer.${i}@example.org`, message: "Please look" }, { cookie: people.cookies.owner }),
        { networkId: String(world.networkId) },
      );
    for (let i = 0; i < PERSONAL_MAIL_PER_HOUR; i++) expect((await ask(i)).status).toBe(200);
    expect((await ask(999)).status).toBe(429);
  });
});

describe("access that ends with its reason", () => {
  it("a member removed from the team loses the grant an edit link gave them while a member", async () => {
    const people = await makePeople("Leaver");
    const world = await freshWorld(people, "Leaver");
    const db = await getDb();
    const made = await call(
      shareAction,
      formRequest(`/networks/${world.networkId}/share`, { intent: "create", role: "editor", expiresInDays: "30" }, { cookie: people.cookies.owner }),
      { networkId: String(world.networkId) },
    );
    const token = String(made.body.url).split("/s/")[1];
    // The editor opens the edit link while still a member: a grant on top of the team role.
    await call(sharedNetwork, getRequest(`/s/${token}`, people.cookies.editor), { token });
    expect(await db.selectFrom("network_grants").select("user_id").where("user_id", "=", people.editor.id).execute()).toHaveLength(1);

    const removed = await call(teamAction, formRequest(`/teams/${people.team.id}`, { intent: "remove", userId: String(people.editor.id) }, { cookie: people.cookies.owner }), {
      teamId: String(people.team.id),
    });
    expect(removed.status).toBe(200);
    expect(await findRole(db, people.team.id, people.editor.id)).toBeUndefined();
    expect(await db.selectFrom("network_grants").select("user_id").where("user_id", "=", people.editor.id).execute()).toHaveLength(0);
    expect((await call(networkApi, jsonRequest("GET", `/api/networks/${world.networkId}`, { cookie: people.cookies.editor }), { networkId: String(world.networkId) })).status).toBe(404);
  });

  it("restoring a deleted network keeps its links shut unless the owner asks to open them again", async () => {
    const people = await makePeople("Restorer");
    const world = await freshWorld(people, "Restorer");
    const viewLink = async () => {
      const made = await call(
        shareAction,
        formRequest(`/networks/${world.networkId}/share`, { intent: "create", role: "viewer", expiresInDays: "30" }, { cookie: people.cookies.owner }),
        { networkId: String(world.networkId) },
      );
      return String(made.body.url).split("/s/")[1];
    };
    const opens = async (token: string) => (await call(sharedNetwork, getRequest(`/s/${token}`), { token })).status;
    const deleteAndRestore = async (fields: Record<string, string>) => {
      const cookie = people.cookies.owner;
      expect((await call(networksAction, formRequest("/networks", { intent: "delete", networkId: String(world.networkId) }, { cookie }))).status).toBe(200);
      expect((await call(networksAction, formRequest("/networks", { intent: "restore", networkId: String(world.networkId), ...fields }, { cookie }))).status).toBe(200);
    };

    const first = await viewLink();
    expect(await opens(first)).toBe(200);
    await deleteAndRestore({});
    expect(await opens(first)).toBe(410);

    const second = await viewLink();
    await deleteAndRestore({ reviveLinks: "on" });
    expect(await opens(second)).toBe(200);
  });

  it("only a proven address can be added to a team; the link mailed at sign-up proves it", async () => {
    const owner = await makeUser("Vic Verifier");
    const team = await (await getDb()).transaction().execute((trx) => insertTeamWithOwner(trx, "Verified team", owner.id));
    const email = `claimed.${Date.now()}@example.org`;
    const joined = await call(signUp, formRequest("/sign-up", { name: "Claire Claimed", email, password: "a long enough password" }));
    expect(joined.status).toBe(302);
    expect((await findUserByEmail(await getDb(), email))?.email_verified_at).toBeNull();

    const addAsOwner = async () =>
      call(teamAction, formRequest(`/teams/${team.id}`, { intent: "add", email, role: "editor" }, { cookie: await cookieFor(owner) }), { teamId: String(team.id) });
    const refused = await addAsOwner();
    expect(refused.body).toMatchObject({ ok: false, message: expect.stringMatching(/has not confirmed its address yet/) });

    await mailSettled();
    const [message] = await receivedMail({ to: email });
    expect(message.subject).toBe("Confirm your e-mail address for Kilostep");
    const link = new URL(message.links[0]);
    expect((await call(verifyEmailPage, getRequest(`${link.pathname}${link.search}`))).body).toMatchObject({ verified: true });
    expect((await call(verifyEmailPage, getRequest(`${link.pathname}${link.search}`))).status).toBe(410);
    expect((await addAsOwner()).body).toMatchObject({ ok: true });
  });
});
