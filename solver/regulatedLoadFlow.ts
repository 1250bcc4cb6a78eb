// The load flow as every caller sees it: converter plants at a set power factor turned into their
// P and Q, then Newton–Raphson inside the on-load tap changers' loop, and each transformer's
// branch reading told the tap it ended on.
import { runLoadFlow } from "#solver/loadFlow/index.ts";
import type { LoadFlowResult } from "#solver/results.ts";
import type { Network, Source } from "#solver/schema.ts";
import { regulateTaps } from "#solver/tapControl.ts";

/** Q of a source at power factor cos φ: P·tan φ, + supplying reactive power, − absorbing it. */
export function powerFactorQMvar(pMW: number, powerFactor: number): number {
  const cos = Math.abs(powerFactor);
  return Math.sign(powerFactor) * Math.abs(pMW) * (Math.sqrt(1 - cos * cos) / cos);
}

function dispatched(source: Source): Source {
  if (source.control !== "pf" || source.powerFactor === undefined) return source;
  return { ...source, control: "pq", qMvar: powerFactorQMvar(source.pMW, source.powerFactor) };
}

export function regulatedLoadFlow(network: Network): LoadFlowResult {
  const scheduled = network.sources.some((s) => s.control === "pf") ? { ...network, sources: network.sources.map(dispatched) } : network;
  const regulated = regulateTaps(scheduled, runLoadFlow);
  if (!regulated.result.converged) return regulated.result;
  const taps = new Map(regulated.taps.map((t) => [t.transformerId, t]));
  const drawn = new Map(regulated.network.transformers.map((t) => [t.id, t.tapPct]));
  return {
    ...regulated.result,
    branches: regulated.result.branches.map((b) => {
      if (b.kind !== "transformer") return b;
      const tap = taps.get(b.id);
      return tap ? { ...b, tapPct: tap.tapPct, tapLimited: tap.tapLimited } : { ...b, tapPct: drawn.get(b.id) ?? 0 };
    }),
  };
}
