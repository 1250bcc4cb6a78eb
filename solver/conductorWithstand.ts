// Adiabatic short-circuit withstand of a conductor (IEC 60949): all the fault's heat stays in the
// conductor, so a cross-section S (mm²) carries I (A) for t (s) when S ≥ I·√t / k. k bundles the
// material's heat capacity, resistivity and the insulation's initial and final temperatures.

export type ConductorMaterial = "copper" | "aluminium" | "acsr";

/**
 * k in A·√s/mm² (IEC 60364-5-54 table values, from memory): copper and aluminium with XLPE
 * insulation (90 °C to 250 °C) 143 and 94; a bare aluminium conductor steel-reinforced overhead
 * line, about 87 on its aluminium area.
 */
export const ADIABATIC_K: Record<ConductorMaterial, number> = { copper: 143, aluminium: 94, acsr: 87 };

/** The smallest cross-section that withstands I (A) for t (s): I·√t / k, in mm². */
export function minimumCrossSectionMm2(faultCurrentA: number, durationS: number, material: ConductorMaterial): number {
  return (faultCurrentA * Math.sqrt(durationS)) / ADIABATIC_K[material];
}

/** The current (A) a cross-section withstands for t (s): k·S / √t. */
export function withstandCurrentA(crossSectionMm2: number, durationS: number, material: ConductorMaterial): number {
  return (ADIABATIC_K[material] * crossSectionMm2) / Math.sqrt(durationS);
}
