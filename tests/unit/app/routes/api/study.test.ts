// POST /api/networks/:id/study: the study of the saved revision, in the shape the command line prints;
// and the same study as a job: POST …/study/jobs (202), GET the job, DELETE it to cancel.
import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { action as createNetworkApi } from "#app/routes/api/networks.ts";
import { action as studyApi } from "#app/routes/api/network-study.ts";
import { action as startStudyJobApi } from "#app/routes/api/network-study-jobs.ts";
import { action as studyJobAction, loader as studyJobLoader } from "#app/routes/api/network-study-job.ts";
import { jobSettled } from "#app/lib/compute/jobs.server.ts";
import { syntheticFeeder } from "../../../../bench/syntheticFeeder.ts";
import { insertMembership, insertTeamWithOwner } from "#db/teams.ts";
import { runStudySync } from "#solver/study/index.ts";
import { call, cookieFor, getRequest, jsonRequest, makeUser } from "../harness.ts";
import { tarnWithCases } from "../../../solver/study/networks.ts";

const cookies = {} as Record<"owner" | "viewer" | "outsider", string>;
let teamId: number;
let networkId: number;
const document = tarnWithCases(
  [
    { id: "peak", name: "Winter peak", hoursPerYear: 2000 },
    { id: "light", name: "Summer light load", hoursPerYear: 6760, loadScale: 0.3 },
  ],
  { ratePctPerYear: 2.5, years: 10 },
);

const post = (body: unknown, cookie = cookies.viewer) =>
  call(studyApi, jsonRequest("POST", `/api/networks/${networkId}/study`, { cookie, body }), { networkId: String(networkId) });

beforeAll(async () => {
  const db = await getDb();
  const owner = await makeUser("Study Owner", { ownTeam: true });
  const viewer = await makeUser("Study Viewer");
  teamId = (await db.transaction().execute((trx) => insertTeamWithOwner(trx, "Study team", owner.id))).id;
  await insertMembership(db, teamId, viewer.id, "viewer");
  cookies.owner = await cookieFor(owner);
  cookies.viewer = await cookieFor(viewer);
  cookies.outsider = await cookieFor(await makeUser("Study Outsider"));
  const created = await call(createNetworkApi, jsonRequest("POST", `/api/networks?team=${teamId}`, { cookie: cookies.owner, body: document }));
  expect(created.status).toBe(201);
  networkId = created.body.id;
});

describe("POST /api/networks/:id/study", () => {
  it("gives a viewer the engine's study of the saved revision, outages and years when asked", async () => {
    const outcome = await post({ outages: true, years: true });
    expect(outcome.status).toBe(200);
    expect(outcome.headers.get("Kilostep-Revision")).toBe("1");
    const engine = runStudySync(document, { outages: true, years: true });
    expect(engine.ok && outcome.body).toEqual(engine.ok && JSON.parse(JSON.stringify(engine.study)));
    expect(outcome.body.cases.map((c: { id: string }) => c.id)).toEqual(["peak", "light"]);
  });

  it("runs the cases alone for an empty body", async () => {
    const outcome = await post({});
    expect(outcome.status).toBe(200);
    expect(outcome.body.outages).toBeUndefined();
    expect(outcome.body.energy.method).toBe("case-hours");
  });

  it("names what is wrong with the request", async () => {
    const outcome = await post({ outages: ["dawn"], colour: "red" });
    expect(outcome.status).toBe(400);
    expect(outcome.body.issues).toContainEqual({ path: "", message: '"colour" is not a field that can be given here' });
  });

  it("refuses other methods with 405", async () => {
    const outcome = await call(studyApi, getRequest(`/api/networks/${networkId}/study`, cookies.viewer), { networkId: String(networkId) });
    expect([outcome.status, outcome.headers.get("Allow")]).toEqual([405, "POST"]);
  });
});

