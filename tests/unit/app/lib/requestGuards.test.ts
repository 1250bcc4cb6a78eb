import { describe, expect, it } from "vitest";
import { bearerToken, generateApiToken, hashApiToken, looksLikeApiToken } from "#app/lib/apiTokenText.server.ts";
import { isCrossOriginWrite } from "#app/lib/originCheck.server.ts";
import { createRateLimiter } from "#app/lib/rateLimit.server.ts";
import { contentSecurityPolicy, setSecurityHeaders } from "#app/lib/securityHeaders.server.ts";

describe("createRateLimiter", () => {
  it("allows the limit within the window, refuses the next with the wait, and forgets after the window", () => {
    const limiter = createRateLimiter({ limit: 3, windowMs: 60_000 });
    const t0 = 1_000_000;
    expect([0, 1, 2].map((i) => limiter.hit("u1", t0 + i * 1000).allowed)).toEqual([true, true, true]);
    expect(limiter.hit("u1", t0 + 10_000)).toEqual({ allowed: false, retryAfterSeconds: 50 });
    expect(limiter.hit("u2", t0 + 10_000).allowed).toBe(true);
    // The first hit leaves the window at t0 + 60 s; one more may go then.
    expect(limiter.hit("u1", t0 + 60_001).allowed).toBe(true);
    expect(limiter.hit("u1", t0 + 60_002).allowed).toBe(false);
  });

  it("keeps memory bounded when many keys arrive at once", () => {
    const limiter = createRateLimiter({ limit: 1, windowMs: 60_000, maxKeys: 100 });
    for (let i = 0; i < 1000; i++) limiter.hit(`addr-${i}`, 5000);
    // The most recent keys are still counted.
    expect(limiter.hit("addr-999", 5001).allowed).toBe(false);
  });
});

describe("API token text", () => {
  it("is 32 random bytes in base64url behind a prefix, never twice the same", () => {
    const a = generateApiToken();
    const b = generateApiToken();
    expect(a).not.toBe(b);
    expect(looksLikeApiToken(a)).toBe(true);
    expect(Buffer.from(a.slice(4), "base64url")).toHaveLength(32);
  });

  it("hashes with SHA-256 (the FIPS 180-4 test vector for \"abc\")", () => {
    expect(hashApiToken("abc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  });

  it("reads the bearer header: none, malformed, and a token", () => {
    const request = (authorization?: string) =>
      new Request("http://kilostep.test/api/networks", { headers: authorization ? { Authorization: authorization } : {} });
    expect(bearerToken(request())).toBeNull();
    expect(bearerToken(request("Basic abc"))).toBe("");
    expect(bearerToken(request("Bearer kst_x"))).toBe("kst_x");
    expect(bearerToken(request("bearer   kst_y "))).toBe("kst_y");
  });
});

describe("isCrossOriginWrite", () => {
  const post = (headers: Record<string, string>, method = "POST") =>
    new Request("http://kilostep.test/networks", { method, headers: { Host: "kilostep.test", ...headers } });

  it("lets reads and same-origin writes through, and scripts that send no Origin", () => {
    expect(isCrossOriginWrite(post({ Origin: "http://evil.test" }, "GET"))).toBe(false);
    expect(isCrossOriginWrite(post({ Origin: "http://kilostep.test", "Sec-Fetch-Site": "same-origin" }))).toBe(false);
    expect(isCrossOriginWrite(post({}))).toBe(false);
  });

  it("refuses another site's origin, an opaque origin, and a cross-site fetch", () => {
    expect(isCrossOriginWrite(post({ Origin: "http://evil.test" }))).toBe(true);
    expect(isCrossOriginWrite(post({ Origin: "http://kilostep.test:8080" }))).toBe(true);
    expect(isCrossOriginWrite(post({ Origin: "null" }))).toBe(true);
    expect(isCrossOriginWrite(post({ "Sec-Fetch-Site": "cross-site" }, "DELETE"))).toBe(true);
    expect(isCrossOriginWrite(post({ "Sec-Fetch-Site": "same-site", Origin: "http://kilostep.test" }))).toBe(true);
  });

  it("does not believe X-Forwarded-Host, which anyone can send", () => {
    expect(isCrossOriginWrite(post({ Origin: "https://evil.test", "X-Forwarded-Host": "evil.test" }))).toBe(true);
  });
});

describe("security headers", () => {
  it("allow scripts only with the page's nonce and forbid framing", () => {
    const policy = contentSecurityPolicy("abc123");
    expect(policy).toContain("script-src 'self' 'nonce-abc123'");
    expect(policy).not.toMatch(/script-src[^;]*unsafe-inline/);
    expect(policy).toContain("frame-ancestors 'none'");
    const headers = new Headers();
    setSecurityHeaders(headers, "abc123");
    expect(headers.get("X-Frame-Options")).toBe("DENY");
    expect(headers.get("X-Content-Type-Options")).toBe("nosniff");
    expect(headers.get("Referrer-Policy")).toBe("same-origin");
    expect(headers.get("Content-Security-Policy")).toBe(policy);
  });
});
