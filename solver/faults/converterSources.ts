// Full-converter units (solar, wind, battery plants) in the IEC 60909-0:2016 short-circuit
// calculation: a current source of the maker's maximum short-circuit current I_skPF, superposed
// on the equivalent voltage source at the fault. The network part I"k,I is computed as before,
// with the converters left out; each converter's current reaches the fault bus i through the
// ratio of transfer to driving-point impedance:
//   I"k = I"k,I + (1/|Z_ii|)·Σ_j |Z_ij|·I_skPFj                       (three-phase)
//   I"k1 = I"k1,I + 3·Σ_j |Z(1)ij|·I_skPFj / |Z(1)ii + Z(2)ii + Z(0)ii|  (line to earth)
//   i_p = i_p,I + √2·I"k,II                                           (peak)
// Converters inject positive-sequence current only (no negative- or zero-sequence source), so in
// the line-to-earth case their current changes only the positive-sequence pre-fault voltage at
// the fault by Z(1)ij·I_skPFj, which the three sequence impedances in series then carry.
// Magnitudes are added: the standard takes the currents as in phase, the conservative case.

export interface ComplexImpedance {
  re: number;
  im: number;
}

/** One converter as the fault bus sees it: its transfer impedance Z_ij and its I_skPF in per unit. */
export interface ConverterTransfer {
  zTransfer: ComplexImpedance;
  currentPu: number;
}

/**
 * I_skPF in per unit of the system base at the converter's bus: faultCurrentPct × rated current,
 * with rated current S_r/(√3·U_n) and base current S_base/(√3·U_n) at the same voltage.
 */
export function converterFaultCurrentPu(ratedMVA: number, faultCurrentPct: number, baseMVA: number): number {
  return (faultCurrentPct / 100) * (ratedMVA / baseMVA);
}

const magnitude = (z: ComplexImpedance) => Math.hypot(z.re, z.im);

/** I"k,II at the fault bus, in per unit: (1/|Z_ii|)·Σ |Z_ij|·I_skPFj. */
export function converterShareThreePhasePu(zDrivingPoint: ComplexImpedance, converters: readonly ConverterTransfer[]): number {
  const zii = magnitude(zDrivingPoint);
  let sum = 0;
  for (const c of converters) sum += magnitude(c.zTransfer) * c.currentPu;
  return sum / zii;
}

/** The converters' part of I"k1, in per unit: 3·Σ |Z(1)ij|·I_skPFj / |2·Z(1)ii + Z(0)ii| (Z(2) = Z(1)). */
export function converterShareLineToEarthPu(
  zPositive: ComplexImpedance,
  zZero: ComplexImpedance,
  converters: readonly ConverterTransfer[],
): number {
  const loop = Math.hypot(2 * zPositive.re + zZero.re, 2 * zPositive.im + zZero.im);
  let sum = 0;
  for (const c of converters) sum += magnitude(c.zTransfer) * c.currentPu;
  return (3 * sum) / loop;
}

/** i_p = i_p,I + √2·I"k,II: a current source adds its own peak without a κ of its own. */
export function peakWithConverters(peakFromVoltageSource: number, converterShare: number): number {
  return peakFromVoltageSource + Math.SQRT2 * converterShare;
}
