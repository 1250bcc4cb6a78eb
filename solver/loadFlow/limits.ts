// PV buses at their reactive limits: a bus whose regulating sources would leave their range is held
// at the limit as a PQ bus, and returns to regulating when its voltage says so (at most a few times,
// so that it cannot see-saw). Newton solves and switching share one iteration budget; a second
// attempt, started with every PV bus at a limit, gets its own.
import { copyState, flatStart, MAX_ITERATIONS, MISMATCH_TOLERANCE_PU, PQ, PV, type LoadFlowModel, type LoadFlowOptions, type LoadFlowState, type Workspace } from "#solver/loadFlow/model.ts";
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
function solveRegulating(model: LoadFlowModel, state: LoadFlowState, loadScale: number, maxIterations: number, tolerance: number): NewtonOutcome {
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

/**
 * The start for a second attempt when holding every set point first has failed: each PV bus begins
 * held at the reactive limit its voltage points to. With its output at the limit nearest zero the
 * bus sits below its set point (it needs more: held at its upper limit) or above it (held at its
 * lower limit). From there a bus returns to regulating only when the voltage at that limit has
 * passed its set point, which brackets the set point between two outputs the plant can give, so
 * no iteration ever chases a voltage that no output within its limits can hold.
 */
function startAtLimits(model: LoadFlowModel, state: LoadFlowState, loadScale: number, maxIterations: number, tolerance: number): NewtonOutcome | undefined {
  const fresh = flatStart(model);
  const { kind, limitState, qHeld } = fresh;
  let any = false;
  for (let i = 0; i < model.busCount; i++) {
    if (model.initialKind[i] !== PV) continue;
    any = true;
    kind[i] = PQ;
    qHeld[i] = Math.min(Math.max(0, model.qMinPu[i]), model.qMaxPu[i]);
    fresh.vm[i] = 1;
  }
  if (!any) return undefined;
  const first = newton(model, fresh, model.workspace, loadScale, maxIterations, tolerance);
  if (!first.converged) return first;
  for (let i = 0; i < model.busCount; i++) {
    if (model.initialKind[i] !== PV) continue;
    const below = fresh.vm[i] < model.voltageSetPu[i];
    limitState[i] = below ? AT_MAX : AT_MIN;
    qHeld[i] = below ? model.qMaxPu[i] : model.qMinPu[i];
    // An open limit cannot be held: the bus regulates (its set point is then reachable).
    if (!Number.isFinite(qHeld[i])) {
      kind[i] = PV;
      limitState[i] = REGULATING;
      qHeld[i] = 0;
      fresh.vm[i] = model.voltageSetPu[i];
    }
  }
  const rest = solveRegulating(model, fresh, loadScale, maxIterations - first.iterations, tolerance);
  copyInto(state, fresh);
  return { ...rest, iterations: first.iterations + rest.iterations };
}

function copyInto(target: LoadFlowState, source: LoadFlowState): void {
  target.vm.set(source.vm);
  target.va.set(source.va);
  target.kind.set(source.kind);
  target.limitState.set(source.limitState);
  target.qHeld.set(source.qHeld);
  target.returnsToPv.set(source.returnsToPv);
}

/**
 * Newton iterations with PV buses switched at their reactive limits. When holding every set point
 * first fails (a set point no output within the limits can hold sends Newton after an operating
 * point that does not exist, or one so far out that the budget runs out on the way), a second
 * attempt with its own budget starts each PV bus at the limit its voltage points to; a network is
 * refused only when both fail. The outcome's iterations count both attempts.
 */
export function solveState(
  model: LoadFlowModel,
  state: LoadFlowState,
  loadScale: number,
  options: LoadFlowOptions = {},
): NewtonOutcome {
  const maxIterations = options.maxIterations ?? MAX_ITERATIONS;
  const tolerance = options.tolerancePu ?? MISMATCH_TOLERANCE_PU;
  const start = copyState(state);
  const direct = solveRegulating(model, state, loadScale, maxIterations, tolerance);
  if (direct.converged) return direct;
  const second = startAtLimits(model, start, loadScale, maxIterations, tolerance);
  if (!second?.converged) return direct;
  copyInto(state, start);
  return { ...second, iterations: direct.iterations + second.iterations };
}
