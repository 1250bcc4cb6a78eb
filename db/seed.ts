// The demo: one team, three people (owner, editor, viewer) and the two demo networks.
// Idempotent: whatever already exists is left as it is, so running it twice changes nothing.
// Run with `tsx db/seed.ts`; it migrates first, and prints the sign-ins (never in production).
import { pathToFileURL } from "node:url";
import { env } from "#app/lib/env.server.ts";
import { hashPassword } from "#app/lib/password.server.ts";
import { createNetwork } from "#app/lib/networks.server.ts";
import { DEMO_DOCUMENTS } from "#app/lib/networkTemplates.server.ts";
import { openMigratedDatabase, type Db } from "./database.ts";
import { DEMO_ACCOUNTS, DEMO_TEAM_NAME } from "./demoAccounts.ts";
import { findUserByEmail, insertUser } from "./users.ts";
import { findRole, insertMembership, insertTeamWithOwner } from "./teams.ts";

export interface SeedSummary {
  teamId: number;
  created: { users: number; teams: number; memberships: number; networks: number };
}

export async function seedDemo(db: Db): Promise<SeedSummary> {
  const created = { users: 0, teams: 0, memberships: 0, networks: 0 };

  const userIds = new Map<string, number>();
  for (const account of DEMO_ACCOUNTS) {
    let user = await findUserByEmail(db, account.email);
    if (!user) {
      user = await insertUser(db, { email: account.email, name: account.name, passwordHash: await hashPassword(account.password) });
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

  for (const document of DEMO_DOCUMENTS) {
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

async function main() {
  if (env.isProduction) {
    console.error("The demo seed does not run in production: its passwords are public.");
    process.exit(1);
  }
  const path = env.databasePath;
  const db = await openMigratedDatabase(path);
  const { created } = await seedDemo(db);
  await db.destroy();
  console.log(
    `Demo data in ${path}: added users ${created.users}, teams ${created.teams}, networks ${created.networks}; existing ones kept.`,
  );
  console.log(`\nDemo sign-ins for the team "${DEMO_TEAM_NAME}" (development only):`);
  for (const account of DEMO_ACCOUNTS) console.log(`  ${account.role.padEnd(6)}  ${account.email.padEnd(28)}  ${account.password}`);
  console.log(`\nOpen http://localhost:${process.env.PORT ?? 3000}/sign-in once the server says it is listening.\n`);
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  await main();
}
