// Switchgear duty: the initial symmetrical short-circuit current against the rated breaking
// current. I"k is at least the symmetrical breaking current I_b, so the comparison errs safe.
import type { Check, FaultResult } from "#solver/results.ts";
import type { Network } from "#solver/schema.ts";

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
        `Bus "${bus.name}" (${bus.id}): initial symmetrical short-circuit current I"k3 = ${kA(reading.ik3kA)}, ` +
        `I"k1 = ${kA(reading.ik1kA)}; ${reading.ik3kA >= reading.ik1kA ? 'I"k3' : 'I"k1'} exceeds the switchgear's ` +
        `rated breaking current ${kA(bus.breakingKA)} (IEC 60909-0 initial symmetrical current against rated breaking current)`,
    });
  }
  return checks;
}
