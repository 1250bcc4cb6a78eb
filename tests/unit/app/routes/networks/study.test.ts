// The study page, its progress stream and its CSV downloads, called as the server calls them:
// who may read them, what a bad query answers, and numbers that agree with the API's study and
// with hand arithmetic (the town's 7 MW lost with its one feeder out; half of it at half load).
import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { studyView } from "#app/lib/studyView.ts";
import { action as studyApi } from "#app/routes/api/network-study.ts";
import { loader as pageLoader } from "#app/routes/networks/study.tsx";
import { loader as runLoader } from "#app/routes/networks/study-run.ts";
import { loader as csvLoader } from "#app/routes/networks/study-csv.ts";
import { loader as reportLoader } from "#app/routes/networks/report.tsx";
import { validateNetwork } from "#solver/schema.ts";
import { insertMembership } from "#db/teams.ts";
import { createNetwork } from "#app/lib/networks.server.ts";
import { starNetwork } from "../../../largeNetworks.ts";
import { call, cookieFor, getRequest, jsonRequest, makeUser, type Outcome } from "../harness.ts";
import { demoDocument, freshWorld, makePeople, type People, type World } from "../reviewWorld.ts";

let people: People;
let world: World;

beforeAll(async () => {
  people = await makePeople("Study page");
  world = await freshWorld(people, "Study page");
});

/**
 * A viewer of the team of their own: each account has its own compute budget, and a full study
 * of the demo (N-1 and 20 years) spends most of one.
 */
async function newViewer(): Promise<string> {
  const user = await makeUser("Study reader");
  await insertMembership(await getDb(), people.team.id, user.id, "viewer");
  return cookieFor(user);
}

const params = () => ({ networkId: String(world.networkId) });
const page = (query: string, cookie = people.cookies.viewer) => call(pageLoader, getRequest(`/networks/${world.networkId}/study${query}`, cookie), params());
const run = (query: string, cookie = people.cookies.viewer) => call(runLoader, getRequest(`/networks/${world.networkId}/study/run${query}`, cookie), params());
const csv = (query: string, cookie = people.cookies.viewer) => call(csvLoader, getRequest(`/networks/${world.networkId}/study.csv${query}`, cookie), params());

function lines(outcome: Outcome): Record<string, any>[] {
  expect(outcome.headers.get("Content-Type")).toMatch(/ndjson/);
  return String(outcome.body)
    .trim()
    .split("\n")
    .map((line) => JSON.parse(line));
}

describe("the study page", () => {
  it("opens for a viewer with the network's three operating cases and its growth", async () => {
    const outcome = await page("");
    expect(outcome.status).toBe(200);
    expect(outcome.body.cases.map((c: { id: string }) => c.id)).toEqual(["winter-peak", "summer-light", "town-feeder-out"]);
    expect(outcome.body.growth).toEqual({ ratePctPerYear: 2, years: 20 });
    expect(outcome.body.branchCount).toBe(5);
    expect(outcome.body.mayEditCases).toBe(false);
    expect((await page("", people.cookies.editor)).body.mayEditCases).toBe(true);
  });

  it("answers a query it cannot run with 400 and a sentence per field", async () => {
    const outcome = await page("?outages=maybe&years=on&rate=lots&horizon=500");
    expect(outcome.status).toBe(400);
    expect(outcome.body.optionErrors.outages).toMatch(/"maybe" is not a choice/);
    expect(outcome.body.optionErrors.rate).toMatch(/"lots" is not a number/);
    expect(outcome.body.optionErrors.horizon).toMatch(/at most 100 years/);
    expect((await page("?rate=2")).body.optionErrors.years).toMatch(/without asking for the years study/);
  });

  it("is not found for an outsider and sends someone signed out to sign in", async () => {
    expect((await page("", people.cookies.outsider)).status).toBe(404);
    expect((await run("", people.cookies.outsider)).status).toBe(404);
    expect((await csv("?table=cases", people.cookies.outsider)).status).toBe(404);
    expect((await page("", "")).status).toBe(302);
    expect((await run("", "")).status).toBe(302);
  });
});

