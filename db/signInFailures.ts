import type { Db } from "./database.ts";

export async function recordSignInFailure(db: Db, account: string, address: string | null, now = new Date()) {
  await db
    .insertInto("sign_in_failures")
    .values({ account, address, failed_at: now.toISOString() })
    .execute();
}

/** Failures since `since` for the account and, when known, for the client address. */
export async function countSignInFailures(
  db: Db,
  account: string,
  address: string | null,
  since: Date,
): Promise<{ forAccount: number; forAddress: number }> {
  const sinceIso = since.toISOString();
  const forAccount = await db
    .selectFrom("sign_in_failures")
    .select((eb) => eb.fn.countAll<number>().as("n"))
    .where("account", "=", account)
    .where("failed_at", ">", sinceIso)
    .executeTakeFirstOrThrow();
  const forAddress =
    address === null
      ? { n: 0 }
      : await db
          .selectFrom("sign_in_failures")
          .select((eb) => eb.fn.countAll<number>().as("n"))
          .where("address", "=", address)
          .where("failed_at", ">", sinceIso)
          .executeTakeFirstOrThrow();
  return { forAccount: Number(forAccount.n), forAddress: Number(forAddress.n) };
}

export async function clearSignInFailures(db: Db, account: string) {
  await db.deleteFrom("sign_in_failures").where("account", "=", account).execute();
}

/** Old failures count for nothing; drop them so the table stays small. */
export async function pruneSignInFailures(db: Db, before: Date) {
  await db.deleteFrom("sign_in_failures").where("failed_at", "<", before.toISOString()).execute();
}
