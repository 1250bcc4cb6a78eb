// Nodal admittance matrices in typed arrays, the one builder for every sequence network: each
// branch as a two-port (I_from = y_ff·V_from + y_ft·V_to, I_to = y_tf·V_from + y_tt·V_to), summed
// into compressed rows. Parallel branches add into the same entry, so rings and parallel lines need
// no special case. The load flow's positive sequence (line charging, taps, core loss) is built here
// from the network; the fault levels' positive and zero sequences from their `NodalNetwork`s.
import type { Network } from "#solver/schema.ts";
import type { Graph } from "#solver/sparse/ordering.ts";
import type { NodalNetwork } from "#solver/faults/nodalNetwork.ts";
import { busIndexOf, type IdIndex } from "#solver/idIndex.ts";
import {
  lineSeriesImpedancePu,
  lineShuntSusceptancePu,
  shuntSusceptancePu,
  transformerCoreConductancePu,
  transformerRatioPu,
  transformerSeriesImpedancePu,
} from "#solver/perUnit.ts";

/** Two-port admittances of every branch (lines first, then transformers), real and imaginary parts. */
export interface BranchTwoPorts {
  count: number;
  from: Int32Array;
  to: Int32Array;
  /** Four complex entries per branch: ff, ft, tf, tt, as re/im pairs (8 numbers per branch). */
  y: Float64Array;
}

export interface AdmittanceMatrix extends Graph {
  /** Off-diagonal entries, aligned with `neighbours`. */
  g: Float64Array;
  b: Float64Array;
  diagonalG: Float64Array;
  diagonalB: Float64Array;
}

export interface NetworkAdmittance {
  busIndex: IdIndex;
  branches: BranchTwoPorts;
  matrix: AdmittanceMatrix;
}

export function buildAdmittance(network: Network): NetworkAdmittance {
  const busIndex = busIndexOf(network);
  const branches = branchTwoPorts(network, busIndex);
  const diagonalG = new Float64Array(network.buses.length);
  const diagonalB = new Float64Array(network.buses.length);
  for (const shunt of network.shunts) diagonalB[busIndex.get(shunt.bus)!] += shuntSusceptancePu(shunt, network.baseMVA);
  const matrix = assembleAdmittance(network.buses.length, branches, diagonalG, diagonalB);
  return { busIndex, branches, matrix };
}

function branchTwoPorts(network: Network, busIndex: IdIndex): BranchTwoPorts {
  const { baseMVA, buses } = network;
  const count = network.lines.length + network.transformers.length;
  const from = new Int32Array(count);
  const to = new Int32Array(count);
  const y = new Float64Array(8 * count);
  let k = 0;
  for (const line of network.lines) {
    const f = busIndex.get(line.fromBus)!;
    const bus = buses[f];
    const z = lineSeriesImpedancePu(line, bus, baseMVA);
    const halfB = lineShuntSusceptancePu(line, bus, baseMVA) / 2;
    const den = z.r * z.r + z.x * z.x;
    const gs = z.r / den;
    const bs = -z.x / den;
    from[k] = f;
    to[k] = busIndex.get(line.toBus)!;
    writeTwoPort(y, k, gs, bs + halfB, -gs, -bs, -gs, -bs, gs, bs + halfB);
    k++;
  }
  for (const t of network.transformers) {
    const h = busIndex.get(t.hvBus)!;
    const l = busIndex.get(t.lvBus)!;
    const z = transformerSeriesImpedancePu(t, buses[l], baseMVA);
    const ratio = transformerRatioPu(t, buses[h], buses[l]);
    const gCore = transformerCoreConductancePu(t, baseMVA);
    const den = z.r * z.r + z.x * z.x;
    const gs = z.r / den;
    const bs = -z.x / den;
    from[k] = h;
    to[k] = l;
    const r2 = ratio * ratio;
    writeTwoPort(y, k, gs / r2 + gCore, bs / r2, -gs / ratio, -bs / ratio, -gs / ratio, -bs / ratio, gs, bs);
    k++;
  }
  return { count, from, to, y };
}

function writeTwoPort(
  y: Float64Array,
  k: number,
  gff: number,
  bff: number,
  gft: number,
  bft: number,
  gtf: number,
  btf: number,
  gtt: number,
  btt: number,
): void {
  const q = 8 * k;
  y[q] = gff;
  y[q + 1] = bff;
  y[q + 2] = gft;
  y[q + 3] = bft;
  y[q + 4] = gtf;
  y[q + 5] = btf;
  y[q + 6] = gtt;
  y[q + 7] = btt;
}

/**
 * Sums branch two-ports into compressed rows over `nodeCount` nodes. `diagonalG`/`diagonalB` carry
 * the shunts already and are added to (and returned). A branch whose ends are one node (its ends
 * joined by a zero impedance elsewhere) adds its whole two-port to that node's diagonal.
 */
