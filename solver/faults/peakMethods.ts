// The peak short-circuit current i_p by the method IEC 60909-0 prescribes for the network at the
// fault (section 8.1):
// - one radial path feeds the fault: κ from R/X of Z_k;
// - the sources reach the fault by separate branches (no branch carries current from two
//   sources): i_p is the sum of the partial peak currents, each with κ from its own branch's R/X;
// - otherwise the network is meshed for this fault: κ by the equivalent-frequency method
//   (method C), R/X = (R_c/X_c)·(f_c/f) with Z_c the impedance at the fault at f_c = 20 Hz for
//   a 50 Hz system, 24 Hz for 60 Hz.
// Sources appear in the positive-sequence fault network as shunts to the reference; a branch that
// holds two of them closes a loop through the reference, which is why it counts as meshed.
import type { NodalNetwork } from "./nodalNetwork.ts";

export type PeakMethod = "radial" | "branch-sum" | "equivalent-frequency";

/** Peak factor κ = 1.02 + 0.98·e^(−3R/X). */
function kappa(rOverX: number): number {
  return 1.02 + 0.98 * Math.exp(-3 * rOverX);
}

/** f_c / f for method C: 20/50 and 24/60 are both 0.4. */
export function equivalentFrequencyRatio(frequencyHz: 50 | 60): number {
  return frequencyHz === 50 ? 20 / 50 : 24 / 60;
}

/** κ by method C from the driving-point impedance computed at f_c. */
export function kappaEquivalentFrequency(zcRe: number, zcIm: number, ratio: number): number {
  return kappa((zcRe / zcIm) * ratio);
}

/** The same fault network at another frequency: reactances scale with f, resistances do not. */
export function atFrequencyRatio(network: NodalNetwork, ratio: number): NodalNetwork {
  return {
    ...network,
    branchZIm: network.branchZIm.map((x) => x * ratio),
    shuntZIm: network.shuntZIm.map((x) => x * ratio),
  };
}

export interface PeakPaths {
  method: PeakMethod[];
  /**
   * Where the method is radial or branch-sum: Σ κ_j·|Y_j| over the branches feeding the fault,
   * in per unit, so that i_p = √2·c·I_base·branchPeakPu (Y_j the branch's admittance seen from
   * the fault). NaN where the method is equivalent-frequency.
   */
  branchPeakPu: Float64Array;
}

/** κ·|Y| of one branch: R/X of its impedance 1/Y is Re(Y)/(−Im(Y)). */
function branchPeak(yRe: number, yIm: number): number {
  const size = Math.hypot(yRe, yIm);
  if (size === 0) return 0;
  return kappa(yRe / -yIm) * size;
}

