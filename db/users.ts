import type { Db } from "./database.ts";
import type { User } from "./schema.ts";

/** One address, one account: compare e-mails trimmed and lower-cased. */
export function normalizeEmail(email: string): string {
  return email.trim().toLowerCase();
}

export async function findUserByEmail(db: Db, email: string): Promise<User | undefined> {
  return db.selectFrom("users").selectAll().where("email", "=", normalizeEmail(email)).executeTakeFirst();
}

export async function insertUser(
  db: Db,
  user: { email: string; name: string; passwordHash: string; emailVerifiedAt?: string | null },
): Promise<User> {
  return db
    .insertInto("users")
    .values({
      email: normalizeEmail(user.email),
      name: user.name.trim(),
      password_hash: user.passwordHash,
      created_at: new Date().toISOString(),
      email_verified_at: user.emailVerifiedAt ?? null,
    })
    .returningAll()
    .executeTakeFirstOrThrow();
}

export async function markEmailVerified(db: Db, userId: number, email: string, now: Date): Promise<void> {
  await db
    .updateTable("users")
    .set({ email_verified_at: now.toISOString() })
    .where("id", "=", userId)
    .where("email", "=", normalizeEmail(email))
    .where("email_verified_at", "is", null)
    .execute();
}
