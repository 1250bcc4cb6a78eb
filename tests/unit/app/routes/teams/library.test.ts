import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { teamEquipmentTypes } from "#app/lib/library.server.ts";
import { action as libraryAction, loader as libraryPage } from "#app/routes/teams/library.tsx";
import { writeLibraryTypes } from "#db/libraryTypes.ts";
import { call, formRequest, getRequest } from "../harness.ts";
import { makeTeam, rowCounts, uploadRequest, type TeamFixture } from "../teamFixtures.ts";

let team: TeamFixture;

beforeAll(async () => {
  team = await makeTeam("Library");
});

const post = (fields: Record<string, string>, cookie = team.cookies.editor) =>
  call(libraryAction, formRequest(`/teams/${team.teamId}/library`, fields, { cookie }), { teamId: String(team.teamId) });

const importCsv = (intent: string, csv: string, cookie = team.cookies.editor) =>
  call(
    libraryAction,
    uploadRequest(`/teams/${team.teamId}/library`, { intent, kind: "", frequencyHz: "50" }, { name: "types.csv", text: csv }, { cookie }),
    { teamId: String(team.teamId) },
  );

const transformer = {
  intent: "save-type",
  typeKind: "transformer",
  name: "Fellside 25",
  ratedMVA: "25 MVA",
  hvKV: "66",
  lvKV: "11 kV",
  impedancePct: "10 %",
  loadLossKW: "0.12 MW",
  noLoadLossKW: "",
  xOverR: "",
  vectorGroup: "YNd11",
};

async function list() {
  return (await call(libraryPage, getRequest(`/teams/${team.teamId}/library`, team.cookies.viewer), { teamId: String(team.teamId) })).body;
}

