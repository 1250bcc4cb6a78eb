// The compute pool's worker thread: piscina calls the default export with one task at a time.
import { runTask, type ComputeTask } from "./tasks.ts";

export default function computeWorker(task: ComputeTask) {
  return runTask(task);
}
