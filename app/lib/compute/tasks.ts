// The heavy work the server does, as plain functions of plain data: they run in a worker thread
// (worker.ts) so the thread that answers requests only reads, writes and sends. Each takes the
// stored document and answers something a structured clone carries back (no functions, no classes).
import { DRAWING_MAX_BUSES, layoutSingleLine, type SingleLineLayout } from "#app/components/report/singleLineLayout.ts";
import { resultsCsv, type CsvTable } from "#solver/csv.ts";
import { solveNetwork, solveValidated, type SolveOutcome } from "#solver/index.ts";
import type { MessagePort } from "node:worker_threads";
import type { JobProgress } from "./jobView.ts";
import { runLadder, type LadderOutcome, type LadderProgress } from "#solver/ladder.ts";
import { validateNetwork, type Network, type ValidationIssue } from "#solver/schema.ts";
import { runStudySync, type StudyOutcome, type StudyProgress } from "#solver/study/index.ts";

/**
 * A stored revision as it is stored: its JSON text, parsed in the worker (not on the request
 * thread, and a string crosses to the worker far cheaper than an object graph), and whether the
 * server has seen it pass the checks (trustedRevisions.server.ts), so the worker need not validate.
 * Only the server sets it, from the database; a document from a request is always `document`.
 */
export interface StoredDocument {
  text: string;
  trusted: boolean;
}

/** What a task works on: a document from a request (validated in the worker), or a stored revision. */
export type TaskInput = { document: unknown; stored?: undefined } | { stored: StoredDocument; document?: undefined };

export type ComputeTask = TaskInput &
  (
    | { kind: "solve" }
    | { kind: "solve-json" }
    | { kind: "ladder-json"; request: unknown }
    | { kind: "csv"; table: CsvTable }
    | { kind: "ladder"; request: unknown }
    | { kind: "report"; study: unknown | null }
    | { kind: "study"; request: unknown }
  );

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

/** Solve: validated first, unless it is a stored revision the server trusts. */
export function solveTask(document: unknown, trusted = false): SolveOutcome {
  return trusted ? solveValidated(document as Network) : solveNetwork(document);
}

export function csvTask(document: unknown, table: CsvTable, trusted = false): CsvOutcome {
  const solved = solveTask(document, trusted);
  if (!solved.ok) return { ok: false };
  return { ok: true, csv: resultsCsv(table, solved.network, solved.result) };
}

export function ladderTask(document: unknown, request: unknown, onProgress?: (step: LadderProgress) => void): LadderOutcome {
  return runLadder(document, request, onProgress);
}

/** The study report's numbers: the solve, the saved ladder study (if any) and the drawing's layout. */
export function reportTask(document: unknown, study: unknown | null, trusted = false): ReportData {
  const solved = solveTask(document, trusted);
  if (!solved.ok) return { solved, ladder: null, drawing: null };
  const ladder = study === null ? null : runLadder(solved.network, study);
  const drawing = solved.network.buses.length <= DRAWING_MAX_BUSES ? layoutSingleLine(solved.network) : null;
  return { solved, ladder, drawing };
}

/** A study; the network's own issues come back under "network" (as the ladder's do), the request's as they are. */
export function studyTask(document: unknown, request: unknown, onStep?: (step: StudyProgress) => void, trusted = false): StudyOutcome {
  // The study validates the network once itself; a first look here tells the network's own issues from the request's.
  if (trusted) return runStudySync(document, request, onStep);
  const checked = validateNetwork(document);
  if (!checked.ok) return { ok: false, issues: checked.issues.map((i) => ({ path: i.path ? `network.${i.path}` : "network", message: i.message })) };
  return runStudySync(checked.network, request, onStep);
}

export function runTask(task: ComputeTask & { progress?: MessagePort }): ComputeAnswers[ComputeTask["kind"]] {
  const document: unknown = task.stored ? JSON.parse(task.stored.text) : task.document;
  const trusted = task.stored?.trusted === true;
  switch (task.kind) {
    case "solve":
      return solveTask(document, trusted);
    case "solve-json": {
      const solved = solveTask(document, trusted);
      return solved.ok ? { ok: true, json: JSON.stringify(solved.result) } : solved;
    }
    case "ladder-json": {
      const run = ladderTask(document, task.request);
      if (!run.ok) return run;
      const { sectionBus, section, money, alternatives, cheapest, sensitivity, inverseSquareReference } = run.ladder;
      return { ok: true, json: JSON.stringify({ sectionBus, section, money, alternatives, cheapest, sensitivity, inverseSquareReference }) };
    }
    case "csv":
      return csvTask(document, task.table, trusted);
    case "ladder":
      return ladderTask(document, task.request, reporter(task.progress, ladderProgressOf));
    case "report":
      return reportTask(document, task.study, trusted);
    case "study":
      return studyTask(document, task.request, reporter(task.progress, studyProgressOf), trusted);
  }
}
