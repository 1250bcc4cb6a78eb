// The compute pool, its budget and the per-revision cache: work runs on a worker thread and
// comes back whole; a time limit or a cancellation stops it with a sentence; the budget counts
// work (buses), not requests; a revision's CSV is computed once however often it is downloaded.
import { afterAll, describe, expect, it, vi } from "vitest";

vi.hoisted(() => {
  process.env.SOLVE_RATE_LIMIT_PER_MINUTE = "30";
});

import { solveCost, spend } from "#app/lib/compute/budget.server.ts";
import { closeComputePool, compute, ComputeStopped } from "#app/lib/compute/pool.server.ts";
import { revisionCsv, solvedRevisionJson, storedSolveCount } from "#app/lib/compute/results.server.ts";
import { createShareLink } from "#app/lib/shareLinks.server.ts";
import { REPORT_ROWS_MAX } from "#app/lib/reportExtent.ts";
import { loader as resultsCsvApi } from "#app/routes/api/results-csv.ts";
import { loader as reportPage } from "#app/routes/networks/report.tsx";
import { loader as sharedResultsCsv } from "#app/routes/share/shared-results-csv.ts";
import { getDb } from "#app/lib/db.server.ts";
import { createNetwork } from "#app/lib/networks.server.ts";
import { solveNetwork } from "#solver/index.ts";
import { syntheticFeeder } from "../../../../bench/syntheticFeeder.ts";
import { call, getRequest } from "../../routes/harness.ts";
import { fixtureText, makeTeam } from "../../routes/teamFixtures.ts";

afterAll(() => closeComputePool());

describe("the compute pool", () => {
  it("answers exactly what the solver answers on the request thread", async () => {
    const document = JSON.parse(fixtureText("tarn-head-calder-flats.json"));
    const inWorker = await compute({ kind: "solve", document });
    expect(inWorker).toEqual(solveNetwork(document));
  }, 60_000);

  it("stops work at its time limit, and when cancelled, with a sentence", async () => {
    const document = syntheticFeeder(3_000);
    const late = await compute({ kind: "solve", document }, { timeLimitMs: 1 }).catch((e: unknown) => e);
    expect(late).toBeInstanceOf(ComputeStopped);
    expect((late as ComputeStopped).reason).toBe("time-limit");
    expect((late as Error).message).toMatch(/stopped after .* its time limit/);
    const controller = new AbortController();
    const asked = compute({ kind: "solve", document }, { signal: controller.signal });
    controller.abort();
    const cancelled = await asked.catch((e: unknown) => e);
    expect((cancelled as ComputeStopped).reason).toBe("cancelled");
  }, 60_000);
});

describe("the compute budget", () => {
  it("charges one unit per started hundred buses", () => {
    expect([solveCost(1), solveCost(100), solveCost(101), solveCost(15_000)]).toEqual([1, 1, 2, 150]);
  });

  it("refuses once the minute's units are spent, says how long to wait, and refills over time", () => {
    const now = 1_000_000;
    expect(spend("user:budget-a", 20, now)).toBeNull();
    expect(spend("user:budget-a", 10, now)).toBeNull();
    const refused = spend("user:budget-a", 10, now);
    expect(refused).toMatchObject({ status: 429, retryAfterSeconds: 20 }); // 10 units at 30 a minute
    expect(refused?.error).toMatch(/at most 30 units a minute/);
    expect(spend("user:budget-a", 10, now + 20_000)).toBeNull();
    expect(spend("user:budget-b", 10, now)).toBeNull(); // each payer has its own budget
  });

  it("lets one piece of work bigger than the whole budget run when the budget is full", () => {
    expect(spend("user:budget-c", 150, 0)).toBeNull();
    expect(spend("user:budget-c", 1, 0)).not.toBeNull();
  });
});

