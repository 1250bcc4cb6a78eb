// Per-unit conversions, worked by hand from the methods' formulas on the demo networks' data.
import { describe, expect, it } from "vitest";
import {
  currentBaseA,
  impedanceBaseOhm,
  lineSeriesImpedancePu,
  lineShuntSusceptancePu,
  loadVoltageExponent,
  shuntSusceptancePu,
  transformerCoreConductancePu,
  transformerOwnImpedancePu,
  transformerRatioPu,
  transformerSeriesImpedancePu,
} from "#solver/perUnit.ts";
import type { Bus, Line, Transformer } from "#solver/schema.ts";

const bus = (id: string, nominalKV: number): Bus => ({ id, name: id, nominalKV, vMinPu: 0.95, vMaxPu: 1.05 });
const bus66 = bus("b66", 66);
const bus11 = bus("b11", 11);

const transformer = (t: Partial<Transformer>): Transformer => ({
  id: "t",
  name: "t",
  hvBus: "b66",
  lvBus: "b11",
  ratedMVA: 25,
  hvKV: 66,
  lvKV: 11,
  impedancePct: 8.5,
  loadLossKW: 118,
  noLoadLossKW: 17,
  tapPct: 0,
  vectorGroup: "YNd11",
  ...t,
});

describe("bases", () => {
  it("Z_base = kV²/MVA: 11 kV on 100 MVA is 1.21 Ω, 66 kV is 43.56 Ω", () => {
    expect(impedanceBaseOhm(11, 100)).toBeCloseTo(1.21, 12);
    expect(impedanceBaseOhm(66, 100)).toBeCloseTo(43.56, 12);
  });
  it("I_base = MVA/(√3·kV): 11 kV on 100 MVA is 5248.6 A", () => {
    expect(currentBaseA(11, 100)).toBeCloseTo(5248.639, 3);
  });
});

describe("line pi model", () => {
  const fell: Line = { id: "l", name: "l", fromBus: "b66", toBus: "b66", kind: "overhead", lengthKm: 48, rOhmPerKm: 0.158, xOhmPerKm: 0.382, bMicroSiemensPerKm: 2.95 };
  it("48 km of 0.158 + j0.382 Ω/km at 66 kV: 7.584 + j18.336 Ω over 43.56 Ω", () => {
    const z = lineSeriesImpedancePu(fell, bus66, 100);
    expect(z.r).toBeCloseTo(7.584 / 43.56, 12);
    expect(z.x).toBeCloseTo(18.336 / 43.56, 12);
  });
  it("total charging 2.95 µS/km × 48 km = 141.6 µS, times 43.56 Ω = 0.006168 pu", () => {
    expect(lineShuntSusceptancePu(fell, bus66, 100)).toBeCloseTo(0.006168, 6);
    expect(lineShuntSusceptancePu({ ...fell, bMicroSiemensPerKm: undefined }, bus66, 100)).toBe(0);
  });
});

describe("two-winding transformer", () => {
  it("r from copper loss: 118 kW on 25 MVA is 0.00472 pu; x = √(0.085² − 0.00472²)", () => {
    const own = transformerOwnImpedancePu(transformer({}));
    expect(own.r).toBeCloseTo(0.00472, 12);
    expect(own.x).toBeCloseTo(Math.sqrt(0.007225 - 0.0000222784), 12);
  });
  it("r from X/R when no copper loss: 7 % at X/R 12 gives r = 0.07/√145", () => {
    const own = transformerOwnImpedancePu(transformer({ impedancePct: 7, loadLossKW: undefined, xOverR: 12 }));
    expect(own.r).toBeCloseTo(0.07 / Math.sqrt(145), 12);
    expect(own.x / own.r).toBeCloseTo(12, 10);
  });
  it("to the system base: × 100/25 at rated windings; × (11.5/11)² more for an 11.5 kV winding on an 11 kV bus", () => {
    const z = transformerSeriesImpedancePu(transformer({}), bus11, 100);
    expect(z.r).toBeCloseTo(0.01888, 12);
    const off = transformerSeriesImpedancePu(transformer({ lvKV: 11.5 }), bus11, 100);
    expect(off.r).toBeCloseTo(0.01888 * (11.5 / 11) ** 2, 12);
  });
  it("off-nominal ratio: a −5 % HV tap gives t = 0.95; 69/11.5 kV windings on 66/11 kV buses with +2.5 % give t = 1.025", () => {
    expect(transformerRatioPu(transformer({ tapPct: -5 }), bus66, bus11)).toBeCloseTo(0.95, 12);
    expect(transformerRatioPu(transformer({ hvKV: 69, lvKV: 11.5, tapPct: 2.5 }), bus66, bus11)).toBeCloseTo(1.025, 12);
  });
  it("core loss 17 kW on 100 MVA is a conductance of 0.00017 pu; none given is none", () => {
    expect(transformerCoreConductancePu(transformer({}), 100)).toBeCloseTo(0.00017, 15);
    expect(transformerCoreConductancePu(transformer({ noLoadLossKW: undefined }), 100)).toBe(0);
  });
});

describe("loads and shunts", () => {
  it("ZIP exponents: constant power 0, current 1, impedance 2", () => {
    expect([loadVoltageExponent("constant-power"), loadVoltageExponent("constant-current"), loadVoltageExponent("constant-impedance")]).toEqual([0, 1, 2]);
  });
  it("a 2 Mvar capacitor is +0.02 pu susceptance on 100 MVA; a reactor is negative", () => {
    expect(shuntSusceptancePu({ id: "c", name: "c", bus: "b11", qMvar: 2 }, 100)).toBeCloseTo(0.02, 15);
    expect(shuntSusceptancePu({ id: "r", name: "r", bus: "b11", qMvar: -0.2 }, 10)).toBeCloseTo(-0.02, 15);
  });
});
