// Small network documents built in code for the solver's reference tests.
import type { NetworkInput } from "#solver/schema.ts";

type Document = NetworkInput;

export interface TwoBusCase {
  kV: number;
  lengthKm: number;
  rOhmPerKm: number;
  xOhmPerKm: number;
  pMW: number;
  qMvar: number;
  sendingPu?: number;
  baseMVA?: number;
  model?: "constant-power" | "constant-current" | "constant-impedance";
}

/** A slack bus feeding one load through one line without shunt susceptance. */
export function twoBus(c: TwoBusCase): Document {
  return {
    format: "kilostep.network",
    version: 1,
    name: "Two-bus check (fictional)",
    frequencyHz: 50,
    baseMVA: c.baseMVA ?? 100,
    buses: [
      { id: "send", name: "Sending end", nominalKV: c.kV },
      { id: "recv", name: "Receiving end", nominalKV: c.kV },
    ],
    sources: [
      { id: "grid", name: "Infeed", bus: "send", kind: "grid", control: "slack", voltagePu: c.sendingPu ?? 1, shortCircuitMVA: 1000, xOverR: 10 },
    ],
    lines: [
      { id: "line", name: "Line", fromBus: "send", toBus: "recv", kind: "overhead", lengthKm: c.lengthKm, rOhmPerKm: c.rOhmPerKm, xOhmPerKm: c.xOhmPerKm },
    ],
    loads: [{ id: "load", name: "Load", bus: "recv", pMW: c.pMW, qMvar: c.qMvar, model: c.model ?? "constant-power" }],
  };
}

export interface TransformerCase {
  hvBusKV: number;
  lvBusKV: number;
  hvKV: number;
  lvKV: number;
  tapPct: number;
  sendingPu?: number;
}

/** A slack on the HV bus, one transformer, nothing on the LV bus: the no-load ratio. */
export function unloadedTransformer(c: TransformerCase): Document {
  return {
    format: "kilostep.network",
    version: 1,
    name: "No-load transformer check (fictional)",
    frequencyHz: 50,
    buses: [
      { id: "hv", name: "HV bus", nominalKV: c.hvBusKV },
      { id: "lv", name: "LV bus", nominalKV: c.lvBusKV },
    ],
    sources: [
      { id: "grid", name: "Infeed", bus: "hv", kind: "grid", control: "slack", voltagePu: c.sendingPu ?? 1, shortCircuitMVA: 2000, xOverR: 10 },
    ],
    transformers: [
      {
        id: "tx",
        name: "Transformer",
        hvBus: "hv",
        lvBus: "lv",
        ratedMVA: 40,
        hvKV: c.hvKV,
        lvKV: c.lvKV,
        impedancePct: 10,
        xOverR: 25,
        tapPct: c.tapPct,
        vectorGroup: "YNd11",
      },
    ],
  };
}
