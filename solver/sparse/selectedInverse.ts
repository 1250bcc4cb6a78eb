// Diagonal of Z = Y⁻¹ for a sparse complex-symmetric matrix (a sequence network's nodal
// admittance), without forming the inverse: Y = L·D·Lᵀ on the elimination order of `ordering.ts`,
// then the selected inverse (Takahashi's recurrence), which touches only the filled pattern of L.
// On a radial network both steps are linear in the number of buses.
//
// No pivoting is needed: every admittance here is (r − jx)/(r² + x²) with r, x ≥ 0, so
// e^{jπ/4}·Y has a positive definite real part and every pivot stays away from zero.
import { findSlot, slotOf, type Symbolic } from "./ordering.ts";

export class ComplexSymmetricFactor {
  /** Per node: the diagonal of Y, then the pivot d after `factorise`. */
  readonly diagonalRe: Float64Array;
  readonly diagonalIm: Float64Array;
  /** Per slot: entry (slotNode, pivot) of Y, then L's entry there after `factorise`. */
  readonly offRe: Float64Array;
  readonly offIm: Float64Array;

  constructor(readonly symbolic: Symbolic) {
    const slots = symbolic.slotStart[symbolic.nodeCount];
    this.diagonalRe = new Float64Array(symbolic.nodeCount);
    this.diagonalIm = new Float64Array(symbolic.nodeCount);
    this.offRe = new Float64Array(slots);
    this.offIm = new Float64Array(slots);
  }

  /** Slot of entry (row, column) = (column, row) of the original pattern. */
  slotOf(row: number, column: number): number {
    return slotOf(this.symbolic, row, column);
  }

  /** Y = L·D·Lᵀ in place. Throws on a zero pivot, which a network of real impedances never gives. */
  factorise(): void {
    const s = this.symbolic;
    const { diagonalRe, diagonalIm, offRe, offIm } = this;
    const { order, slotStart, slotNode, updateStart, updateLower, updateUpper, updateTarget, updateTargetIsUpper } = s;
    for (let p = 0; p < s.nodeCount; p++) {
      const k = order[p];
      const dRe = diagonalRe[k];
      const dIm = diagonalIm[k];
      const dMag2 = dRe * dRe + dIm * dIm;
      if (!(dMag2 > 0)) throw new Error(`zero pivot at node ${k}`);
      for (let slot = slotStart[p]; slot < slotStart[p + 1]; slot++) {
        // l = a / d; the neighbour's diagonal takes a_jj −= l·a.
        const aRe = offRe[slot];
        const aIm = offIm[slot];
        const lRe = (aRe * dRe + aIm * dIm) / dMag2;
        const lIm = (aIm * dRe - aRe * dIm) / dMag2;
        offRe[slot] = lRe;
        offIm[slot] = lIm;
        const j = slotNode[slot];
        diagonalRe[j] -= lRe * aRe - lIm * aIm;
        diagonalIm[j] -= lRe * aIm + lIm * aRe;
      }
      // Fill between two later neighbours i, j: a_ij −= l_i·d·l_j. The pattern lists each ordered
      // pair; the symmetric entry is met once, where it lives in the lower slots.
      for (let m = updateStart[p]; m < updateStart[p + 1]; m++) {
        if (updateTargetIsUpper[m]) continue;
        const a = updateLower[m];
        const b = updateUpper[m];
        const ldRe = offRe[a] * dRe - offIm[a] * dIm;
        const ldIm = offRe[a] * dIm + offIm[a] * dRe;
        const t = updateTarget[m];
        offRe[t] -= ldRe * offRe[b] - ldIm * offIm[b];
        offIm[t] -= ldRe * offIm[b] + ldIm * offRe[b];
      }
    }
  }

  /**
   * The diagonal of Y⁻¹ after `factorise`, last pivot first:
   *   Z_vj = −Σ_k l_kv·Z_kj (j among v's later neighbours),  Z_vv = 1/d_v − Σ_k l_kv·Z_kv.
   * Every Z_kj needed lies on the filled pattern, kept per slot beside L.
   */
  inverseDiagonal(): { zRe: Float64Array; zIm: Float64Array } {
    const s = this.symbolic;
    const n = s.nodeCount;
    const { diagonalRe, diagonalIm, offRe, offIm } = this;
    const { order, position, slotStart, slotNode } = s;
    const zRe = new Float64Array(n);
    const zIm = new Float64Array(n);
    const zOffRe = new Float64Array(offRe.length);
    const zOffIm = new Float64Array(offIm.length);
    for (let p = n - 1; p >= 0; p--) {
      const v = order[p];
      const begin = slotStart[p];
      const end = slotStart[p + 1];
      for (let q = begin; q < end; q++) {
        const j = slotNode[q];
        let sumRe = 0;
        let sumIm = 0;
        for (let t = begin; t < end; t++) {
          const k = slotNode[t];
          let re: number;
          let im: number;
          if (k === j) {
            re = zRe[j];
            im = zIm[j];
          } else {
            const kFirst = position[k] < position[j];
            const slot = findSlot(slotStart, slotNode, position[kFirst ? k : j], kFirst ? j : k);
            re = zOffRe[slot];
            im = zOffIm[slot];
          }
          sumRe += offRe[t] * re - offIm[t] * im;
          sumIm += offRe[t] * im + offIm[t] * re;
        }
        zOffRe[q] = -sumRe;
        zOffIm[q] = -sumIm;
      }
      const dRe = diagonalRe[v];
      const dIm = diagonalIm[v];
      const dMag2 = dRe * dRe + dIm * dIm;
      let re = dRe / dMag2;
      let im = -dIm / dMag2;
      for (let t = begin; t < end; t++) {
        re -= offRe[t] * zOffRe[t] - offIm[t] * zOffIm[t];
        im -= offRe[t] * zOffIm[t] + offIm[t] * zOffRe[t];
      }
      zRe[v] = re;
      zIm[v] = im;
    }
    return { zRe, zIm };
  }
}
