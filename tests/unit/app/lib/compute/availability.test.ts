// Availability: while a large network is reported, laddered, downloaded as CSV and solved at
// once, a light page keeps answering, because the heavy work runs on the compute pool's threads
// and the request thread only reads and sends. Reduced size for CI (3,000 buses). The latencies
// are printed, not asserted (no timed tests): what is asserted is that every answer is 200 and that
// the request thread itself never ran a solve, a ladder or a layout (spies on those modules in this
// thread; the pool's threads load their own copies), which fails as soon as any heavy route
// computes in place again.
import { monitorEventLoopDelay } from "node:perf_hooks";
import { loadavg } from "node:os";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";

vi.hoisted(() => {
  process.env.SOLVE_RATE_LIMIT_PER_MINUTE = "1000000";
});

const onRequestThread = vi.hoisted(() => ({ solves: 0, ladders: 0, layouts: 0 }));
vi.mock("#solver/index.ts", async (importOriginal) => {
  const original = await importOriginal<typeof import("#solver/index.ts")>();
  return { ...original, solveNetwork: (...args: Parameters<typeof original.solveNetwork>) => (onRequestThread.solves++, original.solveNetwork(...args)) };
});
vi.mock("#solver/ladder.ts", async (importOriginal) => {
  const original = await importOriginal<typeof import("#solver/ladder.ts")>();
  return { ...original, runLadder: (...args: Parameters<typeof original.runLadder>) => (onRequestThread.ladders++, original.runLadder(...args)) };
});
vi.mock("#app/components/report/singleLineLayout.ts", async (importOriginal) => {
  const original = await importOriginal<typeof import("#app/components/report/singleLineLayout.ts")>();
  return { ...original, layoutSingleLine: (...args: Parameters<typeof original.layoutSingleLine>) => (onRequestThread.layouts++, original.layoutSingleLine(...args)) };
});

import { closeComputePool } from "#app/lib/compute/pool.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { createNetwork } from "#app/lib/networks.server.ts";
import { action as ladderApi } from "#app/routes/api/ladder.ts";
import { action as solveApi } from "#app/routes/api/network-solve.ts";
import { loader as resultsCsv } from "#app/routes/api/results-csv.ts";
import { loader as report } from "#app/routes/networks/report.tsx";
import { loader as teamsPage } from "#app/routes/teams/list.tsx";
import { syntheticFeeder } from "../../../../bench/syntheticFeeder.ts";
import { call, getRequest, jsonRequest } from "../../routes/harness.ts";
import { makeTeam, type TeamFixture } from "../../routes/teamFixtures.ts";

/** 3,000 in the suite; AVAILABILITY_BUSES=15000 runs the issue's full size (figures printed, same assertions). */
const BUSES = Number(process.env.AVAILABILITY_BUSES ?? 3_000);
const LIGHT_EVERY_MS = 100;

let team: TeamFixture;
let networkId: number;
let sectionBus: string;

beforeAll(async () => {
  team = await makeTeam("Availability");
  const document = syntheticFeeder(BUSES);
  sectionBus = document.buses[2].id;
  const created = await createNetwork(await getDb(), { teamId: team.teamId, document, authorId: team.userIds.owner });
  if (!created.ok) throw new Error("the synthetic feeder does not validate");
  networkId = created.network.id;
}, 120_000);

afterAll(() => closeComputePool());

/**
 * A heavy route's status, its body left unread: the harness's `call` would parse a 10 MB JSON
 * answer on this thread, which a server never does (it sends the text), and that parse would be
 * counted as the request thread being held.
 */
async function statusOf(fn: (args: never) => unknown, request: Request, params: Record<string, string>): Promise<{ status: number }> {
  let result: unknown;
  try {
    result = await fn({ request, url: new URL(request.url), pattern: "", params, context: {} } as never);
  } catch (thrown) {
    result = thrown;
  }
  if (result instanceof Response) {
    await result.body?.cancel();
    return { status: result.status };
  }
  const init = (result as { type?: unknown; init?: ResponseInit | null } | null)?.type === "DataWithResponseInit" ? (result as { init?: ResponseInit | null }).init : null;
  if (result instanceof Error) throw result;
  return { status: init?.status ?? 200 };
}

const percentile = (values: number[], p: number) => [...values].sort((a, b) => a - b)[Math.min(values.length - 1, Math.floor(p * values.length))];

describe(`a ${BUSES}-bus network under heavy work`, () => {
  it("answers the heavy requests with 200 and keeps the light page answering", async () => {
    const cookie = team.cookies.owner;
    const params = { networkId: String(networkId) };
    const timed = async (name: string, run: () => Promise<{ status: number }>) => {
      const start = performance.now();
      const { status } = await run();
      return { name, status, ms: Math.round(performance.now() - start) };
    };
    const loopDelay = monitorEventLoopDelay({ resolution: 20 });
    loopDelay.enable();
    const heavy = Promise.all([
      timed("report page", () => statusOf(report, getRequest(`/networks/${networkId}/report`, cookie), params)),
      timed("ladder API", () =>
        statusOf(ladderApi, jsonRequest("POST", `/api/networks/${networkId}/ladder`, { cookie, body: { sectionBus, voltagesKV: [33, 66] } }), params),
      ),
      timed("results CSV", () => statusOf(resultsCsv, getRequest(`/api/networks/${networkId}/results.csv?table=buses`, cookie), params)),
      timed("solve API", () => statusOf(solveApi, jsonRequest("POST", `/api/networks/${networkId}/solve`, { cookie }), params)),
    ]);

    let heavyDone = false;
    const light: { status: number; ms: number }[] = [];
    const askLight = async () => {
      while (!heavyDone) {
        // Measured from when the request is due, so time the event loop was held counts too.
        const due = performance.now();
        await new Promise((done) => setTimeout(done, LIGHT_EVERY_MS));
        const outcome = await call(teamsPage, getRequest("/teams", cookie));
        light.push({ status: outcome.status, ms: Math.round(performance.now() - due - LIGHT_EVERY_MS) });
      }
    };
    const lightLoop = askLight();
    const answers = await heavy;
    heavyDone = true;
    await lightLoop;

    loopDelay.disable();
    const waits = light.map((l) => l.ms);
    console.log(
      `availability (${BUSES} buses): heavy ${answers.map((a) => `${a.name} ${a.status} in ${a.ms} ms`).join(", ")}; ` +
        `light page ${light.length} answers, p50 ${percentile(waits, 0.5)} ms, p95 ${percentile(waits, 0.95)} ms (target ≤ 300 ms), max ${Math.max(...waits)} ms (target ≤ 1,500 ms); ` +
        `heavy answers target: 200 within 60,000 ms; ` +
        `request thread held at most ${Math.round(loopDelay.max / 1e6)} ms; load average ${loadavg().map((l) => l.toFixed(1)).join(" ")}`,
    );
    expect(answers.map((a) => [a.name, a.status])).toEqual([
      ["report page", 200],
      ["ladder API", 200],
      ["results CSV", 200],
      ["solve API", 200],
    ]);
    expect(light.length).toBeGreaterThan(0);
    expect(light.every((l) => l.status === 200)).toBe(true);
    expect(onRequestThread).toEqual({ solves: 0, ladders: 0, layouts: 0 });
  }, 300_000);
});
