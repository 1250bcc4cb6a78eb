// Built-in equipment types the Details form offers: transformer ratings with their minimum
// short-circuit impedance, overhead conductors and XLPE cables. Every entry says where its numbers come from,
// so a planner knows what to verify. A team's own types arrive through the same shapes.
import type { ConductorMaterial } from "#solver/conductorWithstand.ts";

export interface TransformerType {
  id: string;
  label: string;
  ratedMVA: number;
  impedancePct: number;
  /** Optional: a team's own types often know their losses; the built-in ones do not. */
  loadLossKW?: number;
  noLoadLossKW?: number;
  xOverR?: number;
  /** Where the numbers come from, shown beside the pick. */
  source: string;
}

export interface ConductorType {
  id: string;
  label: string;
  kind: "overhead" | "cable";
  /** For the adiabatic fault withstand; types without it cannot be sized for the fault. */
  material?: ConductorMaterial;
  /** Conductor cross-section in mm² (aluminium area for ACSR). */
  crossSectionMm2?: number;
  /** Cables: the system voltage the insulation is made for. */
  nominalKV?: number;
  /** The frequency the impedances below were given for. */
  frequencyHz: 50 | 60;
  rOhmPerKm: number;
  xOhmPerKm: number;
  ampacityA: number;
  bMicroSiemensPerKm?: number;
  source: string;
}

/** IEC 60076-5 minimum short-circuit impedance by rated power; above 100 MVA it is by agreement. */
export const IEC_60076_5_SOURCE = "IEC 60076-5 minimum, from memory; verify";

const minimumImpedanceBands: { upToKVA: number; impedancePct: number }[] = [
  { upToKVA: 630, impedancePct: 4.0 },
  { upToKVA: 1250, impedancePct: 5.0 },
  { upToKVA: 2500, impedancePct: 6.0 },
  { upToKVA: 6300, impedancePct: 7.0 },
  { upToKVA: 25000, impedancePct: 8.0 },
  { upToKVA: 40000, impedancePct: 10.0 },
  { upToKVA: 63000, impedancePct: 11.0 },
  { upToKVA: 100000, impedancePct: 12.5 },
];

/** The minimum u_k for a rating, or undefined above 100 MVA where the standard leaves it to agreement. */
export function minimumImpedancePct(ratedMVA: number): number | undefined {
  const kVA = ratedMVA * 1000;
  return minimumImpedanceBands.find((band) => kVA <= band.upToKVA)?.impedancePct;
}

/** Preferred ratings planners pick from (common practice, the R10 series of ratings). */
const ratingsMVA = [0.315, 0.5, 0.63, 1, 1.6, 2.5, 4, 5, 6.3, 10, 12.5, 16, 20, 25, 31.5, 40, 50, 63, 80, 100];

function ratingLabel(ratedMVA: number): string {
  return ratedMVA < 1 ? `${Math.round(ratedMVA * 1000)} kVA` : `${ratedMVA} MVA`;
}

export const builtInTransformerTypes: TransformerType[] = ratingsMVA.map((ratedMVA) => {
  const impedancePct = minimumImpedancePct(ratedMVA)!;
  return {
    id: `iec-${ratedMVA}`,
    label: `${ratingLabel(ratedMVA)}, ${impedancePct} %`,
    ratedMVA,
    impedancePct,
    source: IEC_60076_5_SOURCE,
  };
});

export const ACSR_SOURCE = "CRC Electric Power Engineering Handbook, ACSR tables (60 Hz, 1 m spacing)";
/** The ACSR sizes beyond the three in the methods: recalled, with X from each conductor's GMR at 1 m. */
export const ACSR_MEMORY_SOURCE = "ACSR tables (60 Hz, 1 m spacing), from memory; verify";
export const CABLE_SOURCE =
  "R: IEC 60228 class 2 maximum DC resistance at 20 °C; X, capacitance and ampacity: typical single-core XLPE in trefoil, buried, 90 °C; all from memory, verify against the maker";

