// The envelope across operating cases: for each bus its lowest and highest voltage, for each rated
// branch its highest loading, each with the case that sets it. The first case wins a tie.
import type { CaseResult, Envelope } from "#solver/study/results.ts";

export function envelopeOf(cases: readonly CaseResult[]): Envelope {
  const buses = new Map<string, Envelope["buses"][number]>();
  const branches = new Map<string, Envelope["branches"][number]>();
  for (const c of cases) {
    if (!c.loadFlow.converged) continue;
    for (const b of c.loadFlow.buses) {
      const seen = buses.get(b.id);
      if (!seen) buses.set(b.id, { id: b.id, vMinPu: b.vPu, vMinCase: c.id, vMaxPu: b.vPu, vMaxCase: c.id });
      else {
        if (b.vPu < seen.vMinPu) Object.assign(seen, { vMinPu: b.vPu, vMinCase: c.id });
        if (b.vPu > seen.vMaxPu) Object.assign(seen, { vMaxPu: b.vPu, vMaxCase: c.id });
      }
    }
    for (const br of c.loadFlow.branches) {
      if (br.loadingPct === null) continue;
      const seen = branches.get(br.id);
      if (!seen) branches.set(br.id, { id: br.id, maxLoadingPct: br.loadingPct, maxLoadingCase: c.id });
      else if (br.loadingPct > seen.maxLoadingPct) Object.assign(seen, { maxLoadingPct: br.loadingPct, maxLoadingCase: c.id });
    }
  }
  return { buses: [...buses.values()], branches: [...branches.values()] };
}
