// One Newton–Raphson solve in polar form: computed injections, the mismatch against the schedule and
// the Jacobian written straight into the block LU's storage. Slack and PV rows are replaced by
// identity rows, so the pattern never changes while PV buses switch to PQ at their reactive limits.
import { PQ, PV, SLACK, type LoadFlowModel, type LoadFlowState, type Workspace } from "#solver/loadFlow/model.ts";

/** Below tolerance, a mismatch above this (pu) gets one more Newton step: it could still move a voltage by 1e-9 pu. */
const POLISH_ABOVE_PU = 1e-11;
/** Below tolerance, a summed active mismatch above this (MW) gets one more step: ten times inside the balance promised. */
const BALANCE_MARGIN_MW = 1e-7;
/** A mismatch this large (pu) means the iterations have run away. */
const DIVERGED_MISMATCH_PU = 1e8;

export interface NewtonOutcome {
  converged: boolean;
  iterations: number;
  maxMismatchPu: number;
  failure?: "iterations" | "diverged" | "singular" | "limits";
}


/**
 * Computed injections, the mismatch (computed minus scheduled) and, when asked, the Jacobian
 * written straight into the factor's blocks. Returns the largest mismatch that counts.
 */
export function evaluate(model: LoadFlowModel, state: LoadFlowState, w: Workspace, loadScale: number, withJacobian: boolean): number {
  const { rowStart, neighbours, g, b, diagonalG, diagonalB } = model.admittance.matrix;
  const { vm, va, kind, qHeld } = state;
  const { e, f, pCalc, qCalc, mismatch } = w;
  const n = model.busCount;
  const [p0, p1, p2] = model.pLoad;
  const [q0, q1, q2] = model.qLoad;
  for (let i = 0; i < n; i++) {
    e[i] = vm[i] * Math.cos(va[i]);
    f[i] = vm[i] * Math.sin(va[i]);
  }
  const factor = model.factor;
  const { lower, upper, diagonal } = factor;
  if (withJacobian) {
    lower.fill(0);
    upper.fill(0);
  }
  const { entrySlot, entryIsUpper } = model;
  let worst = 0;
  let activeSum = 0;
  for (let i = 0; i < n; i++) {
    const ei = e[i];
    const fi = f[i];
    const gii = diagonalG[i];
    const bii = diagonalB[i];
    let ir = gii * ei - bii * fi;
    let ii = gii * fi + bii * ei;
    const kindI = kind[i];
    for (let k = rowStart[i]; k < rowStart[i + 1]; k++) {
      const j = neighbours[k];
      const yr = g[k] * e[j] - b[k] * f[j];
      const yi = g[k] * f[j] + b[k] * e[j];
      ir += yr;
      ii += yi;
      if (withJacobian) {
        // s_ij = V_i · conj(Y_ij V_j): ∂S_i/∂θ_j = −j·s_ij and V_j·∂S_i/∂V_j = s_ij.
        const sRe = ei * yr + fi * yi;
        const sIm = fi * yr - ei * yi;
        const kindJ = kind[j];
        const q = 4 * entrySlot[k];
        const block = entryIsUpper[k] ? upper : lower;
        if (kindI !== SLACK && kindJ !== SLACK) {
          block[q] = sIm;
          block[q + 1] = kindJ === PV ? 0 : sRe;
          if (kindI === PQ) {
            block[q + 2] = -sRe;
            block[q + 3] = kindJ === PV ? 0 : sIm;
          }
        }
      }
    }
    const pi = ei * ir + fi * ii;
    const qi = fi * ir - ei * ii;
    pCalc[i] = pi;
    qCalc[i] = qi;
    const v = vm[i];
    const v2 = v * v;
    const pl = loadScale * (p0[i] + p1[i] * v + p2[i] * v2);
    const ql = loadScale * (q0[i] + q1[i] * v + q2[i] * v2);
    const dP = pi - (model.pScheduled[i] - pl);
    const dQ = qi - (model.qScheduled[i] + qHeld[i] - ql);
    mismatch[2 * i] = dP;
    mismatch[2 * i + 1] = dQ;
    if (kindI !== SLACK) {
      // Written so that a NaN, once seen, stays the answer.
      const aP = Math.abs(dP);
      activeSum += aP;
      if (aP > worst || aP !== aP) worst = aP;
      if (kindI === PQ) {
        const aQ = Math.abs(dQ);
        if (aQ > worst || aQ !== aQ) worst = aQ;
      }
    }
    if (withJacobian) {
      const d = 4 * i;
      if (kindI === SLACK) {
        diagonal[d] = 1;
        diagonal[d + 1] = 0;
        diagonal[d + 2] = 0;
        diagonal[d + 3] = 1;
      } else {
        const dLoadP = loadScale * (p1[i] * v + 2 * p2[i] * v2);
        const dLoadQ = loadScale * (q1[i] * v + 2 * q2[i] * v2);
        diagonal[d] = -qi - bii * v2;
        if (kindI === PQ) {
          diagonal[d + 1] = pi + gii * v2 + dLoadP;
          diagonal[d + 2] = pi - gii * v2;
          diagonal[d + 3] = qi - bii * v2 + dLoadQ;
        } else {
          diagonal[d + 1] = 0;
          diagonal[d + 2] = 0;
          diagonal[d + 3] = 1;
        }
      }
    }
  }
  w.activeMismatchSumPu = activeSum;
  return worst;
}

/**
 * Newton iterations from the given state (changed in place) until the mismatch is below tolerance.
 * Once below it, one more step is taken while the mismatch could still show, in a bus voltage
 * (above POLISH_ABOVE_PU) or in the MW balance (summed above BALANCE_MARGIN_MW): quadratic
 * convergence then takes it to rounding level for the price of one step.
 */
export function newton(
  model: LoadFlowModel,
  state: LoadFlowState,
  w: Workspace,
  loadScale: number,
  maxIterations: number,
  tolerance: number,
): NewtonOutcome {
  const n = model.busCount;
  const { vm, va, kind } = state;
  const rhs = w.mismatch;
  const base = model.network.baseMVA;
  let iterations = 0;
  let polished = false;
  for (;;) {
    const worst = evaluate(model, state, w, loadScale, iterations < maxIterations);
    if (!Number.isFinite(worst) || worst > DIVERGED_MISMATCH_PU)
      return { converged: false, iterations, maxMismatchPu: worst, failure: "diverged" };
    if (worst < tolerance) {
      const couldShow = worst > POLISH_ABOVE_PU || w.activeMismatchSumPu * base > BALANCE_MARGIN_MW;
      if (polished || !couldShow || iterations >= maxIterations) return { converged: true, iterations, maxMismatchPu: worst };
      polished = true;
    }
    if (iterations >= maxIterations) return { converged: false, iterations, maxMismatchPu: worst, failure: "iterations" };
    if (!model.factor.factorise()) {
      if (polished) return { converged: true, iterations, maxMismatchPu: worst };
      return { converged: false, iterations, maxMismatchPu: worst, failure: "singular" };
    }
    for (let i = 0; i < n; i++) {
      const k = kind[i];
      rhs[2 * i] = k === SLACK ? 0 : -rhs[2 * i];
      rhs[2 * i + 1] = k === PQ ? -rhs[2 * i + 1] : 0;
    }
    model.factor.solve(rhs);
    iterations++;
    for (let i = 0; i < n; i++) {
      va[i] += rhs[2 * i];
      const v = vm[i] * (1 + rhs[2 * i + 1]);
      if (!(v > 1e-6)) return { converged: false, iterations, maxMismatchPu: worst, failure: "diverged" };
      vm[i] = v;
    }
  }
}

