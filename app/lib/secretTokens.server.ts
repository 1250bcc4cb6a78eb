// The secrets that travel in links (share links, team invitations, password resets): 32 random
// bytes (256 bits) as base64url text, stored only as their SHA-256. A fast hash is enough because
// nothing this random can be guessed; what matters is that a copy of the database opens nothing.
import { createHash, randomBytes } from "node:crypto";

export const SECRET_TOKEN_BYTES = 32;
const tokenPattern = /^[A-Za-z0-9_-]{43}$/;

export function newSecretToken(): string {
  return randomBytes(SECRET_TOKEN_BYTES).toString("base64url");
}

export function hashSecretToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}

/** Text that cannot be one of our tokens is refused before any database look-up. */
export function looksLikeSecretToken(text: string | null | undefined): text is string {
  return typeof text === "string" && tokenPattern.test(text);
}

export type SecretState = "live" | "expired" | "revoked" | "used";

/**
 * Where a stored secret stands at `now`. Revoked and used win over expired: the page then says
 * what someone did rather than what the clock did.
 */
export function secretState(
  row: { expires_at: string | null; revoked_at?: string | null; used_at?: string | null },
  now = new Date(),
): SecretState {
  if (row.revoked_at) return "revoked";
  if (row.used_at) return "used";
  if (row.expires_at !== null && row.expires_at <= now.toISOString()) return "expired";
  return "live";
}

export function daysFrom(now: Date, days: number): string {
  return new Date(now.getTime() + days * 86_400_000).toISOString();
}

export function hoursFrom(now: Date, hours: number): string {
  return new Date(now.getTime() + hours * 3_600_000).toISOString();
}

/**
 * A request's path and query as a log line may show them: whatever follows /s/ or /invitations/,
 * and the value of any `token` parameter, becomes "[secret]" (a log is read by more people, and
 * kept longer, than the database's hashed tokens).
 */
export function redactSecretsInUrl(pathAndQuery: string): string {
  return pathAndQuery
    .replace(/^\/(s|invitations)\/[^/?#.]+/, "/$1/[secret]")
    .replace(/([?&]token=)[^&#]*/gi, "$1[secret]");
}
