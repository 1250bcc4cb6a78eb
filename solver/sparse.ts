// Sparse LU of a matrix made of 2×2 blocks on a symmetric pattern (the bus graph), without pivoting
// between blocks. The elimination order peels leaves first, which gives no fill-in on a radial
// network, then orders what is left (the rings) by minimum degree. The symbolic work is done once;
// the numeric factorisation and the solves reuse it and allocate nothing.

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

function findSlot(slotStart: Int32Array, slotNode: Int32Array, ownerPosition: number, node: number): number {
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

/**
 * Numeric values of a 2×2-block matrix on the pattern of a `Symbolic`, factorised in place.
 * Blocks are stored row-major [a, b, c, d]. `lower` holds block (slotNode, pivot), `upper` block
 * (pivot, slotNode), `diagonal` block (node, node), all indexed by slot or node times 4.
 */
export class BlockFactor {
  readonly lower: Float64Array;
  readonly upper: Float64Array;
  /** Diagonal blocks; after `factorise` each holds the inverse of its pivot block. */
  readonly diagonal: Float64Array;

  constructor(readonly symbolic: Symbolic) {
    const slots = symbolic.slotStart[symbolic.nodeCount];
    this.lower = new Float64Array(4 * slots);
    this.upper = new Float64Array(4 * slots);
    this.diagonal = new Float64Array(4 * symbolic.nodeCount);
  }

  /** Factorises in place; false when a pivot block is singular (the matrix has no inverse). */
  factorise(): boolean {
    const s = this.symbolic;
    const { lower, upper, diagonal } = this;
    const { order, slotStart, slotNode, updateStart, updateLower, updateUpper, updateTarget, updateTargetIsUpper } = s;
    for (let p = 0; p < s.nodeCount; p++) {
      const k = order[p];
      const d = 4 * k;
      const a = diagonal[d];
      const b = diagonal[d + 1];
      const c = diagonal[d + 2];
      const e = diagonal[d + 3];
      const det = a * e - b * c;
      const scale = Math.abs(a) + Math.abs(b) + Math.abs(c) + Math.abs(e);
      if (!(Math.abs(det) > 1e-14 * scale * scale) || !Number.isFinite(det)) return false;
      const i0 = e / det;
      const i1 = -b / det;
      const i2 = -c / det;
      const i3 = a / det;
      diagonal[d] = i0;
      diagonal[d + 1] = i1;
      diagonal[d + 2] = i2;
      diagonal[d + 3] = i3;
      for (let slot = slotStart[p]; slot < slotStart[p + 1]; slot++) {
        const q = 4 * slot;
        // L = A(i,k) · D⁻¹
        const l0 = lower[q] * i0 + lower[q + 1] * i2;
        const l1 = lower[q] * i1 + lower[q + 1] * i3;
        const l2 = lower[q + 2] * i0 + lower[q + 3] * i2;
        const l3 = lower[q + 2] * i1 + lower[q + 3] * i3;
        lower[q] = l0;
        lower[q + 1] = l1;
        lower[q + 2] = l2;
        lower[q + 3] = l3;
        const u0 = upper[q];
        const u1 = upper[q + 1];
        const u2 = upper[q + 2];
        const u3 = upper[q + 3];
        const t = 4 * slotNode[slot];
        diagonal[t] -= l0 * u0 + l1 * u2;
        diagonal[t + 1] -= l0 * u1 + l1 * u3;
        diagonal[t + 2] -= l2 * u0 + l3 * u2;
        diagonal[t + 3] -= l2 * u1 + l3 * u3;
      }
      for (let m = updateStart[p]; m < updateStart[p + 1]; m++) {
        const ql = 4 * updateLower[m];
        const qu = 4 * updateUpper[m];
        const target = updateTargetIsUpper[m] ? upper : lower;
        const t = 4 * updateTarget[m];
        target[t] -= lower[ql] * upper[qu] + lower[ql + 1] * upper[qu + 2];
        target[t + 1] -= lower[ql] * upper[qu + 1] + lower[ql + 1] * upper[qu + 3];
        target[t + 2] -= lower[ql + 2] * upper[qu] + lower[ql + 3] * upper[qu + 2];
        target[t + 3] -= lower[ql + 2] * upper[qu + 1] + lower[ql + 3] * upper[qu + 3];
      }
    }
    return true;
  }

  /** Solves A·x = rhs in place (rhs holds two entries per node, node-indexed). */
  solve(rhs: Float64Array): void {
    const s = this.symbolic;
    const { lower, upper, diagonal: inverse } = this;
    const { order, slotStart, slotNode } = s;
    const n = s.nodeCount;
    for (let p = 0; p < n; p++) {
      const k = 2 * order[p];
      const y0 = rhs[k];
      const y1 = rhs[k + 1];
      for (let slot = slotStart[p]; slot < slotStart[p + 1]; slot++) {
        const q = 4 * slot;
        const i = 2 * slotNode[slot];
        rhs[i] -= lower[q] * y0 + lower[q + 1] * y1;
        rhs[i + 1] -= lower[q + 2] * y0 + lower[q + 3] * y1;
      }
    }
    for (let p = n - 1; p >= 0; p--) {
      const node = order[p];
      const k = 2 * node;
      let y0 = rhs[k];
      let y1 = rhs[k + 1];
      for (let slot = slotStart[p]; slot < slotStart[p + 1]; slot++) {
        const q = 4 * slot;
        const i = 2 * slotNode[slot];
        y0 -= upper[q] * rhs[i] + upper[q + 1] * rhs[i + 1];
        y1 -= upper[q + 2] * rhs[i] + upper[q + 3] * rhs[i + 1];
      }
      const d = 4 * node;
      rhs[k] = inverse[d] * y0 + inverse[d + 1] * y1;
      rhs[k + 1] = inverse[d + 2] * y0 + inverse[d + 3] * y1;
    }
  }

  /** Slot of block (row, column) of the original pattern: stored with whichever is eliminated first. */
  slotOf(row: number, column: number): number {
    const s = this.symbolic;
    const rowFirst = s.position[row] < s.position[column];
    return findSlot(s.slotStart, s.slotNode, s.position[rowFirst ? row : column], rowFirst ? column : row);
  }

  /** True when block (row, column) lives in `upper` (the row is eliminated first), false for `lower`. */
  isUpper(row: number, column: number): boolean {
    return this.symbolic.position[row] < this.symbolic.position[column];
  }
}
