// Losses in money: what a planner adds to capital cost to compare alternatives over the asset's life.
import { z } from "zod";

export const HOURS_PER_YEAR = 8760;

/**
 * Loss load factor from load factor, LLF = k·LF + (1 − k)·LF² (Buller and Woodrow's empirical
 * relation). Losses follow the square of the load, so the average loss sits between LF² (a
 * flat load) and LF (an on-off load); k says where.
 */
export function lossLoadFactor(loadFactor: number, k = 0.3): number {
  return k * loadFactor + (1 - k) * loadFactor * loadFactor;
}

/**
 * Present-worth factor (P/A) = ((1 + i)^n − 1) / (i (1 + i)^n) = (1 − (1 + i)^−n) / i; with i = 0
 * it is n. Written with expm1 and log1p so that a rate near zero does not lose every digit.
 */
export function presentWorthFactor(ratePerYear: number, years: number): number {
  if (ratePerYear === 0) return years;
  return -Math.expm1(-years * Math.log1p(ratePerYear)) / ratePerYear;
}

/**
 * The present-worth factor for a cost that grows with the square of the load: year y
 * (0 for the first year of operation, the year the load flow describes) costs (1 + g)^(2y) times
 * the first year's, paid at the end of that year. With g = 0 this is the plain annuity factor.
 */
export function growingLossPresentWorthFactor(ratePerYear: number, years: number, loadGrowthPerYear: number): number {
  let factor = 0;
  for (let year = 0; year < years; year++)
    factor += Math.pow(1 + loadGrowthPerYear, 2 * year) / Math.pow(1 + ratePerYear, year + 1);
  return factor;
}

export interface AnnualEnergyLost {
  loadDependentMWh: number;
  coreMWh: number;
  totalMWh: number;
}

/** Energy lost in the first year: P_loss,peak × LLF × 8760 h (load-dependent) + P0 × 8760 h (core). */
export function annualEnergyLost(loadDependentPeakLossMW: number, coreLossMW: number, llf: number): AnnualEnergyLost {
  const loadDependentMWh = loadDependentPeakLossMW * llf * HOURS_PER_YEAR;
  const coreMWh = coreLossMW * HOURS_PER_YEAR;
  return { loadDependentMWh, coreMWh, totalMWh: loadDependentMWh + coreMWh };
}

// Capital cost defaults. ILLUSTRATIVE PLACEHOLDERS ONLY: round figures of a plausible order of
// magnitude so that the comparison shows its shape; every team must replace them with its own
// unit costs (money.lineCostPerKmByKV, money.transformerCostPerMVAByKV) or enter each
// alternative's capital cost directly.
export const ILLUSTRATIVE_LINE_COST_PER_KM_BY_KV: readonly CostPoint[] = [
  { voltageKV: 11, cost: 35_000 },
  { voltageKV: 33, cost: 70_000 },
  { voltageKV: 66, cost: 130_000 },
  { voltageKV: 132, cost: 260_000 },
  { voltageKV: 220, cost: 420_000 },
  { voltageKV: 400, cost: 800_000 },
  { voltageKV: 765, cost: 1_500_000 },
];
export const ILLUSTRATIVE_TRANSFORMER_COST_PER_MVA_BY_KV: readonly CostPoint[] = [
  { voltageKV: 11, cost: 15_000 },
  { voltageKV: 33, cost: 20_000 },
  { voltageKV: 66, cost: 26_000 },
  { voltageKV: 132, cost: 34_000 },
  { voltageKV: 220, cost: 42_000 },
  { voltageKV: 400, cost: 55_000 },
  { voltageKV: 765, cost: 75_000 },
];
/** Underground cable against overhead line per km at the same voltage (illustrative placeholder). */
export const ILLUSTRATIVE_CABLE_COST_FACTOR = 5;

export interface CostPoint {
  voltageKV: number;
  cost: number;
}

/**
 * A unit cost at any voltage from a table: straight lines on log–log axes between the two
 * neighbouring points (costs grow roughly as a power of the voltage), the end segments extended.
 */
export function costAtVoltage(table: readonly CostPoint[], voltageKV: number): number {
  const points = [...table].sort((a, b) => a.voltageKV - b.voltageKV);
  const exact = points.find((p) => p.voltageKV === voltageKV);
  if (exact) return exact.cost;
  if (points.length === 1) return points[0].cost;
  let i = points.findIndex((p) => p.voltageKV >= voltageKV);
  if (i <= 0) i = i === 0 ? 1 : points.length - 1;
  const a = points[i - 1];
  const b = points[i];
  if (a.cost <= 0 || b.cost <= 0) {
    const share = (voltageKV - a.voltageKV) / (b.voltageKV - a.voltageKV);
    return Math.max(0, a.cost + share * (b.cost - a.cost));
  }
  const slope = Math.log(b.cost / a.cost) / Math.log(b.voltageKV / a.voltageKV);
  return a.cost * Math.pow(voltageKV / a.voltageKV, slope);
}

