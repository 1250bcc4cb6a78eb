// Size a line or cable (or every line of a ladder's section at once): put each candidate
// conductor in its place, solve, and say for each whether it carries the worst loading, keeps
// every bus beyond it inside its band and withstands the fault for the clearing time, with its
// lifetime cost (capital plus present value of losses) beside it. The planner chooses; the
// cheapest that passes is marked. The voltage ladder takes that one for each alternative.
import { minimumCrossSectionMm2, type ConductorMaterial } from "#solver/conductorWithstand.ts";
import { costAtVoltage, lossMoney, moneyInputSchema, type MoneyInput, type MoneyInputDraft } from "#solver/economics.ts";
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
  | { ok: true; lineId: string; lineIds: string[]; verdicts: SizingVerdict[]; cheapestPassing: string | null }
  | { ok: false; message: string };

/** The reference cross-section the illustrative per-km cost is quoted for (a placeholder). */
const REFERENCE_CROSS_SECTION_MM2 = 300;

/**
 * A candidate's capital per km at a nominal voltage: its own figure, else the money table's
 * cost per km at that voltage (times the cable factor for a cable) scaled by √(S / 300 mm²), an
 * illustrative placeholder for a team's own prices.
 */
export function conductorCostPerKm(candidate: Pick<SizingCandidate, "kind" | "crossSectionMm2" | "costPerKm">, nominalKV: number, money: MoneyInput): number {
  if (candidate.costPerKm !== undefined) return candidate.costPerKm;
  return (
    costAtVoltage(money.lineCostPerKmByKV, nominalKV) *
    (candidate.kind === "cable" ? money.cableCostFactor : 1) *
    Math.sqrt(candidate.crossSectionMm2 / REFERENCE_CROSS_SECTION_MM2)
  );
}

/** Buses that lose every source when the lines are opened: the ones whose voltage depends on them. */
function busesBeyond(network: Network, lineIds: ReadonlySet<string>): Set<string> {
  const neighbours = new Map<string, string[]>();
  const link = (a: string, b: string) => {
    neighbours.set(a, [...(neighbours.get(a) ?? []), b]);
    neighbours.set(b, [...(neighbours.get(b) ?? []), a]);
  };
  for (const l of network.lines) if (!lineIds.has(l.id)) link(l.fromBus, l.toBus);
  for (const t of network.transformers) link(t.hvBus, t.lvBus);
  const fed = new Set(network.sources.filter((s) => s.control === "slack").map((s) => s.bus));
  const queue = [...fed];
  while (queue.length > 0) for (const next of neighbours.get(queue.pop()!) ?? []) if (!fed.has(next)) (fed.add(next), queue.push(next));
  const beyond = new Set(network.buses.map((b) => b.id).filter((id) => !fed.has(id)));
  // In a ring nothing is cut off: then every bus counts.
  return beyond.size > 0 ? beyond : new Set(network.buses.map((b) => b.id));
}

const round = (value: number, digits: number) => Number(value.toFixed(digits));

/**
 * Size one line, or several that take the same conductor (a ladder's section): every candidate
 * on all of them, the worst loading among them, the buses beyond them, the fault at any of their
 * ends and their summed losses and capital.
 */
export function sizeConductor(network: Network, lineIdOrIds: string | readonly string[], candidates: readonly SizingCandidate[], options: SizingOptions): SizingOutcome {
  const lineIds = typeof lineIdOrIds === "string" ? [lineIdOrIds] : [...lineIdOrIds];
  const missing = lineIds.find((id) => !network.lines.some((l) => l.id === id));
  if (missing !== undefined || lineIds.length === 0) return { ok: false, message: `There is no line "${missing ?? ""}" in the network.` };
  if (!(options.clearingTimeS > 0)) return { ok: false, message: "The clearing time must be above 0 s." };
  const sizedIds = new Set(lineIds);
  const lines = network.lines.filter((l) => sizedIds.has(l.id));
  const money = moneyInputSchema.parse(options.money ?? {});
  const nominalKV = network.buses.find((b) => b.id === lines[0].fromBus)?.nominalKV ?? 0;
  const lengthKm = lines.reduce((sum, l) => sum + l.lengthKm, 0);
  const endBuses = new Set(lines.flatMap((l) => [l.fromBus, l.toBus]));
  const beyond = busesBeyond(network, sizedIds);

  const verdicts = candidates.map((candidate): SizingVerdict => {
    const capital = conductorCostPerKm(candidate, nominalKV, money) * lengthKm;
    const sized = (line: Network["lines"][number]) => ({
      ...line,
      kind: candidate.kind,
      rOhmPerKm: candidate.rOhmPerKm,
      xOhmPerKm: candidate.xOhmPerKm,
      bMicroSiemensPerKm: candidate.bMicroSiemensPerKm ?? line.bMicroSiemensPerKm,
      ampacityA: candidate.ampacityA,
      r0OhmPerKm: undefined,
      x0OhmPerKm: undefined,
    });
    const solved = solveNetwork({ ...network, lines: network.lines.map((l) => (sizedIds.has(l.id) ? sized(l) : l)) });
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

    const branches = loadFlow.branches.filter((b) => sizedIds.has(b.id));
    const branch = branches.reduce((worst, b) => ((b.loadingPct ?? 0) > (worst.loadingPct ?? 0) ? b : worst));
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
          ? `every bus beyond the ${lines.length > 1 ? "lines" : "line"} stays inside its band`
          : outOfBand.map(({ bus, vPu }) => `${bus.name} at ${round(vPu, 3)} pu is outside ${bus.vMinPu}–${bus.vMaxPu} pu`).join("; "),
    });

    const endFaults = (faults?.buses ?? []).filter((f) => endBuses.has(f.id));
    const faultKA = endFaults.length > 0 ? Math.max(...endFaults.map((f) => f.ik3kA)) : 0;
    const neededMm2 = minimumCrossSectionMm2(faultKA * 1000, options.clearingTimeS, candidate.material);
    tests.push({
      test: "withstand",
      passes: candidate.crossSectionMm2 >= neededMm2,
      reason: `${round(faultKA, 2)} kA for ${options.clearingTimeS} s needs ${round(neededMm2, 0)} mm²; it has ${candidate.crossSectionMm2} mm²`,
    });

    const losses = lossMoney(branches.reduce((sum, b) => sum + b.lossKW, 0) / 1000, 0, money);
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
  return { ok: true, lineId: lineIds[0], lineIds, verdicts, cheapestPassing: passing[0]?.candidateId ?? null };
}
