// Password resets: a one-hour, single-use token (stored as its hash) that lets its holder set a
// new password; using it also ends every session of the account.
import type { Db } from "./database.ts";
import type { PasswordResetRow } from "./schema.ts";

export async function insertPasswordReset(
  db: Db,
  input: { userId: number; tokenHash: string; now: Date; expiresAt: string },
): Promise<void> {
  await db
    .insertInto("password_resets")
    .values({ user_id: input.userId, token_hash: input.tokenHash, created_at: input.now.toISOString(), expires_at: input.expiresAt })
    .execute();
}

export async function findPasswordResetByHash(db: Db, tokenHash: string): Promise<PasswordResetRow | undefined> {
  return db.selectFrom("password_resets").selectAll().where("token_hash", "=", tokenHash).executeTakeFirst();
}

/**
 * In one transaction: take the reset (only if still unused and unexpired), store the new
 * password hash, end every session of the account and spend its other open resets.
 * Returns the account's id, or null when the reset was already used or has expired.
 */
export async function completePasswordReset(db: Db, resetId: number, passwordHash: string, now: Date): Promise<number | null> {
  return db.transaction().execute(async (trx) => {
    const taken = await trx
      .updateTable("password_resets")
      .set({ used_at: now.toISOString() })
      .where("id", "=", resetId)
      .where("used_at", "is", null)
      .where("expires_at", ">", now.toISOString())
      .returning("user_id")
      .executeTakeFirst();
    if (!taken) return null;
    await trx.updateTable("users").set({ password_hash: passwordHash }).where("id", "=", taken.user_id).execute();
    // The link reached the account's address, so the address is proven.
    await trx.updateTable("users").set({ email_verified_at: now.toISOString() }).where("id", "=", taken.user_id).where("email_verified_at", "is", null).execute();
    await trx.deleteFrom("sessions").where("user_id", "=", taken.user_id).execute();
    await trx
      .updateTable("password_resets")
      .set({ used_at: now.toISOString() })
      .where("user_id", "=", taken.user_id)
      .where("used_at", "is", null)
      .execute();
    return taken.user_id;
  });
}
