// Inviting someone to a team by e-mail. The message carries a link that works once, for
// INVITATION_DAYS; accepting it needs an account with the invited address (the invitation page
// creates one when there is none), and joins the team with the invited role.
import { z } from "zod";
import type { Db } from "#db/database.ts";
import { insertAuditEvent } from "#db/auditEvents.ts";
import { deleteInvitation, findInvitationByHash, insertInvitation, revokeInvitation, takeInvitation } from "#db/invitations.ts";
import type { Team, TeamInvitationRow, TeamRole, User } from "#db/schema.ts";
import { findRole, findTeam, insertMembership } from "#db/teams.ts";
import { markEmailVerified, normalizeEmail } from "#db/users.ts";
import { publicUrl } from "./env.server.ts";
import { emailSchema } from "./fieldSchemas.ts";
import { MailUnavailable, PERSONAL_MAIL_LIMIT_MESSAGE, sendMail, spendPersonalMailAllowance } from "./mail.server.ts";
import { invitationMail } from "./mailMessages.ts";
import { daysFrom, hashSecretToken, looksLikeSecretToken, newSecretToken, secretState } from "./secretTokens.server.ts";

export const INVITATION_DAYS = 7;

export const invitationFormSchema = z.object({
  email: emailSchema("Enter the e-mail address to invite."),
  role: z.enum(["owner", "editor", "viewer"], { error: "Choose owner, editor or viewer." }),
});

export type InviteOutcome = { ok: true; message: string } | { ok: false; error: string };

export async function inviteToTeam(
  db: Db,
  input: { team: Team; email: string; role: TeamRole; by: User; now?: Date },
): Promise<InviteOutcome> {
  const now = input.now ?? new Date();
  const email = normalizeEmail(input.email);
  const existing = await db
    .selectFrom("memberships as m")
    .innerJoin("users as u", "u.id", "m.user_id")
    .select("u.name")
    .where("m.team_id", "=", input.team.id)
    .where("u.email", "=", email)
    .executeTakeFirst();
  if (existing) return { ok: false, error: `${existing.name} (${email}) is already a member of this team.` };
  if (!spendPersonalMailAllowance(input.by.id, now.getTime())) return { ok: false, error: PERSONAL_MAIL_LIMIT_MESSAGE };

  const token = newSecretToken();
  const invitation = await insertInvitation(db, {
    teamId: input.team.id,
    email,
    role: input.role,
    tokenHash: hashSecretToken(token),
    invitedBy: input.by.id,
    now,
    expiresAt: daysFrom(now, INVITATION_DAYS),
  });
  try {
    await sendMail({
      to: email,
      ...invitationMail({
        teamName: input.team.name,
        inviterName: input.by.name,
        role: input.role,
        acceptUrl: publicUrl(`/invitations/${token}`),
        expiresAt: invitation.expires_at,
      }),
    });
  } catch (error) {
    // An invitation nobody was told about must not linger as pending.
    await deleteInvitation(db, invitation.id);
    if (error instanceof MailUnavailable) return { ok: false, error: error.message };
    return { ok: false, error: `The invitation could not be sent to ${email}: the mail service refused it. Try again later.` };
  }
  await insertAuditEvent(db, {
    teamId: input.team.id,
    kind: "member-invited",
    actorId: input.by.id,
    summary: `${input.by.name} invited ${email} as ${input.role}.`,
    now,
  });
  return { ok: true, message: `Invitation sent to ${email} (${input.role}); the link works for ${INVITATION_DAYS} days.` };
}

export type OpenedInvitation =
  | { state: "unknown" }
  | { state: "expired" | "revoked" | "used"; invitation: TeamInvitationRow }
  | { state: "live"; invitation: TeamInvitationRow; team: Team };

export async function openInvitation(db: Db, token: string | undefined, now = new Date()): Promise<OpenedInvitation> {
  if (!looksLikeSecretToken(token)) return { state: "unknown" };
  const invitation = await findInvitationByHash(db, hashSecretToken(token));
  if (!invitation) return { state: "unknown" };
  const state = secretState({ expires_at: invitation.expires_at, revoked_at: invitation.revoked_at, used_at: invitation.accepted_at }, now);
  if (state !== "live") return { state, invitation };
  const team = await findTeam(db, invitation.team_id);
  if (!team) return { state: "unknown" };
  return { state: "live", invitation, team };
}

/**
 * The user joins the invitation's team with its role, at most once. Someone already in the team
 * keeps the role they have (the invitation is spent either way).
 */
export async function acceptInvitation(
  db: Db,
  input: { invitation: TeamInvitationRow; team: Team; user: User; now?: Date },
): Promise<InviteOutcome> {
  const now = input.now ?? new Date();
  if (normalizeEmail(input.user.email) !== input.invitation.email) {
    return {
      ok: false,
      error: `This invitation is for ${input.invitation.email}, and you are signed in as ${input.user.email}. Sign out, then open the link again.`,
    };
  }
  const outcome = await db.transaction().execute(async (trx): Promise<InviteOutcome> => {
    if (!(await takeInvitation(trx, input.invitation.id, input.user.id, now))) {
      return { ok: false, error: "This invitation has just been used, revoked or has expired; ask the team's owner for a new one." };
    }
    // The link reached this address, so the address is proven.
    await markEmailVerified(trx, input.user.id, input.user.email, now);
    const current = await findRole(trx, input.team.id, input.user.id);
    if (current) return { ok: true, message: `You were already a member of ${input.team.name} as ${current}.` };
    await insertMembership(trx, input.team.id, input.user.id, input.invitation.role);
    await insertAuditEvent(trx, {
      teamId: input.team.id,
      kind: "member-joined",
      actorId: input.user.id,
      summary: `${input.user.name} (${input.user.email}) accepted the invitation and joined as ${input.invitation.role}.`,
      now,
    });
    return { ok: true, message: `You joined ${input.team.name} as ${input.invitation.role}.` };
  });
  return outcome;
}

/** Withdraw a pending invitation of the team; false when it is no longer pending. */
export async function withdrawInvitation(db: Db, teamId: number, invitationId: number, now = new Date()): Promise<boolean> {
  return revokeInvitation(db, teamId, invitationId, now);
}