/** kcmil to mm² (1 kcmil = 0.5067 mm²), for the aluminium area of ACSR. */
const kcmilToMm2 = (kcmil: number) => Math.round(kcmil * 0.5067);

const acsr = (name: string, kcmil: number, stranding: string, rOhmPerKm: number, xOhmPerKm: number, ampacityA: number, source: string): ConductorType => ({
  id: `acsr-${name.toLowerCase()}`,
  label: `ACSR ${name} ${kcmil} kcmil ${stranding}`,
  kind: "overhead",
  material: "acsr",
  crossSectionMm2: kcmilToMm2(kcmil),
  frequencyHz: 60,
  rOhmPerKm,
  xOhmPerKm,
  ampacityA,
  source,
});

const overheadConductors: ConductorType[] = [
  acsr("Partridge", 266.8, "26/7", 0.2356, 0.378, 460, ACSR_MEMORY_SOURCE),
  acsr("Linnet", 336.4, "26/7", 0.1868, 0.37, 530, ACSR_MEMORY_SOURCE),
  acsr("Hawk", 477, "26/7", 0.1317, 0.357, 659, ACSR_MEMORY_SOURCE),
  acsr("Dove", 556.5, "26/7", 0.1156, 0.351, 730, ACSR_SOURCE),
  acsr("Grosbeak", 636, "26/7", 0.1012, 0.346, 780, ACSR_SOURCE),
  acsr("Drake", 795, "26/7", 0.08, 0.337, 907, ACSR_MEMORY_SOURCE),
  acsr("Cardinal", 954, "54/7", 0.0667, 0.332, 996, ACSR_MEMORY_SOURCE),
  acsr("Falcon", 1590, "54/19", 0.0408, 0.312, 1380, ACSR_SOURCE),
];

/** IEC 60228 class 2 maximum DC resistance at 20 °C, Ω/km (from memory). */
const dcResistance20C: Record<number, { copper: number; aluminium: number }> = {
  95: { copper: 0.193, aluminium: 0.32 },
  185: { copper: 0.0991, aluminium: 0.164 },
  240: { copper: 0.0754, aluminium: 0.125 },
  300: { copper: 0.0601, aluminium: 0.1 },
  400: { copper: 0.047, aluminium: 0.0778 },
  500: { copper: 0.0366, aluminium: 0.0605 },
  630: { copper: 0.0283, aluminium: 0.0469 },
  800: { copper: 0.0221, aluminium: 0.0367 },
  1000: { copper: 0.0176, aluminium: 0.0291 },
};

/** Buried trefoil copper ampacity at 90 °C, A (typical, from memory); aluminium carries about 0.78 of it. */
const copperAmpacityA: Record<number, number> = { 95: 300, 185: 430, 240: 490, 300: 560, 400: 630, 500: 720, 630: 810, 800: 900, 1000: 1000 };
const ALUMINIUM_AMPACITY_SHARE = 0.78;

/** By system voltage: each size's reactance (Ω/km, 50 Hz, trefoil) and capacitance (µF/km), typical. */
const cableRanges: { nominalKV: number; sizes: { mm2: number; xOhmPerKm: number; capacitanceMicroFPerKm: number }[] }[] = [
  { nominalKV: 11, sizes: [{ mm2: 95, xOhmPerKm: 0.12, capacitanceMicroFPerKm: 0.31 }, { mm2: 185, xOhmPerKm: 0.11, capacitanceMicroFPerKm: 0.4 }, { mm2: 300, xOhmPerKm: 0.1, capacitanceMicroFPerKm: 0.48 }, { mm2: 500, xOhmPerKm: 0.095, capacitanceMicroFPerKm: 0.58 }] },
  { nominalKV: 33, sizes: [{ mm2: 95, xOhmPerKm: 0.14, capacitanceMicroFPerKm: 0.17 }, { mm2: 185, xOhmPerKm: 0.125, capacitanceMicroFPerKm: 0.21 }, { mm2: 300, xOhmPerKm: 0.115, capacitanceMicroFPerKm: 0.25 }, { mm2: 630, xOhmPerKm: 0.105, capacitanceMicroFPerKm: 0.33 }] },
  { nominalKV: 66, sizes: [{ mm2: 240, xOhmPerKm: 0.14, capacitanceMicroFPerKm: 0.17 }, { mm2: 500, xOhmPerKm: 0.125, capacitanceMicroFPerKm: 0.22 }, { mm2: 800, xOhmPerKm: 0.115, capacitanceMicroFPerKm: 0.26 }, { mm2: 1000, xOhmPerKm: 0.11, capacitanceMicroFPerKm: 0.28 }] },
  { nominalKV: 132, sizes: [{ mm2: 400, xOhmPerKm: 0.14, capacitanceMicroFPerKm: 0.15 }, { mm2: 630, xOhmPerKm: 0.13, capacitanceMicroFPerKm: 0.18 }, { mm2: 1000, xOhmPerKm: 0.12, capacitanceMicroFPerKm: 0.22 }] },
];

