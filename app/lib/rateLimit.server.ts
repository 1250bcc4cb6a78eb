// A sliding-window counter per key (a user, a token, an address) held in memory: enough for one
// server process, and it forgets on restart, which errs on the side of letting people work.
export interface RateLimiter {
  /** Counts one request for the key; says whether it may go ahead, and if not, for how long to wait. */
  hit(key: string, now?: number): { allowed: true } | { allowed: false; retryAfterSeconds: number };
}

export function createRateLimiter(options: { limit: number; windowMs: number; maxKeys?: number }): RateLimiter {
  const { limit, windowMs } = options;
  const maxKeys = options.maxKeys ?? 10_000;
  const hits = new Map<string, number[]>();

  const forget = (now: number) => {
    for (const [key, times] of hits) if (times[times.length - 1] <= now - windowMs) hits.delete(key);
    // Still too many live keys (many addresses at once): drop the least recently used, so memory
    // stays bounded at the cost of forgetting some counts.
    for (const key of hits.keys()) {
      if (hits.size <= maxKeys) break;
      hits.delete(key);
    }
  };

  return {
    hit(key, now = Date.now()) {
      const recent = (hits.get(key) ?? []).filter((t) => t > now - windowMs);
      if (recent.length >= limit) {
        hits.set(key, recent);
        return { allowed: false, retryAfterSeconds: Math.max(1, Math.ceil((recent[0] + windowMs - now) / 1000)) };
      }
      recent.push(now);
      // Move the key to the end so the oldest-used keys are forgotten first.
      hits.delete(key);
      hits.set(key, recent);
      if (hits.size > maxKeys) forget(now);
      return { allowed: true };
    },
  };
}
