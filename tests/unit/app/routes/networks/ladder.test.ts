import { beforeAll, describe, expect, it } from "vitest";
import tarnHead from "../../../../fixtures/tarn-head-calder-flats.json";
import { getDb } from "#app/lib/db.server.ts";
import { action as ladderApi } from "#app/routes/api/ladder.ts";
import { action as createNetworkApi } from "#app/routes/api/networks.ts";
import { jobSettled } from "#app/lib/compute/jobs.server.ts";
import { action as jobAction, loader as jobLoader } from "#app/routes/networks/job.ts";
import { action as ladderAction, loader as ladderLoader } from "#app/routes/networks/ladder.tsx";
import { loader as reportLoader } from "#app/routes/networks/report.tsx";
import { insertMembership, insertTeamWithOwner } from "#db/teams.ts";
import { writeLibraryTypes } from "#db/libraryTypes.ts";
import { syntheticFeeder } from "../../../../bench/syntheticFeeder.ts";
import { call, cookieFor, formRequest, getRequest, jsonRequest, makeUser } from "../harness.ts";

const cookies = {} as Record<"owner" | "editor" | "viewer" | "outsider", string>;
let networkId: number;
let teamId: number;
let editorName: string;
let ownerId: number;
const study = { sectionBus: "b-calder-66", voltagesKV: [33, 66, 132], money: { energyPricePerMWh: 95, currency: "GBP" } };

const started = (body: unknown, cookie: string, id = networkId) =>
  call(ladderAction, jsonRequest("POST", `/networks/${id}/ladder`, { cookie, body }), { networkId: String(id) });
const jobGet = (jobId: string, cookie: string, id = networkId) =>
  call(jobLoader, getRequest(`/networks/${id}/jobs/${jobId}`, cookie), { networkId: String(id), jobId });
/**
 * The page's run: the action answers at once (a refusal, or 202 with the job), then the page
 * follows the job; this answers what the page ends up showing, as { status, body } with the
 * ladder or the job's sentence, status and issues.
 */
async function pagePost(body: unknown, cookie: string, id = networkId) {
  const start = await started(body, cookie, id);
  if (start.status !== 202) return start;
  expect(start.body.job).toMatchObject({ state: "running", networkId: id });
  await jobSettled(start.body.job.id);
  const job = await jobGet(start.body.job.id, cookie, id);
  expect(job.status).toBe(200);
  if (job.body.state === "done") return { status: 200, body: { ...job.body.result, job: job.body } };
  return { status: job.body.status as number, body: { error: job.body.error, issues: job.body.issues, job: job.body } };
}
const pageGet = (cookie: string, id = networkId) => call(ladderLoader, getRequest(`/networks/${id}/ladder`, cookie), { networkId: String(id) });
const reportGet = (cookie: string, id = networkId) => call(reportLoader, getRequest(`/networks/${id}/report`, cookie), { networkId: String(id) });

beforeAll(async () => {
  const db = await getDb();
  const owner = await makeUser("Page Owner", { ownTeam: true });
  const editor = await makeUser("Page Editor");
  const viewer = await makeUser("Page Viewer");
  const outsider = await makeUser("Page Outsider", { ownTeam: true });
  editorName = editor.name;
  ownerId = owner.id;
  teamId = (await db.transaction().execute((trx) => insertTeamWithOwner(trx, "Ladder page team", owner.id))).id;
  await insertMembership(db, teamId, editor.id, "editor");
  await insertMembership(db, teamId, viewer.id, "viewer");
  cookies.owner = await cookieFor(owner);
  cookies.editor = await cookieFor(editor);
  cookies.viewer = await cookieFor(viewer);
  cookies.outsider = await cookieFor(outsider);
  const created = await call(createNetworkApi, jsonRequest("POST", `/api/networks?team=${teamId}`, { cookie: cookies.owner, body: tarnHead }));
  networkId = created.body.id;
});

