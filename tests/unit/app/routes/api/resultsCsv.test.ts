// GET /api/networks/:id/results.csv: RFC 4180 CSV of the saved revision, read back with papaparse
// (an independent CSV parser) and compared with the solver's own results.
import Papa from "papaparse";
import { beforeAll, describe, expect, it } from "vitest";
import tarnHead from "../../../../fixtures/tarn-head-calder-flats.json";
import { getDb } from "#app/lib/db.server.ts";
import { action as createNetworkApi } from "#app/routes/api/networks.ts";
import { loader as resultsCsv } from "#app/routes/api/results-csv.ts";
import { insertMembership, insertTeamWithOwner } from "#db/teams.ts";
import { solveNetwork } from "#solver/index.ts";
import { call, cookieFor, getRequest, jsonRequest, makeUser } from "../harness.ts";

const cookies = {} as Record<"viewer" | "outsider", string>;
let networkId: number;

beforeAll(async () => {
  const db = await getDb();
  const owner = await makeUser("Csv Owner", { ownTeam: true });
  const viewer = await makeUser("Csv Viewer");
  const outsider = await makeUser("Csv Outsider", { ownTeam: true });
  const teamId = (await db.transaction().execute((trx) => insertTeamWithOwner(trx, "CSV team", owner.id))).id;
  await insertMembership(db, teamId, viewer.id, "viewer");
  cookies.viewer = await cookieFor(viewer);
  cookies.outsider = await cookieFor(outsider);
  const created = await call(createNetworkApi, jsonRequest("POST", `/api/networks?team=${teamId}`, { cookie: await cookieFor(owner), body: tarnHead }));
  networkId = created.body.id;
});

const download = (table: string, cookie?: string) =>
  call(resultsCsv, getRequest(`/api/networks/${networkId}/results.csv?table=${table}`, cookie), { networkId: String(networkId) });

describe("GET /api/networks/:id/results.csv", () => {
  const solved = solveNetwork(tarnHead);
  if (!solved.ok) throw new Error("the demo must solve");

  it("gives a viewer the bus results as a CSV download whose numbers are the solver's", async () => {
    const answer = await download("buses", cookies.viewer);
    expect(answer.status).toBe(200);
    expect(answer.headers.get("Content-Type")).toMatch(/^text\/csv/);
    expect(answer.headers.get("Content-Disposition")).toMatch(/attachment; filename=".*-r1-buses\.csv"/);
    const parsed = Papa.parse<Record<string, string>>(answer.body, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.meta.fields!.some((f) => /kV/.test(f))).toBe(true);
    expect(parsed.data).toHaveLength(solved.result.loadFlow.buses.length);
    const puColumn = parsed.meta.fields!.find((f) => /pu/.test(f) && /^v/i.test(f))!;
    parsed.data.forEach((row, i) => {
      expect(Number(row[puColumn])).toBeCloseTo(solved.result.loadFlow.buses[i].vPu, 4);
    });
  });

  it("gives the branch results with one row per line and transformer", async () => {
    const answer = await download("branches", cookies.viewer);
    const parsed = Papa.parse<Record<string, string>>(answer.body, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data).toHaveLength(tarnHead.lines.length + tarnHead.transformers.length);
  });

  it("names the table when it is missing or unknown", async () => {
    const answer = await download("loads", cookies.viewer);
    expect(answer.status).toBe(400);
    expect(answer.body).toMatch(/table=buses, \?table=branches or \?table=sources/);
  });

  it("refuses someone outside the team and someone not signed in", async () => {
    expect((await download("buses", cookies.outsider)).status).toBe(404);
    expect((await download("buses")).status).toBe(401);
  });
});
