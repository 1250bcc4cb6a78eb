// Fuzz: hostile and careless network files against POST /api/solve and the upload page's create
// action (the routes' handlers called directly, the way the server calls them, in one process).
// Every answer is a success or a 4xx with a sentence, never a 5xx or a throw, each within 2 s;
// a refused upload writes nothing and an accepted one writes exactly one network and revision.
// 2,000 cases each in the ordinary suite; `npm run fuzz` runs 10,000 (FUZZ_RUNS).
import fc from "fast-check";
import { beforeAll, describe, expect, it, vi } from "vitest";

// The solve budget would answer 429 after a few hundred cases; this test is about the answers.
vi.hoisted(() => {
  process.env.SOLVE_RATE_LIMIT_PER_MINUTE = "1000000000";
});

import { compute } from "#app/lib/compute/pool.server.ts";
import { action as solvePosted } from "#app/routes/api/solve.ts";
import { action as upload } from "#app/routes/networks/upload.tsx";
import { call, jsonRequest } from "./harness.ts";
import { makeTeam, rowCounts, uploadRequest, type TeamFixture } from "./teamFixtures.ts";
import { FUZZ_RUNS, hostileCase } from "./hostileDocuments.ts";

const HANG_MS = 2000;
let team: TeamFixture;

beforeAll(async () => {
  team = await makeTeam("Fuzz");
  // Start the compute pool's threads first: their start-up is not an answer's time.
  await compute({ kind: "solve", document: {} });
}, 60_000);

function tally() {
  const counts = new Map<string, number>();
  return {
    add: (key: string) => counts.set(key, (counts.get(key) ?? 0) + 1),
    text: () => [...counts].sort().map(([k, n]) => `${k}×${n}`).join(", "),
  };
}

describe("fuzz", () => {
  it(`POST /api/solve: ${FUZZ_RUNS.toLocaleString("en")} hostile files, each 200 or a clear 4xx within 2 s, nothing written`, async () => {
    const before = await rowCounts();
    const seen = tally();
    let slowestMs = 0;
    await fc.assert(
      fc.asyncProperty(hostileCase, async ({ kind, text }) => {
        const started = performance.now();
        const outcome = await call(solvePosted, jsonRequest("POST", "/api/solve", { cookie: team.cookies.viewer, raw: text }));
        const elapsedMs = performance.now() - started;
        slowestMs = Math.max(slowestMs, elapsedMs);
        seen.add(`${kind} ${outcome.status}`);
        expect(elapsedMs).toBeLessThan(HANG_MS);
        expect(outcome.status === 200 || (outcome.status >= 400 && outcome.status < 500)).toBe(true);
        if (outcome.status !== 200) expect(outcome.body.error).toMatch(/\w+/);
      }),
      { numRuns: FUZZ_RUNS },
    );
    expect(await rowCounts()).toEqual(before);
    console.log(`fuzz POST /api/solve: ${FUZZ_RUNS} cases, no 5xx, slowest ${slowestMs.toFixed(0)} ms; ${seen.text()}`);
  }, 900_000);

  it(`upload page: ${FUZZ_RUNS.toLocaleString("en")} hostile files, each created or a clear 4xx within 2 s, nothing written on refusal`, async () => {
    const seen = tally();
    let slowestMs = 0;
    await fc.assert(
      fc.asyncProperty(hostileCase, async ({ kind, text }) => {
        const before = await rowCounts();
        const started = performance.now();
        const outcome = await call(
          upload,
          uploadRequest("/networks/upload", { intent: "create", teamId: String(team.teamId) }, { name: "fuzz.json", text }, { cookie: team.cookies.editor }),
        );
        const elapsedMs = performance.now() - started;
        slowestMs = Math.max(slowestMs, elapsedMs);
        seen.add(`${kind} ${outcome.status}`);
        expect(elapsedMs).toBeLessThan(HANG_MS);
        const after = await rowCounts();
        if (outcome.status === 302) {
          expect(after).toEqual({ ...before, networks: before.networks + 1, revisions: before.revisions + 1 });
        } else {
          expect(outcome.status >= 400 && outcome.status < 500).toBe(true);
          expect(outcome.body.error).toMatch(/\w+/);
          expect(after).toEqual(before);
        }
      }),
      { numRuns: FUZZ_RUNS },
    );
    console.log(`fuzz upload: ${FUZZ_RUNS} cases, no 5xx, slowest ${slowestMs.toFixed(0)} ms; ${seen.text()}`);
  }, 900_000);
});
