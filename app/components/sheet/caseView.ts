// The sheet's case picker: which operating case the Readings and the results show. "As drawn" is
// the drawing itself; a case is solved by the study engine's own solveCase (the network with the
// case applied, through solveNetwork); the envelope runs the study's cases (no outages, no years,
// no fault levels) and keeps each bus's lowest and highest voltage and each branch's highest
// loading with the case that sets it. So the sheet shows the numbers the study page shows.
// The solving itself is in caseSolve.ts, loaded the first time a case is picked, so the editor's
// JavaScript carries the study engine only for those who use it.
import type { Network } from "#solver/schema.ts";
import type { SolveResult } from "#solver/results.ts";
import type { Study } from "#solver/study/results.ts";
import type { BranchEnvelopeRow, BusEnvelopeRow } from "#solver/study/tables.ts";

export type CaseView = { kind: "as-drawn" } | { kind: "case"; id: string } | { kind: "envelope" };

export const AS_DRAWN_VIEW: CaseView = { kind: "as-drawn" };

export interface CaseChoice {
  /** The picker's option value: "as-drawn", "case:<id>" or "envelope" (case ids are the planner's own). */
  value: string;
  label: string;
  view: CaseView;
}

/** The picker's choices; none for a network without operating cases (it is only ever "as drawn"). */
export function caseChoices(document: Pick<Network, "cases">): CaseChoice[] {
  const cases = document.cases ?? [];
  if (cases.length === 0) return [];
  return [
    { value: "as-drawn", label: "As drawn", view: AS_DRAWN_VIEW },
    ...cases.map((c): CaseChoice => ({ value: `case:${c.id}`, label: c.name, view: { kind: "case", id: c.id } })),
    { value: "envelope", label: "Envelope of all cases", view: { kind: "envelope" } },
  ];
}

export function caseViewValue(view: CaseView): string {
  return view.kind === "case" ? `case:${view.id}` : view.kind;
}

/** The view still on offer for this document: a case since removed falls back to "as drawn". */
export function availableView(document: Pick<Network, "cases">, view: CaseView): CaseView {
  if (view.kind === "as-drawn" || !document.cases?.length) return AS_DRAWN_VIEW;
  if (view.kind === "case" && !document.cases.some((c) => c.id === view.id)) return AS_DRAWN_VIEW;
  return view;
}

export interface ShownCase {
  id: string;
  name: string;
  /** Elements of the drawing the solver did not see in this case: taken out, or left without supply. */
  outOfService: Set<string>;
  lostLoadMW: number;
}

export type CaseSolve =
  | { kind: "case"; result: SolveResult; network: Network; shownCase: ShownCase }
  | { kind: "envelope"; network: Network; study: Study; buses: Map<string, BusEnvelopeRow>; branches: Map<string, BranchEnvelopeRow> }
  | { kind: "as-drawn" };
