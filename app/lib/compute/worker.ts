// The compute pool's worker thread: piscina calls the default export with one task at a time
// (with a port for progress when the caller asked for it).
import type { MessagePort } from "node:worker_threads";
import { runTask, type ComputeTask } from "./tasks.ts";

export default function computeWorker(task: ComputeTask & { progress?: MessagePort }) {
  return runTask(task);
}
