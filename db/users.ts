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
  user: { email: string; name: string; passwordHash: string },
): Promise<User> {
  return db
    .insertInto("users")
    .values({
      email: normalizeEmail(user.email),
      name: user.name.trim(),
      password_hash: user.passwordHash,
      created_at: new Date().toISOString(),
    })
    .returningAll()
    .executeTakeFirstOrThrow();
}
