// Limits checked on a load flow: bus voltage band, line thermal rating, transformer rating, and
// the load flow's own failure. Each check names the element, its value, the limit and the rule.
import type { Check, LoadFlowResult } from "#solver/results.ts";
import type { Network } from "#solver/schema.ts";

const pu = (value: number) => `${value.toFixed(3)} pu`;

export function loadFlowChecks(network: Network, loadFlow: LoadFlowResult): Check[] {
  if (!loadFlow.converged) return [notConvergedCheck(network, loadFlow)];
  return [...voltageChecks(network, loadFlow), ...lineChecks(network, loadFlow), ...transformerChecks(network, loadFlow)];
}

function notConvergedCheck(network: Network, loadFlow: LoadFlowResult): Check {
  return {
    element: network.name,
    kind: "not-converged",
    value: loadFlow.loadabilityPct ?? 0,
    limit: 100,
    message:
      `Network "${network.name}": the load flow did not converge (share of the load that solves ` +
      `${loadFlow.loadabilityPct ?? 0} %, needed 100 %; rule: the load flow must converge). ${loadFlow.message ?? ""}`.trim(),
  };
}

// Readings come in the network's order (buses; lines, then transformers), so each element finds
// its reading by position; a message is written only for a limit broken.

function voltageChecks(network: Network, loadFlow: LoadFlowResult): Check[] {
  const checks: Check[] = [];
  const readings = loadFlow.buses;
  for (let i = 0; i < readings.length; i++) {
    const bus = network.buses[i];
    const reading = readings[i];
    const low = reading.vPu < bus.vMinPu;
    if (!low && !(reading.vPu > bus.vMaxPu)) continue;
    const who = `Bus "${bus.name}"`;
    const band = `voltage band ${bus.vMinPu}–${bus.vMaxPu} pu`;
    const measured = `${pu(reading.vPu)} (${reading.vKV.toFixed(2)} kV)`;
    checks.push(
      low
        ? {
            element: bus.id,
            kind: "undervoltage",
            value: reading.vPu,
            limit: bus.vMinPu,
            message: `${who}: ${measured} is below its minimum ${pu(bus.vMinPu)} (rule: ${band})`,
          }
        : {
            element: bus.id,
            kind: "overvoltage",
            value: reading.vPu,
            limit: bus.vMaxPu,
            message: `${who}: ${measured} is above its maximum ${pu(bus.vMaxPu)} (rule: ${band})`,
          },
    );
  }
  return checks;
}

function lineChecks(network: Network, loadFlow: LoadFlowResult): Check[] {
  const checks: Check[] = [];
  for (let k = 0; k < network.lines.length && k < loadFlow.branches.length; k++) {
    const line = network.lines[k];
    const reading = loadFlow.branches[k];
    if (line.ampacityA === undefined || reading.currentA <= line.ampacityA) continue;
    checks.push({
      element: line.id,
      kind: "line-overload",
      value: reading.currentA,
      limit: line.ampacityA,
      message:
        `Line "${line.name}": current ${reading.currentA.toFixed(0)} A is above its ampacity ` +
        `${line.ampacityA.toFixed(0)} A, ${reading.loadingPct?.toFixed(0)} % loaded (rule: line current within its thermal rating)`,
    });
  }
  return checks;
}

function transformerChecks(network: Network, loadFlow: LoadFlowResult): Check[] {
  const checks: Check[] = [];
  const first = network.lines.length;
  for (let k = 0; k < network.transformers.length && first + k < loadFlow.branches.length; k++) {
    const t = network.transformers[k];
    const reading = loadFlow.branches[first + k];
    const sFrom = reading.pFromMW * reading.pFromMW + reading.qFromMvar * reading.qFromMvar;
    const sTo = reading.pToMW * reading.pToMW + reading.qToMvar * reading.qToMvar;
    // A cheap test first; the exact figure (Math.hypot, as the loading reads) only near or past the rating.
    if (Math.sqrt(Math.max(sFrom, sTo)) < t.ratedMVA * (1 - 1e-9)) continue;
    const apparentMVA = Math.max(Math.hypot(reading.pFromMW, reading.qFromMvar), Math.hypot(reading.pToMW, reading.qToMvar));
    if (apparentMVA <= t.ratedMVA) continue;
    checks.push({
      element: t.id,
      kind: "transformer-overload",
      value: apparentMVA,
      limit: t.ratedMVA,
      message:
        `Transformer "${t.name}": apparent power ${apparentMVA.toFixed(2)} MVA is above its rating ` +
        `${t.ratedMVA} MVA, ${(reading.loadingPct ?? 0).toFixed(0)} % loaded (rule: apparent power within rated MVA)`,
    });
  }
  return checks;
}
