// Driving-point impedance Z_kk of every node of a sequence network: the diagonal of Y⁻¹, from the
// shared admittance builder, the shared elimination order and the complex selected inverse
// (`solver/sparse/`), with no dense inverse. Two things are particular to fault networks:
// a branch of zero impedance joins its two ends into one node, and a group of nodes with no path
// to the reference (no source, no earth) has no finite Z_kk: it is left out of the elimination
// (identity rows) and reported as not reaching the reference.
import { sequenceAdmittance } from "#solver/admittance.ts";
import { SymbolicCache } from "#solver/sparse/ordering.ts";
import { ComplexSymmetricFactor } from "#solver/sparse/selectedInverse.ts";
import type { DrivingPointImpedances, NodalNetwork } from "./nodalNetwork.ts";

class DisjointSets {
  private readonly parent: Int32Array;
  constructor(size: number) {
    this.parent = new Int32Array(size);
    for (let i = 0; i < size; i++) this.parent[i] = i;
  }
  find(x: number): number {
    let root = x;
    while (this.parent[root] !== root) root = this.parent[root];
    while (this.parent[x] !== root) {
      const next = this.parent[x];
      this.parent[x] = root;
      x = next;
    }
    return root;
  }
  join(a: number, b: number): void {
    this.parent[this.find(a)] = this.find(b);
  }
}

/** `analyses` carries the orderings already made in this solve, so that a network of the same graph is not ordered again. */
export function drivingPointImpedances(network: NodalNetwork, analyses: SymbolicCache = new SymbolicCache()): DrivingPointImpedances {
  const n = network.nodeCount;
  const { branchCount, branchFrom, branchTo, branchZRe, branchZIm, branchRatio } = network;

  const merged = new DisjointSets(n);
  for (let b = 0; b < branchCount; b++)
    if (branchZRe[b] === 0 && branchZIm[b] === 0) {
      if (branchRatio[b] !== 1) throw new Error(`a branch from node ${branchFrom[b]} has a ratio but no impedance`);
      merged.join(branchFrom[b], branchTo[b]);
    }
  const node = new Int32Array(n);
  for (let k = 0; k < n; k++) node[k] = merged.find(k);

  const matrix = sequenceAdmittance(network, node);
  const { rowStart, neighbours, g, b, diagonalG, diagonalB } = matrix;

  // Groups that reach the reference: those holding a shunt (a source or an earth path).
  const connected = new DisjointSets(n);
  for (let k = 0; k < branchCount; k++) connected.join(node[branchFrom[k]], node[branchTo[k]]);
  const earthed = new Uint8Array(n);
  for (let s = 0; s < network.shuntCount; s++) earthed[connected.find(node[network.shuntNode[s]])] = 1;
  const active = new Uint8Array(n);
  for (let k = 0; k < n; k++) active[k] = node[k] === k && earthed[connected.find(k)] ? 1 : 0;

  const factor = new ComplexSymmetricFactor(analyses.analyse(matrix));
  const { diagonalRe, diagonalIm, offRe, offIm } = factor;
  for (let i = 0; i < n; i++) {
    if (!active[i]) {
      diagonalRe[i] = 1;
      continue;
    }
    diagonalRe[i] = diagonalG[i];
    diagonalIm[i] = diagonalB[i];
    for (let e = rowStart[i]; e < rowStart[i + 1]; e++) {
      const j = neighbours[e];
      if (j < i) continue;
      const slot = factor.slotOf(i, j);
      offRe[slot] = g[e];
      offIm[slot] = b[e];
    }
  }
  factor.factorise();
  const inverse = factor.inverseDiagonal();

  const result: DrivingPointImpedances = {
    zRe: new Float64Array(n),
    zIm: new Float64Array(n),
    reachesReference: new Uint8Array(n),
  };
  for (let k = 0; k < n; k++) {
    const rep = node[k];
    if (!active[rep]) continue;
    result.zRe[k] = inverse.zRe[rep];
    result.zIm[k] = inverse.zIm[rep];
    result.reachesReference[k] = 1;
  }
  return result;
}
