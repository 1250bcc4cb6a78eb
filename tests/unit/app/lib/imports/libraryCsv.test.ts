import { describe, expect, it } from "vitest";
import { detectLibraryKind, previewLibraryCsv } from "#app/lib/imports/libraryCsv.ts";
import { conductorAtFrequency } from "#app/lib/equipmentLibrary.ts";
import {
  libraryTypeSchema,
  toConductorType,
  toTransformerType,
  transformerTypeDataSchema,
  vectorGroupProblem,
} from "#app/lib/libraryTypes.ts";

const transformerHeader = "name,ratedMVA,hvKV,lvKV,impedancePct,loadLossKW,noLoadLossKW,vectorGroup";
const conductorHeader = "name,kind,rOhmPerKm,xOhmPerKm,bMicroSiemensPerKm,ampacityA";

function preview(csv: string, existing: { id: number; kind: "transformer" | "conductor"; name: string }[] = []) {
  return previewLibraryCsv(csv, { frequencyHz: 50, existing });
}

describe("library CSV: transformers", () => {
  it("reads a maker's list into new types, the kind read from the header", () => {
    const result = preview(
      [transformerHeader, "Fellside 25 MVA,25,66,11,10,120,18,YNd11", "Fellside 2.5 MVA,2.5,11,0.433,6,24.5,3.2,Dyn11"].join("\n"),
    );
    expect(result.ok).toBe(true);
    expect(result.kind).toBe("transformer");
    expect(result.changes).toEqual([
      {
        row: 2,
        action: "new",
        kind: "transformer",
        name: "Fellside 25 MVA",
        id: undefined,
        data: { ratedMVA: 25, hvKV: 66, lvKV: 11, impedancePct: 10, loadLossKW: 120, noLoadLossKW: 18, vectorGroup: "YNd11" },
      },
      expect.objectContaining({ row: 3, name: "Fellside 2.5 MVA", data: expect.objectContaining({ lvKV: 0.433 }) }),
    ]);
  });

  it("updates a type of the same name (any case), and leaves optional columns out", () => {
    const result = preview("name,ratedMVA,hvKV,lvKV,impedancePct\nfellside 25 mva,25,66,11,10.5", [
      { id: 7, kind: "transformer", name: "Fellside 25 MVA" },
      { id: 8, kind: "conductor", name: "fellside 25 mva" },
    ]);
    expect(result.changes[0]).toMatchObject({ action: "update", id: 7, data: { impedancePct: 10.5 } });
    expect(result.changes[0].data).not.toHaveProperty("loadLossKW");
  });

  it("takes units from bracketed headers and from cells (1 MVA = 1000 kVA, 1 kV = 1000 V)", () => {
    const result = preview(
      ["name;rated (kVA);HV (kV);LV (V);uk (%);load loss (W)", "Pole 500;500;11;433;4;5500", "Pole 1M;1 MVA;11 kV;0,433 kV;5 %;10,5 kW"].join("\n"),
    );
    expect(result.ok).toBe(true);
    expect(result.changes.map((c) => c.data)).toEqual([
      { ratedMVA: 0.5, hvKV: 11, lvKV: 0.433, impedancePct: 4, loadLossKW: 5.5 },
      { ratedMVA: 1, hvKV: 11, lvKV: 0.433, impedancePct: 5, loadLossKW: 10.5 },
    ]);
  });

  it("names each bad row: a missing rating, an impossible vector group, LV above HV, losses above the impedance", () => {
    const result = preview(
      [
        transformerHeader,
        "No rating,,66,11,10,,,",
        "Odd clock,25,66,11,10,,,Dyn2",
        "Upside down,25,11,66,10,,,",
        "Lossy,1,11,0.433,4,50,,",
        ",25,66,11,10,,,",
        "Text,25,sixty-six,11,10,,,",
      ].join("\n"),
    );
    expect(result.ok).toBe(false);
    expect(result.changes).toEqual([]);
    expect(result.rowErrors).toEqual([
      { row: 2, column: "ratedMVA", message: "is required" },
      { row: 3, column: "vectorGroup", message: "Dyn2 is not a possible vector group (clock number 2 does not fit these windings)" },
      { row: 4, column: "lvKV", message: "LV 66 kV must be below HV 11 kV" },
      // 50 kW on 1 MVA is R = 5 % > u_k = 4 %.
      { row: 5, column: "loadLossKW", message: "50 kW at 1 MVA gives a resistance above the impedance 4 %" },
      { row: 6, column: "name", message: "a type needs a name" },
      { row: 7, column: "hvKV", message: expect.stringMatching(/sixty-six/) },
    ]);
  });

  it("refuses two rows of one name", () => {
    const result = preview([transformerHeader, "T,25,66,11,10,,,", "t,25,66,11,10,,,"].join("\n"));
    expect(result.rowErrors).toEqual([{ row: 3, column: "name", message: 'row 2 already gives a type named "t"' }]);
  });
});

