// The network page hands the team's own equipment types to the sheet's pickers: every type of
// the network's team in the built-in library's shape, and none of another team's.
import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { teamTypeId } from "#app/lib/libraryTypes.ts";
import { loader as networkLoader } from "#app/routes/networks/network.tsx";
import { listLibraryTypes, writeLibraryTypes } from "#db/libraryTypes.ts";
import { makeTeam, networkFromFixture, type TeamFixture } from "../teamFixtures.ts";
import { call, getRequest } from "../harness.ts";

let team: TeamFixture;
let networkId: number;
let transformerId: number;
let conductorId: number;

const openPage = (cookie: string) => call(networkLoader, getRequest(`/networks/${networkId}`, cookie), { networkId: String(networkId) });

beforeAll(async () => {
  const db = await getDb();
  team = await makeTeam("Sheet library");
  const other = await makeTeam("Other library");
  const written = await writeLibraryTypes(db, {
    teamId: team.teamId,
    userId: team.userIds.editor,
    types: [
      { kind: "transformer", name: "Moorgate 20", data: { ratedMVA: 20, hvKV: 66, lvKV: 11, impedancePct: 10, loadLossKW: 95, vectorGroup: "Dyn11" } },
      { kind: "conductor", name: "Fell 185 cable", data: { kind: "cable", frequencyHz: 50, rOhmPerKm: 0.164, xOhmPerKm: 0.11, bMicroSiemensPerKm: 75, ampacityA: 350 } },
    ],
  });
  expect(written).toEqual({ ok: true, created: 2, updated: 0 });
  const otherWritten = await writeLibraryTypes(db, {
    teamId: other.teamId,
    userId: other.userIds.editor,
    types: [{ kind: "transformer", name: "Not ours 40", data: { ratedMVA: 40, hvKV: 132, lvKV: 33, impedancePct: 12 } }],
  });
  expect(otherWritten.ok).toBe(true);
  const stored = await listLibraryTypes(db, team.teamId);
  transformerId = stored.find((t) => t.kind === "transformer")!.id;
  conductorId = stored.find((t) => t.kind === "conductor")!.id;
  networkId = await networkFromFixture(team);
});

describe("the network page's equipment library", () => {
  it("passes the team's transformer and conductor types in the pickers' shape, marked as the team's", async () => {
    const page = await openPage(team.cookies.editor);
    expect(page.status).toBe(200);
    expect(page.body.library.transformers).toEqual([
      {
        id: teamTypeId(transformerId),
        label: "Moorgate 20",
        ratedMVA: 20,
        hvKV: 66,
        lvKV: 11,
        impedancePct: 10,
        loadLossKW: 95,
        noLoadLossKW: undefined,
        xOverR: undefined,
        vectorGroup: "Dyn11",
        source: "Sheet library team library",
      },
    ]);
    expect(page.body.library.conductors).toEqual([
      {
        id: teamTypeId(conductorId),
        label: "Fell 185 cable",
        kind: "cable",
        frequencyHz: 50,
        rOhmPerKm: 0.164,
        xOhmPerKm: 0.11,
        bMicroSiemensPerKm: 75,
        ampacityA: 350,
        source: "Sheet library team library",
      },
    ]);
  });

  it("gives a viewer the same types (their Details are read only, the list is not secret within the team)", async () => {
    const page = await openPage(team.cookies.viewer);
    expect(page.body.library.transformers.map((t: { label: string }) => t.label)).toEqual(["Moorgate 20"]);
    expect(page.body.library.conductors.map((c: { label: string }) => c.label)).toEqual(["Fell 185 cable"]);
  });

  it("never shows another team's types, and is not found for someone outside the team", async () => {
    const page = await openPage(team.cookies.owner);
    const labels = [...page.body.library.transformers, ...page.body.library.conductors].map((t: { label: string }) => t.label);
    expect(labels).not.toContain("Not ours 40");
    expect((await openPage(team.cookies.outsider)).status).toBe(404);
  });
});