describe("the study as a job", () => {
  const start = (body: unknown, cookie = cookies.viewer, id = networkId) =>
    call(startStudyJobApi, jsonRequest("POST", `/api/networks/${id}/study/jobs`, { cookie, body }), { networkId: String(id) });
  const jobGet = (jobId: string, cookie = cookies.viewer, id = networkId) =>
    call(studyJobLoader, getRequest(`/api/networks/${id}/study/jobs/${jobId}`, cookie), { networkId: String(id), jobId });
  const jobDelete = (jobId: string, cookie = cookies.viewer, id = networkId) =>
    call(studyJobAction, jsonRequest("DELETE", `/api/networks/${id}/study/jobs/${jobId}`, { cookie }), { networkId: String(id), jobId });

  it("answers 202 with the job's address, then gives its progress and the engine's study, as the waited form does", async () => {
    const started = await start({ outages: true, years: true });
    expect(started.status).toBe(202);
    const jobId: string = started.body.id;
    expect(started.body).toMatchObject({ kind: "study", networkId, url: `/api/networks/${networkId}/study/jobs/${jobId}` });
    expect(["running", "done"]).toContain(started.body.state);
    expect(started.headers.get("Location")).toBe(started.body.url);
    expect(started.body.study).toBeUndefined();

    await jobSettled(jobId);
    const done = await jobGet(jobId);
    expect(done.status).toBe(200);
    expect(done.body).toMatchObject({ state: "done", error: null, revision: 1, progress: { stage: expect.any(String) } });
    expect(done.body.progress.done).toBe(done.body.progress.total);
    expect(done.headers.get("Kilostep-Revision")).toBe("1");
    // The waited form's own test compares it with the engine in the same way.
    const engine = runStudySync(document, { outages: true, years: true });
    expect(engine.ok && done.body.study).toEqual(engine.ok && JSON.parse(JSON.stringify(engine.study)));
    expect(done.body.result).toBeUndefined();
  });

  it("is seen and cancelled only by whoever started it; anyone else is told it does not exist", async () => {
    const started = await start({});
    const jobId: string = started.body.id;
    for (const cookie of [cookies.owner, cookies.outsider]) {
      expect((await jobGet(jobId, cookie)).status).toBe(404);
      expect((await jobDelete(jobId, cookie)).status).toBe(404);
    }
    expect((await jobGet("no-such-job")).body.error).toMatch(/no such study job/);
    await jobSettled(jobId);
  });

  it("can be cancelled while it runs: it stops at once and says so", async () => {
    // 2,000 buses with N-1: thousands of load flows, the cancel follows within milliseconds.
    const feeder = syntheticFeeder(2_000);
    const created = await call(createNetworkApi, jsonRequest("POST", `/api/networks?team=${teamId}`, { cookie: cookies.owner, body: feeder }));
    const bigId: number = created.body.id;
    const started = await start({ outages: true }, cookies.owner, bigId);
    expect(started.status).toBe(202);
    const cancelled = await jobDelete(started.body.id, cookies.owner, bigId);
    expect(cancelled.status).toBe(200);
    expect(cancelled.body).toMatchObject({ state: "cancelled", status: 499, error: "The calculation was cancelled; nothing was saved." });
    expect(cancelled.body.study).toBeUndefined();
    expect((await jobGet(started.body.id, cookies.owner, bigId)).body.state).toBe("cancelled");
  }, 60_000);

  it("refuses a malformed request with 400 before starting anything, and a case the network lacks in the job", async () => {
    const bad = await start({ outages: "all", colour: "red" });
    expect(bad.status).toBe(400);
    expect(bad.body.issues).toContainEqual({ path: "", message: '"colour" is not a field that can be given here' });
    const unknownCase = await start({ outages: ["dawn"] });
    expect(unknownCase.status).toBe(202);
    await jobSettled(unknownCase.body.id);
    const failed = await jobGet(unknownCase.body.id);
    expect(failed.body).toMatchObject({ state: "failed", status: 400, issues: [{ path: "outages[0]", message: expect.stringMatching(/no operating case "dawn"/) }] });
  });

  it("answers other methods with 405", async () => {
    const get = await call(startStudyJobApi, getRequest(`/api/networks/${networkId}/study/jobs`, cookies.viewer), { networkId: String(networkId) });
    expect([get.status, get.headers.get("Allow")]).toEqual([405, "POST"]);
    const put = await call(studyJobAction, jsonRequest("PUT", `/api/networks/${networkId}/study/jobs/x`, { cookie: cookies.viewer, body: {} }), { networkId: String(networkId), jobId: "x" });
    expect([put.status, put.headers.get("Allow")]).toEqual([405, "GET, DELETE"]);
  });
});
