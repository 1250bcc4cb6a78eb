// The heavy work the server does, as plain functions of plain data: they run in a worker thread
// (worker.ts) so the thread that answers requests only reads, writes and sends. Each takes the
// stored document and answers something a structured clone carries back (no functions, no classes).
import { deserialize, serialize } from "node:v8";
import { DRAWING_MAX_BUSES, layoutSingleLine, type SingleLineLayout } from "#app/components/report/singleLineLayout.ts";
import { reportPart, type ReportExtent } from "#app/lib/reportExtent.ts";
import { resultsCsv, type CsvTable } from "#solver/csv.ts";
import { solveNetwork, solveValidated, type SolveOutcome } from "#solver/index.ts";
import type { SolveResult } from "#solver/results.ts";
import type { MessagePort } from "node:worker_threads";
import type { JobProgress } from "./jobView.ts";
import { runLadder, type LadderOutcome, type LadderProgress } from "#solver/ladder.ts";
import { validateNetwork, type Network, type ValidationIssue } from "#solver/schema.ts";
import { runStudySync, type StudyOutcome, type StudyProgress } from "#solver/study/index.ts";
import { ladderConductors } from "../conductorCandidates.ts";
import type { ConductorType } from "../equipmentLibrary.ts";

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

/**
 * A stored revision's solve, kept: the worker's answer serialized (v8) into bytes that the request
 * thread holds without ever reading them, and hands back to a worker for each file or page made
 * from it (results.server.ts). Bytes cross between threads as one copy, not an object graph.
 */
export type KeptSolve = { ok: true; kept: Uint8Array; buses: number } | { ok: false; issues: ValidationIssue[] };

/** What is made from a kept solve: the API's JSON, a results CSV, or the report's numbers (with the saved ladder study, if any). */
export type KeptProduct =
  | { product: "json" }
  | { product: "csv"; table: CsvTable }
  | { product: "report"; study: unknown | null; conductors?: ConductorType[] };

export type ComputeTask =
  | (TaskInput &
      (
        | { kind: "solve" }
        | { kind: "solve-kept" }
        | { kind: "solve-json" }
        | { kind: "ladder-json"; request: unknown; conductors?: ConductorType[] }
        | { kind: "ladder"; request: unknown; conductors?: ConductorType[] }
        | { kind: "study"; request: unknown }
      ))
  | ({ kind: "from-kept"; kept: Uint8Array; stored?: undefined; document?: undefined } & KeptProduct);

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

/** What the study report's own study asks of the whole network (its load flows are counted from these). */
export interface ReportStudyShape {
  cases: number;
  branches: number;
  growthYears: number | null;
}

/**
 * The study report's numbers, already cut to what it lists (reportExtent.ts) in the worker, so a
 * large network's report never carries the whole network back to the request thread.
 */
export type ReportData =
  | { ok: true; network: Network; result: SolveResult; extent: ReportExtent; shape: ReportStudyShape; ladder: LadderOutcome | null; drawing: SingleLineLayout | null }
  | { ok: false; issues: ValidationIssue[] };

export type FromKept = JsonOutcome | CsvOutcome | ReportData;

export interface ComputeAnswers {
  solve: SolveOutcome;
  "solve-kept": KeptSolve;
  "solve-json": JsonOutcome;
  "ladder-json": JsonOutcome;
  "from-kept": FromKept;
  ladder: LadderOutcome;
  study: StudyOutcome;
}

/** Solve: validated first, unless it is a stored revision the server trusts. */
export function solveTask(document: unknown, trusted = false): SolveOutcome {
  return trusted ? solveValidated(document as Network) : solveNetwork(document);
}

/** Solve and keep: the answer as bytes for results.server.ts to hold (see KeptSolve). */
export function keptSolveTask(document: unknown, trusted = false): KeptSolve {
  const solved = solveTask(document, trusted);
  if (!solved.ok) return solved;
  return { ok: true, kept: serialize(solved), buses: solved.network.buses.length };
}

/** A file or page's numbers from a kept solve: no solving here, only reading and writing. */
export function fromKeptTask(kept: Uint8Array, want: KeptProduct): FromKept {
  const solved = deserialize(kept) as Extract<SolveOutcome, { ok: true }>;
  switch (want.product) {
    case "json":
      return { ok: true, json: JSON.stringify(solved.result) };
    case "csv":
      return { ok: true, csv: resultsCsv(want.table, solved.network, solved.result) };
    case "report":
      return reportTask(solved, want.study, want.conductors);
  }
}

/** The ladder; sizing draws on the built-in conductors and the team's own (`teamConductors`). */
export function ladderTask(document: unknown, request: unknown, onProgress?: (step: LadderProgress) => void, teamConductors: readonly ConductorType[] = []): LadderOutcome {
  return runLadder(document, request, onProgress, ladderConductors(teamConductors));
}

/**
 * The study report's numbers from a solve: the saved ladder study (if any), the drawing's layout
 * (small networks only) and the part of the network and its results the report lists.
 */
export function reportTask(solved: Extract<SolveOutcome, { ok: true }>, study: unknown | null, teamConductors: readonly ConductorType[] = []): ReportData {
  const { network, result } = solved;
  const ladder = study === null ? null : runLadder(network, study, undefined, ladderConductors(teamConductors));
  const drawing = network.buses.length <= DRAWING_MAX_BUSES ? layoutSingleLine(network) : null;
  const section = ladder?.ok ? ladder.ladder.section : null;
  const part = reportPart(network, result, { alsoBuses: section ? [...section.busIds, ...section.endBusIds] : [] });
  const shape = { cases: network.cases?.length ?? 0, branches: network.lines.length + network.transformers.length, growthYears: network.growth?.years ?? null };
  return { ok: true, network: part.network, result: part.result, extent: part.extent, shape, ladder, drawing };
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
  if (task.kind === "from-kept") return fromKeptTask(task.kept, task);
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
      const run = ladderTask(document, task.request, undefined, task.conductors);
      if (!run.ok) return run;
      const { sectionBus, section, money, alternatives, cheapest, sensitivity, inverseSquareReference } = run.ladder;
      return { ok: true, json: JSON.stringify({ sectionBus, section, money, alternatives, cheapest, sensitivity, inverseSquareReference }) };
    }
    case "solve-kept":
      return keptSolveTask(document, trusted);
    case "ladder":
      return ladderTask(document, task.request, reporter(task.progress, ladderProgressOf), task.conductors);
    case "study":
      return studyTask(document, task.request, reporter(task.progress, studyProgressOf), trusted);
  }
}
