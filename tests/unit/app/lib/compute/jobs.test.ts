// Long work as a job: progress to the end, a time limit that stops it with a sentence, a cap on
// the jobs one account runs at once, and the study run through the pool with the same answer the
// engine gives on its own (the engine's own tests check its numbers).
import { afterAll, describe, expect, it } from "vitest";
import { JOBS_RUNNING_PER_PAYER, cancelJob, jobSettled, jobView, startJob, TooManyJobs } from "#app/lib/compute/jobs.server.ts";
import { closeComputePool, compute } from "#app/lib/compute/pool.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { createNetwork } from "#app/lib/networks.server.ts";
import { runStudyOnNetwork, startStudyJob } from "#app/lib/study.server.ts";
import { runStudySync } from "#solver/study/index.ts";
import { syntheticFeeder } from "../../../../bench/syntheticFeeder.ts";
import { tarnWithCases } from "../../../solver/study/networks.ts";
import { makeTeam } from "../../routes/teamFixtures.ts";

afterAll(() => closeComputePool());

const withCases = () =>
  tarnWithCases(
    [
      { id: "peak", name: "Winter peak", hoursPerYear: 2000 },
      { id: "light", name: "Summer light load", hoursPerYear: 6760, loadScale: 0.3 },
    ],
    { ratePctPerYear: 2.5, years: 10 },
  );

describe("a job", () => {
  it("stops at its time limit with a sentence (a 3,000-bus solve against a 1 ms limit)", async () => {
    const actor = { kind: "user" as const, userId: 900_001 };
    const document = syntheticFeeder(3_000);
    const view = startJob("solve", actor, 1, async (signal) => ({ ok: true, result: await compute({ kind: "solve", document }, { signal }) }), 1);
    await jobSettled(view.id);
    const stopped = jobView(view.id, actor, 1)!;
    expect(stopped).toMatchObject({ state: "stopped", status: 503, result: null });
    expect(stopped.error).toMatch(/^The calculation was stopped after 0 s, its time limit: it is too large to finish in time\./);
  }, 60_000);

  it(`runs at most ${JOBS_RUNNING_PER_PAYER} at once for one account, and only its owner sees or cancels it`, async () => {
    const actor = { kind: "user" as const, userId: 900_002 };
    const other = { kind: "user" as const, userId: 900_003 };
    const waitForCancel = (signal: AbortSignal) => new Promise<never>((_, fail) => signal.addEventListener("abort", () => fail(signal.reason)));
    const running = Array.from({ length: JOBS_RUNNING_PER_PAYER }, () => startJob("wait", actor, 7, waitForCancel));
    expect(() => startJob("wait", actor, 7, waitForCancel)).toThrow(TooManyJobs);
    expect(jobView(running[0].id, other, 7)).toBeNull();
    expect(jobView(running[0].id, actor, 8)).toBeNull();
    expect(await cancelJob(running[0].id, other, 7)).toBeNull();
    for (const job of running) expect(await cancelJob(job.id, actor, 7)).toMatchObject({ state: "cancelled", status: 499 });
    // Cancelled ones no longer count.
    const next = startJob("wait", actor, 7, waitForCancel);
    await cancelJob(next.id, actor, 7);
  });
});

describe("the study on the pool", () => {
  it("answers what the engine answers, and as a job reports its load flows to the last", async () => {
    const team = await makeTeam("Study jobs");
    const db = await getDb();
    const document = withCases();
    const created = await createNetwork(db, { teamId: team.teamId, document, authorId: team.userIds.owner });
    if (!created.ok) throw new Error("the study network does not validate");
    const actor = { kind: "user" as const, userId: team.userIds.viewer };
    const request = { outages: true, years: true };
    const expected = runStudySync(document, request);
    if (!expected.ok) throw new Error("the engine refused the study");

    const waited = await runStudyOnNetwork(db, created.network, request, { actor });
    expect(waited.ok && waited.study).toEqual(expected.study);

    const job = await startStudyJob(db, created.network, request, actor);
    expect(job).toMatchObject({ kind: "study", state: "running", networkId: created.network.id });
    await jobSettled(job.id);
    const done = jobView(job.id, actor, created.network.id)!;
    expect(done.state).toBe("done");
    expect(done.result).toEqual({ study: expected.study, revision: 1 });
    expect(done.progress).toMatchObject({ stage: expect.stringMatching(/^Years of growth: (\d+) of \1 load flows$/) });
    expect(done.progress!.done).toBe(done.progress!.total);
  }, 60_000);

  it("refuses a request that is wrong in itself as the API does (400, fields named)", async () => {
    const team = await makeTeam("Study job refusals");
    const db = await getDb();
    const created = await createNetwork(db, { teamId: team.teamId, document: withCases(), authorId: team.userIds.owner });
    if (!created.ok) throw new Error("the study network does not validate");
    const actor = { kind: "user" as const, userId: team.userIds.viewer };
    const job = await startStudyJob(db, created.network, { outages: ["nowhere"] }, actor);
    await jobSettled(job.id);
    expect(jobView(job.id, actor, created.network.id)).toMatchObject({
      state: "failed",
      status: 400,
      issues: [{ path: "outages[0]", message: expect.stringMatching(/there is no operating case "nowhere"/) }],
    });
  }, 60_000);
});
