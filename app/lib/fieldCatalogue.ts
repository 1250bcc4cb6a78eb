// Every field of the network file as a person reads it: its label and the quantity (hence unit)
// it holds, defined once for Details on the sheet, the team library's forms, revision differences
// and the report. A field a form shows differently (a hint, optional) says so where it is used.
import type { Quantity } from "#solver/quantities.ts";

export interface CatalogueField {
  label: string;
  quantity?: Quantity;
  /** A unit that is not one of the readings' quantities (the network's frequency). */
  unit?: string;
}

export const FIELD_CATALOGUE = {
  name: { label: "Name" },
  frequencyHz: { label: "Frequency", unit: "Hz" },
  baseMVA: { label: "Power base", quantity: "MVA" },
  nominalKV: { label: "Nominal voltage", quantity: "kV" },
  vMinPu: { label: "Lowest voltage allowed", quantity: "pu" },
  vMaxPu: { label: "Highest voltage allowed", quantity: "pu" },
  breakingKA: { label: "Switchgear breaking current", quantity: "kA" },
  minFaultMVA: { label: "Minimum fault level asked S″k3 min", quantity: "MVA" },
  position: { label: "Place on the sheet" },
  bus: { label: "Busbar" },
  kind: { label: "Kind" },
  control: { label: "Control" },
  voltagePu: { label: "Voltage set point", quantity: "pu" },
  angleDeg: { label: "Angle", quantity: "deg" },
  pMW: { label: "Active power P", quantity: "MW" },
  qMvar: { label: "Reactive power Q", quantity: "Mvar" },
  qMinMvar: { label: "Lowest Q", quantity: "Mvar" },
  qMaxMvar: { label: "Highest Q", quantity: "Mvar" },
  shortCircuitMVA: { label: "Short-circuit power S″kQ", quantity: "MVA" },
  shortCircuitMinMVA: { label: "Weakest short-circuit power S″kQ min", quantity: "MVA" },
  powerFactor: { label: "Power factor (+ supplies Q, − absorbs)", quantity: "ratio" },
  faultCurrentPct: { label: "Maximum short-circuit current (of rated)", quantity: "pct" },
  minShortCircuitRatio: { label: "Lowest short-circuit ratio asked", quantity: "ratio" },
  xOverR: { label: "X/R", quantity: "ratio" },
  z0OverZ1: { label: "Z0/Z1", quantity: "ratio" },
  ratedMVA: { label: "Rated power", quantity: "MVA" },
  ratedKV: { label: "Rated voltage", quantity: "kV" },
  xdSubtransientPct: { label: "Subtransient reactance x″d", quantity: "pct" },
  ratedPowerFactor: { label: "Rated power factor", quantity: "ratio" },
  hvBus: { label: "HV busbar" },
  lvBus: { label: "LV busbar" },
  hvKV: { label: "HV winding", quantity: "kV" },
  lvKV: { label: "LV winding", quantity: "kV" },
  impedancePct: { label: "Short-circuit impedance uₖ", quantity: "pct" },
  loadLossKW: { label: "Load (copper) loss at rated current", quantity: "kW" },
  noLoadLossKW: { label: "No-load (core) loss", quantity: "kW" },
  tapPct: { label: "Tap (HV winding)", quantity: "pct" },
  tapMinPct: { label: "Lowest tap", quantity: "pct" },
  tapMaxPct: { label: "Highest tap", quantity: "pct" },
  tapStepPct: { label: "Tap step", quantity: "pct" },
  tapControl: { label: "On-load tap changer (regulated bus, target, band)" },
  vectorGroup: { label: "Vector group" },
  fromBus: { label: "From busbar" },
  toBus: { label: "To busbar" },
  lengthKm: { label: "Length", quantity: "km" },
  rOhmPerKm: { label: "Resistance r", quantity: "ohmPerKm" },
  xOhmPerKm: { label: "Reactance x", quantity: "ohmPerKm" },
  bMicroSiemensPerKm: { label: "Shunt susceptance b", quantity: "microSiemensPerKm" },
  ampacityA: { label: "Ampacity", quantity: "A" },
  r0OhmPerKm: { label: "Zero-sequence r0", quantity: "ohmPerKm" },
  x0OhmPerKm: { label: "Zero-sequence x0", quantity: "ohmPerKm" },
  model: { label: "Voltage dependence" },
} satisfies Record<string, CatalogueField>;

export type CatalogueKey = keyof typeof FIELD_CATALOGUE;

export function catalogueField(key: string): CatalogueField | undefined {
  return (FIELD_CATALOGUE as Record<string, CatalogueField>)[key];
}
