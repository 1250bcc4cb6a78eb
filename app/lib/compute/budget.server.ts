// One compute budget per payer (an account, or a share link used without one), counted in work
// rather than requests: a solve costs one unit per started hundred buses, a ladder that many per
// candidate voltage, a report its solve plus its study. Every route that computes spends from the
// same budget; an answer served from the revision cache costs nothing. Units refill evenly over a
// minute, up to SOLVE_RATE_LIMIT_PER_MINUTE.
import { env } from "../env.server.ts";

export interface BudgetRefusal {
  status: 429;
  error: string;
  retryAfterSeconds: number;
}

/** The work units of one solve of this network. */
export function solveCost(busCount: number): number {
  return Math.max(1, Math.ceil(busCount / 100));
}

interface Bucket {
  units: number;
  at: number;
}

const buckets = new Map<string, Bucket>();
const MAX_PAYERS = 10_000;

/**
 * Spend `cost` units of the payer's budget, or say how long to wait. A single piece of work larger
 * than the whole budget may still run when the budget is full, so no network is too big to solve.
 */
export function spend(payer: string, cost: number, now = Date.now()): BudgetRefusal | null {
  const capacity = env.solveRateLimitPerMinute;
  const perMs = capacity / 60_000;
  const bucket = buckets.get(payer) ?? { units: capacity, at: now };
  bucket.units = Math.min(capacity, bucket.units + (now - bucket.at) * perMs);
  bucket.at = now;
  buckets.delete(payer);
  buckets.set(payer, bucket);
  if (buckets.size > MAX_PAYERS) buckets.delete(buckets.keys().next().value!);
  const price = Math.min(cost, capacity);
  if (bucket.units >= price) {
    bucket.units -= price;
    return null;
  }
  const retryAfterSeconds = Math.max(1, Math.ceil((price - bucket.units) / perMs / 1000));
  return {
    status: 429,
    error: `Too much calculation at once: one account or link may use at most ${capacity} units a minute (a solve costs one per hundred buses). Wait ${retryAfterSeconds} s and try again.`,
    retryAfterSeconds,
  };
}
