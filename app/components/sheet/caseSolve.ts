// The case picker's solving (see caseView.ts), in a module of its own that the sheet loads the
// first time a case or the envelope is picked: one case by the study engine's solveCase, or the
// study's cases (no outages, years or fault levels) and the envelope across them.
import { validateNetwork, type Network } from "#solver/schema.ts";
import { indexElements } from "#solver/elements.ts";
import { runStudySync, solveCase } from "#solver/study/index.ts";
import { branchEnvelopeRows, busEnvelopeRows } from "#solver/study/tables.ts";
import { availableView, type CaseSolve, type CaseView } from "./caseView.ts";

export type SolveInView = typeof solveInView;

/**
 * Solve `document` (a complete network, or a draft's solvable part) in the view asked for; "as
 * drawn", or a view the document no longer offers, is left to the sheet's ordinary solve.
 */
export function solveInView(document: Network, view: CaseView): CaseSolve {
  const shown = availableView(document, view);
  if (shown.kind === "as-drawn") return { kind: "as-drawn" };
  const validated = validateNetwork(document);
  if (!validated.ok) return { kind: "as-drawn" };
  const network = validated.network;
  if (shown.kind === "envelope") {
    const outcome = runStudySync(network, { faults: false });
    if (!outcome.ok) return { kind: "as-drawn" };
    const { study } = outcome;
    return {
      kind: "envelope",
      network,
      study,
      buses: new Map(busEnvelopeRows(network, study).map((row) => [row.id, row])),
      branches: new Map(branchEnvelopeRows(network, study).map((row) => [row.id, row])),
    };
  }
  const operatingCase = network.cases!.find((c) => c.id === shown.id)!;
  const solved = solveCase(network, operatingCase);
  const seen = solved.network ? indexElements(solved.network) : new Map();
  const outOfService = new Set([...indexElements(network).keys()].filter((id) => !seen.has(id)));
  return {
    kind: "case",
    result: solved.result,
    // With nothing energised the solver saw no network: the tables then list the drawing's names, without numbers.
    network: solved.network ?? network,
    shownCase: { id: operatingCase.id, name: operatingCase.name, outOfService, lostLoadMW: solved.lostLoadMW },
  };
}
