// Lines in a team's audit log for what the team pages and the API change: members, roles and
// deleted or restored networks. (Share links, link uses, invitations and restored revisions
// write their own lines where they happen.) Names are written in as they are now.
import type { Db } from "#db/database.ts";
import { insertAuditEvent, listAuditEvents } from "#db/auditEvents.ts";
import { listPendingInvitations } from "#db/invitations.ts";
import type { NetworkRow, Team, TeamRole, User } from "#db/schema.ts";
import { findRole } from "#db/teams.ts";
import { addMemberByEmail, changeMemberRole, removeMember, type Outcome } from "./teams.server.ts";

async function personWords(db: Db, userId: number): Promise<string> {
  const person = await db.selectFrom("users").select(["name", "email"]).where("id", "=", userId).executeTakeFirst();
  return person ? `${person.name} (${person.email})` : `account ${userId}`;
}

/** teams.server.ts's membership changes, each followed by its line in the audit log when it took effect. */
export async function addMemberAudited(db: Db, input: { teamId: number; by: User; email: string; role: TeamRole }): Promise<Outcome> {
  const outcome = await addMemberByEmail(db, input.teamId, input.email, input.role);
  if (outcome.ok) {
    await insertAuditEvent(db, {
      teamId: input.teamId,
      kind: "member-added",
      actorId: input.by.id,
      summary: `${input.by.name} added ${input.email.trim().toLowerCase()} as ${input.role}.`,
    });
  }
  return outcome;
}

export async function changeRoleAudited(db: Db, input: { teamId: number; by: User; memberId: number; role: TeamRole }): Promise<Outcome> {
  const before = await findRole(db, input.teamId, input.memberId);
  const outcome = await changeMemberRole(db, input.teamId, input.memberId, input.role);
  if (outcome.ok && before && before !== input.role) {
    await insertAuditEvent(db, {
      teamId: input.teamId,
      kind: "role-changed",
      actorId: input.by.id,
      summary: `${input.by.name} changed the role of ${await personWords(db, input.memberId)} from ${before} to ${input.role}.`,
    });
  }
  return outcome;
}

export async function removeMemberAudited(db: Db, input: { teamId: number; by: User; memberId: number }): Promise<Outcome> {
  const before = await findRole(db, input.teamId, input.memberId);
  const who = input.memberId === input.by.id ? null : await personWords(db, input.memberId);
  const outcome = await removeMember(db, input.teamId, input.memberId);
  if (outcome.ok && before) {
    await insertAuditEvent(db, {
      teamId: input.teamId,
      kind: "member-removed",
      actorId: input.by.id,
      summary: who ? `${input.by.name} removed ${who} (was ${before}) from the team.` : `${input.by.name} left the team (was ${before}).`,
    });
  }
  return outcome;
}

export async function auditNetworkDeletion(db: Db, input: { network: NetworkRow; by: User; restored: boolean }) {
  await insertAuditEvent(db, {
    teamId: input.network.team_id,
    kind: input.restored ? "network-restored" : "network-deleted",
    actorId: input.by.id,
    networkId: input.network.id,
    summary: `${input.by.name} ${input.restored ? "restored" : "deleted"} the network "${input.network.name}".`,
  });
}

/** What the team page shows its owners besides the members: pending invitations and the log. */
export async function ownerPanels(db: Db, team: Team) {
  const [invitations, audit] = await Promise.all([listPendingInvitations(db, team.id), listAuditEvents(db, team.id)]);
  return { invitations, audit };
}