describe("the study stream", () => {
  it("reports progress up to every load flow, then rows equal to the API's study of the same revision", async () => {
    const outcome = await run("?outages=on&years=on", await newViewer());
    expect(outcome.status).toBe(200);
    const all = lines(outcome);
    const progress = all.filter((l) => l.progress).map((l) => l.progress);
    const last = all.at(-1)!;
    expect(last.view).toBeDefined();
    // 3 cases + 3 × 5 outages + 20 years × 3 cases.
    expect(progress.at(-1)).toMatchObject({ done: 3 + 15 + 60, total: 3 + 15 + 60, stage: expect.stringMatching(/^Years of growth/) });
    expect(progress.map((p) => p.done)).toEqual([...progress.map((p) => p.done)].sort((a, b) => a - b));

    const api = await call(studyApi, jsonRequest("POST", `/api/networks/${world.networkId}/study`, { cookie: await newViewer(), body: { outages: true, years: true } }), params());
    const checked = validateNetwork(demoDocument("Study page main"));
    if (!checked.ok) throw new Error("the demo must validate");
    expect(last.view).toEqual(JSON.parse(JSON.stringify(studyView(checked.network, api.body))));
  });

  it("loses the town's 7 MW with its one feeder out at peak, and 3.5 MW at half load (by hand: 7 × 0.5)", async () => {
    const view = lines(await run("?outages=on", await newViewer())).at(-1)!.view;
    const town = (caseId: string) => view.outages.rows.find((o: any) => o.case.id === caseId && o.elementId === "l-town");
    expect(town("winter-peak").lostLoadMW).toBe(7);
    expect(town("summer-light").lostLoadMW).toBe(3.5);
    // The worst first: the chain is radial, so every outage loses load, the most first.
    const lost = view.outages.rows.filter((o: any) => o.converged).map((o: any) => o.lostLoadMW);
    expect(lost.every((mw: number) => mw > 0)).toBe(true);
    expect(lost).toEqual([...lost].sort((a, b) => b - a));
    // The case with the feeder already out is not studied with it out again.
    expect(town("town-feeder-out")).toBeUndefined();
    expect(view.years).toBeNull();
  });

  it("runs the years on a growth given for this run", async () => {
    const view = lines(await run("?years=on&rate=5&horizon=10", await newViewer())).at(-1)!.view;
    expect(view.growth).toMatchObject({ ratePctPerYear: 5, years: 10 });
    expect(view.years.rows.every((y: any) => y.firstYear >= 0 && y.firstYear <= 10)).toBe(true);
  });

  it("answers a bad query with 400 before running anything", async () => {
    const outcome = await run("?years=on&rate=500&horizon=10");
    expect(outcome.status).toBe(400);
    expect(outcome.body.error).toMatch(/growth rate must be at most 100 %/);
  });

  it("is open to a view link and closed to a revoked one", async () => {
    const viaLink = (token: string) => call(runLoader, getRequest(`/s/${token}/study/run`), { token });
    const live = await viaLink(world.tokens.viewLink);
    expect(live.status).toBe(200);
    expect(lines(live).at(-1)!.view.cases).toHaveLength(3);
    expect((await viaLink(world.tokens.revokedLink)).status).toBe(410);
  });

  it("refuses a study past the reader's compute budget with 429 and a sentence, before streaming", async () => {
    const reader = await newViewer();
    expect((await run("?outages=on&years=on", reader)).status).toBe(200);
    const refused = await run("?outages=on&years=on&rate=3&horizon=20", reader);
    expect(refused.status).toBe(429);
    expect(refused.body.error).toMatch(/\w/);
  });
});

