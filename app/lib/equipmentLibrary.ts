// Built-in equipment types the Details form offers: transformer ratings with their minimum
// short-circuit impedance, and overhead conductors. Every entry says where its numbers come from,
// so a planner knows what to verify. A team's own types arrive through the same shapes.

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

export const builtInConductorTypes: ConductorType[] = [
  { id: "acsr-dove", label: "ACSR Dove 556.5 kcmil 26/7", frequencyHz: 60, rOhmPerKm: 0.1156, xOhmPerKm: 0.351, ampacityA: 730, source: ACSR_SOURCE },
  { id: "acsr-grosbeak", label: "ACSR Grosbeak 636 kcmil 26/7", frequencyHz: 60, rOhmPerKm: 0.1012, xOhmPerKm: 0.346, ampacityA: 780, source: ACSR_SOURCE },
  { id: "acsr-falcon", label: "ACSR Falcon 1590 kcmil 54/19", frequencyHz: 60, rOhmPerKm: 0.0408, xOhmPerKm: 0.312, ampacityA: 1380, source: ACSR_SOURCE },
];

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
