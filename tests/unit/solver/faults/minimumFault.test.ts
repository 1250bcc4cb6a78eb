// IEC 60909-0 minimum case: c_min (1.00 above 1 kV, 0.95 at or below) and the resistance at the
// end of the fault R = [1 + 0.004 K⁻¹·(θe − 20 °C)]·R20 (IEC 60909-0 formula for R_L, from memory).
import { describe, expect, it } from "vitest";
import { endOfFaultResistanceFactor, shortCircuitRatio, voltageFactorCMin } from "#solver/faults/minimumFault.ts";

describe("IEC 60909-0 minimum short-circuit case", () => {
  it("c_min is 1.00 above 1 kV and 0.95 at or below 1 kV", () => {
    expect(voltageFactorCMin(11)).toBe(1.0);
    expect(voltageFactorCMin(1)).toBe(0.95);
    expect(voltageFactorCMin(0.4)).toBe(0.95);
  });

  it("R at 80 °C is 1.24 × R20; at 20 °C unchanged; at 160 °C 1.56 × R20", () => {
    expect(endOfFaultResistanceFactor()).toBeCloseTo(1.24, 12);
    expect(endOfFaultResistanceFactor(20)).toBe(1);
    expect(endOfFaultResistanceFactor(160)).toBeCloseTo(1.56, 12);
  });

  it("short-circuit ratio is S\"k3min over rated MVA", () => {
    expect(shortCircuitRatio(150, 44)).toBeCloseTo(3.409, 3);
  });
});
