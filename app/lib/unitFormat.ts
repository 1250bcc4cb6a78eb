// The quantity kinds of network fields and how their values are written ("33 kV", "8 %").
// Kept apart from the parsing in units.ts, which needs mathjs, so that a page can show values
// without loading mathjs until someone types. The kinds and their units are the readings'
// quantities (#solver/quantities.ts).
import { QUANTITY_UNIT, type Quantity } from "#solver/quantities.ts";

export type QuantityKind = Quantity;

export interface KindSpec {
  /** The same unit in mathjs notation; absent for dimensionless kinds. */
  mathUnit?: string;
  /** Unit names (without prefix) that may be typed into this field. */
  accepts?: string[];
  /** What to say when the unit is wrong. */
  expects: string;
}

export const quantityKinds: Record<QuantityKind, KindSpec> = {
  kV: { mathUnit: "kV", expects: "a voltage such as 33 kV" },
  kA: { mathUnit: "kA", expects: "a current such as 25 kA" },
  A: { mathUnit: "A", expects: "a current such as 500 A" },
  MVA: { mathUnit: "MVA", accepts: ["VA"], expects: "an apparent power such as 25 MVA" },
  MW: { mathUnit: "MW", accepts: ["W"], expects: "an active power such as 250 kW or 12 MW" },
  Mvar: { mathUnit: "Mvar", accepts: ["var"], expects: "a reactive power such as 2 Mvar" },
  kW: { mathUnit: "kW", accepts: ["W"], expects: "a power such as 118 kW" },
  km: { mathUnit: "km", expects: "a length such as 48 km" },
  ohmPerKm: { mathUnit: "ohm/km", expects: "an impedance per length such as 0.12 ohm/km" },
  microSiemensPerKm: { mathUnit: "uS/km", expects: "a susceptance per length such as 2.9 uS/km" },
  pct: { expects: "a percentage such as 18 %" },
  pu: { expects: "a per-unit value such as 1.03 (or 103 %)" },
  deg: { mathUnit: "deg", expects: "an angle such as -5 deg" },
  ratio: { expects: "a plain number" },
};

export function unitLabel(kind: QuantityKind): string {
  return QUANTITY_UNIT[kind];
}

/** Twelve significant digits: enough for any rating, and it hides binary noise like 2.9000000000000004. */
export function tidy(value: number): number {
  return Number(value.toPrecision(12));
}

export function formatQuantity(value: number, kind: QuantityKind): string {
  const label = QUANTITY_UNIT[kind];
  const text = String(tidy(value));
  if (!label) return text;
  return kind === "deg" ? `${text}°` : `${text} ${label}`;
}
