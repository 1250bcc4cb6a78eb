import { describe, expect, it } from "vitest";
import { safeRedirect } from "#app/lib/redirect.ts";

describe("safeRedirect keeps redirects on this site", () => {
  it.each([
    ["/networks/3", "/networks/3"],
    ["/networks?x=1#top", "/networks?x=1#top"],
    ["//evil.example/path", "/networks"],
    ["https://evil.example", "/networks"],
    ["/\\evil.example", "/networks"],
    ["javascript:alert(1)", "/networks"],
    ["/ok\r\nSet-Cookie: x=1", "/networks"],
    ["", "/networks"],
    [null, "/networks"],
  ])("%j → %j", (target, expected) => {
    expect(safeRedirect(target)).toBe(expected);
  });
});
