// The elimination order shared by every sparse factorisation in the solver, and the pattern of the
// factors it produces. Leaves are peeled first, which gives no fill-in on a radial network and keeps
// the cost linear in the number of buses; what is left (rings, meshes) is ordered by minimum degree
// and carries only the fill its loops need. The symbolic work is done once per graph: the load
// flow's block LU (`blockLu.ts`) and the fault levels' complex elimination (`selectedInverse.ts`)
// both run on a `Symbolic` and allocate nothing while they factorise.

import { MinHeap } from "./minHeap.ts";

/** A symmetric graph in compressed rows, no self-loops, no repeated neighbours. */
export interface Graph {
  nodeCount: number;
  rowStart: Int32Array;
  neighbours: Int32Array;
}

/** The elimination order and the pattern of the factors that it produces. */
export interface Symbolic {
  nodeCount: number;
  /** order[position] = node eliminated at that position. */
  order: Int32Array;
  /** position[node] = when the node is eliminated. */
  position: Int32Array;
  /** Off-diagonal slots of the node eliminated at each position: slotStart[p]..slotStart[p+1]. */
  slotStart: Int32Array;
  /** The later-eliminated node each slot couples to. */
  slotNode: Int32Array;
  /** Fill-in updates between two slots of the same pivot: (lower slot a, upper slot b) → target. */
  updateStart: Int32Array;
  updateLower: Int32Array;
  updateUpper: Int32Array;
  updateTarget: Int32Array;
  /** 1 when the target is an upper slot, 0 when a lower one. */
  updateTargetIsUpper: Uint8Array;
}

/**
 * The analyses of one solve, reused for every matrix of the same graph: the positive-sequence
 * fault network in the maximum and minimum cases, at the equivalent frequency and with a
 * converter's bus shorted all share one pattern, as do the two zero-sequence networks. A graph is
 * compared entry by entry (linear), far cheaper than ordering it again.
 */
export class SymbolicCache {
  private readonly known: { graph: Graph; symbolic: Symbolic }[] = [];

  analyse(graph: Graph): Symbolic {
    for (const entry of this.known) if (sameGraph(entry.graph, graph)) return entry.symbolic;
    const symbolic = analyse(graph);
    this.known.push({ graph: { nodeCount: graph.nodeCount, rowStart: graph.rowStart, neighbours: graph.neighbours }, symbolic });
    return symbolic;
  }
}

function sameGraph(a: Graph, b: Graph): boolean {
  if (a.nodeCount !== b.nodeCount || a.neighbours.length !== b.neighbours.length) return false;
  for (let i = 0; i <= a.nodeCount; i++) if (a.rowStart[i] !== b.rowStart[i]) return false;
  for (let e = 0; e < a.neighbours.length; e++) if (a.neighbours[e] !== b.neighbours[e]) return false;
  return true;
}

