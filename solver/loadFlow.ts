// Load flow: Newton–Raphson in polar form (unknowns angle and relative magnitude change per bus),
// one 2×2 block per bus on the bus graph, solved by the sparse block LU of `sparse.ts`.
// Slack and PV rows are replaced by identity rows, so the pattern never changes while PV buses
// switch to PQ at their reactive limits. A network that cannot carry its load gets no numbers,
// only a sentence: its loads are scaled down by bisection to estimate how much it could carry.
import type { Network } from "#solver/schema.ts";
import type { BranchReading, BusReading, LoadFlowResult, SourceReading } from "#solver/results.ts";
import { buildAdmittance, type NetworkAdmittance } from "#solver/admittance.ts";
import { analyse, BlockFactor } from "#solver/sparse.ts";
import { busCurrentBaseA, loadVoltageExponent } from "#solver/perUnit.ts";
import { describeCollapse } from "#solver/collapse.ts";

export const LOAD_FLOW_METHOD = "Newton–Raphson (polar, sparse block LU), flat start";
export const MISMATCH_TOLERANCE_PU = 1e-8;
export const MAX_ITERATIONS = 30;

const PQ = 0;
const PV = 1;
const SLACK = 2;

/** Reactive-limit state of a PV bus: regulating, or held at its upper or lower limit. */
const REGULATING = 0;
const AT_MAX = 1;
const AT_MIN = -1;

/** Below tolerance, a mismatch above this (pu) gets one more Newton step: it could still move a voltage by 1e-9 pu. */
const POLISH_ABOVE_PU = 1e-11;
/** Below tolerance, a summed active mismatch above this (MW) gets one more step: ten times inside the balance promised. */
const BALANCE_MARGIN_MW = 1e-7;
/** A mismatch this large (pu) means the iterations have run away. */
const DIVERGED_MISMATCH_PU = 1e8;
/** Bisection steps when estimating how much load a failing network could carry (about 1 % resolution). */
const LOADABILITY_STEPS = 7;
/** A PV bus that returns from a limit more often than this stays at the limit (stops see-sawing). */
const MAX_RETURNS_TO_PV = 3;

export interface LoadFlowOptions {
  maxIterations?: number;
  tolerancePu?: number;
}

/** Everything about the network that stays fixed while the iterations run. */
export interface LoadFlowModel {
  network: Network;
  admittance: NetworkAdmittance;
  busCount: number;
  initialKind: Uint8Array;
  voltageSetPu: Float64Array;
  angleSetRad: Float64Array;
  /** Scheduled injection of PQ sources plus the P of PV sources (pu). */
  pScheduled: Float64Array;
  qScheduled: Float64Array;
  /** Load at 1 pu by voltage exponent 0, 1, 2 (pu). */
  pLoad: [Float64Array, Float64Array, Float64Array];
  qLoad: [Float64Array, Float64Array, Float64Array];
  /** Bus index of each load, in the network's order. */
  loadBus: Int32Array;
  /** Summed reactive limits of the PV sources at each bus (pu, ±Infinity when open). */
  qMinPu: Float64Array;
  qMaxPu: Float64Array;
  /** Slack bus of each bus's connected group. */
  groupSlack: Int32Array;
  factor: BlockFactor;
  /** Where each off-diagonal admittance entry's Jacobian block lives in the factor. */
  entrySlot: Int32Array;
  entryIsUpper: Uint8Array;
  /** Scratch arrays for the iterations, made once per model. */
  workspace: Workspace;
}

/** The changing part: voltages and bus kinds (PV buses may switch to PQ). */
export interface LoadFlowState {
  vm: Float64Array;
  va: Float64Array;
  kind: Uint8Array;
  limitState: Int8Array;
  /** Reactive output held by a PV bus at its limit (pu). */
  qHeld: Float64Array;
  returnsToPv: Uint8Array;
}

interface Workspace {
  e: Float64Array;
  f: Float64Array;
  pCalc: Float64Array;
  qCalc: Float64Array;
  mismatch: Float64Array;
  /** Σ|ΔP| over the non-slack buses at the last evaluation (pu): what could show in the MW balance. */
  activeMismatchSumPu: number;
}

export interface NewtonOutcome {
  converged: boolean;
  iterations: number;
  maxMismatchPu: number;
  failure?: "iterations" | "diverged" | "singular" | "limits";
}