describe("library CSV: conductors", () => {
  it("reads overhead and cable types at the import's frequency", () => {
    const result = preview(
      [conductorHeader, "Fell 300,overhead,0.0958,0.38,3.0,620", '"Cable 3x240, Al",cable,0.125,0.11,,430'].join("\n"),
    );
    expect(result.ok).toBe(true);
    expect(result.kind).toBe("conductor");
    expect(result.changes.map((c) => c.data)).toEqual([
      { kind: "overhead", frequencyHz: 50, rOhmPerKm: 0.0958, xOhmPerKm: 0.38, bMicroSiemensPerKm: 3, ampacityA: 620 },
      { kind: "cable", frequencyHz: 50, rOhmPerKm: 0.125, xOhmPerKm: 0.11, ampacityA: 430 },
    ]);
    expect(result.changes[1].name).toBe("Cable 3x240, Al");
  });

  it("takes a frequency column over the import's frequency, and ohm/mile in a header (1 mile = 1.609344 km)", () => {
    const result = preview("name,kind,R (ohm/mi),X (ohm/mi),ampacity (kA),frequencyHz\nW,overhead,1.609344,3.218688,0.5,60");
    expect(result.changes[0].data).toEqual({ kind: "overhead", frequencyHz: 60, rOhmPerKm: 1, xOhmPerKm: 2, ampacityA: 500 });
  });

  it("names each bad row: an unknown kind, zero impedance, a negative resistance, no ampacity", () => {
    const result = preview(
      [conductorHeader, "A,underwater,0.1,0.3,,400", "B,cable,0,0,,400", "C,cable,-0.1,0.1,,400", "D,overhead,0.1,0.3,,"].join("\n"),
    );
    expect(result.rowErrors).toEqual([
      { row: 2, column: "kind", message: '"underwater" is not overhead or cable' },
      { row: 3, column: "xOhmPerKm", message: "R and X are both 0; a conductor needs an impedance" },
      { row: 4, column: "rOhmPerKm", message: "must not be negative" },
      { row: 5, column: "ampacityA", message: "is required" },
    ]);
  });
});

describe("library CSV: files it refuses as a whole", () => {
  it("a header that is neither transformers nor conductors", () => {
    expect(preview("name,colour\nA,red").fileError).toMatch(/Cannot tell whether the file holds transformers/);
  });

  it("a header that misses a required column for the chosen kind", () => {
    const result = previewLibraryCsv("name,ratedMVA\nA,25", { kind: "transformer", frequencyHz: 50, existing: [] });
    expect(result.fileError).toMatch(/no "hvKV", "lvKV", "impedancePct" columns/);
  });

  it("detects the kind from either header", () => {
    expect(detectLibraryKind(transformerHeader.split(","))).toBe("transformer");
    expect(detectLibraryKind(conductorHeader.split(","))).toBe("conductor");
    expect(detectLibraryKind(["name", "ratedMVA", "rOhmPerKm"])).toBeNull();
  });
});

