// Forgotten passwords. Asking always gets the same answer, whether or not the address has an
// account, and takes the same time (the message goes out in the background). The link works
// once, for RESET_VALID_MINUTES; setting a new password ends every session of the account.
import type { Db } from "#db/database.ts";
import { completePasswordReset, findPasswordResetByHash, insertPasswordReset } from "#db/passwordResets.ts";
import { findUserByEmail, normalizeEmail } from "#db/users.ts";
import { publicUrl } from "./env.server.ts";
import { sendMailInBackground } from "./mail.server.ts";
import { passwordResetMail } from "./mailMessages.ts";
import { hashPassword } from "./password.server.ts";
import { createRateLimiter } from "./rateLimit.server.ts";
import { hashSecretToken, hoursFrom, looksLikeSecretToken, newSecretToken, secretState } from "./secretTokens.server.ts";

export const RESET_VALID_MINUTES = 60;

// A few messages an hour per address at most, so the form cannot be used to flood someone's inbox.
const perAccount = createRateLimiter({ limit: 3, windowMs: 3_600_000 });

export async function requestPasswordReset(db: Db, input: { email: string; now?: Date }): Promise<void> {
  const now = input.now ?? new Date();
  const email = normalizeEmail(input.email);
  const user = await findUserByEmail(db, email);
  if (!user || !perAccount.hit(email, now.getTime()).allowed) return;
  const token = newSecretToken();
  await insertPasswordReset(db, {
    userId: user.id,
    tokenHash: hashSecretToken(token),
    now,
    expiresAt: hoursFrom(now, RESET_VALID_MINUTES / 60),
  });
  sendMailInBackground({
    to: user.email,
    ...passwordResetMail({
      name: user.name,
      resetUrl: publicUrl(`/reset-password?token=${token}`),
      validMinutes: RESET_VALID_MINUTES,
    }),
  });
}

export type ResetState = "live" | "expired" | "used" | "unknown";

export async function resetTokenState(db: Db, token: string | null | undefined, now = new Date()): Promise<ResetState> {
  if (!looksLikeSecretToken(token)) return "unknown";
  const reset = await findPasswordResetByHash(db, hashSecretToken(token));
  if (!reset) return "unknown";
  const state = secretState(reset, now);
  return state === "revoked" ? "used" : state;
}

/** Sets the new password if the token is still good; returns the account's id, or why not. */
export async function resetPassword(
  db: Db,
  input: { token: string | null | undefined; password: string; now?: Date },
): Promise<{ ok: true; userId: number } | { ok: false; state: Exclude<ResetState, "live"> }> {
  const now = input.now ?? new Date();
  if (!looksLikeSecretToken(input.token)) return { ok: false, state: "unknown" };
  const reset = await findPasswordResetByHash(db, hashSecretToken(input.token));
  if (!reset) return { ok: false, state: "unknown" };
  const userId = await completePasswordReset(db, reset.id, await hashPassword(input.password), now);
  // Not taken: expired, or used (perhaps a moment ago, in another tab).
  if (userId === null) return { ok: false, state: secretState(reset, now) === "expired" ? "expired" : "used" };
  return { ok: true, userId };
}
