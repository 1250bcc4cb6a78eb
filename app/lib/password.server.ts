// Password hashes: bcrypt at cost 12 (tests may lower it), computed off the main thread.
import { env } from "./env.server.ts";
import { bcryptCompare, bcryptHash } from "./passwordHashing.server.ts";

export function hashPassword(password: string): Promise<string> {
  return bcryptHash(password, env.passwordHashCost);
}

// Compared against when the account does not exist, so that a wrong e-mail costs as much time
// as a wrong password and the answer's timing says nothing about who has an account.
let unknownAccountHash: Promise<string> | undefined;

export async function verifyPassword(password: string, hash: string | undefined): Promise<boolean> {
  if (hash === undefined) {
    unknownAccountHash ??= bcryptHash("no account has this password", env.passwordHashCost);
    await bcryptCompare(password, await unknownAccountHash);
    return false;
  }
  return bcryptCompare(password, hash);
}
