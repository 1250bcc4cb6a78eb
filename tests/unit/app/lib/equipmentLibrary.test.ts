import { describe, expect, it } from "vitest";
import {
  builtInConductorTypes,
  builtInTransformerTypes,
  conductorAtFrequency,
  IEC_60076_5_SOURCE,
  minimumImpedancePct,
} from "#app/lib/equipmentLibrary.ts";

describe("transformer types: IEC 60076-5 minimum short-circuit impedance by rated power (from memory; verify)", () => {
  it("follows the bands at their edges", () => {
    expect(minimumImpedancePct(0.63)).toBe(4.0);
    expect(minimumImpedancePct(0.631)).toBe(5.0);
    expect(minimumImpedancePct(1.25)).toBe(5.0);
    expect(minimumImpedancePct(1.251)).toBe(6.0);
    expect(minimumImpedancePct(2.5)).toBe(6.0);
    expect(minimumImpedancePct(6.3)).toBe(7.0);
    expect(minimumImpedancePct(6.301)).toBe(8.0);
    expect(minimumImpedancePct(25)).toBe(8.0);
    expect(minimumImpedancePct(40)).toBe(10.0);
    expect(minimumImpedancePct(63)).toBe(11.0);
    expect(minimumImpedancePct(100)).toBe(12.5);
  });

  it("leaves ratings above 100 MVA to agreement", () => {
    expect(minimumImpedancePct(100.001)).toBeUndefined();
  });

  it("gives every built-in type its band's impedance and marks its source", () => {
    const byRating = new Map(builtInTransformerTypes.map((t) => [t.ratedMVA, t]));
    expect(byRating.get(0.315)?.impedancePct).toBe(4.0);
    expect(byRating.get(1)?.impedancePct).toBe(5.0);
    expect(byRating.get(2.5)?.impedancePct).toBe(6.0);
    expect(byRating.get(5)?.impedancePct).toBe(7.0);
    expect(byRating.get(10)?.impedancePct).toBe(8.0);
    expect(byRating.get(31.5)?.impedancePct).toBe(10.0);
    expect(byRating.get(50)?.impedancePct).toBe(11.0);
    expect(byRating.get(80)?.impedancePct).toBe(12.5);
    for (const t of builtInTransformerTypes) expect(t.source).toBe(IEC_60076_5_SOURCE);
    expect(new Set(builtInTransformerTypes.map((t) => t.id)).size).toBe(builtInTransformerTypes.length);
  });
});

describe("ACSR conductors (CRC Electric Power Engineering Handbook, ACSR tables, 60 Hz, 1 m spacing)", () => {
  const byName = (name: string) => builtInConductorTypes.find((c) => c.label.includes(name))!;

  it("carry the handbook's 60 Hz values", () => {
    expect(byName("Dove")).toMatchObject({ frequencyHz: 60, rOhmPerKm: 0.1156, xOhmPerKm: 0.351, ampacityA: 730 });
    expect(byName("Grosbeak")).toMatchObject({ frequencyHz: 60, rOhmPerKm: 0.1012, xOhmPerKm: 0.346, ampacityA: 780 });
    expect(byName("Falcon")).toMatchObject({ frequencyHz: 60, rOhmPerKm: 0.0408, xOhmPerKm: 0.312, ampacityA: 1380 });
    for (const c of builtInConductorTypes) expect(c.source).toMatch(/CRC Electric Power Engineering Handbook/);
  });

  it("scale reactance by 5/6 for 50 Hz (X = 2πfL) and keep resistance and ampacity", () => {
    const dove = conductorAtFrequency(byName("Dove"), 50);
    expect(dove.xOhmPerKm).toBeCloseTo((0.351 * 5) / 6, 6);
    expect(dove.xOhmPerKm).toBeCloseTo(0.2925, 6);
    expect(dove.rOhmPerKm).toBe(0.1156);
    expect(dove.ampacityA).toBe(730);
    expect(dove.note).toMatch(/50\/60/);
    expect(conductorAtFrequency(byName("Falcon"), 50).xOhmPerKm).toBeCloseTo(0.26, 6);
  });

  it("leave values untouched at their own frequency", () => {
    const falcon = conductorAtFrequency(byName("Falcon"), 60);
    expect(falcon).toEqual({ rOhmPerKm: 0.0408, xOhmPerKm: 0.312, ampacityA: 1380, bMicroSiemensPerKm: undefined });
  });
});
