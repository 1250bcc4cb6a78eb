// The quantities a planner reads, each with its unit and the precision it is shown to, defined
// once for the sheet, the ladder, the report and the CSV. Significant figures, not fixed decimals,
// because one column holds 0.415 kV and 132 kV alike; a cap on the decimals keeps the noise of a
// value that is all but zero out of sight.
export type Quantity =
  | "kV"
  | "kA"
  | "A"
  | "MVA"
  | "MW"
  | "Mvar"
  | "kW"
  | "km"
  | "ohmPerKm"
  | "microSiemensPerKm"
  | "pct"
  | "pu"
  | "deg"
  | "ratio";

export const QUANTITY_UNIT: Record<Quantity, string> = {
  kV: "kV",
  kA: "kA",
  A: "A",
  MVA: "MVA",
  MW: "MW",
  Mvar: "Mvar",
  kW: "kW",
  km: "km",
  ohmPerKm: "Ω/km",
  microSiemensPerKm: "µS/km",
  pct: "%",
  pu: "pu",
  deg: "°",
  ratio: "",
};

interface Precision {
  significant: number;
  maxDecimals: number;
}

/** How a reading is shown on screen and in the report: 11.44 kV, 1.032 pu, 451 A, 2.564 Mvar, 60.0 km. */
export const SHOWN_PRECISION: Record<Quantity, Precision> = {
  kV: { significant: 4, maxDecimals: 3 },
  kA: { significant: 3, maxDecimals: 2 },
  A: { significant: 3, maxDecimals: 1 },
  MVA: { significant: 4, maxDecimals: 3 },
  MW: { significant: 4, maxDecimals: 3 },
  Mvar: { significant: 4, maxDecimals: 3 },
  kW: { significant: 3, maxDecimals: 1 },
  km: { significant: 3, maxDecimals: 2 },
  ohmPerKm: { significant: 3, maxDecimals: 4 },
  microSiemensPerKm: { significant: 3, maxDecimals: 3 },
  pct: { significant: 3, maxDecimals: 1 },
  pu: { significant: 4, maxDecimals: 4 },
  deg: { significant: 3, maxDecimals: 2 },
  ratio: { significant: 3, maxDecimals: 3 },
};

/** A CSV is read by other programs: six significant figures, at most six decimals, for every quantity. */
const CSV_PRECISION: Precision = { significant: 6, maxDecimals: 6 };

/** The decimals that give `value` its significant figures, within the cap. */
export function decimalsFor(value: number, precision: Precision): number {
  if (value === 0 || !Number.isFinite(value)) return 0;
  const wanted = precision.significant - 1 - Math.floor(Math.log10(Math.abs(value)));
  return Math.max(0, Math.min(precision.maxDecimals, wanted));
}

/** `value` rounded to `decimals`, without binary noise and without a negative zero. */
export function roundTo(value: number, decimals: number): number {
  const rounded = Number(value.toFixed(decimals));
  return rounded === 0 ? 0 : rounded;
}

/**
 * The decimals a value is shown with beside limits it is judged against: more than its
 * quantity's own where those would make it read as equal to a limit it is not equal to (451 A
 * over 450 A reads 100.2 %, not 100 %), at most six.
 */
export function decimalsAgainstLimits(value: number, limits: readonly (number | undefined)[], quantity: Quantity): number {
  let decimals = decimalsFor(value, SHOWN_PRECISION[quantity]);
  const hides = (d: number) => limits.some((limit) => limit !== undefined && limit !== value && roundTo(value, d) === roundTo(limit, d));
  while (decimals < 6 && hides(decimals)) decimals++;
  return decimals;
}

/** The value a reader sees: what limits are judged on, so a flag never contradicts its number. */
export function roundShown(value: number, quantity: Quantity): number {
  return roundTo(value, decimalsFor(value, SHOWN_PRECISION[quantity]));
}

/** The number a CSV carries: 11.44, never 11.440000000000001. */
export function roundForCsv(value: number): number {
  return roundTo(value, decimalsFor(value, CSV_PRECISION));
}