describe("team equipment library", () => {
  it("an editor adds a type typed with units, and everyone in the team reads it", async () => {
    const saved = await post(transformer);
    expect(saved.body).toMatchObject({ ok: true, message: 'Saved "Fellside 25".' });
    const page = await list();
    expect(page.canEdit).toBe(false);
    expect(page.types).toEqual([
      expect.objectContaining({ kind: "transformer", name: "Fellside 25", data: { ratedMVA: 25, hvKV: 66, lvKV: 11, impedancePct: 10, loadLossKW: 120, vectorGroup: "YNd11" } }),
    ]);
  });

  it("an editor adds a conductor type, whose own construction field is also called kind", async () => {
    const saved = await post({
      intent: "save-type",
      typeKind: "conductor",
      name: "Fell 100",
      kind: "overhead",
      frequencyHz: "50",
      rOhmPerKm: "0.3",
      xOhmPerKm: "0.35",
      bMicroSiemensPerKm: "",
      ampacityA: "300",
    });
    expect(saved.body).toMatchObject({ ok: true, message: 'Saved "Fell 100".' });
    expect((await list()).types).toContainEqual(expect.objectContaining({ kind: "conductor", name: "Fell 100", data: expect.objectContaining({ kind: "overhead", ampacityA: 300 }) }));
  });

  it("says which field is wrong", async () => {
    const outcome = await post({ ...transformer, name: "Odd", ratedMVA: "25 kV", vectorGroup: "Dyn2" });
    expect(outcome.status).toBe(400);
    expect(outcome.body.fieldErrors.ratedMVA).toMatch(/not an apparent power/);
  });

  it("refuses a viewer (403) and an outsider (404)", async () => {
    const before = await rowCounts();
    expect((await post({ ...transformer, name: "By viewer" }, team.cookies.viewer)).status).toBe(403);
    expect((await post({ ...transformer, name: "By outsider" }, team.cookies.outsider)).status).toBe(404);
    expect(await rowCounts()).toEqual(before);
  });

  it("edits and deletes a type", async () => {
    await post({ ...transformer, name: "Edit me" });
    const id = (await list()).types.find((t: { name: string }) => t.name === "Edit me").id;
    expect((await post({ ...transformer, name: "Edited", typeId: String(id), impedancePct: "11" })).body.ok).toBe(true);
    expect((await list()).types.find((t: { id: number }) => t.id === id)).toMatchObject({ name: "Edited", data: { impedancePct: 11 } });
    expect((await post({ intent: "delete-type", typeId: String(id), typeName: "Edited" })).body.ok).toBe(true);
    expect((await list()).types.some((t: { id: number }) => t.id === id)).toBe(false);
  });

  // Issue #13, finding 10: library types were last-write-wins.
  it("refuses (409) an edit made from an older copy of the type, and keeps the newer one", async () => {
    await post({ ...transformer, name: "Shared type" });
    const opened = (await list()).types.find((t: { name: string }) => t.name === "Shared type");
    const edit = (name: string, impedancePct: string) => post({ ...transformer, name, typeId: String(opened.id), basedOn: opened.updatedAt, impedancePct });
    expect((await edit("Shared type", "9")).body.ok).toBe(true);
    const late = await edit("Shared type", "13");
    expect(late.status).toBe(409);
    expect(late.body.message).toMatch(/nothing was overwritten/);
    expect((await list()).types.find((t: { id: number }) => t.id === opened.id)).toMatchObject({ data: { impedancePct: 9 } });
  });

  it("imports a conductor CSV: preview saves nothing, apply saves every row, a re-import updates by name", async () => {
    const csv = "name,kind,rOhmPerKm,xOhmPerKm,ampacityA\nFell 300,overhead,0.0958,0.38,620\nCable 240,cable,0.125,0.11,430\n";
    const before = await rowCounts();
    const preview = await importCsv("import-preview", csv);
    expect(preview.body).toMatchObject({ ok: true, stage: "preview" });
    expect(await rowCounts()).toEqual(before);
    const applied = await importCsv("import-apply", csv);
    expect(applied.body).toMatchObject({ ok: true, stage: "applied", message: "Saved: 2 new, 0 updated." });
    const again = await importCsv("import-apply", csv.replace("620", "640"));
    expect(again.body.message).toBe("Saved: 0 new, 2 updated.");
    const types = await teamEquipmentTypes(await getDb(), { id: team.teamId, name: "Library team" });
    expect(types.conductors.find((c) => c.label === "Fell 300")).toMatchObject({ ampacityA: 640, frequencyHz: 50, kind: "overhead", source: "Library team library" });
    expect(types.transformers.map((t) => t.label)).toContain("Fellside 25");
  });

  it("saves nothing of an import with a bad row", async () => {
    const before = await rowCounts();
    const outcome = await importCsv("import-apply", "name,kind,rOhmPerKm,xOhmPerKm,ampacityA\nGood,overhead,0.1,0.3,500\nBad,underwater,0.1,0.3,500\n");
    expect(outcome.status).toBe(400);
    expect(outcome.body.rowErrors).toEqual([{ row: 3, column: "kind", message: '"underwater" is not overhead or cable' }]);
    expect(await rowCounts()).toEqual(before);
  });

  it("writes all types in one transaction: one failing write undoes the others", async () => {
    const before = await rowCounts();
    const result = await writeLibraryTypes(await getDb(), {
      teamId: team.teamId,
      userId: team.userIds.editor,
      types: [
        { kind: "conductor", name: "Written first", data: { kind: "cable", frequencyHz: 50, rOhmPerKm: 0.1, xOhmPerKm: 0.1, ampacityA: 300 } },
        { kind: "conductor", name: "Gone meanwhile", data: { kind: "cable", frequencyHz: 50, rOhmPerKm: 0.1, xOhmPerKm: 0.1, ampacityA: 300 }, id: 999_999 },
      ],
    });
    expect(result).toEqual({ ok: false, reason: "stale", error: 'The type "Gone meanwhile" was deleted meanwhile; nothing was saved. Read the file again.' });
    expect(await rowCounts()).toEqual(before);
  });
});
