// The quantity kinds of network fields and how their values are written ("33 kV", "8 %").
// Kept apart from the parsing in units.ts, which needs mathjs, so that a page can show values
// without loading mathjs until someone types.

export type QuantityKind =
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

export interface KindSpec {
  /** The unit the field stores, as the planner reads it. */
  label: string;
  /** The same unit in mathjs notation; absent for dimensionless kinds. */
  mathUnit?: string;
  /** Unit names (without prefix) that may be typed into this field. */
  accepts?: string[];
  /** What to say when the unit is wrong. */
  expects: string;
}

export const quantityKinds: Record<QuantityKind, KindSpec> = {
  kV: { label: "kV", mathUnit: "kV", expects: "a voltage such as 33 kV" },
  kA: { label: "kA", mathUnit: "kA", expects: "a current such as 25 kA" },
  A: { label: "A", mathUnit: "A", expects: "a current such as 500 A" },
  MVA: { label: "MVA", mathUnit: "MVA", accepts: ["VA"], expects: "an apparent power such as 25 MVA" },
  MW: { label: "MW", mathUnit: "MW", accepts: ["W"], expects: "an active power such as 250 kW or 12 MW" },
  Mvar: { label: "Mvar", mathUnit: "Mvar", accepts: ["var"], expects: "a reactive power such as 2 Mvar" },
  kW: { label: "kW", mathUnit: "kW", accepts: ["W"], expects: "a power such as 118 kW" },
  km: { label: "km", mathUnit: "km", expects: "a length such as 48 km" },
  ohmPerKm: { label: "Ω/km", mathUnit: "ohm/km", expects: "an impedance per length such as 0.12 ohm/km" },
  microSiemensPerKm: { label: "µS/km", mathUnit: "uS/km", expects: "a susceptance per length such as 2.9 uS/km" },
  pct: { label: "%", expects: "a percentage such as 18 %" },
  pu: { label: "pu", expects: "a per-unit value such as 1.03 (or 103 %)" },
  deg: { label: "°", mathUnit: "deg", expects: "an angle such as -5 deg" },
  ratio: { label: "", expects: "a plain number" },
};

export function unitLabel(kind: QuantityKind): string {
  return quantityKinds[kind].label;
}

/** Twelve significant digits: enough for any rating, and it hides binary noise like 2.9000000000000004. */
export function tidy(value: number): number {
  return Number(value.toPrecision(12));
}

export function formatQuantity(value: number, kind: QuantityKind): string {
  const label = quantityKinds[kind].label;
  const text = String(tidy(value));
  if (!label) return text;
  return kind === "deg" ? `${text}°` : `${text} ${label}`;
}