describe("library types and the built-in library's shapes", () => {
  it("a team transformer type reads like a built-in one, with its windings besides", () => {
    const data = transformerTypeDataSchema.parse({ ratedMVA: 25, hvKV: 66, lvKV: 11, impedancePct: 10, vectorGroup: "YNd11" });
    expect(toTransformerType(3, "Fellside 25", data, "Calder team")).toEqual({
      id: "team-3",
      label: "Fellside 25",
      ratedMVA: 25,
      impedancePct: 10,
      loadLossKW: undefined,
      noLoadLossKW: undefined,
      xOverR: undefined,
      hvKV: 66,
      lvKV: 11,
      vectorGroup: "YNd11",
      source: "Calder team library",
    });
  });

  it("a team conductor type works with the built-in frequency conversion (X = 2πfL)", () => {
    const type = toConductorType(4, "Fell 300", { kind: "overhead", frequencyHz: 50, rOhmPerKm: 0.1, xOhmPerKm: 0.35, ampacityA: 600 }, "Calder team");
    expect(conductorAtFrequency(type, 60).xOhmPerKm).toBeCloseTo(0.42, 12);
  });

  it("the vector-group rule: star against delta is odd, like windings are even (IEC 60076-1)", () => {
    for (const ok of ["YNd11", "Dyn11", "Dyn1", "YNyn0", "Dd0", "Yy6", "Dzn0"]) expect(vectorGroupProblem(ok)).toBeNull();
    for (const bad of ["YNd0", "Dyn12", "Yy1", "Xy0"]) expect(vectorGroupProblem(bad)).not.toBeNull();
  });

  it("a saved type's schema refuses unknown fields", () => {
    const parsed = libraryTypeSchema.safeParse({ kind: "conductor", name: "A", data: { kind: "cable", frequencyHz: 50, rOhmPerKm: 0.1, xOhmPerKm: 0.1, ampacityA: 100, colour: "red" } });
    expect(parsed.success).toBe(false);
  });
});

describe("library: cables and overhead conductors with their material, size and source", () => {
  it("reads a cable and an overhead conductor from one file, each with where its values come from", () => {
    const result = preview(
      [
        "name,kind,rOhmPerKm,xOhmPerKm,bMicroSiemensPerKm,ampacityA,material,crossSectionMm2,nominalKV,source",
        "Dale 33 kV 300 Al,cable,0.1,0.115,78.5,440,aluminum,300 mm²,33 kV,maker's datasheet 2026",
        "Dale ACSR 150,overhead,0.19,0.35,,470,acsr,150,,from memory",
      ].join("\n"),
    );
    expect(result.ok).toBe(true);
    expect(result.changes.map((c) => c.data)).toEqual([
      { kind: "cable", frequencyHz: 50, rOhmPerKm: 0.1, xOhmPerKm: 0.115, bMicroSiemensPerKm: 78.5, ampacityA: 440, material: "aluminium", crossSectionMm2: 300, nominalKV: 33, source: "maker's datasheet 2026" },
      { kind: "overhead", frequencyHz: 50, rOhmPerKm: 0.19, xOhmPerKm: 0.35, ampacityA: 470, material: "acsr", crossSectionMm2: 150, source: "from memory" },
    ]);
    const cable = toConductorType(7, "Dale 33 kV 300 Al", result.changes[0].data as never, "Dale team");
    expect(cable).toMatchObject({ kind: "cable", nominalKV: 33, material: "aluminium", crossSectionMm2: 300, source: "Dale team library: maker's datasheet 2026" });
  });

  it("names a material it does not know", () => {
    const result = preview([conductorHeader + ",material", "X,cable,0.1,0.1,,400,brass"].join("\n"));
    expect(result.ok).toBe(false);
    expect(JSON.stringify(result)).toContain('\\"brass\\" is not copper, aluminium or acsr');
  });
});
