// Fault levels at every bus by the IEC 60909-0 equivalent voltage source method: the source
// c·U_n/√3 at the faulted bus, every other source shorted behind its corrected impedance.
//   I"k3 = c·U_n / (√3·|Z(1)|),  S"k3 = √3·U_n·I"k3,  i_p = κ·√2·I"k3, κ = 1.02 + 0.98·e^(−3R/X)
//   I"k1 = √3·c·U_n / |Z(1) + Z(2) + Z(0)|  with Z(2) = Z(1)
// Z(1) and Z(0) are the driving-point impedances of the bus in each sequence network, taken
// from a sparse factorisation (no dense inverse). κ uses R/X of Z(1) at the fault.
import { currentBaseA } from "#solver/perUnit.ts";
import type { FaultBusReading, FaultResult } from "#solver/results.ts";
import type { Network } from "#solver/schema.ts";
import { peakFactorKappa } from "./iecFactors.ts";
import { buildSequenceNetworks } from "./sequenceNetworks.ts";
import { drivingPointImpedances } from "./zbusDiagonal.ts";

export { FaultModelError } from "./sequenceNetworks.ts";
export { VectorGroupError, parseVectorGroup } from "./vectorGroup.ts";
export { faultChecks } from "./breakingChecks.ts";

export const UNEARTHED_NOTE = "unearthed system at this bus";
export const NO_SOURCE_NOTE = "no source feeds this bus";

export function computeFaultLevels(network: Network): FaultResult {
  const model = buildSequenceNetworks(network);
  const z1 = drivingPointImpedances(model.positive);
  const z0 = drivingPointImpedances(model.zero);
  const baseMVA = network.baseMVA;

  const buses = model.buses.map((bus, k): FaultBusReading => {
    if (!z1.reachesReference[k])
      return { id: bus.id, ik3kA: 0, ik3MVA: 0, ip3kA: 0, ik1kA: 0, rOverX: 0, note: NO_SOURCE_NOTE };
    const c = model.cMax[k];
    const baseKA = currentBaseA(bus.nominalKV, baseMVA) / 1000;
    const r1 = z1.zRe[k];
    const x1 = z1.zIm[k];
    const ik3kA = (c / Math.sqrt(r1 * r1 + x1 * x1)) * baseKA;
    const rOverX = r1 / x1;
    const reading: FaultBusReading = {
      id: bus.id,
      ik3kA,
      ik3MVA: Math.sqrt(3) * bus.nominalKV * ik3kA,
      ip3kA: peakFactorKappa(rOverX) * Math.SQRT2 * ik3kA,
      ik1kA: 0,
      rOverX,
    };
    if (z0.reachesReference[k]) {
      const sumRe = 2 * r1 + z0.zRe[k];
      const sumIm = 2 * x1 + z0.zIm[k];
      reading.ik1kA = ((3 * c) / Math.sqrt(sumRe * sumRe + sumIm * sumIm)) * baseKA;
    } else reading.note = UNEARTHED_NOTE;
    return reading;
  });

  return { method: "IEC 60909-0", buses };
}
