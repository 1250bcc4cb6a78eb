// The chain from the slack source to a chosen bus, for the voltage profile: buses in order along
// the branches, found by a breadth-first walk (in a radial network the path is unique).
import type { Network } from "#solver/schema.ts";

export function slackBusIds(doc: Network): string[] {
  return doc.sources.filter((s) => s.control === "slack").map((s) => s.bus);
}

/** Bus ids from the slack bus of `endBusId`'s group to `endBusId`, or [] when there is none. */
export function chainTo(doc: Network, endBusId: string): string[] {
  const neighbours = new Map<string, string[]>();
  const link = (a: string, b: string) => {
    neighbours.set(a, [...(neighbours.get(a) ?? []), b]);
    neighbours.set(b, [...(neighbours.get(b) ?? []), a]);
  };
  doc.lines.forEach((l) => link(l.fromBus, l.toBus));
  doc.transformers.forEach((t) => link(t.hvBus, t.lvBus));
  const previous = new Map<string, string | null>();
  const queue = slackBusIds(doc).filter((id) => doc.buses.some((b) => b.id === id));
  queue.forEach((id) => previous.set(id, null));
  while (queue.length) {
    const bus = queue.shift()!;
    if (bus === endBusId) break;
    for (const next of neighbours.get(bus) ?? []) {
      if (!previous.has(next)) {
        previous.set(next, bus);
        queue.push(next);
      }
    }
  }
  if (!previous.has(endBusId)) return [];
  const path: string[] = [];
  for (let at: string | null = endBusId; at !== null; at = previous.get(at) ?? null) path.unshift(at);
  return path;
}

/** Buses that end a chain (touched by one branch only), the natural ends of a profile. */
export function chainEnds(doc: Network): string[] {
  const degree = new Map<string, number>();
  const bump = (id: string) => degree.set(id, (degree.get(id) ?? 0) + 1);
  doc.lines.forEach((l) => (bump(l.fromBus), bump(l.toBus)));
  doc.transformers.forEach((t) => (bump(t.hvBus), bump(t.lvBus)));
  const slack = new Set(slackBusIds(doc));
  return doc.buses.filter((b) => degree.get(b.id) === 1 && !slack.has(b.id)).map((b) => b.id);
}
