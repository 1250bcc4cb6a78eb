// Positive- and zero-sequence networks for the IEC 60909-0 equivalent voltage source method:
// every source shorted behind its corrected impedance (a shunt to the reference), loads, line
// capacitance, shunts and magnetising branches left out, transformers at rated ratio (no tap).
// The negative-sequence network equals the positive one (Z(2) = Z(1)).
//
// Each voltage level keeps its nominal voltage as base. A winding voltage may differ from its
// bus nominal by up to 15 %: the transformer impedance is referred to the winding voltage on
// its own side, and the rated ratio hvKV/lvKV stays as an ideal off-nominal ratio, so an
// impedance seen through the transformer is scaled by the rated ratio squared, as the
// standard refers impedances.
//
// Decisions where the network file is silent:
// - Grid infeed: R/X = 0.1 when `xOverR` is absent (IEC 60909-0 allowance, from memory);
//   zero-sequence Z(0)Q = z0OverZ1 × Z_Q with z0OverZ1 = 1 when absent (the utility gave only
//   S"kQ; an effectively earthed system with S"k1 ≈ S"k3, common practice).
// - Transformer zero-sequence impedance Z(0)T = z0OverZ1 × Z_T, with K_T applied as in the
//   positive sequence; z0OverZ1 = 1 when absent (core-type Dyn/YNd units, common practice),
//   0.1 for an earthed zigzag winding (its zero-sequence impedance is only the leakage between
//   the half-windings on each limb; from memory, give the maker's value when known).
// - Line zero-sequence from r0/x0 where given, each missing one 3 × its positive-sequence
//   value (common practice).
// - Generators are open in zero sequence (neutral assumed high-impedance earthed, common
//   practice). Generator and unit transformer are corrected separately with K_G and K_T, as
//   the methods prescribe, rather than as one power-station unit. Without `ratedKV` a
//   generator is rated at its bus's nominal voltage; without `ratedPowerFactor`, cos φ = 0.85.
// - Converter plants are no shunt here: they enter as current sources, superposed on the result
//   (IEC 60909-0:2016), and only in the maximum case.
// - The minimum case (IEC 60909-0): c_min at the fault and in Z_Q, each grid at
//   `shortCircuitMinMVA` where given, line resistances at the end-of-fault temperature; K_T
//   and K_G as for the maximum.
import type { Bus, Network, Source, Transformer } from "#solver/schema.ts";
import { busIndexOf } from "#solver/idIndex.ts";
import {
  impedanceBaseOhm,
  lineSeriesImpedancePu,
  transformerImpedanceScale,
  transformerOwnImpedancePu,
  transformerRatioPu,
} from "#solver/perUnit.ts";
import {
  DEFAULT_GRID_R_OVER_X,
  fictitiousGeneratorROverX,
  generatorCorrectionKG,
  transformerCorrectionKT,
  voltageFactorCMax,
} from "./iecFactors.ts";
import { endOfFaultResistanceFactor, voltageFactorCMin } from "./minimumFault.ts";
import { NodalNetworkBuilder, type NodalNetwork } from "./nodalNetwork.ts";
import { parseVectorGroup, VectorGroupError, zeroSequenceCoupling, type VectorGroup, type ZeroSequenceCoupling } from "./vectorGroup.ts";

export const DEFAULT_GRID_Z0_OVER_Z1 = 1;
export const DEFAULT_TRANSFORMER_Z0_OVER_Z1 = 1;
export const DEFAULT_ZIGZAG_Z0_OVER_Z1 = 0.1;
export const DEFAULT_GENERATOR_POWER_FACTOR = 0.85;
/** Zero-sequence line impedance over positive when r0/x0 are not given (common practice). */
export const LINE_Z0_OVER_Z1 = 3;

/** IEC 60909-0's two cases: the maximum (switchgear) and the minimum (protection, converters' SCR). */
export type FaultCase = "maximum" | "minimum";

export interface SequenceNetworks {
  buses: Bus[];
  /** c of each bus's voltage level for the case (c_max or c_min), in bus order. */
  c: Float64Array;
  positive: NodalNetwork;
  zero: NodalNetwork;
}

/** A network the fault model cannot represent; the message names the element. */
export class FaultModelError extends Error {
  override name = "FaultModelError";
}

interface Complex {
  re: number;
  im: number;
}

const scale = (z: Complex, k: number): Complex => ({ re: z.re * k, im: z.im * k });

/** Z = |Z| split by X/R: R = |Z|/√(1 + (X/R)²), X = R·X/R. */
function splitByXOverR(magnitude: number, xOverR: number): Complex {
  const re = magnitude / Math.sqrt(1 + xOverR * xOverR);
  return { re, im: re * xOverR };
}

