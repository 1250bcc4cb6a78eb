import { beforeAll, describe, expect, it } from "vitest";
import { loader as networksApi } from "#app/routes/api/networks.ts";
import { action as changeNetwork } from "#app/routes/api/network.ts";
import { loader as sharedNetworkLoader } from "#app/routes/share/shared-network.tsx";
import { getDb } from "#app/lib/db.server.ts";
import { networkAccess, teamAccess } from "#app/lib/permissions.server.ts";
import { hashSecretToken } from "#app/lib/secretTokens.server.ts";
import { createShareLink, openShareLink, revokeShareLink, shareLinkActor } from "#app/lib/shareLinks.server.ts";
import { listAuditEvents } from "#db/auditEvents.ts";
import { markNetworkDeleted } from "#db/networks.ts";
import { listShareLinks, liveGrantRole, listGrantedNetworks } from "#db/shareLinks.ts";
import { call, getRequest, jsonRequest, ORIGIN } from "../harness.ts";
import { demoDocument, freshWorld, makePeople, type People, type World } from "../reviewWorld.ts";

let people: People;
let world: World;

beforeAll(async () => {
  people = await makePeople("Links");
  world = await freshWorld(people, "Links");
});

async function networkRow(id: number) {
  return (await getDb()).selectFrom("networks").selectAll().where("id", "=", id).executeTakeFirstOrThrow();
}

describe("share link tokens", () => {
  it("store only the token's SHA-256; the token appears nowhere in the database", async () => {
    const db = await getDb();
    const { link, url } = await createShareLink(db, {
      network: await networkRow(world.networkId),
      request: { role: "viewer", expiresInDays: 2 },
      by: people.owner,
    });
    const token = url.split("/s/")[1];
    expect(url).toBe(`${ORIGIN}/s/${token}`);
    expect(link.token_hash).toBe(hashSecretToken(token));
    const everyText = JSON.stringify(await db.selectFrom("share_links").selectAll().execute());
    expect(everyText).not.toContain(token);
  });

  it("set the expiry the given number of days ahead, or none", async () => {
    const db = await getDb();
    const now = new Date("2026-12-11T09:00:00.000Z");
    const network = await networkRow(world.networkId);
    const dated = await createShareLink(db, { network, request: { role: "viewer", expiresInDays: 3 }, by: people.owner, now });
    const open = await createShareLink(db, { network, request: { role: "viewer", expiresInDays: null }, by: people.owner, now });
    expect(dated.link.expires_at).toBe("2026-12-14T09:00:00.000Z");
    expect(open.link.expires_at).toBeNull();
  });

  it("open as live, revoked, expired or unknown, checked on every call", async () => {
    const db = await getDb();
    expect((await openShareLink(db, world.tokens.viewLink)).state).toBe("live");
    expect((await openShareLink(db, world.tokens.revokedLink)).state).toBe("revoked");
    expect((await openShareLink(db, world.tokens.expiredLink)).state).toBe("expired");
    expect((await openShareLink(db, world.tokens.owner)).state).toBe("unknown");
    expect((await openShareLink(db, "not a token")).state).toBe("unknown");
  });

  it("stop at once when revoked, for the link and for every grant made from it", async () => {
    const db = await getDb();
    const own = await freshWorld(people, "Links revoke");
    expect(await liveGrantRole(db, own.networkId, people.editLinkUser.id)).toBe("editor");
    const opened = await openShareLink(db, own.tokens.editLink);
    if (opened.state !== "live") throw new Error("the edit link should be live");
    expect(await revokeShareLink(db, opened.link, people.owner)).toBe(true);
    expect(await revokeShareLink(db, opened.link, people.owner)).toBe(false);
    expect((await openShareLink(db, own.tokens.editLink)).state).toBe("revoked");
    expect(await liveGrantRole(db, own.networkId, people.editLinkUser.id)).toBeNull();
    expect(await networkAccess(db, { kind: "user", userId: people.editLinkUser.id }, own.networkId, "view")).toMatchObject({ ok: false, status: 404 });
  });

  it("close with the network: a deleted network's links open nothing", async () => {
    const db = await getDb();
    const own = await freshWorld(people, "Links deleted");
    await markNetworkDeleted(db, own.networkId, people.owner.id);
    expect((await openShareLink(db, own.tokens.viewLink)).state).toBe("gone");
    const page = await call(sharedNetworkLoader, getRequest(`/s/${own.tokens.viewLink}`), { token: own.tokens.viewLink });
    expect(page.status).toBe(410);
    expect(page.body).toMatchObject({ kind: "closed", title: "This network is gone" });
  });
});

