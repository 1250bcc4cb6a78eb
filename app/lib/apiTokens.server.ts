// Creating and revoking a person's API tokens. The token text exists only in the answer to the
// request that created it; after that only its hash is kept.
import { z } from "zod";
import type { Db } from "#db/database.ts";
import { insertApiToken, revokeApiToken } from "#db/apiTokens.ts";
import { generateApiToken, hashApiToken } from "./apiTokenText.server.ts";

export const apiTokenFormSchema = z.object({
  name: z.string().trim().min(1, "Give the token a name, such as the script that will use it.").max(100, "A name may have at most 100 characters."),
  scope: z.enum(["read", "write"], "Choose read or write."),
});

export async function createApiToken(db: Db, userId: number, input: z.output<typeof apiTokenFormSchema>) {
  const token = generateApiToken();
  const id = await insertApiToken(db, { userId, name: input.name, scope: input.scope, tokenHash: hashApiToken(token) });
  return { id, token, name: input.name, scope: input.scope };
}

export async function revokeOwnApiToken(db: Db, userId: number, tokenId: number): Promise<boolean> {
  return revokeApiToken(db, userId, tokenId);
}