const finite = z.number().finite();
const costPointSchema = z.strictObject({
  voltageKV: finite.positive("must be a voltage above 0 kV"),
  cost: finite.nonnegative("must be 0 or more"),
});
const costTableSchema = z
  .array(costPointSchema)
  .min(1, "needs at least one voltage and cost")
  .max(50, "has more than 50 rows")
  .refine((rows) => new Set(rows.map((r) => r.voltageKV)).size === rows.length, "lists a voltage twice");

/** Money inputs with the defaults a planner recognises. Rates are in per cent, as planners quote them. */
export const moneyInputSchema = z.strictObject({
  loadFactor: finite.gt(0, "must be above 0").max(1, "must be at most 1").default(0.6),
  lossLoadFactorK: finite.min(0, "must be 0 or more").max(1, "must be at most 1 (planners use 0.15 to 0.3)").default(0.3),
  energyPricePerMWh: finite.min(0, "must be 0 or more").max(100_000, "must be at most 100 000 per MWh").default(80),
  discountRatePct: finite.min(0, "must be 0 % or more").max(50, "must be at most 50 %").default(8),
  studyYears: z.number().int("must be a whole number of years").min(1, "must be at least 1 year").max(100, "must be at most 100 years").default(25),
  loadGrowthPct: finite.min(-20, "must be at least −20 % a year").max(20, "must be at most 20 % a year").default(0),
  currency: z.string().trim().min(1, "must not be empty").max(12, "must be at most 12 characters").default("EUR"),
  lineCostPerKmByKV: costTableSchema.default(() => ILLUSTRATIVE_LINE_COST_PER_KM_BY_KV.map((p) => ({ ...p }))),
  transformerCostPerMVAByKV: costTableSchema.default(() => ILLUSTRATIVE_TRANSFORMER_COST_PER_MVA_BY_KV.map((p) => ({ ...p }))),
  cableCostFactor: finite.positive("must be above 0").max(50, "must be at most 50").default(ILLUSTRATIVE_CABLE_COST_FACTOR),
});
export type MoneyInput = z.output<typeof moneyInputSchema>;
export type MoneyInputDraft = z.input<typeof moneyInputSchema>;

/** Per-alternative capital cost entries; each replaces the estimate from the unit-cost tables. */
export const capitalOverrideSchema = z.strictObject({
  /** The alternative's whole capital cost, entered by the planner. */
  capitalCost: finite.nonnegative("must be 0 or more").optional(),
  /** Cost per km of every line in the section at this voltage. */
  lineCostPerKm: finite.nonnegative("must be 0 or more").optional(),
  /** Cost of a facing transformer, by transformer id. */
  transformerCosts: z.record(z.string(), finite.nonnegative("must be 0 or more")).optional(),
});
export type CapitalOverride = z.output<typeof capitalOverrideSchema>;

export interface CapitalItem {
  id: string;
  cost: number;
  /** How the cost was found: from the unit-cost table or entered for this alternative. */
  basis: "table" | "entered";
}

export interface CapitalCost {
  total: number;
  /** True when the planner entered the alternative's whole capital cost. */
  entered: boolean;
  lines: (CapitalItem & { lengthKm: number; costPerKm: number })[];
  transformers: (CapitalItem & { ratedMVA: number; hvKV: number })[];
}

export interface CapitalScope {
  voltageKV: number;
  /** `costPerKm`: the line's conductor priced by size (conductor sizing), used unless the planner entered one. */
  lines: readonly { id: string; kind: "overhead" | "cable"; lengthKm: number; costPerKm?: number }[];
  transformers: readonly { id: string; ratedMVA: number; hvKV: number }[];
}

/**
 * Capital of what differs between the alternatives: the section's lines (cost per km at the
 * candidate voltage × length; cables by the cable factor) and the transformers facing it (cost
 * per MVA at their HV winding voltage × rating).
 */
