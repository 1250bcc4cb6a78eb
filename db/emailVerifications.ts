// Links that prove an account's address: single use, stored as their hash.
import type { Db } from "./database.ts";
import { markEmailVerified } from "./users.ts";

export async function insertEmailVerification(db: Db, input: { userId: number; email: string; tokenHash: string; now: Date; expiresAt: string }) {
  await db
    .insertInto("email_verifications")
    .values({ user_id: input.userId, email: input.email, token_hash: input.tokenHash, created_at: input.now.toISOString(), expires_at: input.expiresAt })
    .execute();
}

/** Takes the link if it is unused and unexpired and marks the address proven; the account's id, or null. */
export async function takeEmailVerification(db: Db, tokenHash: string, now: Date): Promise<number | null> {
  return db.transaction().execute(async (trx) => {
    const taken = await trx
      .updateTable("email_verifications")
      .set({ used_at: now.toISOString() })
      .where("token_hash", "=", tokenHash)
      .where("used_at", "is", null)
      .where("expires_at", ">", now.toISOString())
      .returning(["user_id", "email"])
      .executeTakeFirst();
    if (!taken) return null;
    await markEmailVerified(trx, taken.user_id, taken.email, now);
    return taken.user_id;
  });
}
