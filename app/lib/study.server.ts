// The study on a stored network, one seam for the study page, the report and
// POST /api/networks/:id/study, so that all of them compute the same thing from the same inputs.
// The study runs on the compute pool (compute/pool.server.ts), never on the thread that answers
// requests, paid from the asker's budget; the page runs it as a job (compute/jobs.server.ts) whose
// progress it shows and which it may cancel, and which stops at its time limit with a sentence.
//
// Exported, and kept stable for the pages that call them:
// - runStudyOnNetwork(db, network, request, control?) → StudyRun: the study, waited for (the API).
// - startStudyJob(db, network, request, actor) → JobView<StudyJobResult>: the study as a job; the
//   page then asks GET /networks/:networkId/jobs/:jobId (JSON JobView, `result` once done) and
//   cancels with POST there, body intent=cancel. Refusals before it starts (a spent budget, too
//   many jobs) are thrown: pass them to computeRefusal(failure, "page").
// - studyRequestRefusal(body) → the 400 a malformed request gets before any job starts.
// - studyJobAnswer(view) → the API's JSON of a study job (POST /api/networks/:id/study/jobs and
//   GET /api/networks/:id/study/jobs/:jobId): state and progress, then the contract's `study` object.
import type { Db } from "#db/database.ts";
import type { NetworkRow } from "#db/schema.ts";
import { studyRequestSchema, type Study } from "#solver/study/index.ts";
import { inputMessage, zodIssues } from "#solver/alternative.ts";
import type { Network, ValidationIssue } from "#solver/schema.ts";
import { currentDocument } from "./networks.server.ts";
import { refusedRequestSentence } from "./api.server.ts";
import { JOB_TIME_LIMIT_MS, startJob, type JobView } from "./compute/jobs.server.ts";
import { compute, COMPUTE_TIME_LIMIT_MS } from "./compute/pool.server.ts";
import { keptForRevision, payFor, studyCost } from "./compute/results.server.ts";
import type { JobProgress } from "./compute/tasks.ts";
import type { StudyOutcome } from "#solver/study/index.ts";
import type { Actor } from "./permissions.server.ts";

export type { JobProgress, JobView } from "./compute/jobs.server.ts";

export type StudyRun =
  | { ok: true; study: Study; revision: number; document: Network }
  | { ok: false; status: 400 | 422; error: string; issues: ValidationIssue[] };

/** What a finished study job holds. */
export interface StudyJobResult {
  study: Study;
  revision: number;
}

export interface StudyRunControl {
  /** Cancels the study (its worker thread is ended); the promise rejects with ComputeStopped. */
  signal?: AbortSignal;
  /** How far it got: load flows done of the most it needs, and a sentence. */
  onProgress?: (progress: JobProgress) => void;
  /** Who pays from their compute budget; a spent budget throws BudgetExceeded (see computeRefusal). */
  actor?: Actor;
  /** Stopped with a sentence past this (default: a request's limit, 60 s). */
  timeLimitMs?: number;
}

function answerOf(network: NetworkRow, outcome: StudyOutcome): StudyRun {
  if (outcome.ok) return { ok: true, study: outcome.study, revision: network.current_revision, document: outcome.network };
  if (outcome.issues.some((i) => i.path === "network" || i.path.startsWith("network.")))
    return {
      ok: false,
      status: 422,
      error: `Revision ${network.current_revision} no longer passes the network file's checks; fix the network before running a study.`,
      issues: outcome.issues.map((i) => ({ path: i.path.replace(/^network\.?/, ""), message: i.message })),
    };
  return { ok: false, status: 400, error: refusedRequestSentence("study", outcome.issues), issues: outcome.issues };
}

/** The study of the network's current revision; every refusal is a status, a sentence and named fields. */
export async function runStudyOnNetwork(db: Db, network: NetworkRow, request: unknown, control: StudyRunControl = {}): Promise<StudyRun> {
  const { document } = await currentDocument(db, network);
  if (control.actor) payFor(control.actor, studyCost(document, request));
  const outcome = await compute(
    { kind: "study", document, request },
    { signal: control.signal, onProgress: control.onProgress, timeLimitMs: control.timeLimitMs ?? COMPUTE_TIME_LIMIT_MS },
  );
  return answerOf(network, outcome);
}

/**
 * The same, kept per revision and request (the study report's own study): a second report, or the
 * shared report, of the same revision runs nothing. Not cancelled with one asker's request, since
 * others may share it; its time limit still stops it.
 */
export function keptStudyOnNetwork(db: Db, network: NetworkRow, request: unknown, actor: Actor): Promise<StudyRun> {
  return keptForRevision(network, "study", JSON.stringify(request), () => runStudyOnNetwork(db, network, request, { actor }));
}

/** The study of the current revision as a job of `actor`'s (see the head of this file). */
export async function startStudyJob(db: Db, network: NetworkRow, request: unknown, actor: Actor): Promise<JobView<StudyJobResult>> {
  const { document } = await currentDocument(db, network);
  payFor(actor, studyCost(document, request));
  return startJob<StudyJobResult>("study", actor, network.id, async (signal, onProgress) => {
    const run = answerOf(network, await compute({ kind: "study", document, request }, { signal, onProgress, timeLimitMs: 2 * JOB_TIME_LIMIT_MS }));
    return run.ok ? { ok: true, result: { study: run.study, revision: run.revision } } : run;
  });
}

/**
 * The refusal a study request gets for its shape alone (unknown fields, wrong types), in the words
 * the study itself would use, so that the API answers 400 at once instead of starting a job that
 * can only fail. What needs the network (a case id, a growth the network lacks) fails in the job.
 */
export function studyRequestRefusal(body: unknown): Extract<StudyRun, { ok: false }> | null {
  const parsed = studyRequestSchema.safeParse(body ?? {}, { error: inputMessage });
  if (parsed.success) return null;
  const issues = zodIssues(parsed.error);
  return { ok: false, status: 400, error: refusedRequestSentence("study", issues), issues };
}

/** A study job as the API shows it: where to ask, how far it got, and once done the revision and the study. */
export function studyJobAnswer(view: JobView<StudyJobResult>) {
  const { result, networkId, ...rest } = view;
  return {
    ...rest,
    networkId,
    url: `/api/networks/${networkId}/study/jobs/${view.id}`,
    ...(result ? { revision: result.revision, study: result.study } : {}),
  };
}
