// The correction factors and rules of IEC 60909-0 used by the equivalent voltage source method.

/** Above this nominal voltage the network counts as high voltage for the voltage factor. */
const LOW_VOLTAGE_LIMIT_KV = 1;

/**
 * Voltage factor c_max for the maximum short-circuit current: 1.10 above 1 kV, 1.05 at or below
 * 1 kV (systems with a +6 % LV tolerance; a +10 % LV system would take 1.10).
 */
export function voltageFactorCMax(nominalKV: number): number {
  return nominalKV > LOW_VOLTAGE_LIMIT_KV ? 1.1 : 1.05;
}

/** Network transformer correction K_T = 0.95·c_max / (1 + 0.6·x_T), x_T on its own rating. */
export function transformerCorrectionKT(cMax: number, relativeReactance: number): number {
  return (0.95 * cMax) / (1 + 0.6 * relativeReactance);
}

/**
 * Generator correction K_G = (U_n / U_rG) · c_max / (1 + x"_d · sin φ_rG).
 * `powerFactor` is the rated power factor cos φ_rG.
 */
export function generatorCorrectionKG(
  nominalKV: number,
  ratedKV: number,
  cMax: number,
  xdSubtransientPu: number,
  powerFactor: number,
): number {
  const sinPhi = Math.sqrt(Math.max(0, 1 - powerFactor * powerFactor));
  return (nominalKV / ratedKV) * (cMax / (1 + xdSubtransientPu * sinPhi));
}

/**
 * The fictitious generator resistance R_Gf / X"_d that IEC 60909-0 allows for the peak current
 * when no resistance is known (from memory): 0.05 for U_rG > 1 kV and S_rG ≥ 100 MVA, 0.07 for
 * U_rG > 1 kV and S_rG < 100 MVA, 0.15 for U_rG ≤ 1 kV.
 */
export function fictitiousGeneratorROverX(ratedKV: number, ratedMVA: number): number {
  if (ratedKV <= LOW_VOLTAGE_LIMIT_KV) return 0.15;
  return ratedMVA >= 100 ? 0.05 : 0.07;
}

/** When a grid infeed's R/X is not known IEC 60909-0 allows R_Q = 0.1·X_Q (from memory). */
export const DEFAULT_GRID_R_OVER_X = 0.1;

/** Peak factor κ = 1.02 + 0.98·e^(−3R/X). */
export function peakFactorKappa(rOverX: number): number {
  return 1.02 + 0.98 * Math.exp(-3 * rOverX);
}
