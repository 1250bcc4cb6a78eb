// Sparse LU of a matrix made of 2×2 blocks on a symmetric pattern (the bus graph), without pivoting
// between blocks, on the elimination order of `ordering.ts`: the load flow's Jacobian. The numeric
// factorisation and the solves reuse the symbolic work and allocate nothing.
import { slotOf, type Symbolic } from "./ordering.ts";

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
    return slotOf(this.symbolic, row, column);
  }

  /** True when block (row, column) lives in `upper` (the row is eliminated first), false for `lower`. */
  isUpper(row: number, column: number): boolean {
    return this.symbolic.position[row] < this.symbolic.position[column];
  }
}
