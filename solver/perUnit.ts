// Per-unit quantities on the system base, one small function per element quantity.
// Each bus's voltage base is its nominal kV; the power base is the network's baseMVA.
// Shared by the load flow and the fault levels, so every conversion lives here once.
import type { Bus, Line, Load, Shunt, Transformer } from "#solver/schema.ts";

/** A series impedance in per unit: resistance and reactance. */
export interface ImpedancePu {
  r: number;
  x: number;
}

/** Power in per unit: MW or Mvar over the system base. */
export function powerPu(megawattsOrMegavars: number, baseMVA: number): number {
  return megawattsOrMegavars / baseMVA;
}

/** Z_base = kV² / MVA, in ohms. */
export function impedanceBaseOhm(nominalKV: number, baseMVA: number): number {
  return (nominalKV * nominalKV) / baseMVA;
}

/** I_base = MVA / (√3 · kV), in amperes. */
export function currentBaseA(nominalKV: number, baseMVA: number): number {
  return (baseMVA * 1000) / (Math.sqrt(3) * nominalKV);
}

export function busImpedanceBaseOhm(bus: Bus, baseMVA: number): number {
  return impedanceBaseOhm(bus.nominalKV, baseMVA);
}

export function busCurrentBaseA(bus: Bus, baseMVA: number): number {
  return currentBaseA(bus.nominalKV, baseMVA);
}

/** Series impedance of the whole line, (r + jx)·L / Z_base. Both ends share one voltage base. */
export function lineSeriesImpedancePu(line: Line, bus: Bus, baseMVA: number): ImpedancePu {
  const zBase = busImpedanceBaseOhm(bus, baseMVA);
  return { r: (line.rOhmPerKm * line.lengthKm) / zBase, x: (line.xOhmPerKm * line.lengthKm) / zBase };
}

/** Total shunt susceptance of the pi model (half at each end), b·L in siemens times Z_base. */
export function lineShuntSusceptancePu(line: Line, bus: Bus, baseMVA: number): number {
  const bSiemens = (line.bMicroSiemensPerKm ?? 0) * 1e-6 * line.lengthKm;
  return bSiemens * busImpedanceBaseOhm(bus, baseMVA);
}

/**
 * Short-circuit impedance on the transformer's own rating (per unit of ratedMVA and its own
 * winding voltages): |z| = u_k/100; r from the copper loss when given, else from X/R.
 */
export function transformerOwnImpedancePu(t: Transformer): ImpedancePu {
  const z = t.impedancePct / 100;
  const r =
    t.loadLossKW !== undefined
      ? t.loadLossKW / (t.ratedMVA * 1000)
      : z / Math.sqrt(1 + (t.xOverR ?? Number.POSITIVE_INFINITY) ** 2);
  return { r, x: Math.sqrt(Math.max(z * z - r * r, 0)) };
}

/** Factor that takes an impedance from the transformer's own rating to the system base, referred to the LV bus. */
export function transformerImpedanceScale(t: Transformer, lvBus: Bus, baseMVA: number): number {
  const windingRatio = t.lvKV / lvBus.nominalKV;
  return (baseMVA / t.ratedMVA) * windingRatio * windingRatio;
}

/** Series impedance on the system base, on the LV side of the ideal t:1 (HV side) transformer. */
export function transformerSeriesImpedancePu(t: Transformer, lvBus: Bus, baseMVA: number): ImpedancePu {
  const own = transformerOwnImpedancePu(t);
  const scale = transformerImpedanceScale(t, lvBus, baseMVA);
  return { r: own.r * scale, x: own.x * scale };
}

/**
 * Off-nominal ratio t of the ideal t:1 on the HV side: the HV winding with its tap over its bus
 * base, divided by the LV winding over its bus base. A positive HV tap raises t and lowers the LV voltage.
 */
export function transformerRatioPu(t: Transformer, hvBus: Bus, lvBus: Bus): number {
  const hvPu = (t.hvKV * (1 + t.tapPct / 100)) / hvBus.nominalKV;
  const lvPu = t.lvKV / lvBus.nominalKV;
  return hvPu / lvPu;
}

/** Core loss as a shunt conductance at the HV terminal: g = P0 / (baseMVA·1000). */
export function transformerCoreConductancePu(t: Transformer, baseMVA: number): number {
  return (t.noLoadLossKW ?? 0) / (baseMVA * 1000);
}

/** The exponent on |V| of a load's power: constant power 0, current 1, impedance 2. */
export function loadVoltageExponent(model: Load["model"]): 0 | 1 | 2 {
  switch (model) {
    case "constant-power":
      return 0;
    case "constant-current":
      return 1;
    case "constant-impedance":
      return 2;
  }
}

/** A shunt's susceptance: its rated Mvar at 1 pu, capacitive positive. */
export function shuntSusceptancePu(shunt: Shunt, baseMVA: number): number {
  return powerPu(shunt.qMvar, baseMVA);
}