export function assembleAdmittance(
  nodeCount: number,
  branches: BranchTwoPorts,
  diagonalG: Float64Array,
  diagonalB: Float64Array,
): AdmittanceMatrix {
  const n = nodeCount;
  const { count, from, to, y } = branches;
  // Count each branch once per end, fill the rows, then merge parallel branches in place.
  const rowStart = new Int32Array(n + 1);
  for (let k = 0; k < count; k++) {
    if (from[k] === to[k]) continue;
    rowStart[from[k] + 1]++;
    rowStart[to[k] + 1]++;
  }
  for (let i = 0; i < n; i++) rowStart[i + 1] += rowStart[i];
  const fillAt = rowStart.slice(0, n);
  const entries = rowStart[n];
  const neighbours = new Int32Array(entries);
  const g = new Float64Array(entries);
  const b = new Float64Array(entries);
  for (let k = 0; k < count; k++) {
    const f = from[k];
    const t = to[k];
    const q = 8 * k;
    diagonalG[f] += y[q];
    diagonalB[f] += y[q + 1];
    diagonalG[t] += y[q + 6];
    diagonalB[t] += y[q + 7];
    if (f === t) {
      diagonalG[f] += y[q + 2] + y[q + 4];
      diagonalB[f] += y[q + 3] + y[q + 5];
      continue;
    }
    let e = fillAt[f]++;
    neighbours[e] = t;
    g[e] = y[q + 2];
    b[e] = y[q + 3];
    e = fillAt[t]++;
    neighbours[e] = f;
    g[e] = y[q + 4];
    b[e] = y[q + 5];
  }

  // fillAt is free again: it now marks where each neighbour sits in the row being compacted.
  const seenAt = fillAt.fill(-1);
  let out = 0;
  for (let i = 0; i < n; i++) {
    const first = out;
    const end = rowStart[i + 1];
    for (let e = rowStart[i]; e < end; e++) {
      const j = neighbours[e];
      const existing = seenAt[j];
      if (existing >= first) {
        g[existing] += g[e];
        b[existing] += b[e];
      } else {
        seenAt[j] = out;
        neighbours[out] = j;
        g[out] = g[e];
        b[out] = b[e];
        out++;
      }
    }
    rowStart[i] = first;
  }
  rowStart[n] = out;
  return {
    nodeCount: n,
    rowStart,
    neighbours: neighbours.subarray(0, out),
    g: g.subarray(0, out),
    b: b.subarray(0, out),
    diagonalG,
    diagonalB,
  };
}

/**
 * A fault sequence network's admittance: each series impedance behind its ideal ratio r:1 at the
 * `from` end as the two-port y_ff = y/r², y_ft = y_tf = −y/r, y_tt = y, each shunt impedance on its
 * node's diagonal. `node` maps each node to the one it is merged into (zero-impedance links); a
 * branch of zero impedance is such a link and is left out.
 */
export function sequenceAdmittance(network: NodalNetwork, node: Int32Array): AdmittanceMatrix {
  const { nodeCount, branchCount, branchFrom, branchTo, branchZRe, branchZIm, branchRatio } = network;
  let count = 0;
  for (let k = 0; k < branchCount; k++) if (branchZRe[k] !== 0 || branchZIm[k] !== 0) count++;
  const twoPorts: BranchTwoPorts = { count, from: new Int32Array(count), to: new Int32Array(count), y: new Float64Array(8 * count) };
  let m = 0;
  for (let k = 0; k < branchCount; k++) {
    const zRe = branchZRe[k];
    const zIm = branchZIm[k];
    if (zRe === 0 && zIm === 0) continue;
    const mag2 = zRe * zRe + zIm * zIm;
    const gs = zRe / mag2;
    const bs = -zIm / mag2;
    const r = branchRatio[k];
    twoPorts.from[m] = node[branchFrom[k]];
    twoPorts.to[m] = node[branchTo[k]];
    writeTwoPort(twoPorts.y, m, gs / (r * r), bs / (r * r), -gs / r, -bs / r, -gs / r, -bs / r, gs, bs);
    m++;
  }
  const diagonalG = new Float64Array(nodeCount);
  const diagonalB = new Float64Array(nodeCount);
  for (let s = 0; s < network.shuntCount; s++) {
    const zRe = network.shuntZRe[s];
    const zIm = network.shuntZIm[s];
    const mag2 = zRe * zRe + zIm * zIm;
    if (mag2 === 0) throw new Error(`a shunt at node ${network.shuntNode[s]} has no impedance`);
    const k = node[network.shuntNode[s]];
    diagonalG[k] += zRe / mag2;
    diagonalB[k] -= zIm / mag2;
  }
  return assembleAdmittance(nodeCount, twoPorts, diagonalG, diagonalB);
}
