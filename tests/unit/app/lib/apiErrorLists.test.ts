// Issue #13, finding 8 (API): error lists were unbounded: 100,000 invalid buses made a 12.9 MB
// answer. The list now stops at the first ISSUES_LISTED_MAX with the count of all.
import { describe, expect, it } from "vitest";
import { ISSUES_LISTED_MAX } from "#app/lib/api.server.ts";
import { action as solveApi } from "#app/routes/api/solve.ts";
import { call, cookieFor, jsonRequest, makeUser } from "../routes/harness.ts";

describe("API error lists", () => {
  it("list the first problems and count them all", async () => {
    const user = await makeUser("Ivo Invalid");
    const buses = Array.from({ length: 20_000 }, (_, i) => ({ id: `b${i}`, nominalKV: -1 }));
    const answer = await call(solveApi, jsonRequest("POST", "/api/solve", { cookie: await cookieFor(user), body: { version: 1, name: "Many bad buses", buses } }));
    expect(answer.status).toBe(400);
    expect(answer.body.issues).toHaveLength(ISSUES_LISTED_MAX);
    expect(answer.body.issueCount).toBeGreaterThanOrEqual(20_000);
    expect(answer.body.error).toMatch(/the first 100 are listed/);
    expect(JSON.stringify(answer.body).length).toBeLessThan(50_000);
  });
});
