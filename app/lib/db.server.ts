// The app's one database handle, opened and migrated on first use, so that a fresh deployment
// needs no separate migrate step.
import { openMigratedDatabase, type Db } from "#db/database.ts";
import { purgeExpiredDeletions } from "#db/networks.ts";
import { deleteExpiredSessions } from "#db/sessions.ts";
import { env } from "./env.server.ts";

export type { Db };

let opening: Promise<Db> | undefined;

export function getDb(): Promise<Db> {
  opening ??= (async () => {
    const db = await openMigratedDatabase(env.databasePath);
    await purgeExpiredDeletions(db);
    await deleteExpiredSessions(db);
    return db;
  })();
  return opening;
}
