import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { documentFromTemplate } from "#app/lib/demo/networkTemplates.server.ts";
import { createNetwork } from "#app/lib/networks.server.ts";
import {
  abilitiesOf,
  NETWORK_ACTIONS,
  networkAccess,
  roleAllows,
  rolesAllowed,
  TEAM_ACTIONS,
  teamAccess,
  type Action,
  type Actor,
  type NetworkAction,
  type TeamAction,
} from "#app/lib/permissions.server.ts";
import { markNetworkDeleted } from "#db/networks.ts";
import type { TeamRole } from "#db/schema.ts";
import { insertMembership, insertTeamWithOwner } from "#db/teams.ts";
import { makeUser } from "../routes/harness.ts";

// The product's rules, written out by hand (not derived from the module under test):
// owners do everything; editors create, change and rename, and keep the team's equipment library;
// viewers only look (and may leave).
const EXPECTED: Record<TeamRole, Record<Action, boolean>> = {
  owner: {
    "view-team": true, "leave-team": true, "create-in-team": true, "manage-members": true, "edit-library": true,
    view: true, edit: true, rename: true, delete: true, restore: true, share: true,
  },
  editor: {
    "view-team": true, "leave-team": true, "create-in-team": true, "manage-members": false, "edit-library": true,
    view: true, edit: true, rename: true, delete: false, restore: false, share: false,
  },
  viewer: {
    "view-team": true, "leave-team": true, "create-in-team": false, "manage-members": false, "edit-library": false,
    view: true, edit: false, rename: false, delete: false, restore: false, share: false,
  },
};

const ROLES: TeamRole[] = ["owner", "editor", "viewer"];
const cases = ROLES.flatMap((role) =>
  [...TEAM_ACTIONS, ...NETWORK_ACTIONS].map((action) => ({ role, action, allowed: EXPECTED[role][action] })),
);

describe("roleAllows: every role × every action", () => {
  it("covers exactly the actions the module knows", () => {
    expect(Object.keys(EXPECTED.owner).sort()).toEqual([...TEAM_ACTIONS, ...NETWORK_ACTIONS].sort());
  });

  it.each(cases)("$role → $action: $allowed", ({ role, action, allowed }) => {
    expect(roleAllows(role, action)).toBe(allowed);
    expect(abilitiesOf(role)[action]).toBe(allowed);
  });

  it("allows nothing without a role", () => {
    for (const action of [...TEAM_ACTIONS, ...NETWORK_ACTIONS]) expect(roleAllows(null, action)).toBe(false);
  });

  it("names the roles that may do an action, for messages", () => {
    expect(rolesAllowed("delete")).toEqual(["owner"]);
    expect(rolesAllowed("edit")).toEqual(["owner", "editor"]);
  });
});

describe("access checks against the database: every role × every action", () => {
  const actors = {} as Record<TeamRole | "outsider", Actor>;
  let teamId: number;
  let networkId: number;
  let deletedNetworkId: number;

  beforeAll(async () => {
    const db = await getDb();
    const owner = await makeUser("Owen Owner");
    const editor = await makeUser("Edie Editor");
    const viewer = await makeUser("Vic Viewer");
    const outsider = await makeUser("Otto Outsider", { ownTeam: true });
    const team = await db.transaction().execute((trx) => insertTeamWithOwner(trx, "Access team", owner.id));
    teamId = team.id;
    await insertMembership(db, teamId, editor.id, "editor");
    await insertMembership(db, teamId, viewer.id, "viewer");
    for (const [key, user] of Object.entries({ owner, editor, viewer, outsider }))
      actors[key as TeamRole | "outsider"] = { kind: "user", userId: user.id };

    const made = await createNetwork(db, { teamId, document: documentFromTemplate("blank", "Live"), authorId: owner.id });
    const gone = await createNetwork(db, { teamId, document: documentFromTemplate("blank", "Gone"), authorId: owner.id });
    if (!made.ok || !gone.ok) throw new Error("fixture networks did not validate");
    networkId = made.network.id;
    deletedNetworkId = gone.network.id;
    await markNetworkDeleted(db, deletedNetworkId, owner.id);
  });

  const teamCases = ROLES.flatMap((role) => TEAM_ACTIONS.map((action) => ({ role, action })));
  it.each(teamCases)("team: $role → $action", async ({ role, action }) => {
    const access = await teamAccess(await getDb(), actors[role], teamId, action as TeamAction);
    if (EXPECTED[role][action]) {
      expect(access).toMatchObject({ ok: true, role });
    } else {
      expect(access).toMatchObject({ ok: false, status: 403 });
      if (!access.ok) expect(access.error).toContain(`is ${role}`);
    }
  });

  const networkCases = ROLES.flatMap((role) => NETWORK_ACTIONS.filter((a) => a !== "restore").map((action) => ({ role, action })));
  it.each(networkCases)("live network: $role → $action", async ({ role, action }) => {
    const access = await networkAccess(await getDb(), actors[role], networkId, action as NetworkAction);
    expect(access.ok ? 200 : access.status).toBe(EXPECTED[role][action] ? 200 : 403);
  });

  it.each(ROLES)("deleted network: %s may restore only if owner, and sees it as gone otherwise", async (role) => {
    const db = await getDb();
    const restore = await networkAccess(db, actors[role], deletedNetworkId, "restore");
    expect(restore.ok ? 200 : restore.status).toBe(EXPECTED[role].restore ? 200 : 403);
    for (const action of NETWORK_ACTIONS.filter((a) => a !== "restore")) {
      expect(await networkAccess(db, actors[role], deletedNetworkId, action)).toMatchObject({ ok: false, status: 404 });
    }
  });

  it("tells someone outside the team nothing: 404 for every action, on the team and its networks", async () => {
    const db = await getDb();
    for (const action of TEAM_ACTIONS) {
      expect(await teamAccess(db, actors.outsider, teamId, action)).toMatchObject({ ok: false, status: 404 });
    }
    for (const action of NETWORK_ACTIONS) {
      expect(await networkAccess(db, actors.outsider, networkId, action)).toMatchObject({ ok: false, status: 404 });
    }
  });

  it("answers 404 for a team or network that does not exist", async () => {
    const db = await getDb();
    expect(await teamAccess(db, actors.owner, 987654, "view-team")).toMatchObject({ ok: false, status: 404 });
    expect(await networkAccess(db, actors.owner, 987654, "view")).toMatchObject({ ok: false, status: 404 });
  });
});