describe("results kept per revision", () => {
  it("computes a revision's CSV once: later downloads are free and identical", async () => {
    const team = await makeTeam("Cache");
    const db = await getDb();
    const created = await createNetwork(db, { teamId: team.teamId, document: syntheticFeeder(2_900), authorId: team.userIds.owner });
    if (!created.ok) throw new Error("feeder does not validate");
    const actor = { kind: "user" as const, userId: team.userIds.viewer };
    const solves = storedSolveCount();
    const first = await revisionCsv(db, created.network, "buses", actor);
    const again = await Promise.all([revisionCsv(db, created.network, "buses", actor), revisionCsv(db, created.network, "buses", actor)]);
    expect(first.ok).toBe(true);
    expect(again).toEqual([first, first]);
    expect(storedSolveCount() - solves).toBe(1);
  }, 120_000);

  it("solves a revision once for the report, both CSVs, the API and the shared report: none solves again or answers 429", async () => {
    const team = await makeTeam("One solve");
    const db = await getDb();
    const created = await createNetwork(db, { teamId: team.teamId, document: syntheticFeeder(2_900), authorId: team.userIds.owner });
    if (!created.ok) throw new Error("feeder does not validate");
    const networkId = String(created.network.id);
    const owner = (await db.selectFrom("users").selectAll().where("id", "=", team.userIds.owner).executeTakeFirst())!;
    const { url } = await createShareLink(db, { network: created.network, request: { role: "viewer" }, by: owner });
    const token = new URL(url).pathname.split("/").pop()!;
    const solves = storedSolveCount();

    // The report page pays for the solve: 29 of the viewer's 30 units, so any further paid solve would be refused.
    const report = await call(reportPage, getRequest(`/networks/${networkId}/report`, team.cookies.viewer), { networkId });
    expect(report.status).toBe(200);
    expect(report.body.solved.result.loadFlow.converged).toBe(true);
    expect(report.body.extent).toMatchObject({ trimmed: true, buses: { total: 2_900 } });
    // Cut in the worker: the first REPORT_ROWS_MAX buses and those the listed limits name.
    expect(report.body.solved.network.buses.length).toBe(report.body.extent.buses.listed);
    expect(report.body.solved.result.checks.length).toBeLessThanOrEqual(REPORT_ROWS_MAX);
    expect(report.body.extent.buses.listed).toBeLessThan(2_900);

    const buses = await call(resultsCsvApi, getRequest(`/api/networks/${networkId}/results.csv?table=buses`, team.cookies.viewer), { networkId });
    const branches = await call(resultsCsvApi, getRequest(`/api/networks/${networkId}/results.csv?table=branches`, team.cookies.viewer), { networkId });
    const shared = await call(sharedResultsCsv, getRequest(`/s/${token}/results.csv?table=buses`), { token });
    const again = await call(reportPage, getRequest(`/networks/${networkId}/report`, team.cookies.viewer), { networkId });
    const sharedReport = await call(reportPage, getRequest(`/s/${token}/report`), { token });
    const api = await solvedRevisionJson(db, created.network, { kind: "user", userId: team.userIds.viewer });
    expect([buses.status, branches.status, shared.status, again.status, sharedReport.status]).toEqual([200, 200, 200, 200, 200]);
    expect(buses.body.trim().split("\n")).toHaveLength(2_901);
    expect(shared.body).toBe(buses.body);
    expect(sharedReport.body.solved).toEqual(report.body.solved);
    expect(api.ok).toBe(true);
    expect(storedSolveCount() - solves).toBe(1);
  }, 120_000);
});

describe("stored revisions, validated once", () => {
  it("are trusted once saved here, counted by their buses as stored, and an untrusted one is validated on first use", async () => {
    const { currentDocumentText } = await import("#app/lib/networks.server.ts");
    const { writeRevision, findNetwork } = await import("#db/networks.ts");
    const team = await makeTeam("Trusted revisions");
    const db = await getDb();
    const created = await createNetwork(db, { teamId: team.teamId, document: syntheticFeeder(250), authorId: team.userIds.owner });
    if (!created.ok) throw new Error("feeder does not validate");
    expect(await currentDocumentText(db, created.network)).toMatchObject({ buses: 250, trusted: true });

    // A revision stored without this process validating it (as by an older release) that the
    // checks now refuse: a bus at 0 kV. Its first solve validates and answers the checks' issue.
    const broken = structuredClone(created.document);
    broken.buses[3].nominalKV = 0;
    const stored = await writeRevision(db, {
      networkId: created.network.id,
      expectedRevision: 1,
      document: broken,
      problems: [],
      authorId: team.userIds.owner,
      layoutOnly: () => false,
    });
    expect(stored.ok).toBe(true);
    const network = (await findNetwork(db, created.network.id))!;
    expect(await currentDocumentText(db, network)).toMatchObject({ buses: 250, trusted: false });
    const answer = await solvedRevisionJson(db, network, { kind: "user", userId: team.userIds.viewer });
    expect(answer.ok).toBe(false);
    expect(!answer.ok && answer.issues[0].path).toBe("buses[3].nominalKV");
    expect((await currentDocumentText(db, network)).trusted).toBe(false);
    // The pages (sheet, ladder, shared view) read it through the same rule.
    const { checkedRevision } = await import("#app/lib/networks.server.ts");
    const pageView = checkedRevision(network, { document: broken, createdAt: network.updated_at });
    expect(!pageView.ok && pageView.issues[0].path).toBe("buses[3].nominalKV");
    expect(checkedRevision(created.network, { document: created.document, createdAt: created.network.created_at })).toEqual({ ok: true, network: created.document });
  }, 60_000);

  it("are trusted by version: an autosave folded into a trusted revision that makes it a draft is not trusted", async () => {
    const { currentDocumentText, saveNetworkDocument } = await import("#app/lib/networks.server.ts");
    const { findNetwork } = await import("#db/networks.ts");
    const team = await makeTeam("Trusted versions");
    const db = await getDb();
    const created = await createNetwork(db, { teamId: team.teamId, document: syntheticFeeder(20), authorId: team.userIds.owner });
    if (!created.ok) throw new Error("feeder does not validate");
    const author = team.userIds.owner;
    const complete = await saveNetworkDocument(db, { networkId: created.network.id, expectedRevision: 1, document: created.document, authorId: author, foldedSaves: 0 });
    expect(complete).toMatchObject({ ok: true, revision: 2, problems: [] });
    expect((await currentDocumentText(db, (await findNetwork(db, created.network.id))!)).trusted).toBe(true);
    // The same session's next autosave leaves a line pointing at no bus: revision 2 is now a draft.
    const draft = structuredClone(created.document);
    draft.lines[0].toBus = "";
    const folded = await saveNetworkDocument(db, { networkId: created.network.id, expectedRevision: 2, document: draft, authorId: author, foldedSaves: 0 });
    expect(folded).toMatchObject({ ok: true, revision: 2, foldedSaves: 1 });
    expect(folded.ok && folded.problems.length).toBeGreaterThan(0);
    expect((await currentDocumentText(db, (await findNetwork(db, created.network.id))!)).trusted).toBe(false);
  }, 60_000);
});
