// A sequence network as the sparse solver sees it: nodes, series branches (each with an ideal
// real-ratio transformer at its `from` end) and shunt impedances to the reference (earth, or the
// shorted sources behind their impedances).

export interface NodalBranch {
  from: number;
  to: number;
  /** Series impedance in per unit, seen from the `to` end. */
  zRe: number;
  zIm: number;
  /** Ideal ratio ratioFrom : 1 between the `from` node and the series impedance (1 for lines). */
  ratioFrom: number;
}

export interface NodalShunt {
  node: number;
  zRe: number;
  zIm: number;
}

export interface NodalNetwork {
  nodeCount: number;
  branches: NodalBranch[];
  shunts: NodalShunt[];
}

/** Driving-point impedance Z_kk of every node; `reachesReference` false where Z_kk is unbounded. */
export interface DrivingPointImpedances {
  zRe: Float64Array;
  zIm: Float64Array;
  reachesReference: Uint8Array;
}
