// The one access prologue (access.server.ts) and the services the routes now call: each refusal
// keeps the status and shape the product's rules give it (sign-in redirect or 401, 404 for an
// unknown or hidden network, 403 with a sentence for a role too low), and deleting a network
// writes its audit line whichever route deletes it.
import { describe, expect, it } from "vitest";
import { requireApiNetwork, requireNetwork, requireTeam } from "#app/lib/access.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { firstIssue, NETWORK_NAME_MAX, networkNameSchema, noteBodySchema, teamNameSchema } from "#app/lib/fieldSchemas.ts";
import { createNetwork, deleteNetwork, restoreDeletedNetwork } from "#app/lib/networks.server.ts";
import { listAuditEvents } from "#db/auditEvents.ts";
import { insertMembership, insertTeamWithOwner } from "#db/teams.ts";
import { call, cookieFor, getRequest, jsonRequest, makeUser } from "../routes/harness.ts";
import { demoDocument } from "../routes/reviewWorld.ts";

async function world() {
  const db = await getDb();
  const owner = await makeUser("Access Owner");
  const viewer = await makeUser("Access Viewer");
  const outsider = await makeUser("Access Outsider");
  const team = await db.transaction().execute((trx) => insertTeamWithOwner(trx, "Access team", owner.id));
  await insertMembership(db, team.id, viewer.id, "viewer");
  const created = await createNetwork(db, { teamId: team.id, document: demoDocument("Access network"), authorId: owner.id });
  if (!created.ok) throw new Error("demo network does not validate");
  return { db, team, owner, viewer, outsider, network: created.network };
}

const asPage = (fn: () => Promise<unknown>) => call(fn, getRequest("/"));

describe("requireNetwork and requireApiNetwork", () => {
  it("hand back the actor, the network and the role when the action is allowed", async () => {
    const w = await world();
    const grant = await requireNetwork(getRequest("/", await cookieFor(w.viewer)), { networkId: String(w.network.id) }, "view");
    expect(grant.user.id).toBe(w.viewer.id);
    expect(grant.actor).toEqual({ kind: "user", userId: w.viewer.id });
    expect(grant.network.id).toBe(w.network.id);
    expect(grant.role).toBe("viewer");
  });

  it("send someone without a session to sign in (page) or answer 401 (API)", async () => {
    const w = await world();
    const params = { networkId: String(w.network.id) };
    const page = await asPage(() => requireNetwork(getRequest(`/networks/${w.network.id}`), params, "view"));
    expect(page.status).toBe(302);
    const api = await asPage(() => requireApiNetwork(getRequest(`/api/networks/${w.network.id}`), params, "view"));
    expect(api.status).toBe(401);
  });

  it("answer 404 for a malformed number, a network of another team and a deleted one", async () => {
    const w = await world();
    const outsider = await cookieFor(w.outsider);
    const owner = await cookieFor(w.owner);
    expect((await asPage(() => requireNetwork(getRequest("/", owner), { networkId: "7x" }, "view"))).status).toBe(404);
    expect((await asPage(() => requireNetwork(getRequest("/", outsider), { networkId: String(w.network.id) }, "view"))).status).toBe(404);
    const api = await asPage(() => requireApiNetwork(jsonRequest("GET", "/", { cookie: outsider }), { networkId: String(w.network.id) }, "view"));
    expect(api).toMatchObject({ status: 404, body: { error: expect.stringContaining(`no network ${w.network.id}`) } });
    await deleteNetwork(w.db, { network: w.network, by: w.owner });
    expect((await asPage(() => requireNetwork(getRequest("/", owner), { networkId: String(w.network.id) }, "view"))).status).toBe(404);
  });

  it("answer 403 with the roles that may, in the caller's shape", async () => {
    const w = await world();
    const viewer = await cookieFor(w.viewer);
    const params = { networkId: String(w.network.id) };
    const page = await asPage(() => requireNetwork(getRequest("/", viewer), params, "delete"));
    expect(page).toMatchObject({ status: 403, body: expect.stringContaining("needs owner") });
    const api = await asPage(() => requireApiNetwork(jsonRequest("DELETE", "/", { cookie: viewer }), params, "edit"));
    expect(api).toMatchObject({ status: 403, body: { error: expect.stringContaining("needs owner or editor") } });
  });
});

describe("requireTeam", () => {
  it("lets a member see the team and refuses what their role does not allow", async () => {
    const w = await world();
    const viewer = await cookieFor(w.viewer);
    const params = { teamId: String(w.team.id) };
    expect((await requireTeam(getRequest("/", viewer), params, "view-team")).role).toBe("viewer");
    expect((await asPage(() => requireTeam(getRequest("/", viewer), params, "manage-members"))).status).toBe(403);
    const outsider = await cookieFor(w.outsider);
    expect((await asPage(() => requireTeam(getRequest("/", outsider), params, "view-team"))).status).toBe(404);
  });
});

describe("deleting and restoring a network", () => {
  it("writes one audit line each and says until when the network can be restored", async () => {
    const w = await world();
    const now = new Date("2026-12-02T10:00:00Z");
    const { restorableUntil } = await deleteNetwork(w.db, { network: w.network, by: w.owner, now });
    expect(restorableUntil).toBe("2027-01-01T10:00:00.000Z"); // 30 days later, the restore window
    expect(await restoreDeletedNetwork(w.db, { network: w.network, by: w.owner, reviveLinks: true })).toBe(true);
    expect(await restoreDeletedNetwork(w.db, { network: w.network, by: w.owner, reviveLinks: true })).toBe(false);
    const kinds = (await listAuditEvents(w.db, w.team.id)).map((e) => e.kind);
    expect(kinds.filter((k) => k === "network-deleted")).toHaveLength(1);
    expect(kinds.filter((k) => k === "network-restored")).toHaveLength(1);
  });
});

describe("shared field schemas", () => {
  it("trim names and notes and say what is wrong in a sentence", () => {
    expect(networkNameSchema.parse("  Feeder 4 ")).toBe("Feeder 4");
    const tooLong = networkNameSchema.safeParse("x".repeat(NETWORK_NAME_MAX + 1));
    expect(tooLong.success ? "" : firstIssue(tooLong.error)).toBe(`A name may have at most ${NETWORK_NAME_MAX} characters.`);
    const empty = teamNameSchema.safeParse("   ");
    expect(empty.success ? "" : firstIssue(empty.error)).toBe("Give the team a name.");
    const notText = noteBodySchema.safeParse(42);
    expect(notText.success ? "" : firstIssue(notText.error)).toBe("Write something in the note first.");
  });
});
