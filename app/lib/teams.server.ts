// Team membership rules beyond "who may": a team always keeps at least one owner, so the last
// owner can neither leave, be removed, nor be made editor or viewer.
import type { Db } from "#db/database.ts";
import type { Team, TeamRole } from "#db/schema.ts";
import { countOwners, deleteMembership, findRole, insertMembership, insertTeamWithOwner, membersOf, teamsOfUser, updateRole } from "#db/teams.ts";
import { deleteGrantsOnTeamNetworks } from "#db/shareLinks.ts";
import { findUserByEmail } from "#db/users.ts";
import { firstIssue, teamNameSchema } from "./fieldSchemas.ts";

export type Outcome = { ok: true; message: string } | { ok: false; error: string };

export function checkTeamName(raw: unknown): { ok: true; name: string } | { ok: false; error: string } {
  const checked = teamNameSchema.safeParse(raw);
  return checked.success ? { ok: true, name: checked.data } : { ok: false, error: firstIssue(checked.error) };
}

export async function createTeam(db: Db, name: string, ownerId: number): Promise<Team> {
  return db.transaction().execute((trx) => insertTeamWithOwner(trx, name, ownerId));
}

export async function addMemberByEmail(db: Db, teamId: number, email: string, role: TeamRole): Promise<Outcome> {
  const user = await findUserByEmail(db, email);
  if (!user) {
    return {
      ok: false,
      error: `No Kilostep account uses ${email.trim()}. Ask them to sign up first, then add them here.`,
    };
  }
  // Anyone can sign up with an address that is not theirs; only a proven one is taken at its word.
  if (user.email_verified_at === null) {
    return {
      ok: false,
      error: `The account for ${user.email} has not confirmed its address yet. Send an invitation instead: its link proves the address.`,
    };
  }
  return db.transaction().execute(async (trx) => {
    if (await findRole(trx, teamId, user.id)) return { ok: false, error: `${user.name} is already a member of this team.` };
    await insertMembership(trx, teamId, user.id, role);
    return { ok: true, message: `${user.name} joined the team as ${role}.` };
  });
}

export async function changeMemberRole(db: Db, teamId: number, userId: number, role: TeamRole): Promise<Outcome> {
  return db.transaction().execute(async (trx) => {
    const current = await findRole(trx, teamId, userId);
    if (!current) return { ok: false, error: "That person is not a member of this team." };
    if (current === role) return { ok: true, message: `The role stays ${role}.` };
    if (current === "owner" && (await countOwners(trx, teamId)) === 1)
      return { ok: false, error: "The team's last owner cannot be given another role; make someone else owner first." };
    await updateRole(trx, teamId, userId, role);
    return { ok: true, message: `The role is now ${role}.` };
  });
}

export async function removeMember(db: Db, teamId: number, userId: number): Promise<Outcome> {
  return db.transaction().execute(async (trx) => {
    const current = await findRole(trx, teamId, userId);
    if (!current) return { ok: false, error: "That person is not a member of this team." };
    if (current === "owner" && (await countOwners(trx, teamId)) === 1)
      return { ok: false, error: "The team's last owner cannot leave or be removed; make someone else owner first." };
    await deleteMembership(trx, teamId, userId);
    // Access given by the team's share links while a member ends with the membership; a link
    // still live can be opened again, and shows on the Share page to revoke.
    await deleteGrantsOnTeamNetworks(trx, teamId, userId);
    return { ok: true, message: "Removed from the team." };
  });
}

/** The teams a person belongs to, with their role in each. */
export async function teamsOf(db: Db, userId: number) {
  return teamsOfUser(db, userId);
}

/** A team's members with their roles, and how many owners it has (the last one cannot leave). */
export async function teamMembers(db: Db, teamId: number) {
  const members = await membersOf(db, teamId);
  return { members, ownerCount: members.filter((m) => m.role === "owner").length };
}
