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

interface Admittance {
  re: number;
  im: number;
}

const ZERO: Admittance = { re: 0, im: 0 };
const add = (a: Admittance, b: Admittance): Admittance => ({ re: a.re + b.re, im: a.im + b.im });
const sub = (a: Admittance, b: Admittance): Admittance => ({ re: a.re - b.re, im: a.im - b.im });
const mul = (a: Admittance, b: Admittance): Admittance => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
const div = (a: Admittance, b: Admittance): Admittance => {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
};
const inverse = (z: Admittance): Admittance => div({ re: 1, im: 0 }, z);

/** κ·|Y| of one branch: R/X of its impedance 1/Y is Re(Y)/(−Im(Y)). */
function branchPeak(y: Admittance): number {
  const size = Math.hypot(y.re, y.im);
  if (size === 0) return 0;
  return kappa(y.re / -y.im) * size;
}

export function classifyPeakPaths(network: NodalNetwork): PeakPaths {
  const n = network.nodeCount;
  const { branchCount, branchFrom, branchTo, branchZRe, branchZIm, branchRatio } = network;

  // Sources at each node, as admittances, and how many.
  const shuntAdmittances: Admittance[][] = Array.from({ length: n }, () => []);
  for (let s = 0; s < network.shuntCount; s++)
    shuntAdmittances[network.shuntNode[s]].push(inverse({ re: network.shuntZRe[s], im: network.shuntZIm[s] }));

  const adjacency: number[][] = Array.from({ length: n }, () => []);
  for (let b = 0; b < branchCount; b++) {
    adjacency[branchFrom[b]].push(b);
    adjacency[branchTo[b]].push(b);
  }

  /** The admittance seen at the near end of branch b looking through it at `far`, whose own side shows yFar. */
  const across = (b: number, far: number, yFar: Admittance): Admittance => {
    const z = { re: branchZRe[b], im: branchZIm[b] };
    const a2 = branchRatio[b] * branchRatio[b];
    if (far === branchTo[b]) {
      const y = div(yFar, add({ re: 1, im: 0 }, mul(z, yFar)));
      return { re: y.re / a2, im: y.im / a2 };
    }
    const seen = { re: yFar.re * a2, im: yFar.im * a2 };
    return div(seen, add({ re: 1, im: 0 }, mul(z, seen)));
  };

  const method: PeakMethod[] = new Array(n).fill("equivalent-frequency");
  const branchPeakPu = new Float64Array(n).fill(Number.NaN);

  // Walk each connected group as a tree; a branch back to a visited node means a loop.
  const visited = new Uint8Array(n);
  const parent = new Int32Array(n).fill(-1);
  const parentBranch = new Int32Array(n).fill(-1);
  const children: number[][] = Array.from({ length: n }, () => []);
  const yDown: Admittance[] = new Array(n).fill(ZERO);
  const yUp: Admittance[] = new Array(n).fill(ZERO);
  const yFromChild: Admittance[] = new Array(n).fill(ZERO);
  const sourcesDown = new Int32Array(n);
  for (let root = 0; root < n; root++) {
    if (visited[root]) continue;
    const order: number[] = [];
    let meshed = false;
    const stack = [root];
    visited[root] = 1;
    while (stack.length > 0) {
      const k = stack.pop()!;
      order.push(k);
      for (const b of adjacency[k]) {
        if (b === parentBranch[k]) continue;
        const other = branchFrom[b] === k ? branchTo[b] : branchFrom[b];
        if (visited[other]) {
          meshed = true;
          continue;
        }
        visited[other] = 1;
        parent[other] = k;
        parentBranch[other] = b;
        children[k].push(other);
        stack.push(other);
      }
    }
    if (meshed) continue;

    // Down: what each node's subtree shows at the node, and how many sources it holds.
    for (let i = order.length - 1; i >= 0; i--) {
      const k = order[i];
      let y = shuntAdmittances[k].reduce(add, ZERO);
      let count = shuntAdmittances[k].length;
      for (const child of children[k]) {
        const seen = across(parentBranch[child], child, yDown[child]);
        yFromChild[child] = seen;
        y = add(y, seen);
        count += sourcesDown[child];
      }
      yDown[k] = y;
      sourcesDown[k] = count;
    }
    const totalSources = sourcesDown[root];

    // Up: what the rest of the group shows at each node through its parent branch.
    yUp[root] = ZERO;
    for (const k of order) {
      if (k === root) continue;
      const p = parent[k];
      const parentSide = add(sub(yDown[p], yFromChild[k]), yUp[p]);
      yUp[k] = across(parentBranch[k], p, parentSide);
    }

    for (const k of order) {
      const branches: { y: Admittance; sources: number }[] = shuntAdmittances[k].map((y) => ({ y, sources: 1 }));
      for (const child of children[k]) branches.push({ y: yFromChild[child], sources: sourcesDown[child] });
      if (k !== root) branches.push({ y: yUp[k], sources: totalSources - sourcesDown[k] });
      const feeding = branches.filter((b) => b.sources > 0);
      if (feeding.some((b) => b.sources > 1)) continue;
      method[k] = feeding.length > 1 ? "branch-sum" : "radial";
      branchPeakPu[k] = feeding.reduce((sum, b) => sum + branchPeak(b.y), 0);
    }
  }
  return { method, branchPeakPu };
}
