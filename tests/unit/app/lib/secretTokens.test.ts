import { describe, expect, it } from "vitest";
import { hashSecretToken, looksLikeSecretToken, newSecretToken, secretState } from "#app/lib/secretTokens.server.ts";

describe("secret tokens", () => {
  it("carry 256 random bits as 43 base64url characters, never the same twice", () => {
    const tokens = Array.from({ length: 2000 }, newSecretToken);
    for (const token of tokens) {
      expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);
      // 43 base64url characters hold 258 bits; the 32 bytes behind them are 256.
      expect(Buffer.from(token, "base64url")).toHaveLength(32);
      expect(looksLikeSecretToken(token)).toBe(true);
    }
    expect(new Set(tokens).size).toBe(tokens.length);
  });

  it("are stored as SHA-256 in hex (FIPS 180-2 test vector for \"abc\")", () => {
    expect(hashSecretToken("abc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    const token = newSecretToken();
    expect(hashSecretToken(token)).toMatch(/^[0-9a-f]{64}$/);
    expect(hashSecretToken(token)).not.toContain(token);
  });

  it("refuse text that cannot be one of ours before any look-up", () => {
    for (const text of ["", "short", `${"A".repeat(42)}=`, `${"A".repeat(44)}`, `${"A".repeat(42)}/`, null, undefined]) {
      expect(looksLikeSecretToken(text)).toBe(false);
    }
  });

  it("expire at their expiry instant, not a millisecond later, and never without one", () => {
    const expiresAt = "2026-12-11T12:00:00.000Z";
    expect(secretState({ expires_at: expiresAt }, new Date("2026-12-11T11:59:59.999Z"))).toBe("live");
    expect(secretState({ expires_at: expiresAt }, new Date(expiresAt))).toBe("expired");
    expect(secretState({ expires_at: null }, new Date("2099-01-01T00:00:00Z"))).toBe("live");
  });

  it("say revoked or used before expired: what someone did wins over the clock", () => {
    const past = "2020-01-01T00:00:00.000Z";
    expect(secretState({ expires_at: past, revoked_at: past })).toBe("revoked");
    expect(secretState({ expires_at: past, used_at: past })).toBe("used");
    expect(secretState({ expires_at: null, used_at: past })).toBe("used");
  });
});
