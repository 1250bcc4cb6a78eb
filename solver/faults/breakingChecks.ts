// Minimum fault level and converter short-circuit ratio checks follow below.
// Switchgear duty: the initial symmetrical short-circuit current against the rated breaking
// current. I"k is at least the symmetrical breaking current I_b, so the comparison errs safe.
import type { Check, FaultResult } from "#solver/results.ts";
import type { Network } from "#solver/schema.ts";
import { minShortCircuitRatio } from "#solver/equipmentRules.ts";

const kA = (value: number) => `${value.toFixed(2)} kA`;

export function faultChecks(network: Network, faults: FaultResult): Check[] {
  // Readings come in the network's bus order.
  const checks: Check[] = [];
  for (let i = 0; i < faults.buses.length; i++) {
    const bus = network.buses[i];
    const reading = faults.buses[i];
    if (bus.breakingKA === undefined) continue;
    const worst = Math.max(reading.ik3kA, reading.ik1kA);
    if (worst <= bus.breakingKA) continue;
    checks.push({
      element: bus.id,
      kind: "breaking-current",
      value: worst,
      limit: bus.breakingKA,
      message:
        `Bus "${bus.name}": initial symmetrical short-circuit current I"k3 = ${kA(reading.ik3kA)}, ` +
        `I"k1 = ${kA(reading.ik1kA)}; ${reading.ik3kA >= reading.ik1kA ? 'I"k3' : 'I"k1'} exceeds the switchgear's ` +
        `rated breaking current ${kA(bus.breakingKA)} (IEC 60909-0 initial symmetrical current against rated breaking current)`,
    });
  }
  for (const check of minimumFaultChecks(network, faults)) checks.push(check);
  return checks;
}

/** The minimum fault level against what the planner asks of a bus, and each converter's SCR. */
function minimumFaultChecks(network: Network, faults: FaultResult): Check[] {
  // Readings come in the network's bus order.
  const checks: Check[] = [];
  for (let i = 0; i < network.buses.length && i < faults.buses.length; i++) {
    const bus = network.buses[i];
    if (bus.minFaultMVA === undefined) continue;
    const reading = faults.buses[i];
    const minimumMVA = Math.sqrt(3) * bus.nominalKV * reading.ik3MinKA;
    if (minimumMVA >= bus.minFaultMVA) continue;
    checks.push({
      element: bus.id,
      kind: "minimum-fault-level",
      value: minimumMVA,
      limit: bus.minFaultMVA,
      message: `Bus "${bus.name}": minimum fault level S"k3min = ${minimumMVA.toFixed(0)} MVA is below the ${bus.minFaultMVA} MVA asked of it (IEC 60909-0 minimum case)`,
    });
  }
  for (const converter of faults.converters) {
    const source = network.sources.find((s) => s.id === converter.id)!;
    const asked = minShortCircuitRatio(source);
    if (converter.scr >= asked) continue;
    checks.push({
      element: converter.id,
      kind: "weak-grid",
      value: converter.scr,
      limit: asked,
      message: `Converter plant "${source.name}": short-circuit ratio ${converter.scr.toFixed(2)} at its bus is below ${asked}${source.minShortCircuitRatio === undefined ? "" : " asked of it"}, a weak connection (S"k3min / rated MVA${source.minShortCircuitRatio === undefined ? ", common practice" : ""})`,
    });
  }
  return checks;
}
