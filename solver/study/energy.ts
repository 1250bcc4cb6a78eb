// Energy lost in a year across the operating cases: Σ case loss × case hours. Without hours on any
// case, the fallback prices the peak case's loss by the loss load factor (economics.ts).
import type { Network } from "#solver/schema.ts";
import type { LoadFlowResult } from "#solver/results.ts";
import { annualEnergyLost, HOURS_PER_YEAR, lossLoadFactor } from "#solver/economics.ts";
import type { CaseResult, Energy } from "#solver/study/results.ts";

export interface LoadFactorInput {
  loadFactor: number;
  lossLoadFactorK: number;
}

/**
 * Core loss of the transformers in service in a solved network (MW): a shunt conductance at the
 * HV terminal, so it follows the square of that terminal's voltage.
 */
export function transformerCoreLossMW(network: Network, loadFlow: LoadFlowResult): number {
  const vPu = new Map(loadFlow.buses.map((b) => [b.id, b.vPu]));
  const inService = new Set(loadFlow.branches.filter((b) => b.kind === "transformer").map((b) => b.id));
  return network.transformers.reduce(
    (sum, t) => (inService.has(t.id) ? sum + ((t.noLoadLossKW ?? 0) * (vPu.get(t.hvBus) ?? 1) ** 2) / 1000 : sum),
    0,
  );
}

export function energyOf(network: Network, cases: readonly CaseResult[], fallback: LoadFactorInput): Energy {
  const byCase = cases.map((c) => {
    const lossMW = c.loadFlow.converged ? c.loadFlow.totals.lossMW : 0;
    const coreLossMW = c.loadFlow.converged ? transformerCoreLossMW(network, c.loadFlow) : 0;
    const hoursPerYear = c.hoursPerYear ?? null;
    return { case: c.id, lossMW, coreLossMW, hoursPerYear, lossMWh: hoursPerYear === null ? null : lossMW * hoursPerYear };
  });
  const withHours = byCase.filter((c) => c.hoursPerYear !== null);
  if (withHours.length > 0) {
    const lossMWhPerYear = withHours.reduce((sum, c) => sum + c.lossMWh!, 0);
    const coreMWh = withHours.reduce((sum, c) => sum + c.coreLossMW * c.hoursPerYear!, 0);
    return {
      method: "case-hours",
      lossMWhPerYear,
      loadDependentMWh: lossMWhPerYear - coreMWh,
      coreMWh,
      hoursCovered: withHours.reduce((sum, c) => sum + c.hoursPerYear!, 0),
      byCase,
    };
  }

  // The case carrying the most load stands for the peak.
  const peak = cases.reduce<CaseResult | undefined>(
    (best, c) => (c.loadFlow.converged && (!best || c.loadFlow.totals.loadMW > best.loadFlow.totals.loadMW) ? c : best),
    undefined,
  );
  const llf = lossLoadFactor(fallback.loadFactor, fallback.lossLoadFactorK);
  const coreMW = peak ? transformerCoreLossMW(network, peak.loadFlow) : 0;
  const energy = annualEnergyLost(peak ? peak.loadFlow.totals.lossMW - coreMW : 0, coreMW, llf);
  return {
    method: "loss-load-factor",
    lossMWhPerYear: energy.totalMWh,
    loadDependentMWh: energy.loadDependentMWh,
    coreMWh: energy.coreMWh,
    hoursCovered: HOURS_PER_YEAR,
    byCase,
    peakCase: peak?.id,
    loadFactor: fallback.loadFactor,
    lossLoadFactor: llf,
  };
}
