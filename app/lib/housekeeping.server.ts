// Clean-up that must not wait for a restart: networks past their 30-day restore window go for
// good, expired sessions, spent password resets and address links and old sign-in failures are
// dropped. It runs when the database opens and then every HOUSEKEEPING_INTERVAL_MS, on a timer
// that never keeps a process alive by itself.
import type { Db } from "#db/database.ts";
import { purgeExpiredDeletions } from "#db/networks.ts";
import { deleteExpiredSessions } from "#db/sessions.ts";
import { pruneSignInFailures } from "#db/signInFailures.ts";
import { FAILURE_MEMORY_MS } from "./signInThrottle.server.ts";

export const HOUSEKEEPING_INTERVAL_MS = 60 * 60_000;

export async function cleanUp(db: Db, now = new Date()): Promise<void> {
  await purgeExpiredDeletions(db, now);
  await deleteExpiredSessions(db, now);
  await pruneSignInFailures(db, new Date(now.getTime() - FAILURE_MEMORY_MS));
}

/** Runs cleanUp now and then on a timer; returns the function that stops the timer. */
export function startHousekeeping(db: Db, intervalMs = HOUSEKEEPING_INTERVAL_MS): () => void {
  const run = () =>
    cleanUp(db).catch((error: unknown) => {
      // A busy or locked database this hour is tried again next hour.
      console.warn("Housekeeping could not run this time:", error);
    });
  const timer = setInterval(run, intervalMs);
  timer.unref();
  return () => clearInterval(timer);
}