export function buildLoadFlowModel(network: Network): LoadFlowModel {
  const admittance = buildAdmittance(network);
  const { busIndex, matrix } = admittance;
  const n = network.buses.length;
  const base = network.baseMVA;
  const initialKind = new Uint8Array(n);
  const voltageSetPu = new Float64Array(n).fill(1);
  const angleSetRad = new Float64Array(n);
  const pScheduled = new Float64Array(n);
  const qScheduled = new Float64Array(n);
  const qMinPu = new Float64Array(n);
  const qMaxPu = new Float64Array(n);

  for (const s of network.sources) {
    const i = busIndex.get(s.bus)!;
    if (s.control === "slack") {
      initialKind[i] = SLACK;
      voltageSetPu[i] = s.voltagePu;
      angleSetRad[i] = (s.angleDeg * Math.PI) / 180;
    }
  }
  for (const s of network.sources) {
    const i = busIndex.get(s.bus)!;
    if (s.control === "pq") {
      pScheduled[i] += s.pMW / base;
      qScheduled[i] += s.qMvar / base;
    } else if (s.control === "pv") {
      pScheduled[i] += s.pMW / base;
      if (initialKind[i] === PQ) {
        initialKind[i] = PV;
        voltageSetPu[i] = s.voltagePu;
      }
      qMinPu[i] += s.qMinMvar === undefined ? Number.NEGATIVE_INFINITY : s.qMinMvar / base;
      qMaxPu[i] += s.qMaxMvar === undefined ? Number.POSITIVE_INFINITY : s.qMaxMvar / base;
    }
  }

  const pLoad: [Float64Array, Float64Array, Float64Array] = [new Float64Array(n), new Float64Array(n), new Float64Array(n)];
  const qLoad: [Float64Array, Float64Array, Float64Array] = [new Float64Array(n), new Float64Array(n), new Float64Array(n)];
  const loadBus = new Int32Array(network.loads.length);
  for (let m = 0; m < network.loads.length; m++) {
    const load = network.loads[m];
    const i = busIndex.get(load.bus)!;
    loadBus[m] = i;
    const k = loadVoltageExponent(load.model);
    pLoad[k][i] += load.pMW / base;
    qLoad[k][i] += load.qMvar / base;
  }

  const groupSlack = new Int32Array(n).fill(-1);
  const queue = new Int32Array(n);
  for (let s = 0; s < n; s++) {
    if (initialKind[s] !== SLACK) continue;
    let head = 0;
    let tail = 0;
    queue[tail++] = s;
    groupSlack[s] = s;
    while (head < tail) {
      const i = queue[head++];
      for (let e = matrix.rowStart[i]; e < matrix.rowStart[i + 1]; e++) {
        const j = matrix.neighbours[e];
        if (groupSlack[j] === -1) {
          groupSlack[j] = s;
          queue[tail++] = j;
        }
      }
    }
  }

  const factor = new BlockFactor(analyse(matrix));
  const nnz = matrix.neighbours.length;
  const entrySlot = new Int32Array(nnz);
  const entryIsUpper = new Uint8Array(nnz);
  for (let i = 0; i < n; i++) {
    for (let e = matrix.rowStart[i]; e < matrix.rowStart[i + 1]; e++) {
      const j = matrix.neighbours[e];
      entrySlot[e] = factor.slotOf(i, j);
      entryIsUpper[e] = factor.isUpper(i, j) ? 1 : 0;
    }
  }

  return {
    network,
    admittance,
    busCount: n,
    initialKind,
    voltageSetPu,
    angleSetRad,
    pScheduled,
    qScheduled,
    pLoad,
    qLoad,
    loadBus,
    qMinPu,
    qMaxPu,
    groupSlack,
    factor,
    entrySlot,
    entryIsUpper,
    workspace: workspace(n),
  };
}

/** Flat start: every angle at its group's slack angle, PQ magnitudes 1 pu, PV and slack at their set points. */
export function flatStart(model: LoadFlowModel): LoadFlowState {
  const n = model.busCount;
  const vm = new Float64Array(n);
  const va = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    vm[i] = model.initialKind[i] === PQ ? 1 : model.voltageSetPu[i];
    const slack = model.groupSlack[i];
    va[i] = slack >= 0 ? model.angleSetRad[slack] : 0;
  }
  return {
    vm,
    va,
    kind: model.initialKind.slice(),
    limitState: new Int8Array(n),
    qHeld: new Float64Array(n),
    returnsToPv: new Uint8Array(n),
  };
}

export function copyState(state: LoadFlowState): LoadFlowState {
  return {
    vm: state.vm.slice(),
    va: state.va.slice(),
    kind: state.kind.slice(),
    limitState: state.limitState.slice(),
    qHeld: state.qHeld.slice(),
    returnsToPv: state.returnsToPv.slice(),
  };
}

function workspace(n: number): Workspace {
  return {
    e: new Float64Array(n),
    f: new Float64Array(n),
    pCalc: new Float64Array(n),
    qCalc: new Float64Array(n),
    mismatch: new Float64Array(2 * n),
    activeMismatchSumPu: 0,
  };
}

