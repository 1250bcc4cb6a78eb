// A sequence network as the sparse solver sees it: nodes, series branches (each with an ideal
// real-ratio transformer at its `from` end) and shunt impedances to the reference (earth, or the
// shorted sources behind their impedances). Stored as parallel typed arrays: a 10,000-bus
// feeder then costs a handful of allocations instead of tens of thousands of small objects.

export interface NodalNetwork {
  nodeCount: number;
  branchCount: number;
  branchFrom: Int32Array;
  branchTo: Int32Array;
  /** Series impedance in per unit, seen from the `to` end. */
  branchZRe: Float64Array;
  branchZIm: Float64Array;
  /** Ideal ratio ratioFrom : 1 between the `from` node and the series impedance (1 for lines). */
  branchRatio: Float64Array;
  shuntCount: number;
  shuntNode: Int32Array;
  shuntZRe: Float64Array;
  shuntZIm: Float64Array;
}

/** Driving-point impedance Z_kk of every node; `reachesReference` false where Z_kk is unbounded. */
export interface DrivingPointImpedances {
  zRe: Float64Array;
  zIm: Float64Array;
  reachesReference: Uint8Array;
}

/** Fills a NodalNetwork whose branch and shunt counts are known at most in advance. */
export class NodalNetworkBuilder {
  private readonly net: NodalNetwork;

  constructor(nodeCount: number, maxBranches: number, maxShunts: number) {
    this.net = {
      nodeCount,
      branchCount: 0,
      branchFrom: new Int32Array(maxBranches),
      branchTo: new Int32Array(maxBranches),
      branchZRe: new Float64Array(maxBranches),
      branchZIm: new Float64Array(maxBranches),
      branchRatio: new Float64Array(maxBranches),
      shuntCount: 0,
      shuntNode: new Int32Array(maxShunts),
      shuntZRe: new Float64Array(maxShunts),
      shuntZIm: new Float64Array(maxShunts),
    };
  }

  branch(from: number, to: number, zRe: number, zIm: number, ratioFrom = 1): void {
    const net = this.net;
    const b = net.branchCount++;
    net.branchFrom[b] = from;
    net.branchTo[b] = to;
    net.branchZRe[b] = zRe;
    net.branchZIm[b] = zIm;
    net.branchRatio[b] = ratioFrom;
  }

  shunt(node: number, zRe: number, zIm: number): void {
    const net = this.net;
    const s = net.shuntCount++;
    net.shuntNode[s] = node;
    net.shuntZRe[s] = zRe;
    net.shuntZIm[s] = zIm;
  }

  build(): NodalNetwork {
    return this.net;
  }
}
