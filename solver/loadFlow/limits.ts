// PV buses at their reactive limits: a bus whose regulating sources would leave their range is held
// at the limit as a PQ bus, and returns to regulating when its voltage says so (at most a few times,
// so that it cannot see-saw). Newton solves and switching share one iteration budget.
import { MAX_ITERATIONS, MISMATCH_TOLERANCE_PU, PQ, PV, type LoadFlowModel, type LoadFlowOptions, type LoadFlowState, type Workspace } from "#solver/loadFlow/model.ts";
import { newton, type NewtonOutcome } from "#solver/loadFlow/newton.ts";

/** Reactive-limit state of a PV bus: regulating, or held at its upper or lower limit. */
const REGULATING = 0;
const AT_MAX = 1;
const AT_MIN = -1;
/** A PV bus that returns from a limit more often than this stays at the limit (stops see-sawing). */
const MAX_RETURNS_TO_PV = 3;

/** Reactive output of a bus's regulating sources: what the bus injects beyond its scheduled Q, at the solved voltage. */
export function regulatingQ(model: LoadFlowModel, w: Workspace, vm: Float64Array, i: number, loadScale: number): number {
  const v = vm[i];
  const ql = loadScale * (model.qLoad[0][i] + model.qLoad[1][i] * v + model.qLoad[2][i] * v * v);
  return w.qCalc[i] + ql - model.qScheduled[i];
}

/** Switches PV buses at a reactive limit to PQ, and back when the voltage says so; true when anything changed. */
function enforceReactiveLimits(model: LoadFlowModel, state: LoadFlowState, w: Workspace, loadScale: number): boolean {
  const { kind, limitState, qHeld, vm, returnsToPv } = state;
  const slack = 1e-9;
  let changed = false;
  for (let i = 0; i < model.busCount; i++) {
    if (model.initialKind[i] !== PV) continue;
    if (limitState[i] === REGULATING) {
      const q = regulatingQ(model, w, vm, i, loadScale);
      if (q > model.qMaxPu[i] + slack) {
        kind[i] = PQ;
        limitState[i] = AT_MAX;
        qHeld[i] = model.qMaxPu[i];
        changed = true;
      } else if (q < model.qMinPu[i] - slack) {
        kind[i] = PQ;
        limitState[i] = AT_MIN;
        qHeld[i] = model.qMinPu[i];
        changed = true;
      }
    } else if (returnsToPv[i] < MAX_RETURNS_TO_PV) {
      const set = model.voltageSetPu[i];
      const back = limitState[i] === AT_MAX ? vm[i] > set + slack : vm[i] < set - slack;
      if (back) {
        kind[i] = PV;
        limitState[i] = REGULATING;
        qHeld[i] = 0;
        vm[i] = set;
        returnsToPv[i]++;
        changed = true;
      }
    }
  }
  return changed;
}

/** Newton iterations with PV buses switched at their reactive limits, within one iteration budget. */
export function solveState(
  model: LoadFlowModel,
  state: LoadFlowState,
  loadScale: number,
  options: LoadFlowOptions = {},
): NewtonOutcome {
  const maxIterations = options.maxIterations ?? MAX_ITERATIONS;
  const tolerance = options.tolerancePu ?? MISMATCH_TOLERANCE_PU;
  const w = model.workspace;
  let used = 0;
  for (;;) {
    const outcome = newton(model, state, w, loadScale, maxIterations - used, tolerance);
    used += outcome.iterations;
    if (!outcome.converged) return { ...outcome, iterations: used };
    if (!enforceReactiveLimits(model, state, w, loadScale)) {
      return { converged: true, iterations: used, maxMismatchPu: outcome.maxMismatchPu };
    }
    if (used >= maxIterations) return { converged: false, iterations: used, maxMismatchPu: outcome.maxMismatchPu, failure: "limits" };
  }
}