function gridImpedancePu(source: Source, bus: Bus, baseMVA: number, faultCase: FaultCase): Complex {
  const minimum = faultCase === "minimum";
  const c = minimum ? voltageFactorCMin(bus.nominalKV) : voltageFactorCMax(bus.nominalKV);
  const infeedMVA = minimum ? (source.shortCircuitMinMVA ?? source.shortCircuitMVA!) : source.shortCircuitMVA!;
  // Z_Q = c·U_nQ² / S"kQ in ohms; on the bus's own voltage base U_nQ² cancels.
  const magnitude = (c * baseMVA) / infeedMVA;
  return splitByXOverR(magnitude, source.xOverR ?? 1 / DEFAULT_GRID_R_OVER_X);
}

function generatorImpedancePu(source: Source, bus: Bus, baseMVA: number): Complex {
  const ratedKV = source.ratedKV ?? bus.nominalKV;
  const ratedMVA = source.ratedMVA!;
  const xd = source.xdSubtransientPct! / 100;
  const kG = generatorCorrectionKG(
    bus.nominalKV,
    ratedKV,
    voltageFactorCMax(bus.nominalKV),
    xd,
    source.ratedPowerFactor ?? DEFAULT_GENERATOR_POWER_FACTOR,
  );
  const xPu = xd * (ratedKV / bus.nominalKV) ** 2 * (baseMVA / ratedMVA);
  const rOverX = source.xOverR !== undefined ? 1 / source.xOverR : fictitiousGeneratorROverX(ratedKV, ratedMVA);
  return { re: kG * xPu * rOverX, im: kG * xPu };
}

interface TransformerModel {
  /** Corrected series impedance on the LV side of the ideal ratio, system base. */
  zLvSide: Complex;
  ratio: number;
}

function transformerModel(t: Transformer, hv: Bus, lv: Bus, baseMVA: number): TransformerModel {
  const own = transformerOwnImpedancePu(t);
  const kT = transformerCorrectionKT(voltageFactorCMax(lv.nominalKV), own.x);
  const toSystem = transformerImpedanceScale(t, lv, baseMVA);
  return {
    zLvSide: { re: own.r * toSystem * kT, im: own.x * toSystem * kT },
    // Rated ratio: the tap is left at its principal position.
    ratio: transformerRatioPu({ ...t, tapPct: 0 }, hv, lv),
  };
}

interface WindingGroup {
  group: VectorGroup;
  coupling: ZeroSequenceCoupling;
}

/** Parsed, and its zero-sequence coupling worked out, once per distinct vector group code in a network. */
function vectorGroupReader(): (t: Transformer) => WindingGroup {
  const known = new Map<string, WindingGroup>();
  return (t) => {
    let found = known.get(t.vectorGroup);
    if (!found) {
      let group: VectorGroup;
      try {
        group = parseVectorGroup(t.vectorGroup);
      } catch (error) {
        if (error instanceof VectorGroupError) throw new FaultModelError(`transformer "${t.id}": ${error.message}`);
        throw error;
      }
      found = { group, coupling: zeroSequenceCoupling(group) };
      known.set(t.vectorGroup, found);
    }
    return found;
  };
}

function transformerZ0OverZ1(t: Transformer, group: VectorGroup, side: "hv" | "lv"): number {
  return t.z0OverZ1 ?? (group[side].connection === "zigzag" ? DEFAULT_ZIGZAG_Z0_OVER_Z1 : DEFAULT_TRANSFORMER_Z0_OVER_Z1);
}

/** A transformer's zero-sequence impedance as a shunt on one side. */
function addTransformerZeroShunt(zero: NodalNetworkBuilder, t: Transformer, group: VectorGroup, side: "hv" | "lv", node: number, model: TransformerModel): void {
  // Seen from the HV terminals an impedance on the LV side of the ideal t:1 is t² larger.
  const z = scale(model.zLvSide, transformerZ0OverZ1(t, group, side) * (side === "hv" ? model.ratio ** 2 : 1));
  zero.shunt(node, z.re, z.im);
}

/** Places a transformer's zero-sequence impedance as its vector group allows. */
function addTransformerZeroSequence(zero: NodalNetworkBuilder, t: Transformer, windings: WindingGroup, hv: number, lv: number, model: TransformerModel): void {
  const { group, coupling } = windings;
  switch (coupling.kind) {
    case "series": {
      const z = scale(model.zLvSide, transformerZ0OverZ1(t, group, "lv"));
      zero.branch(hv, lv, z.re, z.im, model.ratio);
      break;
    }
    case "shunt":
      addTransformerZeroShunt(zero, t, group, coupling.side, coupling.side === "hv" ? hv : lv, model);
      break;
    case "shunt-both":
      addTransformerZeroShunt(zero, t, group, "hv", hv, model);
      addTransformerZeroShunt(zero, t, group, "lv", lv, model);
      break;
    case "open":
      break;
  }
}

