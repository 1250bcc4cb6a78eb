import { randomBytes } from "node:crypto";
import type { Db } from "./database.ts";
import type { Session, User } from "./schema.ts";

export const SESSION_LIFETIME_DAYS = 30;

export async function insertSession(db: Db, userId: number, now = new Date()): Promise<Session> {
  const expires = new Date(now.getTime() + SESSION_LIFETIME_DAYS * 86_400_000);
  return db
    .insertInto("sessions")
    .values({
      id: randomBytes(32).toString("base64url"),
      user_id: userId,
      created_at: now.toISOString(),
      expires_at: expires.toISOString(),
    })
    .returningAll()
    .executeTakeFirstOrThrow();
}

/** The signed-in user behind a session id, or undefined when the session is unknown or expired. */
export async function findSessionUser(
  db: Db,
  sessionId: string,
  now = new Date(),
): Promise<{ session: Session; user: User } | undefined> {
  const session = await db
    .selectFrom("sessions")
    .selectAll()
    .where("id", "=", sessionId)
    .where("expires_at", ">", now.toISOString())
    .executeTakeFirst();
  if (!session) return undefined;
  const user = await db.selectFrom("users").selectAll().where("id", "=", session.user_id).executeTakeFirst();
  return user ? { session, user } : undefined;
}

export async function deleteSession(db: Db, sessionId: string): Promise<void> {
  await db.deleteFrom("sessions").where("id", "=", sessionId).execute();
}

export async function deleteExpiredSessions(db: Db, now = new Date()): Promise<void> {
  await db.deleteFrom("sessions").where("expires_at", "<=", now.toISOString()).execute();
}
