// The demo: one team, three people (owner, editor, viewer) and the two demo networks.
// Idempotent: whatever already exists is left as it is, so running it twice changes nothing.
// What only the app knows (hashing a password, checking and storing a network, the demo
// documents) comes in as one `DemoServices` argument, so nothing in db/ imports the app; the app's
// one entry that supplies it, and the `npm run seed` command, is app/lib/demo/seed.server.ts.
import type { Db } from "./database.ts";
import { DEMO_ACCOUNTS, DEMO_TEAM_NAME } from "./demoAccounts.ts";
import { findUserByEmail, insertUser } from "./users.ts";
import { findRole, insertMembership, insertTeamWithOwner } from "./teams.ts";

export interface DemoServices {
  hashPassword(password: string): Promise<string>;
  createNetwork(
    db: Db,
    input: { teamId: number; document: unknown; authorId: number; message: string },
  ): Promise<{ ok: true } | { ok: false; issues: { path: string; message: string }[] }>;
  documents: readonly unknown[];
}

export interface SeedSummary {
  teamId: number;
  created: { users: number; teams: number; memberships: number; networks: number };
}

export async function seedDemo(db: Db, services: DemoServices): Promise<SeedSummary> {
  const { hashPassword, createNetwork } = services;
  const created = { users: 0, teams: 0, memberships: 0, networks: 0 };

  const userIds = new Map<string, number>();
  for (const account of DEMO_ACCOUNTS) {
    let user = await findUserByEmail(db, account.email);
    if (!user) {
      // Demo addresses are fictional; they count as confirmed so the demo team can add its people.
      user = await insertUser(db, {
        email: account.email,
        name: account.name,
        passwordHash: await hashPassword(account.password),
        emailVerifiedAt: new Date().toISOString(),
      });
      created.users++;
    }
    userIds.set(account.email, user.id);
  }

  const ownerId = userIds.get(DEMO_ACCOUNTS.find((a) => a.role === "owner")!.email)!;
  const existingTeam = await db
    .selectFrom("teams as t")
    .innerJoin("memberships as m", "m.team_id", "t.id")
    .select("t.id")
    .where("t.name", "=", DEMO_TEAM_NAME)
    .where("m.user_id", "=", ownerId)
    .where("m.role", "=", "owner")
    .orderBy("t.id")
    .executeTakeFirst();
  let teamId = existingTeam?.id;
  if (teamId === undefined) {
    teamId = (await db.transaction().execute((trx) => insertTeamWithOwner(trx, DEMO_TEAM_NAME, ownerId))).id;
    created.teams++;
    created.memberships++;
  }

  for (const account of DEMO_ACCOUNTS) {
    const userId = userIds.get(account.email)!;
    if (!(await findRole(db, teamId, userId))) {
      await insertMembership(db, teamId, userId, account.role);
      created.memberships++;
    }
  }

  for (const document of services.documents) {
    const name = (document as { name: string }).name;
    const exists = await db
      .selectFrom("networks")
      .select("id")
      .where("team_id", "=", teamId)
      .where("name", "=", name)
      .where("deleted_at", "is", null)
      .executeTakeFirst();
    if (exists) continue;
    const result = await createNetwork(db, { teamId, document, authorId: ownerId, message: "Demo network" });
    if (!result.ok) {
      throw new Error(`Demo network "${name}" does not validate: ${result.issues.map((i) => `${i.path} ${i.message}`).join("; ")}`);
    }
    created.networks++;
  }

  return { teamId, created };
}
