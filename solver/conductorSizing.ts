// Size a line or cable: put each candidate conductor in its place, solve, and say for each
// whether it carries the worst loading, keeps every bus beyond it inside its band and withstands
// the fault for the clearing time, with its lifetime cost (capital plus present value of losses)
// beside it. The planner chooses; the cheapest that passes is marked.
import { minimumCrossSectionMm2, type ConductorMaterial } from "#solver/conductorWithstand.ts";
import { costAtVoltage, lossMoney, moneyInputSchema, type MoneyInputDraft } from "#solver/economics.ts";
import { solveNetwork } from "#solver/index.ts";
import type { Network } from "#solver/schema.ts";

export interface SizingCandidate {
  id: string;
  label: string;
  kind: "overhead" | "cable";
  material: ConductorMaterial;
  /** Conductor cross-section (aluminium area for ACSR), for the adiabatic withstand. */
  crossSectionMm2: number;
  rOhmPerKm: number;
  xOhmPerKm: number;
  bMicroSiemensPerKm?: number;
  ampacityA: number;
  /** Capital per km installed; without it the money table's cost at the line's voltage, scaled by size. */
  costPerKm?: number;
}

export interface SizingOptions {
  /** Time the protection takes to clear a fault on the line, seconds. */
  clearingTimeS: number;
  money?: MoneyInputDraft;
}

export interface SizingTest {
  test: "loading" | "voltage" | "withstand" | "solve";
  passes: boolean;
  reason: string;
}

export interface SizingVerdict {
  candidateId: string;
  label: string;
  passes: boolean;
  tests: SizingTest[];
  loadingPct: number | null;
  faultKA: number | null;
  capitalCost: number;
  lossesPresentValue: number | null;
  lifetimeCost: number | null;
}

export type SizingOutcome =
  | { ok: true; lineId: string; verdicts: SizingVerdict[]; cheapestPassing: string | null }
  | { ok: false; message: string };

/** The reference cross-section the illustrative per-km cost is quoted for (a placeholder). */
const REFERENCE_CROSS_SECTION_MM2 = 300;

/** Buses that lose every source when the line is opened: the ones whose voltage depends on it. */
function busesBeyond(network: Network, lineId: string): Set<string> {
  const neighbours = new Map<string, string[]>();
  const link = (a: string, b: string) => {
    neighbours.set(a, [...(neighbours.get(a) ?? []), b]);
    neighbours.set(b, [...(neighbours.get(b) ?? []), a]);
  };
  for (const l of network.lines) if (l.id !== lineId) link(l.fromBus, l.toBus);
  for (const t of network.transformers) link(t.hvBus, t.lvBus);
  const fed = new Set(network.sources.filter((s) => s.control === "slack").map((s) => s.bus));
  const queue = [...fed];
  while (queue.length > 0) for (const next of neighbours.get(queue.pop()!) ?? []) if (!fed.has(next)) (fed.add(next), queue.push(next));
  const beyond = new Set(network.buses.map((b) => b.id).filter((id) => !fed.has(id)));
  // In a ring nothing is cut off: then every bus counts.
  return beyond.size > 0 ? beyond : new Set(network.buses.map((b) => b.id));
}

const round = (value: number, digits: number) => Number(value.toFixed(digits));