export function classifyPeakPaths(network: NodalNetwork): PeakPaths {
  const n = network.nodeCount;
  const { branchCount, branchFrom, branchTo, branchZRe, branchZIm, branchRatio, shuntCount, shuntNode } = network;

  // Sources at each node as admittances, grouped by node in their own order (counting sort).
  const shuntStart = new Int32Array(n + 1);
  for (let s = 0; s < shuntCount; s++) shuntStart[shuntNode[s] + 1]++;
  for (let k = 0; k < n; k++) shuntStart[k + 1] += shuntStart[k];
  const shuntYRe = new Float64Array(shuntCount);
  const shuntYIm = new Float64Array(shuntCount);
  const shuntFill = shuntStart.slice(0, n);
  for (let s = 0; s < shuntCount; s++) {
    const at = shuntFill[shuntNode[s]]++;
    const zr = network.shuntZRe[s];
    const zi = network.shuntZIm[s];
    const d = zr * zr + zi * zi;
    shuntYRe[at] = (1 * zr + 0 * zi) / d;
    shuntYIm[at] = (0 * zr - 1 * zi) / d;
  }

  // Branches at each node, in branch order.
  const adjacencyStart = new Int32Array(n + 1);
  for (let b = 0; b < branchCount; b++) {
    adjacencyStart[branchFrom[b] + 1]++;
    adjacencyStart[branchTo[b] + 1]++;
  }
  for (let k = 0; k < n; k++) adjacencyStart[k + 1] += adjacencyStart[k];
  const adjacency = new Int32Array(2 * branchCount);
  const adjacencyFill = adjacencyStart.slice(0, n);
  for (let b = 0; b < branchCount; b++) {
    adjacency[adjacencyFill[branchFrom[b]]++] = b;
    adjacency[adjacencyFill[branchTo[b]]++] = b;
  }

  // The admittance seen at the near end of branch b looking through it at `far`, whose own side
  // shows (yRe, yIm); written into acrossRe/acrossIm. The operations are those of complex
  // arithmetic term by term, so the figures do not depend on how they are stored.
  let acrossRe = 0;
  let acrossIm = 0;
  const across = (b: number, far: number, yRe: number, yIm: number): void => {
    const zr = branchZRe[b];
    const zi = branchZIm[b];
    const a2 = branchRatio[b] * branchRatio[b];
    let sRe = yRe;
    let sIm = yIm;
    if (far !== branchTo[b]) {
      sRe = yRe * a2;
      sIm = yIm * a2;
    }
    // (s) / (1 + z·s)
    const dRe = 1 + (zr * sRe - zi * sIm);
    const dIm = 0 + (zr * sIm + zi * sRe);
    const d = dRe * dRe + dIm * dIm;
    const qRe = (sRe * dRe + sIm * dIm) / d;
    const qIm = (sIm * dRe - sRe * dIm) / d;
    if (far === branchTo[b]) {
      acrossRe = qRe / a2;
      acrossIm = qIm / a2;
    } else {
      acrossRe = qRe;
      acrossIm = qIm;
    }
  };

  const method: PeakMethod[] = new Array(n).fill("equivalent-frequency");
  const branchPeakPu = new Float64Array(n).fill(Number.NaN);

  // Walk each connected group as a tree; a branch back to a visited node means a loop. In a tree
  // every branch of a node other than the one to its parent leads to a child.
  const visited = new Uint8Array(n);
  const parent = new Int32Array(n).fill(-1);
  const parentBranch = new Int32Array(n).fill(-1);
  const yDownRe = new Float64Array(n);
  const yDownIm = new Float64Array(n);
  const yUpRe = new Float64Array(n);
  const yUpIm = new Float64Array(n);
  const yFromChildRe = new Float64Array(n);
  const yFromChildIm = new Float64Array(n);
  const sourcesDown = new Int32Array(n);
  const order = new Int32Array(n);
  const stack = new Int32Array(n);
  for (let root = 0; root < n; root++) {
    if (visited[root]) continue;
    let count = 0;
    let meshed = false;
    let top = 0;
    stack[top++] = root;
    visited[root] = 1;
    while (top > 0) {
      const k = stack[--top];
      order[count++] = k;
      for (let a = adjacencyStart[k]; a < adjacencyStart[k + 1]; a++) {
        const b = adjacency[a];
        if (b === parentBranch[k]) continue;
        const other = branchFrom[b] === k ? branchTo[b] : branchFrom[b];
        if (visited[other]) {
          meshed = true;
          continue;
        }
        visited[other] = 1;
        parent[other] = k;
        parentBranch[other] = b;
        stack[top++] = other;
      }
    }
    if (meshed) continue;

    // Down: what each node's subtree shows at the node, and how many sources it holds.
    for (let i = count - 1; i >= 0; i--) {
      const k = order[i];
      let yRe = 0;
      let yIm = 0;
      for (let s = shuntStart[k]; s < shuntStart[k + 1]; s++) {
        yRe = yRe + shuntYRe[s];
        yIm = yIm + shuntYIm[s];
      }
      let sources = shuntStart[k + 1] - shuntStart[k];
      for (let a = adjacencyStart[k]; a < adjacencyStart[k + 1]; a++) {
        const b = adjacency[a];
        if (b === parentBranch[k]) continue;
        const child = branchFrom[b] === k ? branchTo[b] : branchFrom[b];
        across(b, child, yDownRe[child], yDownIm[child]);
        yFromChildRe[child] = acrossRe;
        yFromChildIm[child] = acrossIm;
        yRe = yRe + acrossRe;
        yIm = yIm + acrossIm;
        sources += sourcesDown[child];
      }
      yDownRe[k] = yRe;
      yDownIm[k] = yIm;
      sourcesDown[k] = sources;
    }
    const totalSources = sourcesDown[root];

    // Up: what the rest of the group shows at each node through its parent branch.
    yUpRe[root] = 0;
    yUpIm[root] = 0;
    for (let i = 0; i < count; i++) {
      const k = order[i];
      if (k === root) continue;
      const p = parent[k];
      across(parentBranch[k], p, yDownRe[p] - yFromChildRe[k] + yUpRe[p], yDownIm[p] - yFromChildIm[k] + yUpIm[p]);
      yUpRe[k] = acrossRe;
      yUpIm[k] = acrossIm;
    }

    // The branches feeding each node: its own sources, each child's subtree, the rest above it.
    for (let i = 0; i < count; i++) {
      const k = order[i];
      let feeding = 0;
      let shared = false;
      let peak = 0;
      for (let s = shuntStart[k]; s < shuntStart[k + 1]; s++) {
        feeding++;
        peak += branchPeak(shuntYRe[s], shuntYIm[s]);
      }
      for (let a = adjacencyStart[k]; a < adjacencyStart[k + 1] && !shared; a++) {
        const b = adjacency[a];
        if (b === parentBranch[k]) continue;
        const child = branchFrom[b] === k ? branchTo[b] : branchFrom[b];
        const sources = sourcesDown[child];
        if (sources === 0) continue;
        if (sources > 1) shared = true;
        feeding++;
        peak += branchPeak(yFromChildRe[child], yFromChildIm[child]);
      }
      if (k !== root) {
        const sources = totalSources - sourcesDown[k];
        if (sources > 1) shared = true;
        if (sources > 0) {
          feeding++;
          peak += branchPeak(yUpRe[k], yUpIm[k]);
        }
      }
      if (shared) continue;
      method[k] = feeding > 1 ? "branch-sum" : "radial";
      branchPeakPu[k] = peak;
    }
  }
  return { method, branchPeakPu };
}
