import { beforeEach, describe, expect, it } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { action as teamAction, loader as teamLoader } from "#app/routes/teams/team.tsx";
import { action as newTeam } from "#app/routes/teams/new.tsx";
import type { User } from "#db/schema.ts";
import { findRole, insertMembership, insertTeamWithOwner } from "#db/teams.ts";
import { call, cookieFor, formRequest, getRequest, makeUser } from "../harness.ts";

let owner: User;
let editor: User;
let viewer: User;
let stranger: User;
let teamId: number;
const cookie = {} as Record<"owner" | "editor" | "viewer", string>;

const post = (who: keyof typeof cookie, fields: Record<string, string>) =>
  call(teamAction, formRequest(`/teams/${teamId}`, fields, { cookie: cookie[who] }), { teamId: String(teamId) });

async function roleOf(user: User) {
  return (await findRole(await getDb(), teamId, user.id)) ?? null;
}

beforeEach(async () => {
  const db = await getDb();
  owner = await makeUser("Tess Owner");
  editor = await makeUser("Teo Editor");
  viewer = await makeUser("Tam Viewer");
  stranger = await makeUser("Tod Stranger");
  teamId = (await db.transaction().execute((trx) => insertTeamWithOwner(trx, "Members team", owner.id))).id;
  await insertMembership(db, teamId, editor.id, "editor");
  await insertMembership(db, teamId, viewer.id, "viewer");
  cookie.owner = await cookieFor(owner);
  cookie.editor = await cookieFor(editor);
  cookie.viewer = await cookieFor(viewer);
});

describe("the team page", () => {
  it("lists the members, owners first, and tells the page what the caller may do", async () => {
    const outcome = await call(teamLoader, getRequest(`/teams/${teamId}`, cookie.viewer), { teamId: String(teamId) });
    expect(outcome.status).toBe(200);
    expect(outcome.body.members.map((m: { role: string }) => m.role)).toEqual(["owner", "editor", "viewer"]);
    expect(outcome.body.may["manage-members"]).toBe(false);
    const asOwner = await call(teamLoader, getRequest(`/teams/${teamId}`, cookie.owner), { teamId: String(teamId) });
    expect(asOwner.body.may["manage-members"]).toBe(true);
  });

  it("is 404 to someone outside the team and redirects the signed-out to sign in", async () => {
    const outsider = await call(teamLoader, getRequest(`/teams/${teamId}`, await cookieFor(stranger)), { teamId: String(teamId) });
    expect(outsider.status).toBe(404);
    const anonymous = await call(teamLoader, getRequest(`/teams/${teamId}`), { teamId: String(teamId) });
    expect(anonymous.status).toBe(302);
    expect(anonymous.headers.get("Location")).toBe(`/sign-in?redirectTo=%2Fteams%2F${teamId}`);
  });
});

describe("managing members", () => {
  it("lets the owner add an existing user by e-mail", async () => {
    const outcome = await post("owner", { intent: "add", email: stranger.email.toUpperCase(), role: "viewer" });
    expect(outcome.status).toBe(200);
    expect(outcome.body.message).toMatch(/joined the team as viewer/);
    expect(await roleOf(stranger)).toBe("viewer");
  });

  it("names an e-mail without an account, and a member added twice", async () => {
    const unknown = await post("owner", { intent: "add", email: "nobody@example.org", role: "editor" });
    expect(unknown.status).toBe(400);
    expect(unknown.body.message).toMatch(/No Kilostep account uses nobody@example.org/);
    const twice = await post("owner", { intent: "add", email: editor.email, role: "viewer" });
    expect(twice.status).toBe(400);
    expect(twice.body.message).toMatch(/already a member/);
    expect(await roleOf(editor)).toBe("editor");
  });

  it("lets the owner change roles and remove members", async () => {
    expect((await post("owner", { intent: "change-role", userId: String(viewer.id), role: "editor" })).status).toBe(200);
    expect(await roleOf(viewer)).toBe("editor");
    expect((await post("owner", { intent: "remove", userId: String(viewer.id) })).status).toBe(200);
    expect(await roleOf(viewer)).toBeNull();
  });

  it("refuses editors and viewers with 403", async () => {
    for (const who of ["editor", "viewer"] as const) {
      expect((await post(who, { intent: "add", email: stranger.email, role: "owner" })).status).toBe(403);
      expect((await post(who, { intent: "change-role", userId: String(viewer.id), role: "owner" })).status).toBe(403);
      expect((await post(who, { intent: "remove", userId: String(owner.id) })).status).toBe(403);
    }
    expect(await roleOf(stranger)).toBeNull();
    expect(await roleOf(owner)).toBe("owner");
  });

  it("never demotes or removes the last owner, and the last owner cannot leave", async () => {
    const demote = await post("owner", { intent: "change-role", userId: String(owner.id), role: "editor" });
    expect(demote.status).toBe(400);
    expect(demote.body.message).toMatch(/last owner/);
    const remove = await post("owner", { intent: "remove", userId: String(owner.id) });
    expect(remove.status).toBe(400);
    const leave = await post("owner", { intent: "leave" });
    expect(leave.status).toBe(400);
    expect(leave.body.message).toMatch(/last owner/);
    expect(await roleOf(owner)).toBe("owner");
  });

  it("lets an owner step down or leave once another owner exists", async () => {
    await post("owner", { intent: "change-role", userId: String(editor.id), role: "owner" });
    const demote = await post("owner", { intent: "change-role", userId: String(owner.id), role: "viewer" });
    expect(demote.status).toBe(200);
    expect(await roleOf(owner)).toBe("viewer");
  });

  it("lets any member leave, which sends them to their teams", async () => {
    const outcome = await post("viewer", { intent: "leave" });
    expect(outcome.status).toBe(302);
    expect(outcome.headers.get("Location")).toBe("/teams");
    expect(await roleOf(viewer)).toBeNull();
  });

  it("rejects a role that does not exist", async () => {
    const outcome = await post("owner", { intent: "change-role", userId: String(viewer.id), role: "admin" });
    expect(outcome.status).toBe(400);
    expect(await roleOf(viewer)).toBe("viewer");
  });
});

describe("creating a team", () => {
  it("makes the creator its owner", async () => {
    const outcome = await call(newTeam, formRequest("/teams/new", { name: "  Survey crew " }, { cookie: cookie.viewer }));
    expect(outcome.status).toBe(302);
    const id = Number(outcome.headers.get("Location")?.split("/").pop());
    const db = await getDb();
    expect((await db.selectFrom("teams").select("name").where("id", "=", id).executeTakeFirstOrThrow()).name).toBe("Survey crew");
    expect(await findRole(db, id, viewer.id)).toBe("owner");
  });

  it("asks for a name", async () => {
    const outcome = await call(newTeam, formRequest("/teams/new", { name: "   " }, { cookie: cookie.viewer }));
    expect(outcome.status).toBe(400);
    expect(outcome.body.error).toBe("Give the team a name.");
  });
});
