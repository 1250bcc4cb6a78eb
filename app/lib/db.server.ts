// The app's one database handle, opened and migrated on first use, so that a fresh deployment
// needs no separate migrate step; the hourly clean-up starts with it.
import { openMigratedDatabase, type Db } from "#db/database.ts";
import { env } from "./env.server.ts";
import { cleanUp, startHousekeeping } from "./housekeeping.server.ts";

export type { Db };

let opening: Promise<Db> | undefined;

export function getDb(): Promise<Db> {
  opening ??= (async () => {
    const db = await openMigratedDatabase(env.databasePath);
    await cleanUp(db);
    startHousekeeping(db);
    return db;
  })();
  return opening;
}
