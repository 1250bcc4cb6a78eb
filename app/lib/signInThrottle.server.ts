// At most five failed sign-ins a minute for one account or one client address; beyond that the
// form answers 429 without even checking the password, which makes guessing slow.
import type { Db } from "#db/database.ts";
import {
  clearSignInFailures,
  countSignInFailures,
  pruneSignInFailures,
  recordSignInFailure,
} from "#db/signInFailures.ts";

export const SIGN_IN_FAILURE_LIMIT = 5;
const WINDOW_MS = 60_000;

export const THROTTLED_MESSAGE =
  "Too many failed sign-ins for this account or from this address in the last minute. Wait a minute, then try again.";

/**
 * The client's address as told by the reverse proxy in front of the server (X-Forwarded-For,
 * first entry, or X-Real-IP). Without a proxy there is no header, and only the per-account
 * limit applies: the server behind react-router-serve is not told the socket address.
 */
export function clientAddress(request: Request): string | null {
  const forwarded = request.headers.get("X-Forwarded-For")?.split(",")[0]?.trim();
  if (forwarded) return forwarded;
  return request.headers.get("X-Real-IP")?.trim() || null;
}

export async function isSignInThrottled(db: Db, account: string, address: string | null, now = new Date()) {
  const counts = await countSignInFailures(db, account, address, new Date(now.getTime() - WINDOW_MS));
  return counts.forAccount >= SIGN_IN_FAILURE_LIMIT || counts.forAddress >= SIGN_IN_FAILURE_LIMIT;
}

export async function noteSignInFailure(db: Db, account: string, address: string | null, now = new Date()) {
  await recordSignInFailure(db, account, address, now);
  await pruneSignInFailures(db, new Date(now.getTime() - 60 * WINDOW_MS));
}

export async function noteSignInSuccess(db: Db, account: string) {
  await clearSignInFailures(db, account);
}
