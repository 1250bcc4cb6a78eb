// Limits on guessing passwords that a guesser cannot turn against the account's owner.
//
// Each attempt is counted BEFORE its password is checked, in one transaction with the check of
// the limits, so parallel guesses cannot slip past them; a right password then wipes the count.
// Beyond a few free failures an attempt must wait, and the wait doubles with every further failure
// (backoff, never a lock-out). Three counts, each with its own allowance:
// - this account from this address: what one guesser at one account runs into first;
// - this address, whatever the account: one guesser trying many accounts;
// - this account, whatever the address: many guessers at one account. A browser that has signed
//   in to the account before (the known-browser cookie) is exempt from this one, so a distributed
//   attack on an account slows the attackers, not the owner at their usual desk.
import { createCookie } from "react-router";
import type { Db } from "#db/database.ts";
import { clearSignInFailures, recentSignInFailures, recordSignInFailure, pruneSignInFailures } from "#db/signInFailures.ts";
import { hashSecretToken } from "./secretTokens.server.ts";
import { env } from "./env.server.ts";

export interface Allowance {
  /** Failures that cost nothing. */
  free: number;
}

export const ALLOWANCES = {
  accountFromAddress: { free: 5 },
  address: { free: 20 },
  account: { free: 10 },
} as const satisfies Record<string, Allowance>;

/** The first wait after the free failures; each further failure doubles it, up to the cap. */
export const FIRST_WAIT_MS = 1_000;
export const LONGEST_WAIT_MS = 15 * 60_000;
/** Failures older than this count for nothing. */
export const FAILURE_MEMORY_MS = 60 * 60_000;

/** How long after the latest of `failures` failures the next attempt may come. */
export function waitAfter(failures: number, allowance: Allowance): number {
  if (failures < allowance.free) return 0;
  return Math.min(LONGEST_WAIT_MS, FIRST_WAIT_MS * 2 ** Math.min(30, failures - allowance.free));
}

export function throttledMessage(retryAfterSeconds: number): string {
  const wait = retryAfterSeconds < 90 ? `${retryAfterSeconds} seconds` : `${Math.ceil(retryAfterSeconds / 60)} minutes`;
  return `Too many failed sign-ins for this account or from this address. Wait ${wait}, then try again; the wait grows with each further failure.`;
}

export type AttemptVerdict = { allowed: true; attemptId: number } | { allowed: false; retryAfterSeconds: number };

/**
 * Counts one attempt for the account from the address, unless a limit says it must wait; both in
 * one transaction. `knownBrowser` exempts the attempt from the account's count over all addresses.
 */
export async function beginSignInAttempt(
  db: Db,
  input: { account: string; address: string | null; knownBrowser: boolean; now?: Date },
): Promise<AttemptVerdict> {
  const now = input.now ?? new Date();
  const since = new Date(now.getTime() - FAILURE_MEMORY_MS);
  return db.transaction().execute(async (trx): Promise<AttemptVerdict> => {
    const recent = await recentSignInFailures(trx, input.account, input.address, since);
    const scopes: { failures: number; latest: string | null; allowance: Allowance }[] = [
      { ...recent.accountFromAddress, allowance: ALLOWANCES.accountFromAddress },
      ...(input.address === null ? [] : [{ ...recent.address, allowance: ALLOWANCES.address }]),
      ...(input.knownBrowser ? [] : [{ ...recent.account, allowance: ALLOWANCES.account }]),
    ];
    let readyAt = 0;
    for (const scope of scopes) {
      if (scope.latest === null) continue;
      readyAt = Math.max(readyAt, Date.parse(scope.latest) + waitAfter(scope.failures, scope.allowance));
    }
    if (readyAt > now.getTime()) return { allowed: false, retryAfterSeconds: Math.max(1, Math.ceil((readyAt - now.getTime()) / 1000)) };
    const attemptId = await recordSignInFailure(trx, input.account, input.address, now);
    return { allowed: true, attemptId };
  });
}

/** The password was right: this account's failures are forgotten, the attempt's own included. */
export async function signInSucceeded(db: Db, account: string): Promise<void> {
  await clearSignInFailures(db, account);
}

/** The password was wrong: the attempt stays counted; old failures are dropped meanwhile. */
export async function signInFailed(db: Db, now = new Date()): Promise<void> {
  await pruneSignInFailures(db, new Date(now.getTime() - FAILURE_MEMORY_MS));
}

// The known-browser cookie: the accounts (as hashes, never addresses) this browser signed in to.
const KNOWN_ACCOUNTS_KEPT = 5;
const knownBrowserCookie = createCookie("kilostep_known", {
  httpOnly: true,
  sameSite: "lax",
  secure: env.isProduction,
  path: "/sign-in",
  secrets: [env.sessionSecret],
  maxAge: 365 * 86_400,
});

function accountMark(account: string): string {
  return hashSecretToken(`known-browser:${account}`).slice(0, 32);
}

async function knownMarks(request: Request): Promise<string[]> {
  const value: unknown = await knownBrowserCookie.parse(request.headers.get("Cookie"));
  return Array.isArray(value) ? value.filter((v): v is string => typeof v === "string") : [];
}

export async function isKnownBrowser(request: Request, account: string): Promise<boolean> {
  return (await knownMarks(request)).includes(accountMark(account));
}

/** The Set-Cookie header that remembers this browser for the account. */
export async function rememberBrowser(request: Request, account: string): Promise<string> {
  const marks = [accountMark(account), ...(await knownMarks(request)).filter((m) => m !== accountMark(account))];
  return knownBrowserCookie.serialize(marks.slice(0, KNOWN_ACCOUNTS_KEPT));
}