describe("what a link grants", () => {
  it("a view-link actor sees its one network, read only, and nothing of the team or other networks", async () => {
    const db = await getDb();
    const opened = await openShareLink(db, world.tokens.viewLink);
    if (opened.state !== "live") throw new Error("the view link should be live");
    const actor = shareLinkActor(opened.link);
    expect(await networkAccess(db, actor, world.networkId, "view")).toMatchObject({ ok: true, role: "viewer" });
    for (const action of ["edit", "rename", "delete", "share"] as const) {
      expect(await networkAccess(db, actor, world.networkId, action)).toMatchObject({ ok: false, status: 403 });
    }
    expect(await networkAccess(db, actor, world.otherNetworkId, "view")).toMatchObject({ ok: false, status: 404 });
    expect(await teamAccess(db, actor, people.team.id, "view-team")).toMatchObject({ ok: false, status: 404 });
  });

  it("an edit-link holder edits that network only: no delete, no share, no team, no other network", async () => {
    const db = await getDb();
    const actor = { kind: "user" as const, userId: people.editLinkUser.id };
    for (const action of ["view", "edit", "rename"] as const) {
      expect(await networkAccess(db, actor, world.networkId, action)).toMatchObject({ ok: true, role: "editor" });
    }
    const refused = await networkAccess(db, actor, world.networkId, "share");
    expect(refused).toMatchObject({ ok: false, status: 403 });
    if (!refused.ok) expect(refused.error).toContain("given by a share link");
    expect(await networkAccess(db, actor, world.otherNetworkId, "view")).toMatchObject({ ok: false, status: 404 });
    expect(await teamAccess(db, actor, people.team.id, "view-team")).toMatchObject({ ok: false, status: 404 });
    expect((await listGrantedNetworks(db, people.editLinkUser.id)).map((n) => n.id)).toContain(world.networkId);
    expect((await listGrantedNetworks(db, people.revokedUser.id)).map((n) => n.id)).not.toContain(world.networkId);
    const listed = await call(networksApi, getRequest("/api/networks", people.cookies.editLink));
    expect(listed.body.networks).toContainEqual(
      expect.objectContaining({ id: world.networkId, role: "editor", team: { id: people.team.id, name: people.team.name } }),
    );
    expect(listed.body.networks.map((n: { id: number }) => n.id)).not.toContain(world.otherNetworkId);
    const revoked = await call(networksApi, getRequest("/api/networks", people.cookies.revokedLink));
    expect(revoked.body.networks.map((n: { id: number }) => n.id)).not.toContain(world.networkId);
  });

  it("a team viewer who opens an edit link edits that network, and keeps only viewing the others", async () => {
    const db = await getDb();
    const own = await freshWorld(people, "Links upgrade");
    const viewer = { kind: "user" as const, userId: people.viewer.id };
    expect(await networkAccess(db, viewer, own.networkId, "edit")).toMatchObject({ ok: false, status: 403 });
    const page = await call(sharedNetworkLoader, getRequest(`/s/${own.tokens.editLink}`, people.cookies.viewer), { token: own.tokens.editLink });
    expect(page.status).toBe(302);
    expect(page.headers.get("Location")).toBe(`/networks/${own.networkId}`);
    expect(await networkAccess(db, viewer, own.networkId, "edit")).toMatchObject({ ok: true, role: "editor" });
    expect(await networkAccess(db, viewer, own.otherNetworkId, "edit")).toMatchObject({ ok: false, status: 403 });
  });
});

