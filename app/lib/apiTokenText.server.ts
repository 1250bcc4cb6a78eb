// The text of a personal API token and its stored form. The token is 32 random bytes, shown to
// its owner once; the database keeps only its SHA-256, so a copy of the database lets no one in.
// A fast hash is enough here (unlike passwords): 256 random bits cannot be guessed.
import { createHash, randomBytes } from "node:crypto";

/** A prefix makes a leaked token recognisable in logs and by secret scanners. */
export const API_TOKEN_PREFIX = "kst_";
const tokenPattern = /^kst_[A-Za-z0-9_-]{43}$/;

export function generateApiToken(): string {
  return API_TOKEN_PREFIX + randomBytes(32).toString("base64url");
}

export function hashApiToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}

export function looksLikeApiToken(text: string): boolean {
  return tokenPattern.test(text);
}

/** The token in an `Authorization: Bearer …` header; null when there is none, "" when it is malformed. */
export function bearerToken(request: Request): string | null {
  const header = request.headers.get("Authorization");
  if (!header) return null;
  const match = /^Bearer\s+(\S+)\s*$/i.exec(header);
  return match ? match[1] : "";
}
