// Readings of a solved load flow: bus voltages, branch flows, currents, losses and loadings, source
// outputs and the totals, in the shape the command line, the API and the pages show.
import type { BranchReading, BusReading, LoadFlowResult, SourceReading } from "#solver/results.ts";
import { busCurrentBaseA, loadVoltageExponent } from "#solver/perUnit.ts";
import { LOAD_FLOW_METHOD, SLACK, type LoadFlowModel, type LoadFlowState, type Workspace } from "#solver/loadFlow/model.ts";
import { evaluate } from "#solver/loadFlow/newton.ts";
import { regulatingQ } from "#solver/loadFlow/limits.ts";

export function emptyResult(iterations: number): LoadFlowResult {
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


export function readResults(model: LoadFlowModel, state: LoadFlowState, iterations: number): LoadFlowResult {
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

export function allFinite(result: LoadFlowResult): boolean {
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
