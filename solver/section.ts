// The section of a network the voltage ladder re-rates: one voltage level between transformers.
import type { Network } from "#solver/schema.ts";
import { connectedGroups } from "#solver/topology.ts";

export interface FacingWinding {
  transformerId: string;
  /** Which of the transformer's windings is on the section's side. */
  winding: "hv" | "lv";
}

export interface Section {
  /** Present nominal voltage of the section. */
  nominalKV: number;
  /** Buses reached from the chosen bus through lines only, in the network's order. */
  busIds: string[];
  /** Lines with both ends in the section. */
  lineIds: string[];
  /** Transformer windings connected to a section bus (a transformer with both sides here appears twice). */
  facingWindings: FacingWinding[];
  /** Sources connected to a section bus. */
  sourceIds: string[];
  /**
   * Where the section meets the rest of the chain: buses with a facing winding or a source,
   * and buses with at most one line in the section (the open end of a spur). Fault levels
   * are reported here because that is where the switchgear ratings are chosen.
   */
  endBusIds: string[];
}

/** Every bus's section number: buses joined by lines share one; transformers bound them. */
export function sectionGroups(network: Network): { groupOf: (busId: string) => number | undefined; count: number } {
  const { adjacency, group, count } = connectedGroups(network, { linesOnly: true });
  return {
    groupOf: (busId) => {
      const at = adjacency.position.get(busId);
      return at === undefined ? undefined : group[at];
    },
    count,
  };
}

/**
 * The section containing `busId`, or undefined when there is no such bus. Transformers bound
 * it; lines cannot, since a valid network's lines never change voltage level. Linear in the size
 * of the network.
 */
export function findSection(network: Network, busId: string): Section | undefined {
  const { groupOf } = sectionGroups(network);
  const here = groupOf(busId);
  if (here === undefined) return undefined;
  const start = network.buses.find((b) => b.id === busId)!;
  const inSection = (id: string) => groupOf(id) === here;

  const busIds = network.buses.filter((b) => inSection(b.id)).map((b) => b.id);
  const lines = network.lines.filter((l) => inSection(l.fromBus) && inSection(l.toBus));
  const facingWindings: FacingWinding[] = [];
  const boundary = new Set<string>();
  for (const t of network.transformers) {
    if (inSection(t.hvBus)) {
      facingWindings.push({ transformerId: t.id, winding: "hv" });
      boundary.add(t.hvBus);
    }
    if (inSection(t.lvBus)) {
      facingWindings.push({ transformerId: t.id, winding: "lv" });
      boundary.add(t.lvBus);
    }
  }
  const sources = network.sources.filter((s) => inSection(s.bus));
  for (const s of sources) boundary.add(s.bus);

  const linesAtBus = new Map<string, number>();
  for (const l of lines) {
    linesAtBus.set(l.fromBus, (linesAtBus.get(l.fromBus) ?? 0) + 1);
    linesAtBus.set(l.toBus, (linesAtBus.get(l.toBus) ?? 0) + 1);
  }
  const endBusIds = busIds.filter((id) => boundary.has(id) || (linesAtBus.get(id) ?? 0) <= 1);

  return {
    nominalKV: start.nominalKV,
    busIds,
    lineIds: lines.map((l) => l.id),
    facingWindings,
    sourceIds: sources.map((s) => s.id),
    endBusIds,
  };
}
