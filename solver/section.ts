// The section of a network the voltage ladder re-rates: one voltage level between transformers.
import type { Network } from "#solver/schema.ts";

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

/**
 * The section containing `busId`, or undefined when there is no such bus. Transformers bound
 * it; lines cannot, since a valid network's lines never change voltage level.
 */
export function findSection(network: Network, busId: string): Section | undefined {
  const start = network.buses.find((b) => b.id === busId);
  if (!start) return undefined;

  const neighbours = new Map<string, string[]>();
  for (const line of network.lines) {
    neighbours.set(line.fromBus, [...(neighbours.get(line.fromBus) ?? []), line.toBus]);
    neighbours.set(line.toBus, [...(neighbours.get(line.toBus) ?? []), line.fromBus]);
  }
  const reached = new Set([start.id]);
  const queue = [start.id];
  while (queue.length > 0) {
    for (const next of neighbours.get(queue.shift()!) ?? []) {
      if (!reached.has(next)) {
        reached.add(next);
        queue.push(next);
      }
    }
  }

  const busIds = network.buses.filter((b) => reached.has(b.id)).map((b) => b.id);
  const lines = network.lines.filter((l) => reached.has(l.fromBus) && reached.has(l.toBus));
  const facingWindings: FacingWinding[] = [];
  for (const t of network.transformers) {
    if (reached.has(t.hvBus)) facingWindings.push({ transformerId: t.id, winding: "hv" });
    if (reached.has(t.lvBus)) facingWindings.push({ transformerId: t.id, winding: "lv" });
  }
  const sources = network.sources.filter((s) => reached.has(s.bus));

  const linesAtBus = (id: string) => lines.filter((l) => l.fromBus === id || l.toBus === id).length;
  const boundary = new Set([
    ...facingWindings.map((w) => {
      const t = network.transformers.find((tr) => tr.id === w.transformerId)!;
      return w.winding === "hv" ? t.hvBus : t.lvBus;
    }),
    ...sources.map((s) => s.bus),
  ]);
  const endBusIds = busIds.filter((id) => boundary.has(id) || linesAtBus(id) <= 1);

  return {
    nominalKV: start.nominalKV,
    busIds,
    lineIds: lines.map((l) => l.id),
    facingWindings,
    sourceIds: sources.map((s) => s.id),
    endBusIds,
  };
}
