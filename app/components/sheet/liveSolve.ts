// Solving in the browser after each edit: the same solveNetwork the command line and the API
// use, timed, and turned into the lookups the sheet's Readings need.
import { useEffect } from "react";
import { solveNetwork } from "#solver/index.ts";
import type { Check } from "#solver/results.ts";
import type { Network } from "#solver/schema.ts";
import { documentIssues } from "./documentIssues.ts";
import { solvablePart } from "./solvablePart.ts";
import type { Readings, SheetStore, SolveState } from "./sheetStore.ts";

export const READINGS_MEASURE = "kilostep:edit-to-readings";

/**
 * A draft solves its complete part (solvablePart.ts): readings there, the rest marked as left
 * out and its problems listed, never a sheet without numbers for one loose part.
 */
export function solveForSheet(document: Network): SolveState {
  const started = performance.now();
  const problems = documentIssues(document);
  const part = problems.length ? solvablePart(document) : { network: document, leftOut: new Set<string>() };
  if (!part) return { kind: "invalid", issues: problems };
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
  const { result, network } = outcome;
  const converged = result.loadFlow.converged;
  const checksByElement = new Map<string, Check[]>();
  for (const check of result.checks) {
    const list = checksByElement.get(check.element);
    if (list) list.push(check);
    else checksByElement.set(check.element, [check]);
  }
  const readings: Readings = {
    result,
    network,
    elapsedMs,
    // A load flow that did not converge has no numbers worth drawing: none are kept.
    buses: new Map(converged ? result.loadFlow.buses.map((b) => [b.id, b]) : []),
    branches: new Map(converged ? result.loadFlow.branches.map((b) => [b.id, b]) : []),
    sources: new Map(converged ? result.loadFlow.sources.map((s) => [s.id, s]) : []),
    faults: new Map((result.faults?.buses ?? []).map((f) => [f.id, f])),
    checksByElement,
    leftOut: part.leftOut,
    problems,
  };
  return { kind: "solved", readings };
}

/**
 * Re-solve whenever the document changes, at once and in the same store update's turn: every
 * change of the document is a committed value (Enter, leaving a field, a drop, the end of a drag,
 * an undo; typing and dragging stay outside the document until then), so there is nothing to wait
 * for, and React draws the edit and its Readings in one render.
 */
export function useLiveSolve(store: SheetStore): void {
  useEffect(() => {
    const run = () => store.getState().actions.setSolve(solveForSheet(store.getState().document));
    run();
    return store.subscribe((state, previous) => {
      if (state.document !== previous.document) run();
    });
  }, [store]);
}
