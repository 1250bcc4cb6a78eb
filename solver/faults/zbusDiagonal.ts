// Diagonal of Z = Y⁻¹ for a sparse complex-symmetric nodal admittance matrix, without forming
// the inverse: Y = L·D·Lᵀ in a minimum-degree order, then the selected inverse (Takahashi's
// recurrence), which touches only the filled pattern of L. A radial network eliminated from its
// leaves has no fill, so the whole job is linear in the number of buses; rings and parallel
// branches only add the fill their loops need.
//
// No pivoting is needed: every admittance here is r − jx over r² + x² with r, x ≥ 0, so
// e^{jπ/4}·Y has a positive definite real part and every pivot stays away from zero.
import type { DrivingPointImpedances, NodalNetwork } from "./nodalNetwork.ts";

interface Entry {
  re: number;
  im: number;
}

class DisjointSets {
  private readonly parent: Int32Array;
  constructor(size: number) {
    this.parent = Int32Array.from({ length: size }, (_, i) => i);
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

/** Min-heap of (degree, node) with stale entries skipped on pop. */
class DegreeQueue {
  private keys: number[] = [];
  private nodes: number[] = [];
  push(key: number, node: number): void {
    const keys = this.keys;
    const nodes = this.nodes;
    let i = keys.length;
    keys.push(key);
    nodes.push(node);
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (keys[parent] <= key) break;
      keys[i] = keys[parent];
      nodes[i] = nodes[parent];
      i = parent;
    }
    keys[i] = key;
    nodes[i] = node;
  }
  /** Returns [key, node] or undefined when empty. */
  pop(): [number, number] | undefined {
    const keys = this.keys;
    const nodes = this.nodes;
    if (keys.length === 0) return undefined;
    const top: [number, number] = [keys[0], nodes[0]];
    const lastKey = keys.pop()!;
    const lastNode = nodes.pop()!;
    const size = keys.length;
    if (size > 0) {
      let i = 0;
      for (;;) {
        const left = 2 * i + 1;
        if (left >= size) break;
        const right = left + 1;
        const child = right < size && keys[right] < keys[left] ? right : left;
        if (keys[child] >= lastKey) break;
        keys[i] = keys[child];
        nodes[i] = nodes[child];
        i = child;
      }
      keys[i] = lastKey;
      nodes[i] = lastNode;
    }
    return top;
  }
}

export function drivingPointImpedances(network: NodalNetwork): DrivingPointImpedances {
  const n = network.nodeCount;

  // A branch of zero impedance makes its two ends one node.
  const merged = new DisjointSets(n);
  for (const b of network.branches)
    if (b.zRe === 0 && b.zIm === 0) {
      if (b.ratioFrom !== 1) throw new Error(`a branch from node ${b.from} has a ratio but no impedance`);
      merged.join(b.from, b.to);
    }
  const node = Int32Array.from({ length: n }, (_, i) => merged.find(i));

  const diagRe = new Float64Array(n);
  const diagIm = new Float64Array(n);
  const rows: Map<number, Entry>[] = Array.from({ length: n }, () => new Map());
  const connected = new DisjointSets(n);

  for (const b of network.branches) {
    if (b.zRe === 0 && b.zIm === 0) continue;
    const f = node[b.from];
    const t = node[b.to];
    const mag2 = b.zRe * b.zRe + b.zIm * b.zIm;
    const yRe = b.zRe / mag2;
    const yIm = -b.zIm / mag2;
    const r = b.ratioFrom;
    diagRe[t] += yRe;
    diagIm[t] += yIm;
    diagRe[f] += yRe / (r * r);
    diagIm[f] += yIm / (r * r);
    if (f === t) continue;
    let entry = rows[f].get(t);
    if (!entry) {
      entry = { re: 0, im: 0 };
      rows[f].set(t, entry);
      rows[t].set(f, entry);
    }
    entry.re -= yRe / r;
    entry.im -= yIm / r;
    connected.join(f, t);
  }

  const earthedGroup = new Uint8Array(n);
  for (const s of network.shunts) {
    const k = node[s.node];
    const mag2 = s.zRe * s.zRe + s.zIm * s.zIm;
    if (mag2 === 0) throw new Error(`a shunt at node ${s.node} has no impedance`);
    diagRe[k] += s.zRe / mag2;
    diagIm[k] += -s.zIm / mag2;
    earthedGroup[connected.find(k)] = 1;
  }

  // Only representatives of merged nodes in groups that reach the reference are eliminated.
  const active = new Uint8Array(n);
  const queue = new DegreeQueue();
  let activeCount = 0;
  for (let k = 0; k < n; k++)
    if (node[k] === k && earthedGroup[connected.find(k)]) {
      active[k] = 1;
      activeCount++;
      queue.push(rows[k].size, k);
    }

  // Elimination: for each pivot, its later neighbours, the L column and D.
  const order = new Int32Array(activeCount);
  const position = new Int32Array(n).fill(-1);
  const neighbours: Int32Array[] = new Array(n);
  const lRe: Float64Array[] = new Array(n);
  const lIm: Float64Array[] = new Array(n);
  const pivotRe = new Float64Array(n);
  const pivotIm = new Float64Array(n);

  let step = 0;
  for (let popped = queue.pop(); popped; popped = queue.pop()) {
    const [degree, v] = popped;
    if (position[v] !== -1 || rows[v].size !== degree) continue;
    position[v] = step;
    order[step++] = v;

    const dRe = diagRe[v];
    const dIm = diagIm[v];
    const dMag2 = dRe * dRe + dIm * dIm;
    if (!(dMag2 > 0)) throw new Error(`zero pivot at node ${v}`);
    pivotRe[v] = dRe;
    pivotIm[v] = dIm;

    const row = rows[v];
    const size = row.size;
    const nb = new Int32Array(size);
    const aRe = new Float64Array(size);
    const aIm = new Float64Array(size);
    const cRe = new Float64Array(size);
    const cIm = new Float64Array(size);
    let i = 0;
    for (const [u, e] of row) {
      nb[i] = u;
      aRe[i] = e.re;
      aIm[i] = e.im;
      // l_u = a_uv / d
      cRe[i] = (e.re * dRe + e.im * dIm) / dMag2;
      cIm[i] = (e.im * dRe - e.re * dIm) / dMag2;
      i++;
    }
    neighbours[v] = nb;
    lRe[v] = cRe;
    lIm[v] = cIm;

    // Schur complement: a_uw −= l_u · a_vw over the neighbours, with fill where needed.
    for (let p = 0; p < size; p++) {
      const u = nb[p];
      const rowU = rows[u];
      rowU.delete(v);
      diagRe[u] -= cRe[p] * aRe[p] - cIm[p] * aIm[p];
      diagIm[u] -= cRe[p] * aIm[p] + cIm[p] * aRe[p];
      for (let q = p + 1; q < size; q++) {
        const w = nb[q];
        let entry = rowU.get(w);
        if (!entry) {
          entry = { re: 0, im: 0 };
          rowU.set(w, entry);
          rows[w].set(u, entry);
        }
        entry.re -= cRe[p] * aRe[q] - cIm[p] * aIm[q];
        entry.im -= cRe[p] * aIm[q] + cIm[p] * aRe[q];
      }
    }
    row.clear();
    for (let p = 0; p < size; p++) queue.push(rows[nb[p]].size, nb[p]);
  }

  // Selected inverse, last pivot first:
  //   Z_vj = −Σ_k l_kv·Z_kj (j among v's later neighbours),  Z_vv = 1/d_v − Σ_k l_kv·Z_kv.
  const zDiagRe = new Float64Array(n);
  const zDiagIm = new Float64Array(n);
  const zOffRe: Float64Array[] = new Array(n);
  const zOffIm: Float64Array[] = new Array(n);
  const zBetween = (a: number, b: number): Entry => {
    if (a === b) return { re: zDiagRe[a], im: zDiagIm[a] };
    const [first, second] = position[a] < position[b] ? [a, b] : [b, a];
    const nb = neighbours[first];
    for (let i = 0; i < nb.length; i++)
      if (nb[i] === second) return { re: zOffRe[first][i], im: zOffIm[first][i] };
    throw new Error(`selected inverse left the filled pattern at nodes ${a}, ${b}`);
  };

  for (let s = activeCount - 1; s >= 0; s--) {
    const v = order[s];
    const nb = neighbours[v];
    const cRe = lRe[v];
    const cIm = lIm[v];
    const size = nb.length;
    const offRe = new Float64Array(size);
    const offIm = new Float64Array(size);
    for (let q = 0; q < size; q++) {
      let sumRe = 0;
      let sumIm = 0;
      for (let p = 0; p < size; p++) {
        const z = zBetween(nb[p], nb[q]);
        sumRe += cRe[p] * z.re - cIm[p] * z.im;
        sumIm += cRe[p] * z.im + cIm[p] * z.re;
      }
      offRe[q] = -sumRe;
      offIm[q] = -sumIm;
    }
    zOffRe[v] = offRe;
    zOffIm[v] = offIm;
    const dRe = pivotRe[v];
    const dIm = pivotIm[v];
    const dMag2 = dRe * dRe + dIm * dIm;
    let re = dRe / dMag2;
    let im = -dIm / dMag2;
    for (let p = 0; p < size; p++) {
      re -= cRe[p] * offRe[p] - cIm[p] * offIm[p];
      im -= cRe[p] * offIm[p] + cIm[p] * offRe[p];
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
