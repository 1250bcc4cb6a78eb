// The compute pool's worker thread: piscina calls the default export with one task at a time
// (with a port for progress when the caller asked for it).
import { setPriority } from "node:os";
import type { MessagePort } from "node:worker_threads";
import { runTask, type ComputeTask } from "./tasks.ts";

// The calculation threads yield the CPU to the thread that answers requests: on Linux a thread's
// niceness is its own, and process 0 names the calling thread, so this lowers this worker only.
// On a busy machine the request thread then still gets its turn and light pages keep answering.
try {
  setPriority(0, 10);
} catch {
  // Not permitted or not supported here: the pool still works, only without the head start.
}

export default function computeWorker(task: ComputeTask & { progress?: MessagePort }) {
  return runTask(task);
}
