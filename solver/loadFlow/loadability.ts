// A network that cannot carry its load gets no numbers, only a sentence: its loads are scaled down
// together by bisection to estimate how much it could carry, and the chain that fails is named.
import { describeCollapse } from "#solver/collapse.ts";
import type { LoadFlowResult } from "#solver/results.ts";
import { copyState, flatStart, PQ, type LoadFlowModel, type LoadFlowState } from "#solver/loadFlow/model.ts";
import type { NewtonOutcome } from "#solver/loadFlow/newton.ts";
import { solveState } from "#solver/loadFlow/limits.ts";
import { emptyResult } from "#solver/loadFlow/readings.ts";

/** Bisection steps when estimating how much load a failing network could carry (about 1 % resolution). */
const LOADABILITY_STEPS = 7;

/** Largest share of the load (0–1) the network still carries, by bisection on a common load scale. */
export function estimateLoadability(model: LoadFlowModel): { scale: number; state: LoadFlowState } | undefined {
  const zero = flatStart(model);
  if (!solveState(model, zero, 0).converged) return undefined;
  let low = 0;
  let high = 1;
  let lowState = zero;
  for (let step = 0; step < LOADABILITY_STEPS; step++) {
    const mid = (low + high) / 2;
    const trial = copyState(lowState);
    if (solveState(model, trial, mid).converged) {
      low = mid;
      lowState = trial;
    } else high = mid;
  }
  // The whole load once more, from the largest share that solved: a refusal is kept only when
  // continuation in load cannot reach it either.
  const full = copyState(lowState);
  if (solveState(model, full, 1).converged) return { scale: 1, state: full };
  return { scale: low, state: lowState };
}


export function notConverged(model: LoadFlowModel, outcome: NewtonOutcome, loadability = estimateLoadability(model)): LoadFlowResult {
  const result = emptyResult(outcome.iterations);
  if (!loadability) {
    return {
      ...result,
      message:
        "The load flow did not converge even with every load set to zero: look at the sources' voltage set points, their reactive limits and the transformer taps.",
    };
  }
  const loadabilityPct = Math.round(loadability.scale * 100);
  return {
    ...result,
    loadabilityPct,
    message: describeCollapse(model.network, model.admittance.busIndex, {
      busVoltagePu: loadability.state.vm,
      busIsPq: (i) => loadability.state.kind[i] === PQ,
      groupSlack: model.groupSlack,
      loadabilityPct: loadability.scale * 100,
      iterations: outcome.iterations,
      failure: outcome.failure,
    }),
  };
}

