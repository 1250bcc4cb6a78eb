// Solving in the browser after each edit: the same solveNetwork the command line and the API
// use, timed, and turned into the lookups the sheet's Readings need; in the operating case the
// picker shows, or the envelope across every case (caseView.ts).
import { useEffect } from "react";
import { solveNetwork } from "#solver/index.ts";
import type { Check, SolveResult } from "#solver/results.ts";
import type { Network } from "#solver/schema.ts";
import { documentIssues } from "./documentIssues.ts";
import { solvablePart } from "./solvablePart.ts";
import { AS_DRAWN_VIEW, type CaseView } from "./caseView.ts";
import type { SolveInView } from "./caseSolve.ts";
import type { Readings, SheetStore, SolveState } from "./sheetStore.ts";
import type { SheetIssue } from "./documentIssues.ts";

export const READINGS_MEASURE = "kilostep:edit-to-readings";

/**
 * A draft solves its complete part (solvablePart.ts): readings there, the rest marked as left
 * out and its problems listed, never a sheet without numbers for one loose part.
 */
export function solveForSheet(document: Network, view: CaseView = AS_DRAWN_VIEW, solveInView?: SolveInView): SolveState {
  const started = performance.now();
  const problems = documentIssues(document);
  const part = problems.length ? solvablePart(document) : { network: document, leftOut: new Set<string>() };
  if (!part) return { kind: "invalid", issues: problems };
  if (view.kind !== "as-drawn" && solveInView) {
    const shown = solveShownCase(solveInView, part.network, view, started, part.leftOut, problems);
    if (shown) return shown;
  }
  let outcome: ReturnType<typeof solveNetwork>;
  try {
    outcome = solveNetwork(part.network);
  } catch (error) {
    return { kind: "failed", message: `The solver stopped on this network: ${error instanceof Error ? error.message : String(error)}` };
  }
  const elapsedMs = performance.now() - started;
  if (!outcome.ok) {
    return { kind: "invalid", issues: problems.length ? problems : outcome.issues.map((i) => ({ message: `${i.path}: ${i.message}` })) };
  }
  return { kind: "solved", readings: readingsOf(outcome.result, outcome.network, elapsedMs, part.leftOut, problems) };
}

/** One operating case, or the envelope across them all; undefined leaves the drawing as drawn. */
function solveShownCase(
  solveInView: SolveInView,
  network: Network,
  view: CaseView,
  started: number,
  leftOut: Set<string>,
  problems: SheetIssue[],
): SolveState | undefined {
  let solved: ReturnType<typeof solveInView>;
  try {
    solved = solveInView(network, view);
  } catch (error) {
    return { kind: "failed", message: `The solver stopped on this case: ${error instanceof Error ? error.message : String(error)}` };
  }
  const elapsedMs = performance.now() - started;
  if (solved.kind === "as-drawn") return undefined;
  if (solved.kind === "case") {
    const readings = readingsOf(solved.result, solved.network, elapsedMs, leftOut, problems);
    return { kind: "solved", readings: { ...readings, shownCase: solved.shownCase } };
  }
  const { network: solvedNetwork, study, buses, branches } = solved;
  return { kind: "envelope", envelope: { network: solvedNetwork, study, elapsedMs, buses, branches, leftOut, problems } };
}

function readingsOf(result: SolveResult, network: Network, elapsedMs: number, leftOut: Set<string>, problems: SheetIssue[]): Readings {
  const converged = result.loadFlow.converged;
  const checksByElement = new Map<string, Check[]>();
  for (const check of result.checks) {
    const list = checksByElement.get(check.element);
    if (list) list.push(check);
    else checksByElement.set(check.element, [check]);
  }
  return {
    result,
    network,
    elapsedMs,
    // A load flow that did not converge has no numbers worth drawing: none are kept.
    buses: new Map(converged ? result.loadFlow.buses.map((b) => [b.id, b]) : []),
    branches: new Map(converged ? result.loadFlow.branches.map((b) => [b.id, b]) : []),
    sources: new Map(converged ? result.loadFlow.sources.map((s) => [s.id, s]) : []),
    faults: new Map((result.faults?.buses ?? []).map((f) => [f.id, f])),
    checksByElement,
    leftOut,
    problems,
  };
}

/**
 * Re-solve whenever the document, or the case the picker shows, changes, at once and in the same
 * store update's turn: every change of the document is a committed value (Enter, leaving a field,
 * a drop, the end of a drag, an undo; typing and dragging stay outside the document until then),
 * so there is nothing to wait for, and React draws the edit and its Readings in one render.
 */
export function useLiveSolve(store: SheetStore): void {
  useEffect(() => {
    // The case picker's solving loads the first time a case is picked (caseSolve.ts).
    let solveInView: SolveInView | undefined;
    const run = () => {
      const { document, caseView, actions } = store.getState();
      if (caseView.kind !== "as-drawn" && !solveInView) {
        import("./caseSolve.ts").then(
          (loaded) => {
            solveInView = loaded.solveInView;
            run();
          },
          () => actions.setSolve({ kind: "failed", message: "The operating case could not be loaded; check the connection and pick the case again." }),
        );
        return;
      }
      actions.setSolve(solveForSheet(document, caseView, solveInView));
    };
    run();
    return store.subscribe((state, previous) => {
      if (state.document !== previous.document || state.caseView !== previous.caseView) run();
    });
  }, [store]);
}
