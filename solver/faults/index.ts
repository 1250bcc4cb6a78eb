// Fault levels at every bus by the IEC 60909-0 equivalent voltage source method: the source
// c·U_n/√3 at the faulted bus, every other source shorted behind its corrected impedance.
//   I"k3 = c·U_n / (√3·|Z(1)|),  S"k3 = √3·U_n·I"k3,  i_p = κ·√2·I"k3, κ = 1.02 + 0.98·e^(−3R/X)
//   I"k1 = √3·c·U_n / |Z(1) + Z(2) + Z(0)|  with Z(2) = Z(1)
// Z(1) and Z(0) are the driving-point impedances of the bus in each sequence network, taken
// from a sparse factorisation (no dense inverse). κ by the method the network at the fault
// calls for (peakMethods.ts). Converter plants add their current-source share in the maximum
// case (converterSources.ts); the minimum case (c_min, weakest infeeds, hot conductors) gives
// ik3MinKA and ik1MinKA, and each converter's short-circuit ratio.
import { busIndexOf } from "#solver/idIndex.ts";
import { SymbolicCache } from "#solver/sparse/ordering.ts";
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
import { buildFaultCases } from "./sequenceNetworks.ts";
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
function transferMagnitudes(network: NodalNetwork, z: DrivingPointImpedances, j: number, analyses: SymbolicCache): Float64Array {
  const scale = 1e-6 * Math.hypot(z.zRe[j], z.zIm[j]);
  const shorted: NodalNetwork = {
    ...network,
    shuntCount: network.shuntCount + 1,
    shuntNode: Int32Array.from([...network.shuntNode.subarray(0, network.shuntCount), j]),
    shuntZRe: Float64Array.from([...network.shuntZRe.subarray(0, network.shuntCount), 0]),
    shuntZIm: Float64Array.from([...network.shuntZIm.subarray(0, network.shuntCount), scale]),
  };
  const after = drivingPointImpedances(shorted, analyses);
  const out = new Float64Array(network.nodeCount);
  const jj = Math.hypot(z.zRe[j], z.zIm[j] + scale);
  for (let i = 0; i < network.nodeCount; i++) {
    if (!z.reachesReference[i]) continue;
    out[i] = i === j ? Math.hypot(z.zRe[j], z.zIm[j]) : Math.sqrt(Math.hypot(z.zRe[i] - after.zRe[i], z.zIm[i] - after.zIm[i]) * jj);
  }
  return out;
}

export function computeFaultLevels(network: Network): FaultResult {
  const { maximum: model, minimum } = buildFaultCases(network);
  const analyses = new SymbolicCache();
  const z1 = drivingPointImpedances(model.positive, analyses);
  const z0 = drivingPointImpedances(model.zero, analyses);
  const z1Min = drivingPointImpedances(minimum.positive, analyses);
  const z0Min = drivingPointImpedances(minimum.zero, analyses);
  const baseMVA = network.baseMVA;
  const paths = classifyPeakPaths(model.positive);
  const fcRatio = equivalentFrequencyRatio(network.frequencyHz);
  const atFc = paths.method.includes("equivalent-frequency") ? drivingPointImpedances(atFrequencyRatio(model.positive, fcRatio), analyses) : null;

  const busIndex = busIndexOf(network);
  const converters = network.sources
    .filter((s) => s.kind === "converter" && s.ratedMVA !== undefined && s.faultCurrentPct !== undefined)
    .map((s) => {
      const j = busIndex.get(s.bus)!;
      return {
        source: s,
        j,
        currentPu: converterFaultCurrentPu(s.ratedMVA!, s.faultCurrentPct!, baseMVA),
        transfer: z1.reachesReference[j] ? transferMagnitudes(model.positive, z1, j, analyses) : null,
      };
    });
  const feeding = converters.filter((cv) => cv.transfer !== null);

  // One reading per bus and nothing else allocated in the loop: the hot path of a large network.
  const buses: FaultBusReading[] = new Array(model.buses.length);
  for (let k = 0; k < buses.length; k++) {
    const bus = model.buses[k];
    const method = paths.method[k];
    if (!z1.reachesReference[k]) {
      buses[k] = { id: bus.id, ik3kA: 0, ik3MVA: 0, ip3kA: 0, ik1kA: 0, rOverX: 0, ik3MinKA: 0, ik1MinKA: 0, ipMethod: method, note: NO_SOURCE_NOTE };
      continue;
    }
    const c = model.c[k];
    const baseKA = currentBaseA(bus.nominalKV, baseMVA) / 1000;
    const r1 = z1.zRe[k];
    const x1 = z1.zIm[k];
    const ik3NetworkPu = c / Math.hypot(r1, x1);
    const ipNetworkPu =
      method === "equivalent-frequency"
        ? kappaEquivalentFrequency(atFc!.zRe[k], atFc!.zIm[k], fcRatio) * Math.SQRT2 * ik3NetworkPu
        : Math.SQRT2 * c * paths.branchPeakPu[k];

    const transfers: ConverterTransfer[] | null =
      feeding.length > 0 ? feeding.map((cv) => ({ zTransfer: { re: cv.transfer![k], im: 0 }, currentPu: cv.currentPu })) : null;
    const converterShare = transfers ? converterShareThreePhasePu({ re: r1, im: x1 }, transfers) : 0;
    const ik3kA = (ik3NetworkPu + converterShare) * baseKA;

    let ik3MinKA = 0;
    let ik1MinKA = 0;
    if (z1Min.reachesReference[k]) {
      const cMin = minimum.c[k];
      ik3MinKA = (cMin / Math.hypot(z1Min.zRe[k], z1Min.zIm[k])) * baseKA;
      if (z0Min.reachesReference[k])
        ik1MinKA = ((3 * cMin) / Math.hypot(2 * z1Min.zRe[k] + z0Min.zRe[k], 2 * z1Min.zIm[k] + z0Min.zIm[k])) * baseKA;
    }

    const reading: FaultBusReading = {
      id: bus.id,
      ik3kA,
      ik3MVA: Math.sqrt(3) * bus.nominalKV * ik3kA,
      ip3kA: peakWithConverters(ipNetworkPu, converterShare) * baseKA,
      ik1kA: 0,
      rOverX: r1 / x1,
      ik3MinKA,
      ik1MinKA,
      ipMethod: method,
    };
    if (z0.reachesReference[k]) {
      const share = transfers ? converterShareLineToEarthPu({ re: r1, im: x1 }, { re: z0.zRe[k], im: z0.zIm[k] }, transfers) : 0;
      const loop = Math.hypot(2 * r1 + z0.zRe[k], 2 * x1 + z0.zIm[k]);
      reading.ik1kA = ((3 * c) / loop + share) * baseKA;
    } else reading.note = UNEARTHED_NOTE;
    buses[k] = reading;
  }

  const converterReadings: ConverterFaultReading[] = converters.map((cv) => {
    const bus = model.buses[cv.j];
    const minimumMVA = Math.sqrt(3) * bus.nominalKV * buses[cv.j].ik3MinKA;
    return { id: cv.source.id, bus: bus.id, scr: shortCircuitRatio(minimumMVA, cv.source.ratedMVA!) };
  });

  return { method: "IEC 60909-0", buses, converters: converterReadings };
}
