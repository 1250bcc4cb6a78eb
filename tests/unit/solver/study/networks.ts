// Small network documents for the study tests: the demo chain with cases, and a substation of two
// identical transformers in parallel.
import { readFileSync } from "node:fs";
import { join } from "node:path";
import type { NetworkInput } from "#solver/schema.ts";

const FIXTURES = join(import.meta.dirname, "..", "..", "..", "fixtures");

export function fixtureDocument(file: string): NetworkInput {
  return JSON.parse(readFileSync(join(FIXTURES, file), "utf8")) as NetworkInput;
}

/** The demo hydro chain as a version 2 file with the given cases. */
export function tarnWithCases(cases: NetworkInput["cases"], growth?: NetworkInput["growth"]): NetworkInput {
  const doc = fixtureDocument("tarn-head-calder-flats.json");
  // The stored demo may already carry its own cases; these tests say exactly which they study.
  return { ...doc, version: 2, cases, growth };
}

/** A stiff 66 kV infeed feeding an 11 kV load through two identical 10 MVA transformers in parallel. */
export function twinTransformers(loadMW: number): NetworkInput {
  const transformer = (id: string) => ({
    id,
    name: `Transformer ${id}`,
    hvBus: "hv",
    lvBus: "lv",
    ratedMVA: 10,
    hvKV: 66,
    lvKV: 11,
    impedancePct: 8,
    xOverR: 15,
    vectorGroup: "Dyn11",
  });
  return {
    format: "kilostep.network",
    version: 2,
    name: "Twin transformers (fictional)",
    frequencyHz: 50,
    buses: [
      { id: "hv", name: "66 kV", nominalKV: 66 },
      { id: "lv", name: "11 kV", nominalKV: 11, vMinPu: 0.9, vMaxPu: 1.1 },
    ],
    sources: [{ id: "grid", name: "Grid", bus: "hv", kind: "grid", control: "slack", voltagePu: 1, shortCircuitMVA: 5000, xOverR: 10 }],
    transformers: [transformer("t1"), transformer("t2")],
    loads: [{ id: "load", name: "Town", bus: "lv", pMW: loadMW, qMvar: loadMW * 0.33 }],
  };
}
