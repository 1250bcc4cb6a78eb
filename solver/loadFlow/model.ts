// The load flow's model: everything about the network that stays fixed while the iterations run
// (admittance matrix, schedules, loads by voltage exponent, reactive limits, the factor's pattern),
// and the state that changes (voltages, bus kinds). Unknowns are angle and relative magnitude change
// per bus, one 2×2 block per bus on the bus graph.
import type { Network } from "#solver/schema.ts";
import { buildAdmittance, type NetworkAdmittance } from "#solver/admittance.ts";
import { analyse } from "#solver/sparse/ordering.ts";
import { BlockFactor } from "#solver/sparse/blockLu.ts";
import { loadVoltageExponent, powerPu } from "#solver/perUnit.ts";

export const LOAD_FLOW_METHOD = "Newton–Raphson (polar, sparse block LU), flat start";
export const MISMATCH_TOLERANCE_PU = 1e-8;
export const MAX_ITERATIONS = 30;

export const PQ = 0;
export const PV = 1;
export const SLACK = 2;

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

export interface Workspace {
  e: Float64Array;
  f: Float64Array;
  pCalc: Float64Array;
  qCalc: Float64Array;
  mismatch: Float64Array;
  /** Σ|ΔP| over the non-slack buses at the last evaluation (pu): what could show in the MW balance. */
  activeMismatchSumPu: number;
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
      pScheduled[i] += powerPu(s.pMW, base);
      qScheduled[i] += powerPu(s.qMvar, base);
    } else if (s.control === "pv") {
      pScheduled[i] += powerPu(s.pMW, base);
      if (initialKind[i] === PQ) {
        initialKind[i] = PV;
        voltageSetPu[i] = s.voltagePu;
      }
      qMinPu[i] += s.qMinMvar === undefined ? Number.NEGATIVE_INFINITY : powerPu(s.qMinMvar, base);
      qMaxPu[i] += s.qMaxMvar === undefined ? Number.POSITIVE_INFINITY : powerPu(s.qMaxMvar, base);
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
    pLoad[k][i] += powerPu(load.pMW, base);
    qLoad[k][i] += powerPu(load.qMvar, base);
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