export function capitalCost(scope: CapitalScope, money: MoneyInput, override: CapitalOverride = {}): CapitalCost {
  const lines = scope.lines.map((line) => {
    const entered = override.lineCostPerKm !== undefined;
    const costPerKm = entered
      ? override.lineCostPerKm!
      : (line.costPerKm ?? costAtVoltage(money.lineCostPerKmByKV, scope.voltageKV) * (line.kind === "cable" ? money.cableCostFactor : 1));
    return { id: line.id, lengthKm: line.lengthKm, costPerKm, cost: costPerKm * line.lengthKm, basis: entered ? "entered" : "table" } as const;
  });
  const transformers = scope.transformers.map((t) => {
    const enteredCost = override.transformerCosts?.[t.id];
    const cost = enteredCost ?? t.ratedMVA * costAtVoltage(money.transformerCostPerMVAByKV, t.hvKV);
    return { id: t.id, ratedMVA: t.ratedMVA, hvKV: t.hvKV, cost, basis: enteredCost === undefined ? "table" : "entered" } as const;
  });
  const itemised = [...lines, ...transformers].reduce((sum, item) => sum + item.cost, 0);
  return {
    total: override.capitalCost ?? itemised,
    entered: override.capitalCost !== undefined,
    lines,
    transformers,
  };
}

export interface LossMoney {
  /** The loss load factor used; null when the energy came from the operating cases' hours. */
  lossLoadFactor: number | null;
  energyLostFirstYear: AnnualEnergyLost;
  lossCostFirstYear: number;
  presentValueOfLosses: number;
}

/**
 * The losses of one alternative in money: the load-dependent part (lines and transformer copper)
 * by the loss load factor and the load growth, the core part all year round at the same level.
 */
export function lossMoney(loadDependentPeakLossMW: number, coreLossMW: number, money: MoneyInput, energyPricePerMWh = money.energyPricePerMWh): LossMoney {
  const llf = lossLoadFactor(money.loadFactor, money.lossLoadFactorK);
  return { ...energyMoney(annualEnergyLost(loadDependentPeakLossMW, coreLossMW, llf), money, energyPricePerMWh), lossLoadFactor: llf };
}

/** A first year's energy lost, however found (loss load factor or the cases' hours), in money over the study years. */
export function energyMoney(energy: AnnualEnergyLost, money: MoneyInput, energyPricePerMWh = money.energyPricePerMWh): LossMoney {
  const rate = money.discountRatePct / 100;
  const presentValueOfLosses =
    energy.loadDependentMWh * energyPricePerMWh * growingLossPresentWorthFactor(rate, money.studyYears, money.loadGrowthPct / 100) +
    energy.coreMWh * energyPricePerMWh * presentWorthFactor(rate, money.studyYears);
  return {
    lossLoadFactor: null,
    energyLostFirstYear: energy,
    lossCostFirstYear: energy.totalMWh * energyPricePerMWh,
    presentValueOfLosses,
  };
}

/** Indexes of the alternatives that have a total, cheapest first; ties keep the order asked. */
export function rankByTotalCost(totalCosts: readonly (number | null)[]): number[] {
  return totalCosts
    .map((total, index) => ({ total, index }))
    .filter((entry): entry is { total: number; index: number } => entry.total !== null)
    .sort((a, b) => a.total - b.total || a.index - b.index)
    .map((entry) => entry.index);
}

/** The energy price moves the planner is shown: 30 % down, as entered, 30 % up. */
export const PRICE_SENSITIVITY_FACTORS = [0.7, 1, 1.3] as const;

export interface PriceCase {
  priceFactor: number;
  energyPricePerMWh: number;
  totalCosts: (number | null)[];
  ranking: number[];
}

export interface PriceSensitivity {
  cases: PriceCase[];
  /** True when the order of the alternatives is not the same at every price. */
  rankingMoves: boolean;
}

export interface LossesForMoney {
  /** Null when the alternative cannot carry the load: it then has no losses to price. */
  loadDependentPeakLossMW: number | null;
  coreLossMW: number | null;
  /** The year's energy from the operating cases' hours; when given, it is priced instead of the peak. */
  energy?: AnnualEnergyLost;
  capitalCost: number;
}

export function priceSensitivity(alternatives: readonly LossesForMoney[], money: MoneyInput): PriceSensitivity {
  const cases = PRICE_SENSITIVITY_FACTORS.map((priceFactor) => {
    const energyPricePerMWh = money.energyPricePerMWh * priceFactor;
    const totalCosts = alternatives.map((a) =>
      a.loadDependentPeakLossMW === null || a.coreLossMW === null
        ? null
        : a.capitalCost +
          (a.energy ? energyMoney(a.energy, money, energyPricePerMWh) : lossMoney(a.loadDependentPeakLossMW, a.coreLossMW, money, energyPricePerMWh))
            .presentValueOfLosses,
    );
    return { priceFactor, energyPricePerMWh, totalCosts, ranking: rankByTotalCost(totalCosts) };
  });
  const orders = cases.map((c) => c.ranking.join(","));
  return { cases, rankingMoves: orders.some((order) => order !== orders[0]) };
}