export function sizeConductor(network: Network, lineId: string, candidates: readonly SizingCandidate[], options: SizingOptions): SizingOutcome {
  const line = network.lines.find((l) => l.id === lineId);
  if (!line) return { ok: false, message: `There is no line "${lineId}" in the network.` };
  if (!(options.clearingTimeS > 0)) return { ok: false, message: "The clearing time must be above 0 s." };
  const money = moneyInputSchema.parse(options.money ?? {});
  const nominalKV = network.buses.find((b) => b.id === line.fromBus)?.nominalKV ?? 0;
  const beyond = busesBeyond(network, lineId);

  const verdicts = candidates.map((candidate): SizingVerdict => {
    const tableCostPerKm =
      costAtVoltage(money.lineCostPerKmByKV, nominalKV) *
      (candidate.kind === "cable" ? money.cableCostFactor : 1) *
      Math.sqrt(candidate.crossSectionMm2 / REFERENCE_CROSS_SECTION_MM2);
    const capital = (candidate.costPerKm ?? tableCostPerKm) * line.lengthKm;
    const sized = {
      ...line,
      kind: candidate.kind,
      rOhmPerKm: candidate.rOhmPerKm,
      xOhmPerKm: candidate.xOhmPerKm,
      bMicroSiemensPerKm: candidate.bMicroSiemensPerKm ?? line.bMicroSiemensPerKm,
      ampacityA: candidate.ampacityA,
      r0OhmPerKm: undefined,
      x0OhmPerKm: undefined,
    };
    const solved = solveNetwork({ ...network, lines: network.lines.map((l) => (l.id === lineId ? sized : l)) });
    const failed = (reason: string): SizingVerdict => ({
      candidateId: candidate.id,
      label: candidate.label,
      passes: false,
      tests: [{ test: "solve", passes: false, reason }],
      loadingPct: null,
      faultKA: null,
      capitalCost: capital,
      lossesPresentValue: null,
      lifetimeCost: null,
    });
    if (!solved.ok) return failed(solved.issues.map((i) => i.message).join("; "));
    const { loadFlow, faults } = solved.result;
    if (!loadFlow.converged) return failed(loadFlow.message ?? "the load flow found no solution with this conductor");

    const branch = loadFlow.branches.find((b) => b.id === lineId)!;
    const loadingPct = branch.loadingPct ?? 0;
    const tests: SizingTest[] = [
      {
        test: "loading",
        passes: loadingPct <= 100,
        reason: `carries ${round(branch.currentA, 0)} A of its ${candidate.ampacityA} A (${round(loadingPct, 1)} %)`,
      },
    ];

    const outOfBand = network.buses
      .filter((b) => beyond.has(b.id))
      .map((b) => ({ bus: b, vPu: loadFlow.buses.find((r) => r.id === b.id)!.vPu }))
      .filter(({ bus, vPu }) => vPu < bus.vMinPu || vPu > bus.vMaxPu);
    tests.push({
      test: "voltage",
      passes: outOfBand.length === 0,
      reason:
        outOfBand.length === 0
          ? `every bus beyond the line stays inside its band`
          : outOfBand.map(({ bus, vPu }) => `${bus.name} at ${round(vPu, 3)} pu is outside ${bus.vMinPu}–${bus.vMaxPu} pu`).join("; "),
    });

    const endFaults = (faults?.buses ?? []).filter((f) => f.id === line.fromBus || f.id === line.toBus);
    const faultKA = endFaults.length > 0 ? Math.max(...endFaults.map((f) => f.ik3kA)) : 0;
    const neededMm2 = minimumCrossSectionMm2(faultKA * 1000, options.clearingTimeS, candidate.material);
    tests.push({
      test: "withstand",
      passes: candidate.crossSectionMm2 >= neededMm2,
      reason: `${round(faultKA, 2)} kA for ${options.clearingTimeS} s needs ${round(neededMm2, 0)} mm²; it has ${candidate.crossSectionMm2} mm²`,
    });

    const losses = lossMoney(branch.lossKW / 1000, 0, money);
    return {
      candidateId: candidate.id,
      label: candidate.label,
      passes: tests.every((t) => t.passes),
      tests,
      loadingPct,
      faultKA,
      capitalCost: capital,
      lossesPresentValue: losses.presentValueOfLosses,
      lifetimeCost: capital + losses.presentValueOfLosses,
    };
  });

  const passing = verdicts.filter((v) => v.passes && v.lifetimeCost !== null).sort((a, b) => a.lifetimeCost! - b.lifetimeCost!);
  return { ok: true, lineId, verdicts, cheapestPassing: passing[0]?.candidateId ?? null };
}
