// How buses connect: the branch adjacency of a network and the walks over it that the sheet, the
// ladder, the report and the voltage ladder's sections share. Every walk is iterative and linear
// in the number of buses and branches, so a 100,000-bus feeder neither overflows the stack nor
// slows to quadratic time.
import type { Network } from "#solver/schema.ts";

type Topology = Pick<Network, "buses" | "lines" | "transformers" | "sources">;

/**
 * The buses by position and, for each, its neighbours through branches in compressed rows:
 * neighbours of bus i are `neighbour[start[i]] … neighbour[start[i + 1] - 1]`, lines before
 * transformers, in file order. Branches naming an unknown bus are left out.
 */
export interface Adjacency {
  busIds: string[];
  position: Map<string, number>;
  start: Int32Array;
  neighbour: Int32Array;
}

export function branchAdjacency(network: Topology, options: { linesOnly?: boolean } = {}): Adjacency {
  const busIds = network.buses.map((b) => b.id);
  const position = new Map<string, number>();
  busIds.forEach((id, i) => {
    if (!position.has(id)) position.set(id, i);
  });
  const ends: [number, number][] = [];
  const add = (a: string, b: string) => {
    const i = position.get(a);
    const j = position.get(b);
    if (i !== undefined && j !== undefined) ends.push([i, j]);
  };
  for (const l of network.lines) add(l.fromBus, l.toBus);
  if (!options.linesOnly) for (const t of network.transformers) add(t.hvBus, t.lvBus);
  const start = new Int32Array(busIds.length + 1);
  for (const [i, j] of ends) {
    start[i + 1]++;
    start[j + 1]++;
  }
  for (let i = 0; i < busIds.length; i++) start[i + 1] += start[i];
  const fill = start.slice(0, busIds.length);
  const neighbour = new Int32Array(start[busIds.length]);
  for (const [i, j] of ends) {
    neighbour[fill[i]++] = j;
    neighbour[fill[j]++] = i;
  }
  return { busIds, position, start, neighbour };
}

export function slackBusIds(network: Pick<Network, "sources">): string[] {
  return network.sources.filter((s) => s.control === "slack").map((s) => s.bus);
}

/**
 * Breadth first from the given buses: for every bus reached, the bus it was reached from
 * (-1 for a starting bus; -2 for a bus not reached).
 */
function breadthFirst(adjacency: Adjacency, starts: number[]): Int32Array {
  const previous = new Int32Array(adjacency.busIds.length).fill(-2);
  const queue = new Int32Array(adjacency.busIds.length);
  let head = 0;
  let tail = 0;
  for (const s of starts) {
    if (previous[s] !== -2) continue;
    previous[s] = -1;
    queue[tail++] = s;
  }
  while (head < tail) {
    const bus = queue[head++];
    for (let k = adjacency.start[bus]; k < adjacency.start[bus + 1]; k++) {
      const next = adjacency.neighbour[k];
      if (previous[next] === -2) {
        previous[next] = bus;
        queue[tail++] = next;
      }
    }
  }
  return previous;
}

/**
 * The chain a voltage profile is drawn along: bus ids from the slack bus of `endBusId`'s group to
 * `endBusId`, fewest branches first (in a radial network the path is unique); [] when no slack
 * source reaches it.
 */
export function chainTo(network: Topology, endBusId: string): string[] {
  const adjacency = branchAdjacency(network);
  const end = adjacency.position.get(endBusId);
  if (end === undefined) return [];
  const starts = slackBusIds(network).flatMap((id) => adjacency.position.get(id) ?? []);
  const previous = breadthFirst(adjacency, starts);
  if (previous[end] === -2) return [];
  const path: string[] = [];
  for (let at = end; at >= 0; at = previous[at]) path.push(adjacency.busIds[at]);
  return path.reverse();
}

/** Buses that end a chain (touched by one branch only, and not a slack bus): a profile's natural ends. */
export function chainEnds(network: Topology): string[] {
  const adjacency = branchAdjacency(network);
  const slack = new Set(slackBusIds(network));
  return adjacency.busIds.filter((id, i) => adjacency.position.get(id) === i && adjacency.start[i + 1] - adjacency.start[i] === 1 && !slack.has(id));
}

/**
 * Connected groups: for every bus position, the number of its group (groups numbered in the
 * order of their first bus). With `linesOnly`, transformers separate groups: each group is then
 * one voltage level, the voltage ladder's section.
 */
export function connectedGroups(network: Topology, options: { linesOnly?: boolean } = {}): { adjacency: Adjacency; group: Int32Array; count: number } {
  const adjacency = branchAdjacency(network, options);
  const n = adjacency.busIds.length;
  const group = new Int32Array(n).fill(-1);
  const stack = new Int32Array(n);
  let count = 0;
  for (let s = 0; s < n; s++) {
    if (group[s] !== -1) continue;
    let top = 0;
    stack[top++] = s;
    group[s] = count;
    while (top > 0) {
      const bus = stack[--top];
      for (let k = adjacency.start[bus]; k < adjacency.start[bus + 1]; k++) {
        const next = adjacency.neighbour[k];
        if (group[next] === -1) {
          group[next] = count;
          stack[top++] = next;
        }
      }
    }
    count++;
  }
  return { adjacency, group, count };
}

/**
 * Each bus's distance in branches from the nearest slack source; a group without a slack counts
 * from its first bus. The order a left-to-right arrangement follows.
 */
export function distanceFromSlack(network: Topology): Map<string, number> {
  const adjacency = branchAdjacency(network);
  const n = adjacency.busIds.length;
  const distance = new Int32Array(n).fill(-1);
  const queue = new Int32Array(n);
  let head = 0;
  let tail = 0;
  const start = (at: number | undefined) => {
    if (at === undefined || distance[at] !== -1) return;
    distance[at] = 0;
    queue[tail++] = at;
  };
  const spread = () => {
    while (head < tail) {
      const bus = queue[head++];
      for (let k = adjacency.start[bus]; k < adjacency.start[bus + 1]; k++) {
        const next = adjacency.neighbour[k];
        if (distance[next] === -1) {
          distance[next] = distance[bus] + 1;
          queue[tail++] = next;
        }
      }
    }
  };
  for (const id of slackBusIds(network)) start(adjacency.position.get(id));
  spread();
  for (let i = 0; i < n; i++) {
    start(adjacency.position.get(adjacency.busIds[i]));
    spread();
  }
  const byId = new Map<string, number>();
  adjacency.busIds.forEach((id, i) => {
    if (!byId.has(id)) byId.set(id, distance[i]);
  });
  return byId;
}