describe("the ladder page", () => {
  it("opens for a viewer with no study saved, and says a viewer may not save", async () => {
    const page = await pageGet(cookies.viewer);
    expect(page.status).toBe(200);
    expect(page.body).toMatchObject({ role: "viewer", canSave: false, saved: null, savedLadder: null, revision: 1 });
  });

  it("is not found for someone outside the team", async () => {
    expect((await pageGet(cookies.outsider)).status).toBe(404);
    expect((await pagePost({ intent: "run", request: study }, cookies.outsider)).status).toBe(404);
  });

  it("runs for a viewer and answers exactly what the API answers for the same request", async () => {
    const page = await pagePost({ intent: "run", request: study }, cookies.viewer);
    expect(page.status).toBe(200);
    const api = await call(ladderApi, jsonRequest("POST", `/api/networks/${networkId}/ladder`, { cookie: cookies.viewer, body: study }), {
      networkId: String(networkId),
    });
    expect(page.body.ladder.alternatives.map((a: { voltageKV: number }) => a.voltageKV)).toEqual([33, 66, 132]);
    expect(JSON.parse(JSON.stringify(page.body.ladder.alternatives))).toEqual(api.body.alternatives);
    expect(page.body.ladder.cheapest).toEqual(api.body.cheapest);
  });

  it("refuses to save for a viewer (403, naming the role) and stores nothing", async () => {
    const outcome = await pagePost({ intent: "save", request: study }, cookies.viewer);
    expect(outcome.status).toBe(403);
    expect(outcome.body.error).toMatch(/viewer/);
    const db = await getDb();
    expect(await db.selectFrom("ladder_studies").selectAll().where("network_id", "=", networkId).execute()).toEqual([]);
  });

  it("names the fields of a bad request with 400", async () => {
    const outcome = await pagePost({ intent: "run", request: { sectionBus: "b-calder-66", voltagesKV: [], money: { loadFactor: 2 } } }, cookies.viewer);
    expect(outcome.status).toBe(400);
    expect(outcome.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(["money.loadFactor", "voltagesKV"]);
  });

  it("saves an editor's study with the network and shows it again on the next visit, for everyone in the team", async () => {
    const saved = await pagePost({ intent: "save", request: study }, cookies.editor);
    expect(saved.status).toBe(200);
    expect(saved.body.ladder.cheapest).toMatchObject({ voltageKV: 66 });
    const again = await pageGet(cookies.viewer);
    expect(again.body.saved).toMatchObject({ networkRevision: 1, updatedByName: editorName });
    expect(again.body.saved.request).toMatchObject({ sectionBus: "b-calder-66", voltagesKV: [33, 66, 132] });
    expect(again.body.saved.request.money).toMatchObject({ energyPricePerMWh: 95, currency: "GBP", loadFactor: 0.6, discountRatePct: 8 });
    expect(again.body.savedLadder.alternatives.map((a: { converged: boolean }) => a.converged)).toEqual([false, true, true]);
  });

  it("replaces the saved study on the next save instead of adding another", async () => {
    const basedOn = async () => (await pageGet(cookies.editor)).body.saved?.updatedAt ?? null;
    expect((await pagePost({ intent: "save", request: { ...study, voltagesKV: [66, 132] }, basedOn: await basedOn() }, cookies.editor)).status).toBe(200);
    const db = await getDb();
    const rows = await db.selectFrom("ladder_studies").select(["voltages_kv"]).where("network_id", "=", networkId).execute();
    expect(rows).toEqual([{ voltages_kv: "[66,132]" }]);
    expect((await pagePost({ intent: "save", request: study, basedOn: await basedOn() }, cookies.editor)).status).toBe(200);
  });

  // Issue #13, finding 10: the saved study was last-write-wins.
  it("refuses (409) a save that started from an older study, and keeps the newer one", async () => {
    const { updatedAt } = (await pageGet(cookies.editor)).body.saved;
    expect((await pagePost({ intent: "save", request: { ...study, voltagesKV: [132] }, basedOn: updatedAt }, cookies.owner)).status).toBe(200);
    const late = await pagePost({ intent: "save", request: { ...study, voltagesKV: [33] }, basedOn: updatedAt }, cookies.editor);
    expect(late.status).toBe(409);
    expect(late.body.error).toMatch(/nothing was overwritten/);
    const rows = await (await getDb()).selectFrom("ladder_studies").select(["voltages_kv"]).where("network_id", "=", networkId).execute();
    expect(rows).toEqual([{ voltages_kv: "[132]" }]);
    expect((await pagePost({ intent: "save", request: study, basedOn: null }, cookies.editor)).status).toBe(409);
    const current = (await pageGet(cookies.editor)).body.saved.updatedAt;
    expect((await pagePost({ intent: "save", request: study, basedOn: current }, cookies.editor)).status).toBe(200);
  });

  it("keeps a study that sizes the section's conductor, and the saved ladder says which conductor each alternative got", async () => {
    const basedOn = (await pageGet(cookies.editor)).body.saved?.updatedAt ?? null;
    const sizing = { clearingTimeS: 0.5 };
    expect((await pagePost({ intent: "save", request: { ...study, sizing }, basedOn }, cookies.editor)).status).toBe(200);
    const again = await pageGet(cookies.viewer);
    expect(again.body.saved.request.sizing).toEqual(sizing);
    const chosen = again.body.savedLadder.alternatives.map((a: { sizing: { chosen: { label: string } | null } | null }) => a.sizing?.chosen?.label ?? null);
    expect(chosen[0]).toBeNull();
    expect(chosen[1]).toMatch(/^ACSR /);
    const rows = await (await getDb()).selectFrom("ladder_studies").select(["sizing"]).where("network_id", "=", networkId).execute();
    expect(rows).toEqual([{ sizing: JSON.stringify(sizing) }]);

    // A team conductor that passes and costs less over its life than any built-in one is chosen, on the next visit too.
    const written = await writeLibraryTypes(await getDb(), {
      teamId,
      userId: ownerId,
      types: [
        {
          kind: "conductor",
          name: "Moorland 200 (team type)",
          data: { kind: "overhead", frequencyHz: 50, rOhmPerKm: 0.12, xOhmPerKm: 0.35, ampacityA: 600, material: "acsr", crossSectionMm2: 200 },
        },
      ],
    });
    expect(written.ok).toBe(true);
    const withTeamType = await pageGet(cookies.viewer);
    expect(withTeamType.body.savedLadder.alternatives[1].sizing.chosen.label).toBe("Moorland 200 (team type)");
    const back = (await pageGet(cookies.editor)).body.saved.updatedAt;
    expect((await pagePost({ intent: "save", request: study, basedOn: back }, cookies.editor)).status).toBe(200);
    expect((await pageGet(cookies.viewer)).body.saved.request).not.toHaveProperty("sizing");
  });
});

describe("the ladder as a job", () => {
  it("reports progress to the end, and only to whoever started it", async () => {
    const start = await started({ intent: "run", request: study }, cookies.viewer);
    expect(start.status).toBe(202);
    const { id } = start.body.job;
    // Someone else in the team, or on another network, is told it does not exist.
    expect((await jobGet(id, cookies.editor)).status).toBe(404);
    expect((await jobGet(id, cookies.outsider)).status).toBe(404);
    await jobSettled(id);
    const done = await jobGet(id, cookies.viewer);
    expect(done.body).toMatchObject({ state: "done", error: null, progress: { stage: expect.stringMatching(/^Alternative 3 of 3 \(132 kV\)$/) } });
    expect(done.body.progress.done).toBe(done.body.progress.total);
    expect(done.body.result.ladder.alternatives).toHaveLength(3);
  });

  it("can be cancelled by whoever started it: it stops, says so and saves nothing", async () => {
    // A feeder of 2,000 buses: its ladder runs for seconds, the cancel follows within milliseconds.
    const feeder = syntheticFeeder(2_000);
    const created = await call(createNetworkApi, jsonRequest("POST", `/api/networks?team=${teamId}`, { cookie: cookies.owner, body: feeder }));
    const bigId: number = created.body.id;
    const request = { sectionBus: feeder.buses[2].id, voltagesKV: [33, 66] };
    const start = await started({ intent: "save", request, basedOn: null }, cookies.editor, bigId);
    expect(start.status).toBe(202);
    const jobId: string = start.body.job.id;
    const cancelAs = (cookie: string) =>
      call(jobAction, formRequest(`/networks/${bigId}/jobs/${jobId}`, { intent: "cancel" }, { cookie }), { networkId: String(bigId), jobId });
    expect((await cancelAs(cookies.owner)).status).toBe(404);
    const cancelled = await cancelAs(cookies.editor);
    expect(cancelled.status).toBe(200);
    expect(cancelled.body).toMatchObject({ state: "cancelled", error: "The calculation was cancelled; nothing was saved.", result: null });
    const db = await getDb();
    expect(await db.selectFrom("ladder_studies").selectAll().where("network_id", "=", bigId).execute()).toEqual([]);
  }, 60_000);

  it("answers a job address that names nothing with 404 and a sentence", async () => {
    const missing = await jobGet("no-such-job", cookies.viewer);
    expect(missing.status).toBe(404);
    expect(String(missing.body)).toMatch(/no such calculation/);
  });
});

describe("the study report", () => {
  it("opens for a viewer with the solved network, the saved ladder and who wrote the revision", async () => {
    const report = await reportGet(cookies.viewer);
    expect(report.status).toBe(200);
    expect(report.body.revision).toMatchObject({ number: 1, by: "Page Owner" });
    expect(report.body.solved.result.loadFlow.converged).toBe(true);
    expect(report.body.ladder.alternatives.map((a: { voltageKV: number }) => a.voltageKV)).toEqual([33, 66, 132]);
    expect(report.body.ladder.money.currency).toBe("GBP");
  });

  it("is not found for someone outside the team or a network that is not a number", async () => {
    expect((await reportGet(cookies.outsider)).status).toBe(404);
    const malformed = await call(reportLoader, getRequest("/networks/x/report", cookies.viewer), { networkId: "x" });
    expect(malformed.status).toBe(404);
  });
});
