import type { Db } from "./database.ts";

/** Returns the new row's id. */
export async function recordSignInFailure(db: Db, account: string, address: string | null, now = new Date()): Promise<number> {
  const row = await db
    .insertInto("sign_in_failures")
    .values({ account, address, failed_at: now.toISOString() })
    .returning("id")
    .executeTakeFirstOrThrow();
  return row.id;
}

interface Tally {
  failures: number;
  /** The latest failure's time, or null when there is none. */
  latest: string | null;
}

async function tally(db: Db, since: Date, where: { account?: string; address?: string | null }): Promise<Tally> {
  let query = db
    .selectFrom("sign_in_failures")
    .select((eb) => [eb.fn.countAll<number>().as("n"), eb.fn.max("failed_at").as("latest")])
    .where("failed_at", ">", since.toISOString());
  if (where.account !== undefined) query = query.where("account", "=", where.account);
  if (where.address !== undefined) query = query.where("address", where.address === null ? "is" : "=", where.address);
  const row = await query.executeTakeFirstOrThrow();
  return { failures: Number(row.n), latest: (row.latest as string | null) ?? null };
}

/** Failures since `since`: for the account from the address, for the address, for the account. */
export async function recentSignInFailures(db: Db, account: string, address: string | null, since: Date) {
  return {
    accountFromAddress: await tally(db, since, { account, address }),
    address: address === null ? { failures: 0, latest: null } : await tally(db, since, { address }),
    account: await tally(db, since, { account }),
  };
}

export async function clearSignInFailures(db: Db, account: string) {
  await db.deleteFrom("sign_in_failures").where("account", "=", account).execute();
}

/** Old failures count for nothing; drop them so the table stays small. */
export async function pruneSignInFailures(db: Db, before: Date) {
  await db.deleteFrom("sign_in_failures").where("failed_at", "<", before.toISOString()).execute();
}