/**
 * Computed injections, the mismatch (computed minus scheduled) and, when asked, the Jacobian
 * written straight into the factor's blocks. Returns the largest mismatch that counts.
 */
function evaluate(model: LoadFlowModel, state: LoadFlowState, w: Workspace, loadScale: number, withJacobian: boolean): number {
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
function newton(
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

/** Reactive output of a bus's regulating sources: what the bus injects beyond its scheduled Q, at the solved voltage. */
function regulatingQ(model: LoadFlowModel, w: Workspace, vm: Float64Array, i: number, loadScale: number): number {
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
  return { scale: low, state: lowState };
}

/** Solves a validated network. Never returns NaN or Infinity; a failure comes back as a sentence. */
export function runLoadFlow(network: Network, options: LoadFlowOptions = {}): LoadFlowResult {
  const model = buildLoadFlowModel(network);
  const state = flatStart(model);
  const outcome = solveState(model, state, 1, options);
  if (!outcome.converged) return notConverged(model, outcome);
  const result = readResults(model, state, outcome.iterations);
  if (!allFinite(result))
    return {
      ...emptyResult(outcome.iterations),
      message: "The load flow produced numbers that are not finite; the network data is probably extreme (for example a near-zero impedance).",
    };
  return result;
}

function emptyResult(iterations: number): LoadFlowResult {
  return {
    converged: false,
    iterations,
    method: LOAD_FLOW_METHOD,
    buses: [],
    branches: [],
    sources: [],
    totals: { generationMW: 0, loadMW: 0, lossMW: 0, lossPct: 0 },
  };
}

function notConverged(model: LoadFlowModel, outcome: NewtonOutcome): LoadFlowResult {
  const loadability = estimateLoadability(model);
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
      maxIterations: MAX_ITERATIONS,
    }),
  };
}

function readResults(model: LoadFlowModel, state: LoadFlowState, iterations: number): LoadFlowResult {
  const { network } = model;
  const base = network.baseMVA;
  const w = model.workspace;
  evaluate(model, state, w, 1, false);
  const { vm, va } = state;
  const { e, f } = w;

  const buses: BusReading[] = network.buses.map((bus, i) => ({
    id: bus.id,
    vPu: vm[i],
    vKV: vm[i] * bus.nominalKV,
    angleDeg: (va[i] * 180) / Math.PI,
  }));

  const { from, to, y } = model.admittance.branches;
  const lineCount = network.lines.length;
  const branches: BranchReading[] = new Array(model.admittance.branches.count);
  let lossMW = 0;
  for (let k = 0; k < branches.length; k++) {
    const isLine = k < lineCount;
    const element = isLine ? network.lines[k] : network.transformers[k - lineCount];
    const fb = from[k];
    const tb = to[k];
    const q = 8 * k;
    const ifRe = y[q] * e[fb] - y[q + 1] * f[fb] + y[q + 2] * e[tb] - y[q + 3] * f[tb];
    const ifIm = y[q] * f[fb] + y[q + 1] * e[fb] + y[q + 2] * f[tb] + y[q + 3] * e[tb];
    const itRe = y[q + 4] * e[fb] - y[q + 5] * f[fb] + y[q + 6] * e[tb] - y[q + 7] * f[tb];
    const itIm = y[q + 4] * f[fb] + y[q + 5] * e[fb] + y[q + 6] * f[tb] + y[q + 7] * e[tb];
    const pFrom = (e[fb] * ifRe + f[fb] * ifIm) * base;
    const qFrom = (f[fb] * ifRe - e[fb] * ifIm) * base;
    const pTo = (e[tb] * itRe + f[tb] * itIm) * base;
    const qTo = (f[tb] * itRe - e[tb] * itIm) * base;
    // Square roots written out: Math.hypot is several times slower and these run once per branch.
    const currentFromA = Math.sqrt(ifRe * ifRe + ifIm * ifIm) * busCurrentBaseA(network.buses[fb], base);
    const currentToA = Math.sqrt(itRe * itRe + itIm * itIm) * busCurrentBaseA(network.buses[tb], base);
    const currentA = Math.max(currentFromA, currentToA);
    lossMW += pFrom + pTo;
    let loadingPct: number | null;
    if (isLine) {
      const ampacity = network.lines[k].ampacityA;
      loadingPct = ampacity === undefined ? null : (currentA / ampacity) * 100;
    } else {
      const rated = network.transformers[k - lineCount].ratedMVA;
      loadingPct = (Math.sqrt(Math.max(pFrom * pFrom + qFrom * qFrom, pTo * pTo + qTo * qTo)) / rated) * 100;
    }
    branches[k] = {
      id: element.id,
      kind: isLine ? "line" : "transformer",
      fromBus: network.buses[fb].id,
      toBus: network.buses[tb].id,
      pFromMW: pFrom,
      qFromMvar: qFrom,
      pToMW: pTo,
      qToMvar: qTo,
      lossKW: (pFrom + pTo) * 1000,
      currentA,
      loadingPct,
    };
  }

  const sources = sourceReadings(model, state, w);
  let generationMW = 0;
  let injectedMW = 0;
  for (const s of sources) {
    generationMW += s.pMW;
    injectedMW += Math.max(s.pMW, 0);
  }
  let loadMW = 0;
  for (let m = 0; m < network.loads.length; m++) {
    const load = network.loads[m];
    const v = vm[model.loadBus[m]];
    const p = load.pMW * v ** loadVoltageExponent(load.model);
    loadMW += p;
    injectedMW += Math.max(-p, 0);
  }
  return {
    converged: true,
    iterations,
    method: LOAD_FLOW_METHOD,
    buses,
    branches,
    sources,
    totals: {
      generationMW,
      loadMW,
      lossMW,
      // Losses against everything fed into the network, so that an exporting plant reads sensibly.
      lossPct: injectedMW > 0 ? (lossMW / injectedMW) * 100 : 0,
    },
  };
}

