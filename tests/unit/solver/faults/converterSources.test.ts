// Full-converter units as current sources, IEC 60909-0:2016 (from memory of its clauses on
// full-converter power station units): I_skPF = faultCurrentPct × I_r, superposed on the
// equivalent voltage source through Z_ij/Z_ii; line to earth through the three sequence
// impedances in series (symmetrical components, any textbook); peak i_p = i_p,I + √2·I"k,II.
import { describe, expect, it } from "vitest";
import {
  converterFaultCurrentPu,
  converterShareLineToEarthPu,
  converterShareThreePhasePu,
  peakWithConverters,
} from "#solver/faults/converterSources.ts";

describe("full-converter unit as a current source (IEC 60909-0:2016)", () => {
  it("I_skPF of a 44 MVA plant at 120 % is 1.2·44/(√3·33 kV) = 0.9238 kA at 33 kV", () => {
    const pu = converterFaultCurrentPu(44, 120, 100);
    const baseKA = 100 / (Math.sqrt(3) * 33);
    expect(pu * baseKA).toBeCloseTo(0.9238, 4);
  });

  it("a converter on the faulted bus adds its whole I_skPF (Z_ij = Z_ii)", () => {
    const z = { re: 0.01, im: 0.1 };
    expect(converterShareThreePhasePu(z, [{ zTransfer: z, currentPu: 0.5 }])).toBeCloseTo(0.5, 12);
  });

  it("a converter behind a line reaches the fault by the current divider Z_Q/(Z_Q + Z_L)", () => {
    // Hand-worked: grid Z_Q = j0.1 at bus 1, line Z_L = j0.3 to the faulted bus 2, converter at
    // bus 1 injecting 1 pu. Its current splits between the grid and the line: 0.1/0.4 reaches bus 2.
    const share = converterShareThreePhasePu({ re: 0, im: 0.4 }, [{ zTransfer: { re: 0, im: 0.1 }, currentPu: 1 }]);
    expect(share).toBeCloseTo(0.25, 12);
  });

  it("line to earth: Z1 = Z2 = j0.15, Z0 = j0.20 and 1 pu at the fault bus gives 3·0.15/0.5 = 0.9 pu", () => {
    const z1 = { re: 0, im: 0.15 };
    const share = converterShareLineToEarthPu(z1, { re: 0, im: 0.2 }, [{ zTransfer: z1, currentPu: 1 }]);
    expect(share).toBeCloseTo(0.9, 12);
  });

  it("adds no zero-sequence path: with Z(0) unchanged the share falls as Z(0) grows", () => {
    const z1 = { re: 0, im: 0.15 };
    const converters = [{ zTransfer: z1, currentPu: 1 }];
    expect(converterShareLineToEarthPu(z1, { re: 0, im: 2 }, converters)).toBeLessThan(
      converterShareLineToEarthPu(z1, { re: 0, im: 0.2 }, converters),
    );
  });

  it("peak: the current source adds √2·I\"k,II without a κ of its own", () => {
    expect(peakWithConverters(21.94, 1)).toBeCloseTo(21.94 + Math.SQRT2, 12);
  });
});