/** Orders the nodes (leaves first, then minimum degree) and records the factor pattern. */
export function analyse(graph: Graph): Symbolic {
  const n = graph.nodeCount;
  const { rowStart, neighbours } = graph;
  const order = new Int32Array(n);
  const position = new Int32Array(n).fill(-1);
  const degree = new Int32Array(n);
  for (let i = 0; i < n; i++) degree[i] = rowStart[i + 1] - rowStart[i];

  // Upper neighbours of each eliminated node; leaves have at most one, so most of it stays flat.
  const structOf: number[][] = new Array(n);
  const leafParent = new Int32Array(n).fill(-1);
  let placed = 0;

  const queue = new Int32Array(n);
  let head = 0;
  let tail = 0;
  for (let i = 0; i < n; i++) if (degree[i] <= 1) queue[tail++] = i;
  while (head < tail) {
    const k = queue[head++];
    if (position[k] !== -1) continue;
    position[k] = placed;
    order[placed++] = k;
    for (let e = rowStart[k]; e < rowStart[k + 1]; e++) {
      const j = neighbours[e];
      if (position[j] !== -1) continue;
      leafParent[k] = j;
      degree[j]--;
      if (degree[j] === 1) queue[tail++] = j;
    }
  }

  if (placed < n) placeCoreByMinimumDegree(graph, position, order, placed, structOf);

  const slotStart = new Int32Array(n + 1);
  for (let p = 0; p < n; p++) {
    const k = order[p];
    const count = structOf[k] ? structOf[k].length : leafParent[k] >= 0 ? 1 : 0;
    slotStart[p + 1] = slotStart[p] + count;
  }
  const slotNode = new Int32Array(slotStart[n]);
  for (let p = 0; p < n; p++) {
    const k = order[p];
    const list = structOf[k];
    if (list) list.forEach((j, m) => (slotNode[slotStart[p] + m] = j));
    else if (leafParent[k] >= 0) slotNode[slotStart[p]] = leafParent[k];
  }

  const updateStart = new Int32Array(n + 1);
  const lower: number[] = [];
  const upper: number[] = [];
  const target: number[] = [];
  const targetIsUpper: number[] = [];
  for (let p = 0; p < n; p++) {
    const from = slotStart[p];
    const to = slotStart[p + 1];
    for (let a = from; a < to; a++) {
      for (let b = from; b < to; b++) {
        if (a === b) continue;
        const i = slotNode[a];
        const j = slotNode[b];
        // Entry (i, j) lives with whichever of i and j is eliminated first.
        const iFirst = position[i] < position[j];
        const owner = iFirst ? i : j;
        const other = iFirst ? j : i;
        const slot = findSlot(slotStart, slotNode, position[owner], other);
        lower.push(a);
        upper.push(b);
        target.push(slot);
        targetIsUpper.push(iFirst ? 1 : 0);
      }
    }
    updateStart[p + 1] = lower.length;
  }

  return {
    nodeCount: n,
    order,
    position,
    slotStart,
    slotNode,
    updateStart,
    updateLower: Int32Array.from(lower),
    updateUpper: Int32Array.from(upper),
    updateTarget: Int32Array.from(target),
    updateTargetIsUpper: Uint8Array.from(targetIsUpper),
  };
}

export function findSlot(slotStart: Int32Array, slotNode: Int32Array, ownerPosition: number, node: number): number {
  for (let s = slotStart[ownerPosition]; s < slotStart[ownerPosition + 1]; s++) if (slotNode[s] === node) return s;
  throw new Error("sparse factor pattern is inconsistent: a fill-in entry has no slot");
}

/** Minimum degree on the nodes left after the leaves are peeled (the 2-core: rings and meshes). */
function placeCoreByMinimumDegree(
  graph: Graph,
  position: Int32Array,
  order: Int32Array,
  firstPosition: number,
  structOf: number[][],
): void {
  const { nodeCount: n, rowStart, neighbours } = graph;
  const adjacency = new Map<number, Set<number>>();
  for (let i = 0; i < n; i++) {
    if (position[i] !== -1) continue;
    const set = new Set<number>();
    for (let e = rowStart[i]; e < rowStart[i + 1]; e++) if (position[neighbours[e]] === -1) set.add(neighbours[e]);
    adjacency.set(i, set);
  }
  const heap = new MinHeap();
  for (const [i, set] of adjacency) heap.push(set.size, i);
  let placed = firstPosition;
  while (placed < n) {
    const k = heap.pop();
    const deg = heap.lastKey;
    const set = adjacency.get(k);
    if (!set || set.size !== deg) continue; // stale entry
    position[k] = placed;
    order[placed++] = k;
    const struct = [...set].sort((a, b) => a - b);
    structOf[k] = struct;
    adjacency.delete(k);
    for (const i of struct) {
      const si = adjacency.get(i)!;
      si.delete(k);
      for (const j of struct) if (j !== i) si.add(j);
      heap.push(si.size, i);
    }
  }
}

/** Slot of entry (row, column) of the original pattern: stored with whichever is eliminated first. */
export function slotOf(symbolic: Symbolic, row: number, column: number): number {
  const rowFirst = symbolic.position[row] < symbolic.position[column];
  return findSlot(symbolic.slotStart, symbolic.slotNode, symbolic.position[rowFirst ? row : column], rowFirst ? column : row);
}
