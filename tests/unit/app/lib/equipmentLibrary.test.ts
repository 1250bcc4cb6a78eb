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
    for (const c of builtInConductorTypes.filter((t) => t.kind === "overhead")) expect(c.source).toMatch(/ACSR tables/);
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

describe("more ACSR sizes (ACSR tables, 60 Hz, 1 m spacing, from memory)", () => {
  const byName = (name: string) => builtInConductorTypes.find((c) => c.label.includes(name))!;

  it("X = 2π·60·2·10⁻⁷·ln(1 m / GMR) Ω/km from each conductor's GMR (from memory)", () => {
    const x = (gmrMm: number) => 2 * Math.PI * 60 * 2e-7 * 1000 * Math.log(1000 / gmrMm);
    expect(byName("Hawk").xOhmPerKm).toBeCloseTo(x(8.81), 2);
    expect(byName("Drake").xOhmPerKm).toBeCloseTo(x(11.43), 2);
    expect(byName("Dove").xOhmPerKm).toBeCloseTo(x(9.54), 2);
  });

  it("resistance falls and ampacity rises with size, and each says it is from memory", () => {
    const overhead = builtInConductorTypes.filter((c) => c.kind === "overhead");
    for (let i = 1; i < overhead.length; i++) {
      expect(overhead[i].crossSectionMm2!).toBeGreaterThan(overhead[i - 1].crossSectionMm2!);
      expect(overhead[i].rOhmPerKm).toBeLessThan(overhead[i - 1].rOhmPerKm);
      expect(overhead[i].ampacityA).toBeGreaterThan(overhead[i - 1].ampacityA);
    }
    expect(byName("Hawk").source).toMatch(/from memory/);
  });
});

describe("XLPE cables, 11 to 132 kV, copper and aluminium (IEC 60228 class 2 R20, from memory; typical X, C, ampacity)", () => {
  const cables = builtInConductorTypes.filter((c) => c.kind === "cable");
  const cable = (id: string) => cables.find((c) => c.id === id)!;

  it("cover 11, 33, 66 and 132 kV in both metals, each with its source", () => {
    expect(new Set(cables.map((c) => c.nominalKV))).toEqual(new Set([11, 33, 66, 132]));
    expect(new Set(cables.map((c) => c.material))).toEqual(new Set(["copper", "aluminium"]));
    for (const c of cables) expect(c.source).toMatch(/IEC 60228.*from memory/);
  });

  it("IEC 60228 class 2: 240 mm² copper 0.0754 Ω/km, aluminium 0.125 Ω/km at 20 °C", () => {
    expect(cable("xlpe-66kv-cu-240").rOhmPerKm).toBe(0.0754);
    expect(cable("xlpe-66kv-al-240").rOhmPerKm).toBe(0.125);
  });

  it("susceptance is 2πfC: 0.25 µF/km at 50 Hz is 78.5 µS/km", () => {
    expect(cable("xlpe-33kv-cu-300").bMicroSiemensPerKm).toBeCloseTo(2 * Math.PI * 50 * 0.25, 1);
  });

  it("aluminium carries less than copper of the same size; higher voltages have less capacitance per size", () => {
    expect(cable("xlpe-11kv-al-300").ampacityA).toBeLessThan(cable("xlpe-11kv-cu-300").ampacityA);
    expect(cable("xlpe-33kv-cu-300").bMicroSiemensPerKm!).toBeLessThan(cable("xlpe-11kv-cu-300").bMicroSiemensPerKm!);
  });

  it("ids are unique across the whole library", () => {
    expect(new Set(builtInConductorTypes.map((c) => c.id)).size).toBe(builtInConductorTypes.length);
  });
});