/** B = 2πf·C: µF/km to µS/km at 50 Hz. */
const susceptanceMicroSiemensPerKm = (capacitanceMicroFPerKm: number) => Number((2 * Math.PI * 50 * capacitanceMicroFPerKm).toFixed(1));

const xlpeCables: ConductorType[] = cableRanges.flatMap(({ nominalKV, sizes }) =>
  sizes.flatMap(({ mm2, xOhmPerKm, capacitanceMicroFPerKm }) =>
    (["copper", "aluminium"] as const).map((material) => ({
      id: `xlpe-${nominalKV}kv-${material === "copper" ? "cu" : "al"}-${mm2}`,
      label: `${nominalKV} kV XLPE ${material === "copper" ? "Cu" : "Al"} ${mm2} mm²`,
      kind: "cable" as const,
      material,
      crossSectionMm2: mm2,
      nominalKV,
      frequencyHz: 50 as const,
      rOhmPerKm: dcResistance20C[mm2][material],
      xOhmPerKm,
      bMicroSiemensPerKm: susceptanceMicroSiemensPerKm(capacitanceMicroFPerKm),
      ampacityA: material === "copper" ? copperAmpacityA[mm2] : Math.round(copperAmpacityA[mm2] * ALUMINIUM_AMPACITY_SHARE),
      source: CABLE_SOURCE,
    })),
  ),
);

export const builtInConductorTypes: ConductorType[] = [...overheadConductors, ...xlpeCables];

export interface ConductorAtFrequency {
  rOhmPerKm: number;
  xOhmPerKm: number;
  ampacityA: number;
  bMicroSiemensPerKm?: number;
  /** Set when the values were converted, so the form can say so. */
  note?: string;
}

/**
 * A conductor's values at the network's frequency. Inductive reactance is proportional to
 * frequency (X = 2πfL); resistance and ampacity are kept, since skin effect changes R_ac by well
 * under 1 % between 50 and 60 Hz on these sizes (common practice).
 */
export function conductorAtFrequency(conductor: ConductorType, frequencyHz: 50 | 60): ConductorAtFrequency {
  const round = (v: number) => Number(v.toPrecision(6));
  if (conductor.frequencyHz === frequencyHz) {
    return {
      rOhmPerKm: conductor.rOhmPerKm,
      xOhmPerKm: conductor.xOhmPerKm,
      ampacityA: conductor.ampacityA,
      bMicroSiemensPerKm: conductor.bMicroSiemensPerKm,
    };
  }
  const ratio = frequencyHz / conductor.frequencyHz;
  return {
    rOhmPerKm: conductor.rOhmPerKm,
    xOhmPerKm: round(conductor.xOhmPerKm * ratio),
    ampacityA: conductor.ampacityA,
    bMicroSiemensPerKm:
      conductor.bMicroSiemensPerKm === undefined ? undefined : round(conductor.bMicroSiemensPerKm * ratio),
    note: `X scaled ${frequencyHz}/${conductor.frequencyHz} from the ${conductor.frequencyHz} Hz value`,
  };
}
