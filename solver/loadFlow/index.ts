// Load flow: Newton–Raphson in polar form on the sparse block LU, PV buses switched to PQ at their
// reactive limits. A network that cannot carry its load gets no numbers, only a sentence.
//   model.ts        what stays fixed while the iterations run, and the state that changes
//   newton.ts       mismatch, Jacobian and the Newton iterations
//   limits.ts       PV/PQ switching at reactive limits around the Newton solves
//   loadability.ts  how much of its load a failing network could carry, and the sentence
//   readings.ts     voltages, flows, losses, source outputs and totals for output
import type { Network } from "#solver/schema.ts";
import type { LoadFlowResult } from "#solver/results.ts";
import { buildLoadFlowModel, flatStart, type LoadFlowOptions } from "#solver/loadFlow/model.ts";
import { solveState } from "#solver/loadFlow/limits.ts";
import { estimateLoadability, notConverged } from "#solver/loadFlow/loadability.ts";
import { allFinite, emptyResult, readResults } from "#solver/loadFlow/readings.ts";

export { LOAD_FLOW_METHOD, MAX_ITERATIONS, MISMATCH_TOLERANCE_PU, type LoadFlowOptions } from "#solver/loadFlow/model.ts";

/** Solves a validated network. Never returns NaN or Infinity; a failure comes back as a sentence. */
export function runLoadFlow(network: Network, options: LoadFlowOptions = {}): LoadFlowResult {
  const model = buildLoadFlowModel(network);
  const state = flatStart(model);
  const outcome = solveState(model, state, 1, options);
  let solved = state;
  if (!outcome.converged) {
    // Verified by continuation in load before the network is refused: raised from no load, a
    // network that has a solution reaches it.
    const loadability = estimateLoadability(model);
    if (loadability?.scale !== 1) return notConverged(model, outcome, loadability);
    solved = loadability.state;
  }
  const result = readResults(model, solved, outcome.iterations);
  if (!allFinite(result))
    return {
      ...emptyResult(outcome.iterations),
      message: "The load flow produced numbers that are not finite; the network data is probably extreme (for example a near-zero impedance).",
    };
  return result;
}

