// An operating case applied to a network: the plain network the solver sees in that case. Loads
// scaled, dispatch overridden, elements out of service removed, and whatever that leaves without
// a path to a slack source removed too, its load counted as lost. No physics here: the result
// is solved like any drawn network.
import type { Network, OperatingCase } from "#solver/schema.ts";

/** A network without cases is studied as one case, the network as drawn. */
export const AS_DRAWN: OperatingCase = { id: "as-drawn", name: "As drawn", loadScale: 1 };

export function operatingCases(network: Network): OperatingCase[] {
  return network.cases && network.cases.length > 0 ? network.cases : [AS_DRAWN];
}

export interface CaseAdjustment {
  /** Extra elements out of service, e.g. the outage under study. */
  outOfService?: readonly string[];
  /** Every load's P and Q times this on top of the case's own scales (load growth). */
  loadGrowthFactor?: number;
}

export interface AppliedCase {
  /** The network as in the case, without cases or growth, ready to solve; null when no bus is energised. */
  document: Network | null;
  lostLoadMW: number;
  deenergisedBuses: string[];
}

export function applyCase(network: Network, operatingCase: OperatingCase, adjustment: CaseAdjustment = {}): AppliedCase {
  const out = new Set([...(operatingCase.outOfService ?? []), ...(adjustment.outOfService ?? [])]);
  const growth = adjustment.loadGrowthFactor ?? 1;
  const overrides = operatingCase.sources ?? {};

  const sources = network.sources
    .filter((s) => !out.has(s.id) && overrides[s.id]?.inService !== false)
    .map((s) => {
      const o = overrides[s.id];
      if (!o) return s;
      return {
        ...s,
        pMW: o.pMW ?? s.pMW,
        qMvar: o.qMvar ?? s.qMvar,
        voltagePu: o.voltagePu ?? s.voltagePu,
      };
    });
  const loads = network.loads
    .filter((l) => !out.has(l.id))
    .map((l) => {
      const factor = (operatingCase.loads?.[l.id] ?? operatingCase.loadScale) * growth;
      return factor === 1 ? l : { ...l, pMW: l.pMW * factor, qMvar: l.qMvar * factor };
    });
  const lines = network.lines.filter((l) => !out.has(l.id));
  const transformers = network.transformers.filter((t) => !out.has(t.id));
  const shunts = network.shunts.filter((s) => !out.has(s.id));

  const energised = energisedBuses(
    network.buses.map((b) => b.id),
    [...lines.map((l) => [l.fromBus, l.toBus] as const), ...transformers.map((t) => [t.hvBus, t.lvBus] as const)],
    sources.filter((s) => s.control === "slack").map((s) => s.bus),
  );
  const live = (bus: string) => energised.has(bus);
  const deenergisedBuses = network.buses.filter((b) => !live(b.id)).map((b) => b.id);
  const lostLoadMW = loads.filter((l) => !live(l.bus)).reduce((sum, l) => sum + l.pMW, 0);
  if (energised.size === 0) return { document: null, lostLoadMW, deenergisedBuses };

  const { cases: _cases, growth: _growth, ...plain } = network;
  return {
    document: {
      ...plain,
      buses: network.buses.filter((b) => live(b.id)),
      sources: sources.filter((s) => live(s.bus)),
      loads: loads.filter((l) => live(l.bus)),
      shunts: shunts.filter((s) => live(s.bus)),
      lines: lines.filter((l) => live(l.fromBus)),
      transformers: transformers.filter((t) => live(t.hvBus)),
    },
    lostLoadMW,
    deenergisedBuses,
  };
}

/** Buses joined to a slack bus through in-service branches: a breadth-first walk of the topology. */
function energisedBuses(busIds: readonly string[], branches: readonly (readonly [string, string])[], slackBuses: readonly string[]): Set<string> {
  const neighbours = new Map<string, string[]>(busIds.map((id) => [id, []]));
  for (const [a, b] of branches) {
    neighbours.get(a)?.push(b);
    neighbours.get(b)?.push(a);
  }
  const reached = new Set(slackBuses.filter((bus) => neighbours.has(bus)));
  const queue = [...reached];
  for (let head = 0; head < queue.length; head++)
    for (const next of neighbours.get(queue[head])!)
      if (!reached.has(next)) {
        reached.add(next);
        queue.push(next);
      }
  return reached;
}
