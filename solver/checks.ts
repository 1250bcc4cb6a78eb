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

function voltageChecks(network: Network, loadFlow: LoadFlowResult): Check[] {
  const readings = new Map(loadFlow.buses.map((b) => [b.id, b]));
  const checks: Check[] = [];
  for (const bus of network.buses) {
    const reading = readings.get(bus.id);
    if (!reading) continue;
    const who = `Bus "${bus.name}" (${bus.id})`;
    const band = `voltage band ${bus.vMinPu}–${bus.vMaxPu} pu`;
    if (reading.vPu < bus.vMinPu)
      checks.push({
        element: bus.id,
        kind: "undervoltage",
        value: reading.vPu,
        limit: bus.vMinPu,
        message: `${who}: ${pu(reading.vPu)} (${reading.vKV.toFixed(2)} kV) is below its minimum ${pu(bus.vMinPu)} (rule: ${band})`,
      });
    else if (reading.vPu > bus.vMaxPu)
      checks.push({
        element: bus.id,
        kind: "overvoltage",
        value: reading.vPu,
        limit: bus.vMaxPu,
        message: `${who}: ${pu(reading.vPu)} (${reading.vKV.toFixed(2)} kV) is above its maximum ${pu(bus.vMaxPu)} (rule: ${band})`,
      });
  }
  return checks;
}

function lineChecks(network: Network, loadFlow: LoadFlowResult): Check[] {
  const readings = new Map(loadFlow.branches.map((b) => [b.id, b]));
  const checks: Check[] = [];
  for (const line of network.lines) {
    const reading = readings.get(line.id);
    if (!reading || line.ampacityA === undefined || reading.currentA <= line.ampacityA) continue;
    checks.push({
      element: line.id,
      kind: "line-overload",
      value: reading.currentA,
      limit: line.ampacityA,
      message:
        `Line "${line.name}" (${line.id}): current ${reading.currentA.toFixed(0)} A is above its ampacity ` +
        `${line.ampacityA.toFixed(0)} A, ${reading.loadingPct?.toFixed(0)} % loaded (rule: line current within its thermal rating)`,
    });
  }
  return checks;
}

function transformerChecks(network: Network, loadFlow: LoadFlowResult): Check[] {
  const readings = new Map(loadFlow.branches.map((b) => [b.id, b]));
  const checks: Check[] = [];
  for (const t of network.transformers) {
    const reading = readings.get(t.id);
    if (!reading) continue;
    const apparentMVA = Math.max(Math.hypot(reading.pFromMW, reading.qFromMvar), Math.hypot(reading.pToMW, reading.qToMvar));
    if (apparentMVA <= t.ratedMVA) continue;
    checks.push({
      element: t.id,
      kind: "transformer-overload",
      value: apparentMVA,
      limit: t.ratedMVA,
      message:
        `Transformer "${t.name}" (${t.id}): apparent power ${apparentMVA.toFixed(2)} MVA is above its rating ` +
        `${t.ratedMVA} MVA, ${(reading.loadingPct ?? 0).toFixed(0)} % loaded (rule: apparent power within rated MVA)`,
    });
  }
  return checks;
}
