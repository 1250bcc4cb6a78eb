// The worker threads that do the heavy work (tasks.ts), sized to the machine's cores, so the
// thread that answers requests never waits on a solve, a ladder, a CSV or a report layout.
// In a built server the worker is the bundled `computeWorker.js` beside the server bundle (emitted
// by the build, see vite.config.ts); from source (vitest, the dev server) it is worker.ts run by tsx.
import { existsSync } from "node:fs";
import { availableParallelism } from "node:os";
import { dirname, join } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import { MessageChannel, receiveMessageOnPort } from "node:worker_threads";
import { Piscina } from "piscina";
import type { ComputeAnswers, ComputeTask, JobProgress } from "./tasks.ts";

export const BUILT_WORKER_FILE = "computeWorker.js";
/** Work that runs longer than this is stopped and answered with a sentence. */
export const COMPUTE_TIME_LIMIT_MS = 60_000;

/** The work was stopped: by its time limit, or because whoever asked for it cancelled. */
export class ComputeStopped extends Error {
  constructor(
    readonly reason: "time-limit" | "cancelled",
    limitMs: number,
  ) {
    super(
      reason === "time-limit"
        ? `The calculation was stopped after ${Math.round(limitMs / 1000)} s, its time limit: it is too large to finish in time. Ask for less at once (fewer voltages, cases, outages or years).`
        : "The calculation was cancelled.",
    );
    this.name = "ComputeStopped";
  }
}

function workerLocation(): { filename: string; execArgv: string[] } {
  const here = dirname(fileURLToPath(import.meta.url));
  // The server bundle's code sits in build/server or in a chunk under build/server/assets.
  const built = [join(here, BUILT_WORKER_FILE), join(here, "..", BUILT_WORKER_FILE)].find((file) => existsSync(file));
  if (built) return { filename: pathToFileURL(built).href, execArgv: [] };
  return { filename: pathToFileURL(join(here, "worker.ts")).href, execArgv: ["--import", "tsx"] };
}

let pool: Piscina | undefined;

function computePool(): Piscina {
  if (!pool) {
    const { filename, execArgv } = workerLocation();
    const threads = Math.max(1, availableParallelism());
    pool = new Piscina({ filename, execArgv, minThreads: 1, maxThreads: threads, idleTimeout: 30_000 });
  }
  return pool;
}

/** How many tasks wait for a free thread, for the load test and diagnostics. */
export function computeQueueLength(): number {
  return pool?.queueSize ?? 0;
}

export interface ComputeOptions {
  /** Abort to cancel: the thread is ended, so the work really stops. */
  signal?: AbortSignal;
  /** Past this the work is stopped too (default COMPUTE_TIME_LIMIT_MS). */
  timeLimitMs?: number;
  /** Called on the request thread as the worker reports how far it got (studies and ladders). */
  onProgress?: (progress: JobProgress) => void;
}

/**
 * Run one task on a worker thread. `signal` cancels it (the thread is ended, so the work really
 * stops); past `timeLimitMs` it stops too. Either way the promise rejects with ComputeStopped.
 */
export async function compute<T extends ComputeTask>(task: T, options: ComputeOptions = {}): Promise<ComputeAnswers[T["kind"]]> {
  const limitMs = options.timeLimitMs ?? COMPUTE_TIME_LIMIT_MS;
  const timeout = AbortSignal.timeout(limitMs);
  const signal = options.signal ? AbortSignal.any([options.signal, timeout]) : timeout;
  // Progress crosses on a port of its own, handed to the worker with the task.
  const channel = options.onProgress ? new MessageChannel() : undefined;
  if (channel) channel.port1.on("message", (progress: JobProgress) => options.onProgress!(progress));
  try {
    const sent = channel ? { ...task, progress: channel.port2 } : task;
    return (await computePool().run(sent, { signal, transferList: channel ? [channel.port2] : undefined })) as ComputeAnswers[T["kind"]];
  } catch (failure) {
    if (timeout.aborted) throw new ComputeStopped("time-limit", limitMs);
    if (options.signal?.aborted) throw new ComputeStopped("cancelled", limitMs);
    throw failure;
  } finally {
    if (channel) {
      // The worker's last reports were queued before its answer; hear them before closing.
      for (let left = receiveMessageOnPort(channel.port1); left; left = receiveMessageOnPort(channel.port1)) options.onProgress!(left.message as JobProgress);
      channel.port1.close();
    }
  }
}

/** End the threads (tests and shutdown); the next task starts a new pool. */
export async function closeComputePool(): Promise<void> {
  const closing = pool;
  pool = undefined;
  await closing?.destroy();
}
