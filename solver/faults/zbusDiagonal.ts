// Diagonal of Z = Y⁻¹ for a sparse complex-symmetric nodal admittance matrix, without forming
// the inverse: Y = L·D·Lᵀ, then the selected inverse (Takahashi's recurrence), which touches
// only the filled pattern of L. Leaves are eliminated first, one at a time, which on a radial
// network creates no fill: factorisation and selected inverse are both linear in the number of
// buses. Whatever remains after peeling (rings, parallel paths) is ordered by minimum degree
// and carries only the fill its loops need.
//
// No pivoting is needed: every admittance here is (r − jx)/(r² + x²) with r, x ≥ 0, so
// e^{jπ/4}·Y has a positive definite real part and every pivot stays away from zero.
import { MinHeap } from "../minHeap.ts";
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

/** An off-diagonal entry of the (partly eliminated) matrix, shared by both of its rows. */
interface Entry {
  re: number;
  im: number;
}

export function drivingPointImpedances(network: NodalNetwork): DrivingPointImpedances {
  const n = network.nodeCount;

  const {
    branchCount,
    branchFrom,
    branchTo,
    branchZRe,
    branchZIm,
    branchRatio,
    shuntCount,
    shuntNode,
    shuntZRe,
    shuntZIm,
  } = network;

  // A branch of zero impedance makes its two ends one node.
  const merged = new DisjointSets(n);
  for (let b = 0; b < branchCount; b++)
    if (branchZRe[b] === 0 && branchZIm[b] === 0) {
      if (branchRatio[b] !== 1) throw new Error(`a branch from node ${branchFrom[b]} has a ratio but no impedance`);
      merged.join(branchFrom[b], branchTo[b]);
    }
  const node = new Int32Array(n);
  for (let k = 0; k < n; k++) node[k] = merged.find(k);

  // Assemble Y: diagonal in arrays, off-diagonal in compressed rows (parallel branches summed
  // when their entries meet in elimination).
  const diagRe = new Float64Array(n);
  const diagIm = new Float64Array(n);
  const degree = new Int32Array(n);
  const connected = new DisjointSets(n);
  const edgeFrom = new Int32Array(branchCount);
  const edgeTo = new Int32Array(branchCount);
  const offRe = new Float64Array(branchCount);
  const offIm = new Float64Array(branchCount);
  let edgeCount = 0;
  for (let b = 0; b < branchCount; b++) {
    const zRe = branchZRe[b];
    const zIm = branchZIm[b];
    if (zRe === 0 && zIm === 0) continue;
    const f = node[branchFrom[b]];
    const t = node[branchTo[b]];
    const mag2 = zRe * zRe + zIm * zIm;
    const yRe = zRe / mag2;
    const yIm = -zIm / mag2;
    const r = branchRatio[b];
    if (f === t) {
      // Both ends in one merged node: y/r² + y − 2y/r, nothing for a plain line.
      const loop = (1 - 1 / r) ** 2;
      diagRe[f] += yRe * loop;
      diagIm[f] += yIm * loop;
      continue;
    }
    diagRe[t] += yRe;
    diagIm[t] += yIm;
    diagRe[f] += yRe / (r * r);
    diagIm[f] += yIm / (r * r);
    edgeFrom[edgeCount] = f;
    edgeTo[edgeCount] = t;
    offRe[edgeCount] = -yRe / r;
    offIm[edgeCount] = -yIm / r;
    edgeCount++;
    degree[f]++;
    degree[t]++;
    connected.join(f, t);
  }
  const rowStart = new Int32Array(n + 1);
  for (let k = 0; k < n; k++) rowStart[k + 1] = rowStart[k] + degree[k];
  const fillAt = rowStart.slice(0, n);
  const slotNode = new Int32Array(rowStart[n]);
  const slotEdge = new Int32Array(rowStart[n]);
  for (let e = 0; e < edgeCount; e++) {
    slotNode[fillAt[edgeFrom[e]]] = edgeTo[e];
    slotEdge[fillAt[edgeFrom[e]]++] = e;
    slotNode[fillAt[edgeTo[e]]] = edgeFrom[e];
    slotEdge[fillAt[edgeTo[e]]++] = e;
  }

  const earthedGroup = new Uint8Array(n);
  for (let s = 0; s < shuntCount; s++) {
    const k = node[shuntNode[s]];
    const zRe = shuntZRe[s];
    const zIm = shuntZIm[s];
    const mag2 = zRe * zRe + zIm * zIm;
    if (mag2 === 0) throw new Error(`a shunt at node ${shuntNode[s]} has no impedance`);
    diagRe[k] += zRe / mag2;
    diagIm[k] += -zIm / mag2;
    earthedGroup[connected.find(k)] = 1;
  }

  // Only representatives of merged nodes in groups that reach the reference are eliminated.
  const active = new Uint8Array(n);
  let activeCount = 0;
  for (let k = 0; k < n; k++)
    if (node[k] === k && earthedGroup[connected.find(k)]) {
      active[k] = 1;
      activeCount++;
    }

  // The factor, one pivot at a time in elimination order: its later neighbours (slots
  // lStart[p] … lStart[p+1]), L's column there, and the pivot D.
  const order = new Int32Array(activeCount);
  const position = new Int32Array(n).fill(-1);
  const lStart = new Int32Array(activeCount + 1);
  const lNode: number[] = [];
  const lRe: number[] = [];
  const lIm: number[] = [];
  const pivotRe = new Float64Array(n);
  const pivotIm = new Float64Array(n);
  let step = 0;

  const takePivot = (v: number): [number, number, number] => {
    const dRe = diagRe[v];
    const dIm = diagIm[v];
    const dMag2 = dRe * dRe + dIm * dIm;
    if (!(dMag2 > 0)) throw new Error(`zero pivot at node ${v}`);
    pivotRe[v] = dRe;
    pivotIm[v] = dIm;
    position[v] = step;
    order[step] = v;
    return [dRe, dIm, dMag2];
  };

  // Phase 1: peel leaves (one remaining branch slot; parallel branches wait for phase 2).
  // A leaf's only remaining neighbour u takes a_uu −= a_uv²/d_v.
  const remaining = degree.slice();
  const leaves: number[] = [];
  for (let k = 0; k < n; k++) if (active[k] && remaining[k] <= 1) leaves.push(k);
  for (let head = 0; head < leaves.length; head++) {
    const v = leaves[head];
    if (position[v] !== -1) continue;
    const [dRe, dIm, dMag2] = takePivot(v);
    for (let s = rowStart[v]; s < rowStart[v + 1]; s++) {
      const u = slotNode[s];
      if (position[u] !== -1) continue;
      const aRe = offRe[slotEdge[s]];
      const aIm = offIm[slotEdge[s]];
      const cRe = (aRe * dRe + aIm * dIm) / dMag2;
      const cIm = (aIm * dRe - aRe * dIm) / dMag2;
      lNode.push(u);
      lRe.push(cRe);
      lIm.push(cIm);
      diagRe[u] -= cRe * aRe - cIm * aIm;
      diagIm[u] -= cRe * aIm + cIm * aRe;
      remaining[u] -= remaining[v];
      if (remaining[u] <= 1) leaves.push(u);
      break;
    }
    step++;
    lStart[step] = lNode.length;
  }

  // Phase 2: what is left holds loops. Rows as maps of shared entries, minimum degree order.
  if (step < activeCount) {
    const rows = new Map<number, Map<number, Entry>>();
    for (let k = 0; k < n; k++) if (active[k] && position[k] === -1) rows.set(k, new Map());
    for (const [k, row] of rows)
      for (let s = rowStart[k]; s < rowStart[k + 1]; s++) {
        const u = slotNode[s];
        if (u < k || position[u] !== -1) continue;
        let entry = row.get(u);
        if (!entry) {
          entry = { re: 0, im: 0 };
          row.set(u, entry);
          rows.get(u)!.set(k, entry);
        }
        entry.re += offRe[slotEdge[s]];
        entry.im += offIm[slotEdge[s]];
      }
    const queue = new MinHeap();
    for (const [k, row] of rows) queue.push(row.size, k);
    while (queue.size > 0) {
      const v = queue.pop();
      const row = rows.get(v)!;
      if (position[v] !== -1 || row.size !== queue.lastKey) continue;
      const [dRe, dIm, dMag2] = takePivot(v);
      const first = lNode.length;
      const aRe: number[] = [];
      const aIm: number[] = [];
      for (const [u, e] of row) {
        lNode.push(u);
        lRe.push((e.re * dRe + e.im * dIm) / dMag2);
        lIm.push((e.im * dRe - e.re * dIm) / dMag2);
        aRe.push(e.re);
        aIm.push(e.im);
      }
      // Schur complement: a_uw −= l_u·a_vw over the neighbours, with fill where needed.
      const size = aRe.length;
      for (let p = 0; p < size; p++) {
        const u = lNode[first + p];
        const cRe = lRe[first + p];
        const cIm = lIm[first + p];
        const rowU = rows.get(u)!;
        rowU.delete(v);
        diagRe[u] -= cRe * aRe[p] - cIm * aIm[p];
        diagIm[u] -= cRe * aIm[p] + cIm * aRe[p];
        for (let q = p + 1; q < size; q++) {
          const w = lNode[first + q];
          let entry = rowU.get(w);
          if (!entry) {
            entry = { re: 0, im: 0 };
            rowU.set(w, entry);
            rows.get(w)!.set(u, entry);
          }
          entry.re -= cRe * aRe[q] - cIm * aIm[q];
          entry.im -= cRe * aIm[q] + cIm * aRe[q];
        }
      }
      row.clear();
      for (let p = 0; p < size; p++) queue.push(rows.get(lNode[first + p])!.size, lNode[first + p]);
      step++;
      lStart[step] = lNode.length;
    }
  }

  // Selected inverse, last pivot first:
  //   Z_vj = −Σ_k l_kv·Z_kj (j among v's later neighbours),  Z_vv = 1/d_v − Σ_k l_kv·Z_kv.
  // Every Z_kj needed lies on the filled pattern, stored beside L (zOff) or on the diagonal.
  const zDiagRe = new Float64Array(n);
  const zDiagIm = new Float64Array(n);
  const zOffRe = new Float64Array(lNode.length);
  const zOffIm = new Float64Array(lNode.length);
  const slotBetween = (a: number, b: number): number => {
    const earlier = position[a] < position[b] ? a : b;
    const later = earlier === a ? b : a;
    const p = position[earlier];
    for (let s = lStart[p]; s < lStart[p + 1]; s++) if (lNode[s] === later) return s;
    throw new Error(`selected inverse left the filled pattern at nodes ${a}, ${b}`);
  };

  for (let p = activeCount - 1; p >= 0; p--) {
    const v = order[p];
    const begin = lStart[p];
    const end = lStart[p + 1];
    for (let q = begin; q < end; q++) {
      const j = lNode[q];
      let sumRe = 0;
      let sumIm = 0;
      for (let s = begin; s < end; s++) {
        const k = lNode[s];
        let zRe: number;
        let zIm: number;
        if (k === j) {
          zRe = zDiagRe[j];
          zIm = zDiagIm[j];
        } else {
          const slot = slotBetween(k, j);
          zRe = zOffRe[slot];
          zIm = zOffIm[slot];
        }
        sumRe += lRe[s] * zRe - lIm[s] * zIm;
        sumIm += lRe[s] * zIm + lIm[s] * zRe;
      }
      zOffRe[q] = -sumRe;
      zOffIm[q] = -sumIm;
    }
    const dRe = pivotRe[v];
    const dIm = pivotIm[v];
    const dMag2 = dRe * dRe + dIm * dIm;
    let re = dRe / dMag2;
    let im = -dIm / dMag2;
    for (let s = begin; s < end; s++) {
      re -= lRe[s] * zOffRe[s] - lIm[s] * zOffIm[s];
      im -= lRe[s] * zOffIm[s] + lIm[s] * zOffRe[s];
    }
    zDiagRe[v] = re;
    zDiagIm[v] = im;
  }

  const result: DrivingPointImpedances = {
    zRe: new Float64Array(n),
    zIm: new Float64Array(n),
    reachesReference: new Uint8Array(n),
  };
  for (let k = 0; k < n; k++) {
    const rep = node[k];
    if (!active[rep]) continue;
    result.zRe[k] = zDiagRe[rep];
    result.zIm[k] = zDiagIm[rep];
    result.reachesReference[k] = 1;
  }
  return result;
}
