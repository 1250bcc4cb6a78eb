import type { Db } from "./database.ts";
import type { Team, TeamRole } from "./schema.ts";

export interface TeamOfUser {
  id: number;
  name: string;
  role: TeamRole;
  memberCount: number;
}

export interface TeamMember {
  userId: number;
  name: string;
  email: string;
  role: TeamRole;
  joinedAt: string;
}

/** A new team with its first member as owner. Call inside a transaction with the trx. */
export async function insertTeamWithOwner(db: Db, name: string, ownerId: number): Promise<Team> {
  const now = new Date().toISOString();
  const team = await db
    .insertInto("teams")
    .values({ name: name.trim(), created_at: now })
    .returningAll()
    .executeTakeFirstOrThrow();
  await db
    .insertInto("memberships")
    .values({ team_id: team.id, user_id: ownerId, role: "owner", created_at: now })
    .execute();
  return team;
}

export async function findTeam(db: Db, teamId: number): Promise<Team | undefined> {
  return db.selectFrom("teams").selectAll().where("id", "=", teamId).executeTakeFirst();
}

export async function findRole(db: Db, teamId: number, userId: number): Promise<TeamRole | undefined> {
  const row = await db
    .selectFrom("memberships")
    .select("role")
    .where("team_id", "=", teamId)
    .where("user_id", "=", userId)
    .executeTakeFirst();
  return row?.role;
}

export async function teamsOfUser(db: Db, userId: number): Promise<TeamOfUser[]> {
  const rows = await db
    .selectFrom("memberships as m")
    .innerJoin("teams as t", "t.id", "m.team_id")
    .select((eb) => [
      "t.id",
      "t.name",
      "m.role",
      eb
        .selectFrom("memberships as all_m")
        .select((inner) => inner.fn.countAll<number>().as("n"))
        .whereRef("all_m.team_id", "=", "t.id")
        .as("memberCount"),
    ])
    .where("m.user_id", "=", userId)
    .orderBy("t.name")
    .execute();
  return rows.map((r) => ({ id: r.id, name: r.name, role: r.role, memberCount: Number(r.memberCount) }));
}

export async function membersOf(db: Db, teamId: number): Promise<TeamMember[]> {
  const rows = await db
    .selectFrom("memberships as m")
    .innerJoin("users as u", "u.id", "m.user_id")
    .select(["u.id as userId", "u.name", "u.email", "m.role", "m.created_at as joinedAt"])
    .where("m.team_id", "=", teamId)
    .orderBy("u.name")
    .execute();
  const rank: Record<TeamRole, number> = { owner: 0, editor: 1, viewer: 2 };
  return rows.sort((a, b) => rank[a.role] - rank[b.role]);
}

export async function countOwners(db: Db, teamId: number): Promise<number> {
  const row = await db
    .selectFrom("memberships")
    .select((eb) => eb.fn.countAll<number>().as("n"))
    .where("team_id", "=", teamId)
    .where("role", "=", "owner")
    .executeTakeFirstOrThrow();
  return Number(row.n);
}

export async function insertMembership(db: Db, teamId: number, userId: number, role: TeamRole): Promise<void> {
  await db
    .insertInto("memberships")
    .values({ team_id: teamId, user_id: userId, role, created_at: new Date().toISOString() })
    .execute();
}

export async function updateRole(db: Db, teamId: number, userId: number, role: TeamRole): Promise<void> {
  await db
    .updateTable("memberships")
    .set({ role })
    .where("team_id", "=", teamId)
    .where("user_id", "=", userId)
    .execute();
}

export async function deleteMembership(db: Db, teamId: number, userId: number): Promise<void> {
  await db.deleteFrom("memberships").where("team_id", "=", teamId).where("user_id", "=", userId).execute();
}
