// Fault levels at every bus by the IEC 60909-0 equivalent voltage source method: the source
// c·U_n/√3 at the faulted bus, every other source shorted behind its corrected impedance.
//   I"k3 = c·U_n / (√3·|Z(1)|),  S"k3 = √3·U_n·I"k3,  i_p = κ·√2·I"k3, κ = 1.02 + 0.98·e^(−3R/X)
//   I"k1 = √3·c·U_n / |Z(1) + Z(2) + Z(0)|  with Z(2) = Z(1)
// Z(1) and Z(0) are the driving-point impedances of the bus in each sequence network, taken
// from a sparse factorisation (no dense inverse). κ by the method the network at the fault
// calls for (peakMethods.ts). Converter plants add their current-source share in the maximum
// case (converterSources.ts); the minimum case (c_min, weakest infeeds, hot conductors) gives
// ik3MinKA and ik1MinKA, and each converter's short-circuit ratio.
import { currentBaseA } from "#solver/perUnit.ts";
import type { ConverterFaultReading, FaultBusReading, FaultResult } from "#solver/results.ts";
import type { Network } from "#solver/schema.ts";
import {
  converterFaultCurrentPu,
  converterShareLineToEarthPu,
  converterShareThreePhasePu,
  peakWithConverters,
  type ConverterTransfer,
} from "./converterSources.ts";
import { shortCircuitRatio } from "./minimumFault.ts";
import type { DrivingPointImpedances, NodalNetwork } from "./nodalNetwork.ts";
import { atFrequencyRatio, classifyPeakPaths, equivalentFrequencyRatio, kappaEquivalentFrequency } from "./peakMethods.ts";
import { buildSequenceNetworks } from "./sequenceNetworks.ts";
import { drivingPointImpedances } from "./zbusDiagonal.ts";

export { FaultModelError } from "./sequenceNetworks.ts";
export { VectorGroupError, parseVectorGroup } from "./vectorGroup.ts";
export { faultChecks } from "./breakingChecks.ts";

export const UNEARTHED_NOTE = "unearthed system at this bus";
export const NO_SOURCE_NOTE = "no source feeds this bus";

/**
 * |Z_ij| for every i, from two driving-point solves: shorting node j through a small z_s turns
 * Z_ii into Z_ii − Z_ij²/(Z_jj + z_s), so |Z_ij|² = |Z_ii − Z'_ii|·|Z_jj + z_s|. Only the
 * magnitude is needed (the standard adds the converters' currents as magnitudes).
 */
function transferMagnitudes(network: NodalNetwork, z: DrivingPointImpedances, j: number): Float64Array {
  const scale = 1e-6 * Math.hypot(z.zRe[j], z.zIm[j]);
  const shorted: NodalNetwork = {
    ...network,
    shuntCount: network.shuntCount + 1,
    shuntNode: Int32Array.from([...network.shuntNode.subarray(0, network.shuntCount), j]),
    shuntZRe: Float64Array.from([...network.shuntZRe.subarray(0, network.shuntCount), 0]),
    shuntZIm: Float64Array.from([...network.shuntZIm.subarray(0, network.shuntCount), scale]),
  };
  const after = drivingPointImpedances(shorted);
  const out = new Float64Array(network.nodeCount);
  const jj = Math.hypot(z.zRe[j], z.zIm[j] + scale);
  for (let i = 0; i < network.nodeCount; i++) {
    if (!z.reachesReference[i]) continue;
    out[i] = i === j ? Math.hypot(z.zRe[j], z.zIm[j]) : Math.sqrt(Math.hypot(z.zRe[i] - after.zRe[i], z.zIm[i] - after.zIm[i]) * jj);
  }
  return out;
}

