import { describe, expect, it } from "vitest";
import { builtInConductorTypes, builtInTransformerTypes } from "#app/lib/equipmentLibrary.ts";
import { transformerSchema, type Line, type Transformer } from "#solver/schema.ts";
import { applyConductorType, applyTransformerType } from "#app/components/sheet/equipmentApply.ts";

const withLosses: Transformer = {
  id: "t", name: "T", hvBus: "a", lvBus: "b", ratedMVA: 25, hvKV: 66, lvKV: 11, impedancePct: 8.5,
  loadLossKW: 118, noLoadLossKW: 17, tapPct: 0, vectorGroup: "YNd11",
};

describe("applying a transformer type", () => {
  it("sets rating and u_k, drops the old unit's losses and keeps the X/R they implied", () => {
    const type = builtInTransformerTypes.find((t) => t.ratedMVA === 40)!;
    const next = applyTransformerType(withLosses, type);
    expect(next).toMatchObject({ ratedMVA: 40, impedancePct: 10 });
    expect(next.loadLossKW).toBeUndefined();
    expect(next.noLoadLossKW).toBeUndefined();
    // r = 118/25000 = 0.00472, x = √(0.085² − r²) = 0.084869: X/R = 17.98 → 18.0 (3 significant digits)
    expect(next.xOverR).toBe(18);
    expect(transformerSchema.safeParse(next).success).toBe(true);
  });

  it("keeps an X/R the element already has, and takes a team type's own losses", () => {
    const plain: Transformer = { ...withLosses, loadLossKW: undefined, noLoadLossKW: undefined, xOverR: 12 };
    expect(applyTransformerType(plain, builtInTransformerTypes[0]).xOverR).toBe(12);
    const team = { id: "team-1", label: "Our 20 MVA", ratedMVA: 20, impedancePct: 9, loadLossKW: 98, noLoadLossKW: 15, source: "Team library" };
    expect(applyTransformerType(withLosses, team)).toMatchObject({ ratedMVA: 20, impedancePct: 9, loadLossKW: 98, noLoadLossKW: 15 });
  });
});

describe("applying a conductor", () => {
  const line: Line = { id: "l", name: "L", fromBus: "a", toBus: "b", kind: "overhead", lengthKm: 10, rOhmPerKm: 0.2, xOhmPerKm: 0.4 };
  const falcon = builtInConductorTypes.find((c) => c.label.includes("Falcon"))!;

  it("uses the 60 Hz values on a 60 Hz network (CRC handbook ACSR tables)", () => {
    expect(applyConductorType(line, falcon, 60)).toEqual({
      line: { ...line, rOhmPerKm: 0.0408, xOhmPerKm: 0.312, ampacityA: 1380 },
      note: undefined,
    });
  });

  it("scales X by 5/6 on a 50 Hz network and says so", () => {
    const applied = applyConductorType(line, falcon, 50);
    expect(applied.line.xOhmPerKm).toBeCloseTo(0.26, 9);
    expect(applied.note).toMatch(/scaled 50\/60/);
  });
});
