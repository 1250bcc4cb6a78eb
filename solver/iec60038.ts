// IEC 60038 standard voltages above 1 kV: the list the voltage ladder offers as candidates.
// Nominal voltages follow the list in the project's methods; the highest voltage for equipment
// (U_m) for 33, 66 and 132 kV is given there too (36, 72.5, 145 kV); the other U_m values are
// the standard's tables as recalled (from memory; verify against IEC 60038 before relying on
// them for insulation co-ordination).

/** Series I is 50 Hz practice, series II 60 Hz (North American) practice; "higher" is above 245 kV U_m. */
export type Iec60038Series = "I" | "II" | "higher";

export interface StandardVoltage {
  nominalKV: number;
  series: Iec60038Series;
  /**
   * False for the values the standard keeps only for existing networks (3, 6, 10, 20 kV beside
   * 3.3, 6.6, 11, 22 kV) or marks as not to be used for new ones (15, 35, 45, 150 kV).
   */
  preferred: boolean;
  /** Highest voltage for equipment U_m, the insulation level the switchgear is bought for. */
  highestForEquipmentKV: number;
}

const v = (nominalKV: number, series: Iec60038Series, preferred: boolean, highestForEquipmentKV: number) =>
  ({ nominalKV, series, preferred, highestForEquipmentKV }) satisfies StandardVoltage;

export const IEC_60038_VOLTAGES: readonly StandardVoltage[] = [
  v(3, "I", false, 3.6),
  v(3.3, "I", true, 3.6),
  v(6, "I", false, 7.2),
  v(6.6, "I", true, 7.2),
  v(10, "I", false, 12),
  v(11, "I", true, 12),
  v(15, "I", false, 17.5),
  v(20, "I", false, 24),
  v(22, "I", true, 24),
  v(33, "I", true, 36),
  v(35, "I", false, 40.5),
  v(45, "I", false, 52),
  v(66, "I", true, 72.5),
  v(110, "I", true, 123),
  v(132, "I", true, 145),
  v(150, "I", false, 170),
  v(220, "I", true, 245),
  v(4.16, "II", true, 4.4),
  v(12.47, "II", true, 13.2),
  v(13.2, "II", true, 13.97),
  v(13.8, "II", true, 14.52),
  v(24.94, "II", true, 26.4),
  v(34.5, "II", true, 36.5),
  v(69, "II", true, 72.5),
  v(115, "II", true, 123),
  v(138, "II", true, 145),
  v(230, "II", true, 245),
  v(275, "higher", true, 300),
  v(330, "higher", true, 362),
  v(400, "higher", true, 420),
  v(500, "higher", true, 550),
  v(765, "higher", true, 800),
];

/** Two voltages are the same standard value when they agree to a part in a million. */
function sameKV(a: number, b: number): boolean {
  return Math.abs(a - b) <= 1e-6 * Math.max(a, b);
}

export function standardVoltage(nominalKV: number): StandardVoltage | undefined {
  return IEC_60038_VOLTAGES.find((s) => sameKV(s.nominalKV, nominalKV));
}

export function highestVoltageForEquipmentKV(nominalKV: number): number | undefined {
  return standardVoltage(nominalKV)?.highestForEquipmentKV;
}

/** How far below and above the present voltage a candidate may lie (a factor of 3 either way). */
export const CANDIDATE_RANGE_FACTOR = 3;

export interface CandidateOptions {
  /** Used to pick the series when the present voltage is on neither list: 60 Hz means series II. */
  frequencyHz?: 50 | 60;
}

/**
 * The candidate voltages offered for a section now at `presentKV`, ascending.
 *
 * Rule: the series is the present voltage's own (series II when it is a series-II value, or
 * when it is on no list and the network runs at 60 Hz; otherwise series I). Offered are that
 * series' preferred values and the "higher" values lying from a third to three times the
 * present voltage, plus the present voltage itself even when it is not preferred or not
 * standard, so the existing design is always one of the alternatives. Going further than a
 * factor of three changes the kind of link (distribution against bulk transmission) rather than
 * its voltage, so those are left to free entry.
 */
export function candidateVoltagesKV(presentKV: number, options: CandidateOptions = {}): number[] {
  if (!Number.isFinite(presentKV) || presentKV <= 0) return [];
  const present = standardVoltage(presentKV);
  const series: Iec60038Series =
    present?.series === "II" || (present === undefined && options.frequencyHz === 60) ? "II" : "I";
  const low = presentKV / CANDIDATE_RANGE_FACTOR;
  const high = presentKV * CANDIDATE_RANGE_FACTOR;
  const offered = IEC_60038_VOLTAGES.filter(
    (s) =>
      (s.series === series || s.series === "higher") &&
      s.preferred &&
      s.nominalKV >= low * (1 - 1e-9) &&
      s.nominalKV <= high * (1 + 1e-9),
  ).map((s) => s.nominalKV);
  if (!offered.some((kv) => sameKV(kv, presentKV))) offered.push(presentKV);
  return offered.sort((a, b) => a - b);
}
