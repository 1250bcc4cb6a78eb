import bcrypt from "bcryptjs";
import { env } from "./env.server.ts";

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, env.passwordHashCost);
}

// Compared against when the account does not exist, so that a wrong e-mail costs as much time
// as a wrong password and the answer's timing says nothing about who has an account.
let unknownAccountHash: Promise<string> | undefined;

export async function verifyPassword(password: string, hash: string | undefined): Promise<boolean> {
  if (hash === undefined) {
    unknownAccountHash ??= bcrypt.hash("no account has this password", env.passwordHashCost);
    await bcrypt.compare(password, await unknownAccountHash);
    return false;
  }
  return bcrypt.compare(password, hash);
}