export function computeFaultLevels(network: Network): FaultResult {
  const model = buildSequenceNetworks(network);
  const minimum = buildSequenceNetworks(network, "minimum");
  const z1 = drivingPointImpedances(model.positive);
  const z0 = drivingPointImpedances(model.zero);
  const z1Min = drivingPointImpedances(minimum.positive);
  const z0Min = drivingPointImpedances(minimum.zero);
  const baseMVA = network.baseMVA;
  const paths = classifyPeakPaths(model.positive);
  const fcRatio = equivalentFrequencyRatio(network.frequencyHz);
  const atFc = paths.method.includes("equivalent-frequency") ? drivingPointImpedances(atFrequencyRatio(model.positive, fcRatio)) : null;

  const busIndex = new Map(model.buses.map((b, k) => [b.id, k]));
  const converters = network.sources
    .filter((s) => s.kind === "converter" && s.ratedMVA !== undefined && s.faultCurrentPct !== undefined)
    .map((s) => {
      const j = busIndex.get(s.bus)!;
      return {
        source: s,
        j,
        currentPu: converterFaultCurrentPu(s.ratedMVA!, s.faultCurrentPct!, baseMVA),
        transfer: z1.reachesReference[j] ? transferMagnitudes(model.positive, z1, j) : null,
      };
    });

  const buses = model.buses.map((bus, k): FaultBusReading => {
    if (!z1.reachesReference[k])
      return { id: bus.id, ik3kA: 0, ik3MVA: 0, ip3kA: 0, ik1kA: 0, rOverX: 0, ik3MinKA: 0, ik1MinKA: 0, ipMethod: paths.method[k], note: NO_SOURCE_NOTE };
    const c = model.c[k];
    const baseKA = currentBaseA(bus.nominalKV, baseMVA) / 1000;
    const r1 = z1.zRe[k];
    const x1 = z1.zIm[k];
    const ik3NetworkPu = c / Math.hypot(r1, x1);
    const method = paths.method[k];
    const ipNetworkPu =
      method === "equivalent-frequency"
        ? kappaEquivalentFrequency(atFc!.zRe[k], atFc!.zIm[k], fcRatio) * Math.SQRT2 * ik3NetworkPu
        : Math.SQRT2 * c * paths.branchPeakPu[k];

    const transfers: ConverterTransfer[] = converters.flatMap((cv) =>
      cv.transfer ? [{ zTransfer: { re: cv.transfer[k], im: 0 }, currentPu: cv.currentPu }] : [],
    );
    const zkk = { re: r1, im: x1 };
    const converterShare = transfers.length > 0 ? converterShareThreePhasePu(zkk, transfers) : 0;
    const ik3kA = (ik3NetworkPu + converterShare) * baseKA;

    const minimumKA = (z: DrivingPointImpedances, zZero: DrivingPointImpedances) => {
      if (!z.reachesReference[k]) return { ik3: 0, ik1: 0 };
      const cMin = minimum.c[k];
      const ik3 = (cMin / Math.hypot(z.zRe[k], z.zIm[k])) * baseKA;
      const ik1 = zZero.reachesReference[k]
        ? ((3 * cMin) / Math.hypot(2 * z.zRe[k] + zZero.zRe[k], 2 * z.zIm[k] + zZero.zIm[k])) * baseKA
        : 0;
      return { ik3, ik1 };
    };
    const min = minimumKA(z1Min, z0Min);

    const reading: FaultBusReading = {
      id: bus.id,
      ik3kA,
      ik3MVA: Math.sqrt(3) * bus.nominalKV * ik3kA,
      ip3kA: peakWithConverters(ipNetworkPu, converterShare) * baseKA,
      ik1kA: 0,
      rOverX: r1 / x1,
      ik3MinKA: min.ik3,
      ik1MinKA: min.ik1,
      ipMethod: method,
    };
    if (z0.reachesReference[k]) {
      const z0kk = { re: z0.zRe[k], im: z0.zIm[k] };
      const share = transfers.length > 0 ? converterShareLineToEarthPu(zkk, z0kk, transfers) : 0;
      const loop = Math.hypot(2 * r1 + z0kk.re, 2 * x1 + z0kk.im);
      reading.ik1kA = ((3 * c) / loop + share) * baseKA;
    } else reading.note = UNEARTHED_NOTE;
    return reading;
  });

  const converterReadings: ConverterFaultReading[] = converters.map((cv) => {
    const bus = model.buses[cv.j];
    const minimumMVA = Math.sqrt(3) * bus.nominalKV * buses[cv.j].ik3MinKA;
    return { id: cv.source.id, bus: bus.id, scr: shortCircuitRatio(minimumMVA, cv.source.ratedMVA!) };
  });

  return { method: "IEC 60909-0", buses, converters: converterReadings };
}
