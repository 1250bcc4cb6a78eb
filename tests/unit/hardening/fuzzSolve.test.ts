// Fuzz: hostile and careless network files posted to POST /api/solve (the route's action called
// directly, the way the server calls it). Every answer is 200 or a 4xx with a sentence, never a
// 5xx or a throw, each within 2 s, and nothing is written to the database.
import fc from "fast-check";
import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { action as solvePosted } from "#app/routes/api/solve.ts";
import { call, cookieFor, jsonRequest, makeUser } from "../app/harness.ts";
import { FUZZ_RUNS, hostileCase } from "./hostileDocuments.ts";

const HANG_MS = 2000;
let cookie: string;

async function rowCounts() {
  const db = await getDb();
  const count = async (table: "networks" | "network_revisions") =>
    Number((await db.selectFrom(table).select((eb) => eb.fn.countAll().as("n")).executeTakeFirstOrThrow()).n);
  return { networks: await count("networks"), revisions: await count("network_revisions") };
}

beforeAll(async () => {
  cookie = await cookieFor(await makeUser("Fuzz Solver", { ownTeam: true }));
});

describe("fuzz POST /api/solve", () => {
  it(`answers ${FUZZ_RUNS.toLocaleString("en")} hostile files with 200 or a clear 4xx, each within 2 s, writing nothing`, async () => {
    const before = await rowCounts();
    const statuses = new Map<string, number>();
    let slowestMs = 0;
    await fc.assert(
      fc.asyncProperty(hostileCase, async ({ kind, text }) => {
        const started = performance.now();
        const outcome = await call(solvePosted, jsonRequest("POST", "/api/solve", { cookie, raw: text }));
        const elapsedMs = performance.now() - started;
        slowestMs = Math.max(slowestMs, elapsedMs);
        statuses.set(`${kind} ${outcome.status}`, (statuses.get(`${kind} ${outcome.status}`) ?? 0) + 1);
        expect(elapsedMs).toBeLessThan(HANG_MS);
        expect(outcome.status === 200 || (outcome.status >= 400 && outcome.status < 500)).toBe(true);
        if (outcome.status !== 200) expect(outcome.body.error).toMatch(/\w+/);
      }),
      { numRuns: FUZZ_RUNS },
    );
    expect(await rowCounts()).toEqual(before);
    console.log(
      `fuzz /api/solve: ${FUZZ_RUNS} cases, slowest ${slowestMs.toFixed(0)} ms, no 5xx; by kind and status: ` +
        [...statuses].sort().map(([k, n]) => `${k}×${n}`).join(", "),
    );
  }, 600_000);
});
