// Creating an account, in one place for both ways in: the sign-up page and an invitation link.
// The account and a team of its own are made together, so a new person can create a network at
// once; the password is hashed before the transaction so the database is never held for it.
import type { Db } from "#db/database.ts";
import type { User } from "#db/schema.ts";
import { insertTeamWithOwner } from "#db/teams.ts";
import { listApiTokens } from "#db/apiTokens.ts";
import { teamsOfUser } from "#db/teams.ts";
import { findUserByEmail, insertUser, normalizeEmail } from "#db/users.ts";
import type { ReviewNoteMail } from "#db/schema.ts";
import { reviewNoteMailSetting, saveReviewNoteMailSetting } from "#db/userSettings.ts";
import { hashPassword } from "./password.server.ts";
import { createRateLimiter } from "./rateLimit.server.ts";

export const DUPLICATE_EMAIL = "An account with this e-mail already exists. Sign in instead, or use another address.";

/** The new account, or null when the address has one already (perhaps made a moment ago). */
export async function createAccount(
  db: Db,
  input: { name: string; email: string; password: string; emailVerified: boolean; now?: Date },
): Promise<User | null> {
  if (await findUserByEmail(db, input.email)) return null;
  const passwordHash = await hashPassword(input.password);
  return db.transaction().execute(async (trx) => {
    if (await findUserByEmail(trx, input.email)) return null;
    const created = await insertUser(trx, {
      email: input.email,
      name: input.name,
      passwordHash,
      emailVerifiedAt: input.emailVerified ? (input.now ?? new Date()).toISOString() : null,
    });
    await insertTeamWithOwner(trx, `${created.name}'s team`, created.id);
    return created;
  });
}

/** New accounts one client address may make in an hour, and all addresses together. */
export const SIGN_UPS_PER_ADDRESS_PER_HOUR = 10;
export const SIGN_UPS_PER_HOUR = 200;
const perAddress = createRateLimiter({ limit: SIGN_UPS_PER_ADDRESS_PER_HOUR, windowMs: 3_600_000 });
const overall = createRateLimiter({ limit: SIGN_UPS_PER_HOUR, windowMs: 3_600_000 });

/**
 * Counts one sign-up (checked before the password is hashed); null when it may go ahead, else the
 * seconds to wait. Counted in memory: one process, and a restart errs on the side of newcomers.
 */
export function signUpWait(address: string | null, now = Date.now()): number | null {
  const verdict = address === null ? { allowed: true as const } : perAddress.hit(`address:${address}`, now);
  if (!verdict.allowed) return verdict.retryAfterSeconds;
  const total = overall.hit("all", now);
  return total.allowed ? null : total.retryAfterSeconds;
}

export function signUpWaitMessage(seconds: number): string {
  return `Too many new accounts from here in the last hour. Try again in ${Math.ceil(seconds / 60)} minutes.`;
}

export { normalizeEmail };

/** Whether an address already has an account (the invitation page offers sign-in, not sign-up). */
export async function accountExists(db: Db, email: string): Promise<boolean> {
  return Boolean(await findUserByEmail(db, email));
}

/** What the account page shows: the person's teams, their API tokens and their mail setting. */
export async function accountOverview(db: Db, userId: number) {
  const [teams, tokens, reviewNoteMail] = await Promise.all([teamsOfUser(db, userId), listApiTokens(db, userId), reviewNoteMailSetting(db, userId)]);
  return { teams, tokens, reviewNoteMail };
}

/** Turns the e-mail about new review notes on or off for one person. */
export function setReviewNoteMail(db: Db, userId: number, value: ReviewNoteMail): Promise<void> {
  return saveReviewNoteMailSetting(db, userId, value);
}
