// Bench: IEC 60909-0 fault levels at every bus of a 10,000-bus radial feeder (target ≤ 100 ms).
// A 33 kV infeed, a 33/11 kV Dyn11 transformer, an 11 kV trunk with laterals, and 11/0.4 kV
// Dyn11 distribution transformers along it. Prints the median of repeated all-bus solves.
import { pathToFileURL } from "node:url";
import { computeFaultLevels } from "#solver/faults/index.ts";
import { validateNetwork, type Network, type NetworkInput } from "#solver/schema.ts";

export const FAULT_BENCH_BUSES = 10_000;
export const FAULT_BENCH_TARGET_MS = 100;

export function radialFeeder(busCount: number): Network {
  const doc: NetworkInput & Required<Pick<NetworkInput, "buses" | "lines" | "transformers">> = {
    format: "kilostep.network",
    version: 1,
    name: `radial feeder of ${busCount} buses`,
    frequencyHz: 50,
    buses: [
      { id: "b0", name: "Grid 33 kV", nominalKV: 33 },
      { id: "b1", name: "Primary 11 kV", nominalKV: 11 },
    ],
    sources: [{ id: "q", name: "Grid", bus: "b0", kind: "grid", control: "slack", shortCircuitMVA: 750, xOverR: 8 }],
    transformers: [
      { id: "t-primary", name: "Primary", hvBus: "b0", lvBus: "b1", ratedMVA: 30, hvKV: 33, lvKV: 11, impedancePct: 10, loadLossKW: 130, vectorGroup: "Dyn11" },
    ],
    lines: [],
  };
  const mediumVoltage = [1];
  for (let k = 2; k < busCount; k++) {
    const id = `b${k}`;
    if (k % 10 === 0) {
      doc.buses.push({ id, name: `LV ${k}`, nominalKV: 0.4 });
      doc.transformers.push({ id: `t${k}`, name: `Distribution ${k}`, hvBus: `b${mediumVoltage[mediumVoltage.length - 1]}`, lvBus: id, ratedMVA: 0.5, hvKV: 11, lvKV: 0.42, impedancePct: 4.5, loadLossKW: 5.5, vectorGroup: "Dyn11" });
      continue;
    }
    // Trunk most of the time; every seventh bus starts a lateral from an earlier trunk bus.
    const parent = mediumVoltage[Math.max(0, mediumVoltage.length - 1 - (k % 7 === 0 ? 25 : 0))];
    doc.buses.push({ id, name: `MV ${k}`, nominalKV: 11 });
    doc.lines.push({ id: `l${k}`, name: `Section ${k}`, fromBus: `b${parent}`, toBus: id, kind: "overhead", lengthKm: 0.2, rOhmPerKm: 0.27, xOhmPerKm: 0.35 });
    mediumVoltage.push(k);
  }
  const checked = validateNetwork(doc);
  if (!checked.ok) throw new Error(checked.issues.map((i) => `${i.path}: ${i.message}`).join("\n"));
  return checked.network;
}

export function runFaultBench(runs = 21): { medianMs: number; buses: number } {
  const network = radialFeeder(FAULT_BENCH_BUSES);
  computeFaultLevels(network);
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const started = performance.now();
    const result = computeFaultLevels(network);
    times.push(performance.now() - started);
    if (result.buses.length !== FAULT_BENCH_BUSES) throw new Error("fault bench: a bus is missing from the result");
  }
  times.sort((a, b) => a - b);
  const medianMs = times[Math.floor(times.length / 2)];
  console.log(
    `faults: IEC 60909-0 all-bus I"k3/i_p/I"k1, ${FAULT_BENCH_BUSES} buses radial: median ${medianMs.toFixed(1)} ms, ` +
      `fastest ${times[0].toFixed(1)} ms over ${runs} runs (target ≤ ${FAULT_BENCH_TARGET_MS} ms) ` +
      (medianMs <= FAULT_BENCH_TARGET_MS ? "ok" : "TOO SLOW"),
  );
  return { medianMs, buses: FAULT_BENCH_BUSES };
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? "").href) runFaultBench();