/**
 * Both IEC 60909-0 cases in one pass over the network: the maximum (c_max, each grid at
 * shortCircuitMVA) and the minimum (c_min, each grid at shortCircuitMinMVA where given, line
 * resistances at the end-of-fault temperature). Transformers and generators are the same in both.
 */
export function buildFaultCases(network: Network): Record<FaultCase, SequenceNetworks> {
  const { buses, baseMVA } = network;
  const index = busIndexOf(network);
  const busIndex = (busId: string, kind: string, elementId: string): number => {
    const i = index.get(busId);
    if (i === undefined) throw new FaultModelError(`${kind} "${elementId}" refers to bus "${busId}", which does not exist`);
    return i;
  };
  const branchCount = network.lines.length + network.transformers.length;
  const zeroShunts = network.sources.length + 2 * network.transformers.length;
  const positive = new NodalNetworkBuilder(buses.length, branchCount, network.sources.length);
  const zero = new NodalNetworkBuilder(buses.length, branchCount, zeroShunts);
  const positiveMin = new NodalNetworkBuilder(buses.length, branchCount, network.sources.length);
  const zeroMin = new NodalNetworkBuilder(buses.length, branchCount, zeroShunts);

  const hot = endOfFaultResistanceFactor();
  for (const line of network.lines) {
    const from = busIndex(line.fromBus, "line", line.id);
    const to = busIndex(line.toBus, "line", line.id);
    const z1 = lineSeriesImpedancePu(line, buses[from], baseMVA);
    const ohmToPu = line.lengthKm / impedanceBaseOhm(buses[from].nominalKV, baseMVA);
    const r0 = (line.r0OhmPerKm ?? LINE_Z0_OVER_Z1 * line.rOhmPerKm) * ohmToPu;
    const x0 = (line.x0OhmPerKm ?? LINE_Z0_OVER_Z1 * line.xOhmPerKm) * ohmToPu;
    positive.branch(from, to, z1.r * 1, z1.x);
    zero.branch(from, to, r0 * 1, x0);
    positiveMin.branch(from, to, z1.r * hot, z1.x);
    zeroMin.branch(from, to, r0 * hot, x0);
  }

  const vectorGroupOf = vectorGroupReader();
  for (const t of network.transformers) {
    const hv = busIndex(t.hvBus, "transformer", t.id);
    const lv = busIndex(t.lvBus, "transformer", t.id);
    const model = transformerModel(t, buses[hv], buses[lv], baseMVA);
    const windings = vectorGroupOf(t);
    positive.branch(hv, lv, model.zLvSide.re, model.zLvSide.im, model.ratio);
    positiveMin.branch(hv, lv, model.zLvSide.re, model.zLvSide.im, model.ratio);
    addTransformerZeroSequence(zero, t, windings, hv, lv, model);
    addTransformerZeroSequence(zeroMin, t, windings, hv, lv, model);
  }

  for (const source of network.sources) {
    const k = busIndex(source.bus, "source", source.id);
    if (source.kind === "converter") continue;
    if (source.kind === "grid") {
      if (source.shortCircuitMVA === undefined)
        throw new FaultModelError(`grid infeed "${source.id}" has no shortCircuitMVA`);
      const z0OverZ1 = source.z0OverZ1 ?? DEFAULT_GRID_Z0_OVER_Z1;
      const zQ = gridImpedancePu(source, buses[k], baseMVA, "maximum");
      const zQMin = gridImpedancePu(source, buses[k], baseMVA, "minimum");
      positive.shunt(k, zQ.re, zQ.im);
      zero.shunt(k, zQ.re * z0OverZ1, zQ.im * z0OverZ1);
      positiveMin.shunt(k, zQMin.re, zQMin.im);
      zeroMin.shunt(k, zQMin.re * z0OverZ1, zQMin.im * z0OverZ1);
    } else {
      if (source.ratedMVA === undefined || source.xdSubtransientPct === undefined)
        throw new FaultModelError(`generator "${source.id}" needs ratedMVA and xdSubtransientPct`);
      const zG = generatorImpedancePu(source, buses[k], baseMVA);
      positive.shunt(k, zG.re, zG.im);
      positiveMin.shunt(k, zG.re, zG.im);
    }
  }

  const cMax = new Float64Array(buses.length);
  const cMin = new Float64Array(buses.length);
  for (let i = 0; i < buses.length; i++) {
    cMax[i] = voltageFactorCMax(buses[i].nominalKV);
    cMin[i] = voltageFactorCMin(buses[i].nominalKV);
  }
  return {
    maximum: { buses, c: cMax, positive: positive.build(), zero: zero.build() },
    minimum: { buses, c: cMin, positive: positiveMin.build(), zero: zeroMin.build() },
  };
}