/**
 * Source outputs. Fixed sources give their schedule; the slack takes what its bus injects beyond
 * the others. Reactive output at a regulating bus is shared by the sources there: in proportion to
 * their reactive ranges when all are limited, else equally.
 */
function sourceReadings(model: LoadFlowModel, state: LoadFlowState, w: Workspace): SourceReading[] {
  const { network } = model;
  const base = network.baseMVA;
  const busIndex = model.admittance.busIndex;
  const vm = state.vm;
  const regulatingAt = new Map<number, number[]>();
  network.sources.forEach((s, k) => {
    if (s.control === "pq") return;
    const i = busIndex.get(s.bus)!;
    if (s.control === "pv" && model.initialKind[i] === SLACK) return;
    regulatingAt.set(i, [...(regulatingAt.get(i) ?? []), k]);
  });
  const readings: SourceReading[] = network.sources.map((s) => ({ id: s.id, pMW: s.pMW, qMvar: s.qMvar }));
  for (const [i, members] of regulatingAt) {
    const v = vm[i];
    const pl = model.pLoad[0][i] + model.pLoad[1][i] * v + model.pLoad[2][i] * v * v;
    const qRegulated = regulatingQ(model, w, vm, i, 1) * base;
    if (model.initialKind[i] === SLACK) {
      // Everything at a slack bus that is not scheduled: the slack source itself.
      const slack = members[0];
      readings[slack].pMW = (w.pCalc[i] + pl - model.pScheduled[i]) * base;
      readings[slack].qMvar = qRegulated;
      continue;
    }
    const limits = members.map((k) => network.sources[k]);
    const bounded = limits.every((s) => s.qMinMvar !== undefined && s.qMaxMvar !== undefined);
    const range = bounded ? limits.reduce((sum, s) => sum + (s.qMaxMvar! - s.qMinMvar!), 0) : 0;
    const lowest = bounded ? limits.reduce((sum, s) => sum + s.qMinMvar!, 0) : 0;
    const proportional = members.length > 1 && bounded && range > 1e-6;
    members.forEach((k, m) => {
      const s = limits[m];
      readings[k].qMvar = proportional
        ? s.qMinMvar! + ((qRegulated - lowest) / range) * (s.qMaxMvar! - s.qMinMvar!)
        : qRegulated / members.length;
    });
  }
  // PV sources sharing a bus with the slack deliver their P; their Q is counted with the slack.
  network.sources.forEach((s, k) => {
    if (s.control === "pv" && model.initialKind[busIndex.get(s.bus)!] === SLACK) readings[k].qMvar = 0;
  });
  return readings;
}

function allFinite(result: LoadFlowResult): boolean {
  const ok = Number.isFinite;
  for (const b of result.buses) if (!(ok(b.vPu) && ok(b.vKV) && ok(b.angleDeg))) return false;
  for (const b of result.branches) {
    if (!(ok(b.pFromMW) && ok(b.qFromMvar) && ok(b.pToMW) && ok(b.qToMvar) && ok(b.lossKW) && ok(b.currentA))) return false;
    if (b.loadingPct !== null && !ok(b.loadingPct)) return false;
  }
  for (const s of result.sources) if (!(ok(s.pMW) && ok(s.qMvar))) return false;
  const t = result.totals;
  return ok(t.generationMW) && ok(t.loadMW) && ok(t.lossMW) && ok(t.lossPct);
}
