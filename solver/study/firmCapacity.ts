// Firm capacity of a substation: transformers in parallel between the same two busbars hold their
// load with the largest unit out (installed less the largest unit; common practice for N-1).
import type { Network } from "#solver/schema.ts";
import type { CaseResult, FirmCapacity } from "#solver/study/results.ts";

export function firmCapacities(network: Network, cases: readonly CaseResult[]): FirmCapacity[] {
  const groups = new Map<string, Network["transformers"]>();
  for (const t of network.transformers) {
    const key = `${t.hvBus}\u0000${t.lvBus}`;
    groups.set(key, [...(groups.get(key) ?? []), t]);
  }
  return [...groups.values()]
    .filter((group) => group.length > 1)
    .map((group) => {
      const installedMVA = group.reduce((sum, t) => sum + t.ratedMVA, 0);
      const firmMVA = installedMVA - Math.max(...group.map((t) => t.ratedMVA));
      const ids = new Set(group.map((t) => t.id));
      let peakDemandMVA = 0;
      let peakCase = cases[0]?.id ?? "";
      for (const c of cases) {
        if (!c.loadFlow.converged) continue;
        const demand = c.loadFlow.branches
          .filter((b) => ids.has(b.id))
          .reduce((sum, b) => sum + Math.max(Math.hypot(b.pFromMW, b.qFromMvar), Math.hypot(b.pToMW, b.qToMvar)), 0);
        if (demand > peakDemandMVA) [peakDemandMVA, peakCase] = [demand, c.id];
      }
      return {
        hvBus: group[0].hvBus,
        lvBus: group[0].lvBus,
        transformers: group.map((t) => t.id),
        installedMVA,
        firmMVA,
        peakDemandMVA,
        peakCase,
        withinFirm: peakDemandMVA <= firmMVA,
      };
    });
}
