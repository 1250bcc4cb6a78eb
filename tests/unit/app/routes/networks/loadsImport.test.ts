import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { action as importLoads, loader as importPage, SHOWN_CHANGES } from "#app/routes/networks/loads-import.tsx";
import { findNetwork, readRevision } from "#db/networks.ts";
import { call, getRequest } from "../harness.ts";
import { makeTeam, networkFromFixture, rowCounts, uploadRequest, type TeamFixture } from "../teamFixtures.ts";

let team: TeamFixture;

beforeAll(async () => {
  team = await makeTeam("Loads");
});

const goodCsv = "bus,name,P (kW),power factor\nb-town,Calder Flats school,400,0.95\nCalder Flats town 11 kV,Calder Flats town,7500,0.9 lagging\n";

function send(networkId: number, intent: string, csv: string, revision: number, cookie = team.cookies.editor) {
  return call(
    importLoads,
    uploadRequest(`/networks/${networkId}/loads-import`, { intent, revision: String(revision) }, { name: "loads.csv", text: csv, type: "text/csv" }, { cookie }),
    { networkId: String(networkId) },
  );
}

async function currentRevision(networkId: number) {
  return (await findNetwork(await getDb(), networkId))!.current_revision;
}

describe("loads CSV import into a network", () => {
  it("previews the change without saving, then applies it as one new revision", async () => {
    const networkId = await networkFromFixture(team);
    const page = await call(importPage, getRequest(`/networks/${networkId}/loads-import`, team.cookies.editor), { networkId: String(networkId) });
    expect(page.body).toMatchObject({ revision: 1, loadCount: 2 });

    const preview = await send(networkId, "preview", goodCsv, 1);
    expect(preview.status).toBe(200);
    expect(preview.body.changes.map((c: { action: string; load: { name: string } }) => [c.action, c.load.name])).toEqual([
      ["new", "Calder Flats school"],
      ["update", "Calder Flats town"],
    ]);
    expect(await currentRevision(networkId)).toBe(1);

    const applied = await send(networkId, "apply", goodCsv, 1);
    expect(applied.status).toBe(200);
    expect(applied.body).toMatchObject({ stage: "applied", revision: 2 });
    const stored = (await readRevision(await getDb(), networkId, 2))!;
    const loads = (stored.document as { loads: { name: string; pMW: number; qMvar: number }[] }).loads;
    expect(loads).toHaveLength(3);
    // P = 7.5 MW at power factor 0.9: Q = P·tan(arccos 0.9) = 7.5 × 0.484322 = 3.6324 Mvar.
    expect(loads.find((l) => l.name === "Calder Flats town")).toMatchObject({ pMW: 7.5, qMvar: expect.closeTo(3.63242, 4) });
    expect(stored.message).toBe("Loads from loads.csv: 1 added, 1 updated");
  });

  it("saves nothing when any row is wrong", async () => {
    const networkId = await networkFromFixture(team);
    const before = await rowCounts();
    const outcome = await send(networkId, "apply", `${goodCsv}b-nowhere,Ghost,1,0.9\n`, 1);
    expect(outcome.status).toBe(400);
    expect(outcome.body.rowErrors).toEqual([{ row: 4, column: "bus", message: 'no bus has the id or name "b-nowhere"' }]);
    expect(await rowCounts()).toEqual(before);
  });

  it("refuses to apply over a revision saved since the preview (409), saving nothing", async () => {
    const networkId = await networkFromFixture(team);
    expect((await send(networkId, "apply", goodCsv, 1)).status).toBe(200);
    const before = await rowCounts();
    const stale = await send(networkId, "apply", goodCsv, 1);
    expect(stale.status).toBe(409);
    expect(stale.body.fileError).toMatch(/changed since the preview \(it is now at revision 2\)/);
    expect(await rowCounts()).toEqual(before);
  });

  it("takes 20,000 rows: the answer lists the first changes and counts them all, so the page stays small enough to render", async () => {
    const networkId = await networkFromFixture(team);
    const rows = ["bus,name,P (kW),power factor"];
    for (let i = 0; i < 20_000; i++) rows.push(`b-town,Feeder load ${i},${100 + (i % 50)},0.95`);
    const csv = rows.join("\n");

    const preview = await send(networkId, "preview", csv, 1);
    expect(preview.status).toBe(200);
    expect(preview.body).toMatchObject({ added: 20_000, updated: 0 });
    expect(preview.body.changes).toHaveLength(SHOWN_CHANGES);
    // Before the cap the preview carried every change (4.3 MB) and its page outlasted the render budget.
    expect(JSON.stringify(preview.body).length).toBeLessThan(200_000);

    const applied = await send(networkId, "apply", csv, 1);
    expect(applied.status).toBe(200);
    expect(applied.body).toMatchObject({ stage: "applied", revision: 2, added: 20_000, changes: [] });
    const stored = (await readRevision(await getDb(), networkId, 2))!;
    expect((stored.document as { loads: unknown[] }).loads).toHaveLength(20_002);
  }, 60_000);

  it("is refused to a viewer (403)", async () => {
    const networkId = await networkFromFixture(team);
    expect((await send(networkId, "apply", goodCsv, 1, team.cookies.viewer)).status).toBe(403);
    expect(await currentRevision(networkId)).toBe(1);
  });
});
