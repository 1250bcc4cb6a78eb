// Proving that an account's address is its holder's: a single-use link mailed to the address, good
// for VERIFY_VALID_DAYS. Sign-up sends one; the account page sends another on request. Opening a
// password-reset or invitation link proves the address too. Only a proven address may be added to
// a team directly: anyone can sign up with an address that is not theirs.
import type { Db } from "#db/database.ts";
import { insertEmailVerification, takeEmailVerification } from "#db/emailVerifications.ts";
import type { User } from "#db/schema.ts";
import { publicUrl } from "./env.server.ts";
import { sendMailInBackground } from "./mail.server.ts";
import { emailVerificationMail } from "./mailMessages.ts";
import { createRateLimiter } from "./rateLimit.server.ts";
import { daysFrom, hashSecretToken, looksLikeSecretToken, newSecretToken } from "./secretTokens.server.ts";

export const VERIFY_VALID_DAYS = 7;

// A few messages an hour per account, so the button cannot be used to flood the address.
const perAccount = createRateLimiter({ limit: 3, windowMs: 3_600_000 });

/** Mails a link to the account's address; false when this hour's few are spent. */
export async function sendEmailVerification(db: Db, user: User, now = new Date()): Promise<boolean> {
  if (!perAccount.hit(`user:${user.id}`, now.getTime()).allowed) return false;
  const token = newSecretToken();
  await insertEmailVerification(db, { userId: user.id, email: user.email, tokenHash: hashSecretToken(token), now, expiresAt: daysFrom(now, VERIFY_VALID_DAYS) });
  sendMailInBackground({ to: user.email, ...emailVerificationMail({ name: user.name, verifyUrl: publicUrl(`/verify-email?token=${token}`), validDays: VERIFY_VALID_DAYS }) });
  return true;
}

/** The account whose address the link proves, or null for a link that is unknown, used or expired. */
export async function verifyEmail(db: Db, token: string | null | undefined, now = new Date()): Promise<number | null> {
  if (!looksLikeSecretToken(token)) return null;
  return takeEmailVerification(db, hashSecretToken(token), now);
}
