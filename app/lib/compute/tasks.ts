// The heavy work the server does, as plain functions of plain data: they run in a worker thread
// (worker.ts) so the thread that answers requests only reads, writes and sends. Each takes the
// stored document and answers something a structured clone carries back (no functions, no classes).
import { layoutSingleLine, type SingleLineLayout } from "#app/components/report/singleLineLayout.ts";
import { branchesCsv, busesCsv } from "#solver/csv.ts";
import { solveNetwork, type SolveOutcome } from "#solver/index.ts";
import type { MessagePort } from "node:worker_threads";
import type { JobProgress } from "./jobView.ts";
import { runLadder, type LadderOutcome, type LadderProgress } from "#solver/ladder.ts";
import { validateNetwork, type ValidationIssue } from "#solver/schema.ts";
import { runStudySync, type StudyOutcome, type StudyProgress } from "#solver/study/index.ts";

/** Drawings of more buses than this are left out of the report, which says so in a sentence. */
export const DRAWING_MAX_BUSES = 400;

export type ComputeTask =
  | { kind: "solve"; document: unknown }
  | { kind: "solve-json"; document: unknown }
  | { kind: "ladder-json"; document: unknown; request: unknown }
  | { kind: "csv"; document: unknown; table: "buses" | "branches" }
  | { kind: "ladder"; document: unknown; request: unknown }
  | { kind: "report"; document: unknown; study: unknown | null }
  | { kind: "study"; document: unknown; request: unknown };

export type { JobProgress } from "./jobView.ts";

/** Reports at most this often, and once at the end; a bar needs no more. */
const PROGRESS_EVERY_MS = 100;

const STUDY_STAGES: Record<StudyProgress["stage"], string> = { cases: "Operating cases", outages: "Outages", years: "Years of growth" };

export function studyProgressOf(step: StudyProgress): JobProgress {
  return { done: step.done, total: step.total, stage: `${STUDY_STAGES[step.stage]}: ${step.done} of ${step.total} load flows` };
}

export function ladderProgressOf(step: LadderProgress): JobProgress {
  const total = step.alternatives * 1000;
  return {
    done: Math.min(total, step.alternative * 1000 + Math.round(step.fraction * 1000)),
    total,
    stage: `Alternative ${step.alternative + 1} of ${step.alternatives} (${step.voltageKV} kV)`,
  };
}

/** A throttled reporter onto the port the pool handed over with the task, or nothing. */
function reporter<T>(port: MessagePort | undefined, shape: (step: T) => JobProgress): ((step: T) => void) | undefined {
  if (!port) return undefined;
  let last = 0;
  return (step) => {
    const progress = shape(step);
    const now = performance.now();
    if (progress.done < progress.total && now - last < PROGRESS_EVERY_MS) return;
    last = now;
    port.postMessage(progress);
  };
}

export type CsvOutcome = { ok: true; csv: string } | { ok: false };

/**
 * An answer the API sends as JSON, written in the worker: a large result then crosses to the
 * request thread as one string, not as an object graph to rebuild there.
 */
export type JsonOutcome = { ok: true; json: string } | { ok: false; issues: ValidationIssue[] };

export interface ReportData {
  solved: SolveOutcome;
  ladder: LadderOutcome | null;
  drawing: SingleLineLayout | null;
}

export interface ComputeAnswers {
  solve: SolveOutcome;
  "solve-json": JsonOutcome;
  "ladder-json": JsonOutcome;
  csv: CsvOutcome;
  ladder: LadderOutcome;
  report: ReportData;
  study: StudyOutcome;
}

export function solveTask(document: unknown): SolveOutcome {
  return solveNetwork(document);
}

export function csvTask(document: unknown, table: "buses" | "branches"): CsvOutcome {
  const solved = solveNetwork(document);
  if (!solved.ok) return { ok: false };
  return { ok: true, csv: table === "buses" ? busesCsv(solved.network, solved.result) : branchesCsv(solved.network, solved.result) };
}

export function ladderTask(document: unknown, request: unknown, onProgress?: (step: LadderProgress) => void): LadderOutcome {
  return runLadder(document, request, onProgress);
}

/** The study report's numbers: the solve, the saved ladder study (if any) and the drawing's layout. */
export function reportTask(document: unknown, study: unknown | null): ReportData {
  const solved = solveNetwork(document);
  if (!solved.ok) return { solved, ladder: null, drawing: null };
  const ladder = study === null ? null : runLadder(solved.network, study);
  const drawing = solved.network.buses.length <= DRAWING_MAX_BUSES ? layoutSingleLine(solved.network) : null;
  return { solved, ladder, drawing };
}

/** A study; the network's own issues come back under "network" (as the ladder's do), the request's as they are. */
export function studyTask(document: unknown, request: unknown, onStep?: (step: StudyProgress) => void): StudyOutcome {
  const checked = validateNetwork(document);
  if (!checked.ok) return { ok: false, issues: checked.issues.map((i) => ({ path: i.path ? `network.${i.path}` : "network", message: i.message })) };
  return runStudySync(checked.network, request, onStep);
}

export function runTask(task: ComputeTask & { progress?: MessagePort }): ComputeAnswers[ComputeTask["kind"]] {
  switch (task.kind) {
    case "solve":
      return solveTask(task.document);
    case "solve-json": {
      const solved = solveTask(task.document);
      return solved.ok ? { ok: true, json: JSON.stringify(solved.result) } : solved;
    }
    case "ladder-json": {
      const run = ladderTask(task.document, task.request);
      if (!run.ok) return run;
      const { sectionBus, section, money, alternatives, cheapest, sensitivity, inverseSquareReference } = run.ladder;
      return { ok: true, json: JSON.stringify({ sectionBus, section, money, alternatives, cheapest, sensitivity, inverseSquareReference }) };
    }
    case "csv":
      return csvTask(task.document, task.table);
    case "ladder":
      return ladderTask(task.document, task.request, reporter(task.progress, ladderProgressOf));
    case "report":
      return reportTask(task.document, task.study);
    case "study":
      return studyTask(task.document, task.request, reporter(task.progress, studyProgressOf));
  }
}
