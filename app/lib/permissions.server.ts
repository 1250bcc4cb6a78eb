// The one place that answers "may this actor do this to that team or network". Every loader,
// action and API route asks here; the pages use `abilitiesOf` to hide what would be refused.
import { data } from "react-router";
import type { Db } from "#db/database.ts";
import { findNetwork } from "#db/networks.ts";
import type { NetworkRow, ShareRole, Team, TeamRole } from "#db/schema.ts";
import { liveGrantRole } from "#db/shareLinks.ts";
import { findRole, findTeam } from "#db/teams.ts";

/**
 * Who is acting. A signed-in user acts with their team roles, plus the roles that share links
 * they opened grant on single networks (network_grants, live only while the link is). A
 * share-link holder without an account acts as the link itself: one role on exactly one
 * network, nothing on any team or any other network. `roleOnTeam` / `roleOnNetwork` are the
 * two places that know about each kind.
 */
export type { TeamRole };

export type Actor =
  | { kind: "user"; userId: number }
  | { kind: "share-link"; linkId: number; networkId: number; role: ShareRole };

export const TEAM_ACTIONS = ["view-team", "leave-team", "create-in-team", "manage-members", "edit-library"] as const;
export const NETWORK_ACTIONS = ["view", "edit", "rename", "delete", "restore", "share"] as const;
export type TeamAction = (typeof TEAM_ACTIONS)[number];
export type NetworkAction = (typeof NETWORK_ACTIONS)[number];
export type Action = TeamAction | NetworkAction;

export const ROLES: readonly TeamRole[] = ["owner", "editor", "viewer"];

const GRANTS: Record<TeamRole, ReadonlySet<Action>> = {
  owner: new Set<Action>([...TEAM_ACTIONS, ...NETWORK_ACTIONS]),
  editor: new Set<Action>(["view-team", "leave-team", "create-in-team", "edit-library", "view", "edit", "rename"]),
  viewer: new Set<Action>(["view-team", "leave-team", "view"]),
};

const ACTION_WORDS: Record<Action, string> = {
  "view-team": "seeing this team",
  "leave-team": "leaving this team",
  "create-in-team": "creating a network in this team",
  "manage-members": "managing this team's members",
  "edit-library": "changing this team's equipment library",
  view: "opening this network",
  edit: "changing this network",
  rename: "renaming this network",
  delete: "deleting this network",
  restore: "restoring this network",
  share: "sharing this network",
};

export function roleAllows(role: TeamRole | null | undefined, action: Action): boolean {
  return role ? GRANTS[role].has(action) : false;
}

/** Which roles may do the action, for messages such as "needs owner or editor". */
export function rolesAllowed(action: Action): TeamRole[] {
  return ROLES.filter((role) => GRANTS[role].has(action));
}

/** Every action's answer for one role, for pages deciding which controls to show. */
export function abilitiesOf(role: TeamRole | null | undefined): Record<Action, boolean> {
  const all = [...TEAM_ACTIONS, ...NETWORK_ACTIONS] as Action[];
  return Object.fromEntries(all.map((action) => [action, roleAllows(role, action)])) as Record<Action, boolean>;
}

export async function roleOnTeam(db: Db, actor: Actor, teamId: number): Promise<TeamRole | null> {
  if (actor.kind !== "user") return null;
  return (await findRole(db, teamId, actor.userId)) ?? null;
}

const ROLE_STRENGTH: Record<TeamRole, number> = { viewer: 1, editor: 2, owner: 3 };

async function roleOnNetwork(db: Db, actor: Actor, network: Pick<NetworkRow, "id" | "team_id">): Promise<TeamRole | null> {
  if (actor.kind === "share-link") return actor.networkId === network.id ? actor.role : null;
  const teamRole = await roleOnTeam(db, actor, network.team_id);
  if (teamRole === "owner") return teamRole;
  const granted = await liveGrantRole(db, network.id, actor.userId);
  if (!granted) return teamRole;
  return !teamRole || ROLE_STRENGTH[granted] > ROLE_STRENGTH[teamRole] ? granted : teamRole;
}

export type Refusal = { ok: false; status: 403 | 404; error: string };
export type TeamAccess = { ok: true; team: Team; role: TeamRole } | Refusal;
export type NetworkAccess = { ok: true; network: NetworkRow; role: TeamRole } | Refusal;

function refusedFor(role: TeamRole, action: Action, where: string): Refusal {
  const needed = rolesAllowed(action).join(" or ");
  return {
    ok: false,
    status: 403,
    error: `Your role in ${where} is ${role}; ${ACTION_WORDS[action]} needs ${needed}.`,
  };
}

/** Someone outside the team learns nothing, not even that the team exists: 404. */
export async function teamAccess(db: Db, actor: Actor, teamId: number, action: TeamAction): Promise<TeamAccess> {
  const team = await findTeam(db, teamId);
  const role = team ? await roleOnTeam(db, actor, team.id) : null;
  if (!team || !role) return { ok: false, status: 404, error: `There is no team ${teamId} that you belong to.` };
  if (!roleAllows(role, action)) return refusedFor(role, action, `the team "${team.name}"`);
  return { ok: true, team, role };
}

/** A deleted network can only be restored; for everything else it is gone (404). */
export async function networkAccess(
  db: Db,
  actor: Actor,
  networkId: number,
  action: NetworkAction,
): Promise<NetworkAccess> {
  const missing: Refusal = { ok: false, status: 404, error: `There is no network ${networkId} that you can open.` };
  const network = await findNetwork(db, networkId);
  if (!network) return missing;
  if (network.deleted_at !== null && action !== "restore") return missing;
  const role = await roleOnNetwork(db, actor, network);
  if (!role) return missing;
  if (!roleAllows(role, action)) {
    if ((await roleOnTeam(db, actor, network.team_id)) !== role) return refusedFor(role, action, "this network, given by a share link,");
    const team = await findTeam(db, network.team_id);
    return refusedFor(role, action, `the team "${team?.name ?? network.team_id}"`);
  }
  return { ok: true, network, role };
}

/** For pages: a refusal becomes a thrown `data()` that the error boundary shows. */
export function grantedOrPageError<T extends { ok: true }>(access: T | Refusal): T {
  if (!access.ok) throw data(access.error, { status: access.status });
  return access;
}

/** For the JSON API: a refusal becomes a thrown JSON response. */
export function grantedOrApiError<T extends { ok: true }>(access: T | Refusal): T {
  if (!access.ok) throw Response.json({ error: access.error }, { status: access.status });
  return access;
}
