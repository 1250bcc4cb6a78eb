// What a page sees of a long calculation run as a job (jobs.server.ts), shared by the server and
// the pages that poll GET /networks/:networkId/jobs/:jobId.
import type { ValidationIssue } from "#solver/schema.ts";

/** How far a long piece of work got, for a progress bar and the sentence beside it. */
export interface JobProgress {
  done: number;
  total: number;
  /** What it is doing, in words: "Outages: 40 of 120 load flows". */
  stage: string;
}

export type JobState = "running" | "done" | "failed" | "cancelled" | "stopped";

/** A job as its owner sees it. `result` is there once it is done. */
export interface JobView<R = unknown> {
  id: string;
  kind: string;
  networkId: number;
  state: JobState;
  progress: JobProgress | null;
  /** Set when it failed, was cancelled or stopped: the sentence to show. */
  error: string | null;
  /** The status a page would have answered for the failure (400, 409, 422, 429, 503). */
  status: number | null;
  issues: ValidationIssue[];
  startedAt: string;
  finishedAt: string | null;
  result: R | null;
}

/** The address a job is asked about and cancelled at. */
export function jobPath(job: Pick<JobView, "id" | "networkId">): string {
  return `/networks/${job.networkId}/jobs/${job.id}`;
}
