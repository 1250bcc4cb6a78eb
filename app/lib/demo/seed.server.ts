// The demo seed's one entry into the app: it hands db/seed.ts the services only the app has
// (password hashing, checking and storing a network, the demo documents). `npm run seed` runs
// this file: it migrates first and prints the sign-ins; it never runs in production.
import { pathToFileURL } from "node:url";
import { openMigratedDatabase } from "#db/database.ts";
import { DEMO_ACCOUNTS, DEMO_TEAM_NAME } from "#db/demoAccounts.ts";
import { seedDemo, type DemoServices, type SeedSummary } from "#db/seed.ts";
import type { Db } from "../db.server.ts";
import { env } from "../env.server.ts";
import { createNetwork } from "../networks.server.ts";
import { hashPassword } from "../password.server.ts";
import { DEMO_DOCUMENTS } from "./networkTemplates.server.ts";

const demoServices: DemoServices = { hashPassword, createNetwork, documents: DEMO_DOCUMENTS };

/** The demo team, its three people and the two demo networks in `db` (idempotent). */
export function seedDemoData(db: Db): Promise<SeedSummary> {
  return seedDemo(db, demoServices);
}

async function main() {
  if (env.isProduction) {
    console.error("The demo seed does not run in production: its passwords are public.");
    process.exit(1);
  }
  const path = env.databasePath;
  const db = await openMigratedDatabase(path);
  const { created } = await seedDemoData(db);
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
