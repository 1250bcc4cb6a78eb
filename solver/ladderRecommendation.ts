// The voltage ladder's recommendation: the cheapest alternative that keeps every limit in every
// case, and the sentence saying which operating case decided it.
import { rankByTotalCost } from "#solver/economics.ts";
import type { LadderAlternative, LadderRecommendation } from "#solver/ladder.ts";
import type { Study, StudyCheck } from "#solver/study/index.ts";

export function recommend(alternatives: readonly LadderAlternative[], currency: string, studies: readonly Study[]): LadderRecommendation | null {
  const totals = (keep: (a: LadderAlternative) => boolean) => alternatives.map((a) => (keep(a) ? a.money.totalCost : null));
  const withinLimits = rankByTotalCost(totals((a) => a.withinLimits));
  const index = withinLimits[0] ?? rankByTotalCost(totals(() => true))[0];
  if (index === undefined) return null;
  const chosen = alternatives[index];
  const total = `${Math.round(chosen.money.totalCost!).toLocaleString("en-GB")} ${currency}`;
  const decidingCase = decidingCaseOf(alternatives, index, studies);
  const caseName = (id: string) => alternatives[index].cases.find((c) => c.id === id)?.name ?? id;
  const because =
    decidingCase === null
      ? ""
      : decidingCase.reason === "limits"
        ? ` The case that decided: "${decidingCase.name}", in which ${decidingCase.cheaperKV} kV, though cheaper, ${
            decidingCase.check.kind === "not-converged" ? "cannot carry the load" : `breaks a limit at ${decidingCase.check.element} (${decidingCase.check.kind})`
          }.`
        : ` The case that decided: "${caseName(decidingCase.id)}", whose losses weigh most in the year's energy (${decidingCase.shareOfEnergyPct.toFixed(0)} % of it).`;
  return {
    index,
    voltageKV: chosen.voltageKV,
    totalCost: chosen.money.totalCost!,
    withinLimits: chosen.withinLimits,
    decidingCase: decidingCase && { id: decidingCase.id, name: decidingCase.name, reason: decidingCase.reason },
    note:
      (chosen.withinLimits
        ? `${chosen.voltageKV} kV has the lowest total cost (${total}, capital plus the present value of losses) of the alternatives that keep every voltage and loading within its limit${chosen.cases.length > 1 ? " in every operating case" : ""}.`
        : `No alternative keeps every voltage and loading within its limit; of those that carry the load, ${chosen.voltageKV} kV has the lowest total cost (${total}). Resolve the broken limits before relying on this ranking.`) +
      because,
  };
}

type Decider =
  | { reason: "limits"; id: string; name: string; cheaperKV: number; check: StudyCheck }
  | { reason: "losses"; id: string; name: string; shareOfEnergyPct: number };

/**
 * Which case decided the recommendation: among the alternatives cheaper than the chosen one that
 * were ruled out, the cheapest, and the case of its first broken limit; when nothing cheaper was
 * ruled out, the case with the largest share of the chosen alternative's energy lost.
 */
function decidingCaseOf(alternatives: readonly LadderAlternative[], index: number, studies: readonly Study[]): Decider | null {
  const chosen = alternatives[index];
  // An alternative that cannot carry the load has no losses to price; its capital still says whether it was cheaper.
  const cost = (a: LadderAlternative) => a.money.totalCost ?? a.money.capital.total;
  const ruledOut = alternatives
    .filter((a) => a !== chosen && !a.withinLimits && cost(a) < chosen.money.totalCost! && a.studyChecks.length > 0)
    .sort((a, b) => cost(a) - cost(b));
  if (chosen.withinLimits && ruledOut.length > 0) {
    const check = ruledOut[0].studyChecks[0];
    const name = ruledOut[0].cases.find((c) => c.id === check.case)?.name ?? check.case;
    return { reason: "limits", id: check.case, name, cheaperKV: ruledOut[0].voltageKV, check };
  }
  const byCase = studies[index].energy.byCase.filter((c) => c.lossMWh !== null);
  if (byCase.length === 0) return null;
  const heaviest = byCase.reduce((a, b) => (b.lossMWh! > a.lossMWh! ? b : a));
  const totalMWh = byCase.reduce((sum, c) => sum + c.lossMWh!, 0);
  return {
    reason: "losses",
    id: heaviest.case,
    name: chosen.cases.find((c) => c.id === heaviest.case)?.name ?? heaviest.case,
    shareOfEnergyPct: totalMWh > 0 ? (100 * heaviest.lossMWh!) / totalMWh : 0,
  };
}
