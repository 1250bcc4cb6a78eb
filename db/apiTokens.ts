// Personal API tokens, stored by their SHA-256 only. A revoked token stays listed (so its owner
// sees when it was last used) but never authenticates again.
import type { Db } from "./database.ts";
import type { ApiTokenScope, User } from "./schema.ts";

export interface ApiTokenListing {
  id: number;
  name: string;
  scope: ApiTokenScope;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

/** How stale last_used_at may get before a use writes it again: a busy script is one write a minute. */
const LAST_USE_RESOLUTION_MS = 60_000;

export async function insertApiToken(
  db: Db,
  input: { userId: number; name: string; scope: ApiTokenScope; tokenHash: string },
): Promise<number> {
  const row = await db
    .insertInto("api_tokens")
    .values({ user_id: input.userId, name: input.name, scope: input.scope, token_hash: input.tokenHash, created_at: new Date().toISOString() })
    .returning("id")
    .executeTakeFirstOrThrow();
  return row.id;
}

export async function listApiTokens(db: Db, userId: number): Promise<ApiTokenListing[]> {
  return db
    .selectFrom("api_tokens")
    .select(["id", "name", "scope", "created_at as createdAt", "last_used_at as lastUsedAt", "revoked_at as revokedAt"])
    .where("user_id", "=", userId)
    .orderBy("revoked_at", (ob) => ob.asc().nullsFirst())
    .orderBy("id", "desc")
    .execute();
}

export async function revokeApiToken(db: Db, userId: number, tokenId: number): Promise<boolean> {
  const result = await db
    .updateTable("api_tokens")
    .set({ revoked_at: new Date().toISOString() })
    .where("id", "=", tokenId)
    .where("user_id", "=", userId)
    .where("revoked_at", "is", null)
    .executeTakeFirst();
  return Number(result.numUpdatedRows) === 1;
}

/** The live token with this hash and its owner; records the use (at most once a minute). */
export async function useApiToken(
  db: Db,
  tokenHash: string,
  now = new Date(),
): Promise<{ user: User; tokenId: number; scope: ApiTokenScope } | undefined> {
  const token = await db
    .selectFrom("api_tokens")
    .select(["id", "user_id", "scope", "last_used_at"])
    .where("token_hash", "=", tokenHash)
    .where("revoked_at", "is", null)
    .executeTakeFirst();
  if (!token) return undefined;
  const user = await db.selectFrom("users").selectAll().where("id", "=", token.user_id).executeTakeFirst();
  if (!user) return undefined;
  if (token.last_used_at === null || now.getTime() - new Date(token.last_used_at).getTime() >= LAST_USE_RESOLUTION_MS) {
    await db.updateTable("api_tokens").set({ last_used_at: now.toISOString() }).where("id", "=", token.id).execute();
  }
  return { user, tokenId: token.id, scope: token.scope };
}
