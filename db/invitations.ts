// Team invitations: an owner invites an e-mail address with a role; the link in the message
// (stored here only as its hash) works once and until it expires.
import type { Db } from "./database.ts";
import type { TeamInvitationRow, TeamRole } from "./schema.ts";

export interface PendingInvitation {
  id: number;
  email: string;
  role: TeamRole;
  invitedByName: string | null;
  createdAt: string;
  expiresAt: string;
}

export async function insertInvitation(
  db: Db,
  input: { teamId: number; email: string; role: TeamRole; tokenHash: string; invitedBy: number; now: Date; expiresAt: string },
): Promise<TeamInvitationRow> {
  return db
    .insertInto("team_invitations")
    .values({
      team_id: input.teamId,
      email: input.email,
      role: input.role,
      token_hash: input.tokenHash,
      invited_by: input.invitedBy,
      created_at: input.now.toISOString(),
      expires_at: input.expiresAt,
    })
    .returningAll()
    .executeTakeFirstOrThrow();
}

export async function findInvitationByHash(db: Db, tokenHash: string): Promise<TeamInvitationRow | undefined> {
  return db.selectFrom("team_invitations").selectAll().where("token_hash", "=", tokenHash).executeTakeFirst();
}

export async function deleteInvitation(db: Db, id: number): Promise<void> {
  await db.deleteFrom("team_invitations").where("id", "=", id).execute();
}

/** Invitations of the team not yet accepted, revoked or expired, newest first. */
export async function listPendingInvitations(db: Db, teamId: number, now = new Date()): Promise<PendingInvitation[]> {
  return db
    .selectFrom("team_invitations as i")
    .leftJoin("users as u", "u.id", "i.invited_by")
    .select(["i.id", "i.email", "i.role", "u.name as invitedByName", "i.created_at as createdAt", "i.expires_at as expiresAt"])
    .where("i.team_id", "=", teamId)
    .where("i.accepted_at", "is", null)
    .where("i.revoked_at", "is", null)
    .where("i.expires_at", ">", now.toISOString())
    .orderBy("i.created_at", "desc")
    .execute();
}

/**
 * Takes the invitation for the user if it is still live; false when someone (or a second tab)
 * took it first, or it was revoked or expired meanwhile. The guard makes it single use.
 */
export async function takeInvitation(db: Db, id: number, userId: number, now: Date): Promise<boolean> {
  const result = await db
    .updateTable("team_invitations")
    .set({ accepted_at: now.toISOString(), accepted_by: userId })
    .where("id", "=", id)
    .where("accepted_at", "is", null)
    .where("revoked_at", "is", null)
    .where("expires_at", ">", now.toISOString())
    .executeTakeFirst();
  return Number(result.numUpdatedRows) === 1;
}

export async function revokeInvitation(db: Db, teamId: number, id: number, now: Date): Promise<boolean> {
  const result = await db
    .updateTable("team_invitations")
    .set({ revoked_at: now.toISOString() })
    .where("id", "=", id)
    .where("team_id", "=", teamId)
    .where("accepted_at", "is", null)
    .where("revoked_at", "is", null)
    .executeTakeFirst();
  return Number(result.numUpdatedRows) === 1;
}