describe("the study CSV", () => {
  it("downloads each table of the study the page shows", async () => {
    const reader = await newViewer();
    const outcome = await csv("?table=outages&outages=on", reader);
    expect(outcome.status).toBe(200);
    expect(outcome.headers.get("Content-Type")).toMatch(/text\/csv/);
    expect(outcome.headers.get("Content-Disposition")).toMatch(/study-outages\.csv/);
    const rows = String(outcome.body).trimEnd().split("\r\n").map((r) => r.split(","));
    const lost = rows[0].indexOf("lost_load_MW");
    expect(rows.find((r) => r[0] === "winter-peak" && r[1] === "l-town")![lost]).toBe("7");
    for (const table of ["cases", "envelope"]) expect((await csv(`?table=${table}`, reader)).status).toBe(200);
    expect((await csv("?table=years&years=on", reader)).status).toBe(200);
    // The study just run for the N-1 table answers this one too, at no cost.
    expect((await csv("?table=firm-capacity&outages=on", reader)).status).toBe(200);
  });

  it("says what is missing instead of an empty file", async () => {
    expect(await csv("?table=outages")).toMatchObject({ status: 400, body: expect.stringMatching(/needs the outage study: add outages=on/) });
    expect(await csv("?table=years")).toMatchObject({ status: 400, body: expect.stringMatching(/add years=on/) });
    expect(await csv("?table=buses")).toMatchObject({ status: 400, body: expect.stringMatching(/Name the table/) });
    expect(await csv("?table=cases&outages=perhaps")).toMatchObject({ status: 400, body: expect.stringMatching(/"perhaps" is not a choice/) });
  });

  it("asks a network without growth for one", async () => {
    const db = await getDb();
    const document = { ...demoDocument("No growth"), growth: undefined };
    const { createNetwork } = await import("#app/lib/networks.server.ts");
    const made = await createNetwork(db, { teamId: people.team.id, document, authorId: people.owner.id });
    if (!made.ok) throw new Error("fixture must validate");
    const outcome = await call(csvLoader, getRequest(`/networks/${made.network.id}/study.csv?table=years&years=on`, people.cookies.viewer), { networkId: String(made.network.id) });
    expect(outcome.status).toBe(400);
    expect(outcome.body).toMatch(/gives no load growth/);
  });
});

describe("the report's study part", () => {
  it("carries the cases, N-1 and the network's years, with the same rows as the study page", async () => {
    const reader = await newViewer();
    const report = await call(reportLoader, getRequest(`/networks/${world.networkId}/report`, reader), params());
    expect(report.status).toBe(200);
    const part = report.body.reportStudy;
    expect(part).toMatchObject({ error: null, withYears: true });
    expect(part.view.outages.rows.find((o: any) => o.case.id === "winter-peak" && o.elementId === "l-town").lostLoadMW).toBe(7);
    expect(part.view.growth).toMatchObject({ ratePctPerYear: 2, years: 20 });
    const page = lines(await run("?outages=on&years=on", await newViewer())).at(-1)!.view;
    expect(JSON.parse(JSON.stringify(part.view))).toEqual(page);
  });

  it("says why the study is missing when the reader's budget is spent, and still gives the report", async () => {
    const reader = await newViewer();
    expect((await run("?outages=on&years=on", reader)).status).toBe(200);
    // A network no one has reported on yet: a kept report study would be free.
    const made = await createNetwork(await getDb(), { teamId: people.team.id, document: demoDocument("Study page, budget spent"), authorId: people.owner.id });
    if (!made.ok) throw new Error("fixture must validate");
    const report = await call(reportLoader, getRequest(`/networks/${made.network.id}/report`, reader), { networkId: String(made.network.id) });
    expect(report.status).toBe(200);
    expect(report.body.reportStudy.view).toBeNull();
    expect(report.body.reportStudy.error).toMatch(/\w/);
  });

  it("keeps the report's study per revision: a second reader, whose budget is spent, is given it free", async () => {
    const first = await call(reportLoader, getRequest(`/networks/${world.networkId}/report`, await newViewer()), params());
    expect(first.body.reportStudy.view).not.toBeNull();
    const reader = await newViewer();
    expect((await run("?outages=on&years=on", reader)).status).toBe(200);
    const report = await call(reportLoader, getRequest(`/networks/${world.networkId}/report`, reader), params());
    expect(report.body.reportStudy).toEqual(first.body.reportStudy);
  });

  it("leaves an N-1 too large for a report to the study page, and says so", async () => {
    // 1,600 spurs: N-1 alone would be 1,600 load flows.
    const made = await createNetwork(await getDb(), { teamId: people.team.id, document: starNetwork(1600), authorId: people.owner.id });
    if (!made.ok) throw new Error("fixture must validate");
    const report = await call(reportLoader, getRequest(`/networks/${made.network.id}/report`, await newViewer()), { networkId: String(made.network.id) });
    expect(report.status).toBe(200);
    expect(report.body.reportStudy.skipped).toMatch(/N-1 \(1,600 load flows\) is too large for a report/);
    expect(report.body.reportStudy.view.outages).toBeNull();
    expect(report.body.reportStudy.view.cases).toHaveLength(1);
  });
});