describe("the shared page and its record of use", () => {
  it("shows a view link to someone without an account, and notes one use per visit with an audit line", async () => {
    const db = await getDb();
    const own = await freshWorld(people, "Links uses");
    const first = await call(sharedNetworkLoader, getRequest(`/s/${own.tokens.viewLink}`), { token: own.tokens.viewLink });
    expect(first.status).toBe(200);
    expect(first.body).toMatchObject({ kind: "view", id: own.networkId, revision: { number: 1 } });
    await call(sharedNetworkLoader, getRequest(`/s/${own.tokens.viewLink}`), { token: own.tokens.viewLink });
    const links = await listShareLinks(db, own.networkId);
    const viewLink = links.find((l) => l.id === own.liveShareId)!;
    expect(viewLink.uses).toEqual([expect.objectContaining({ userName: null })]);
    const audit = await listAuditEvents(db, people.team.id);
    expect(audit.some((e) => e.kind === "link-used" && e.networkId === own.networkId && e.summary.startsWith("Someone without an account"))).toBe(true);
  });

  it("asks for an account before an edit link opens, and records who then used it", async () => {
    const db = await getDb();
    const own = await freshWorld(people, "Links edit page");
    const anonymous = await call(sharedNetworkLoader, getRequest(`/s/${own.tokens.editLink}`), { token: own.tokens.editLink });
    expect(anonymous.status).toBe(200);
    expect(anonymous.body).toEqual({ kind: "sign-in", back: `/s/${own.tokens.editLink}` });
    const signedIn = await call(sharedNetworkLoader, getRequest(`/s/${own.tokens.editLink}`, people.cookies.outsider), { token: own.tokens.editLink });
    expect(signedIn.status).toBe(302);
    const uses = (await listShareLinks(db, own.networkId)).flatMap((l) => l.uses);
    expect(uses).toEqual([expect.objectContaining({ userName: people.outsider.name })]);
  });

  it("opens a draft read only with its problems, as the owner's sheet does; a wrong shape is still refused", async () => {
    const own = await freshWorld(people, "Links draft");
    const network = await networkRow(own.networkId);
    const draft = demoDocument("Links draft");
    (draft.loads as { bus: string }[])[0].bus = "";
    const saved = await call(
      changeNetwork,
      jsonRequest("PUT", `/api/networks/${own.networkId}`, { cookie: people.cookies.owner, body: { revision: network.current_revision, document: draft } }),
      { networkId: String(own.networkId) },
    );
    expect(saved.status).toBe(200);
    expect(saved.body.problems).toHaveLength(1);
    const page = await call(sharedNetworkLoader, getRequest(`/s/${own.tokens.viewLink}`), { token: own.tokens.viewLink });
    expect(page.status).toBe(200);
    expect(page.body.kind).toBe("view");
    expect(page.body.document.loads[0].bus).toBe("");
    expect(page.body.issues).toEqual([]);
    expect(page.body.problems).toEqual(saved.body.problems);
    // The link still reads only its own network, and only while it is live.
    const revoked = await call(sharedNetworkLoader, getRequest(`/s/${own.tokens.revokedLink}`), { token: own.tokens.revokedLink });
    expect(revoked.status).toBe(410);
    expect(revoked.body.document).toBeUndefined();
  });

  it("shows nothing but a sentence for a revoked or expired link", async () => {
    for (const [token, title] of [
      [world.tokens.revokedLink, "This link was revoked"],
      [world.tokens.expiredLink, "This link has expired"],
    ]) {
      const page = await call(sharedNetworkLoader, getRequest(`/s/${token}`), { token });
      expect(page.status).toBe(410);
      expect(Object.keys(page.body).sort()).toEqual(["kind", "sentence", "title"]);
      expect(page.body.title).toBe(title);
    }
  });
});
