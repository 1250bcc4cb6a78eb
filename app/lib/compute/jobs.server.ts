// Long work as a job: started by one request, it runs on the compute pool while the page asks
// how far it got (GET /networks/:id/jobs/:jobId), may be cancelled (POST there with
// intent=cancel), and stops at its time limit with a sentence. Jobs live in this process's memory
// only: they are answers being computed, not records; a restart forgets them and the page says
// so. Each job belongs to whoever started it (an account or a share link) and one network; anyone
// else asking for it is told it does not exist.
import { randomBytes } from "node:crypto";
import type { ValidationIssue } from "#solver/schema.ts";
import type { Actor } from "../permissions.server.ts";
import { ComputeStopped } from "./pool.server.ts";
import { BudgetExceeded, payerOf } from "./results.server.ts";
import type { JobProgress, JobView } from "./jobView.ts";

/** A job may run this long before it is stopped with a sentence. */
export const JOB_TIME_LIMIT_MS = 5 * 60_000;
/** Finished jobs are kept this long for the page to collect. */
export const JOB_KEPT_MS = 15 * 60_000;
/** Jobs one payer may have running at once. */
export const JOBS_RUNNING_PER_PAYER = 2;
const JOBS_KEPT = 500;

export type { JobProgress, JobState, JobView } from "./jobView.ts";

/** What a job's work resolves to: a result, or a refusal in the service's own shape. */
export type JobOutcome<R> = { ok: true; result: R } | { ok: false; status: number; error: string; issues: ValidationIssue[] };

interface Job<R = unknown> {
  view: JobView<R>;
  payer: string;
  controller: AbortController;
  settled: Promise<void>;
  expiresAt: number;
}

const jobs = new Map<string, Job>();

function forget(now = Date.now()) {
  for (const [id, job] of jobs) if (job.view.state !== "running" && job.expiresAt <= now) jobs.delete(id);
  // Oldest first; a running job is never dropped (it is bounded by JOBS_RUNNING_PER_PAYER).
  for (const [id, job] of jobs) {
    if (jobs.size <= JOBS_KEPT) break;
    if (job.view.state !== "running") jobs.delete(id);
  }
}

export class TooManyJobs extends Error {
  readonly status = 429;
  constructor() {
    super(`You already have ${JOBS_RUNNING_PER_PAYER} calculations running; wait for one to finish, or cancel it, and start this one again.`);
    this.name = "TooManyJobs";
  }
}

/**
 * Start `work` as a job of `actor`'s on `networkId`. `work` gets the job's signal (cancellation
 * and the time limit) and a progress callback. Throws TooManyJobs when the actor has enough
 * running already; a failure of `work` becomes the job's sentence, never a thrown error.
 */
export function startJob<R>(
  kind: string,
  actor: Actor,
  networkId: number,
  work: (signal: AbortSignal, onProgress: (progress: JobProgress) => void) => Promise<JobOutcome<R>>,
  timeLimitMs = JOB_TIME_LIMIT_MS,
): JobView<R> {
  forget();
  const payer = payerOf(actor);
  let running = 0;
  for (const job of jobs.values()) if (job.payer === payer && job.view.state === "running") running++;
  if (running >= JOBS_RUNNING_PER_PAYER) throw new TooManyJobs();

  const controller = new AbortController();
  const view: JobView<R> = {
    id: randomBytes(12).toString("base64url"),
    kind,
    networkId,
    state: "running",
    progress: null,
    error: null,
    status: null,
    issues: [],
    startedAt: new Date().toISOString(),
    finishedAt: null,
    result: null,
  };
  const job: Job<R> = { view, payer, controller, settled: Promise.resolve(), expiresAt: Number.POSITIVE_INFINITY };
  jobs.set(view.id, job as Job);
  const finish = (change: Partial<JobView<R>>) => {
    if (view.state !== "running") return;
    Object.assign(view, change, { finishedAt: new Date().toISOString() });
    job.expiresAt = Date.now() + JOB_KEPT_MS;
  };
  const timer = setTimeout(() => controller.abort(new ComputeStopped("time-limit", timeLimitMs)), timeLimitMs);
  timer.unref();
  job.settled = (async () => {
    try {
      const outcome = await work(controller.signal, (progress) => {
        if (view.state === "running") view.progress = progress;
      });
      if (outcome.ok) finish({ state: "done", result: outcome.result, progress: view.progress && { ...view.progress, done: view.progress.total } });
      else finish({ state: "failed", status: outcome.status, error: outcome.error, issues: outcome.issues });
    } catch (failure) {
      const reason: unknown = controller.signal.aborted ? controller.signal.reason : failure;
      if (reason instanceof ComputeStopped && reason.reason === "time-limit") finish({ state: "stopped", status: 503, error: reason.message });
      else if (controller.signal.aborted) finish({ state: "cancelled", status: 499, error: "The calculation was cancelled; nothing was saved." });
      else if (failure instanceof BudgetExceeded) finish({ state: "failed", status: 429, error: failure.message });
      else {
        console.error(failure);
        finish({ state: "failed", status: 500, error: "The calculation failed on the server. Try again; if it keeps happening, tell your team's owner." });
      }
    } finally {
      clearTimeout(timer);
    }
  })();
  return view;
}

function ownJob(id: string, actor: Actor, networkId: number): Job | undefined {
  const job = jobs.get(id);
  return job && job.payer === payerOf(actor) && job.view.networkId === networkId ? job : undefined;
}

/** The job as its owner sees it (the result only once done), or null: not theirs, not this network's, or forgotten. */
export function jobView(id: string, actor: Actor, networkId: number): JobView | null {
  const job = ownJob(id, actor, networkId);
  return job ? { ...job.view } : null;
}

/** Cancel the owner's running job (the worker thread is ended); answers its view, or null as jobView does. */
export async function cancelJob(id: string, actor: Actor, networkId: number): Promise<JobView | null> {
  const job = ownJob(id, actor, networkId);
  if (!job) return null;
  job.controller.abort();
  await job.settled;
  return { ...job.view };
}

/** Resolves when the job has finished, whichever way (tests, and callers that wait). */
export async function jobSettled(id: string): Promise<void> {
  await jobs.get(id)?.settled;
}
