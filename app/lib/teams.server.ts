// Team membership rules beyond "who may": a team always keeps at least one owner, so the last
// owner can neither leave, be removed, nor be made editor or viewer.
import type { Db } from "#db/database.ts";
import type { Team, TeamRole } from "#db/schema.ts";
import { countOwners, deleteMembership, findRole, insertMembership, insertTeamWithOwner, updateRole } from "#db/teams.ts";
import { findUserByEmail } from "#db/users.ts";
import { TEAM_NAME_MAX } from "./forms.ts";

export type Outcome = { ok: true; message: string } | { ok: false; error: string };

export function checkTeamName(raw: unknown): { ok: true; name: string } | { ok: false; error: string } {
  const name = typeof raw === "string" ? raw.trim() : "";
  if (!name) return { ok: false, error: "Give the team a name." };
  if (name.length > TEAM_NAME_MAX) return { ok: false, error: `A team name may have at most ${TEAM_NAME_MAX} characters.` };
  return { ok: true, name };
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
    return { ok: true, message: "Removed from the team." };
  });
}
