// bcrypt off the main thread. bcryptjs is pure JavaScript: at cost 12 one hash is a few hundred
// milliseconds of CPU, and its async form only slices that work on the main thread, so a burst of
// sign-ins stalled every other request. Here the hashing runs in a small pool of worker threads;
// the main thread only waits. Hashes stay bcrypt ($2b$), so every existing account still signs in.
//
// The worker's code is a string (an eval worker) that loads bcryptjs from the path the main thread
// resolved: there is then no separate worker file for the build to find and copy.
import { createRequire } from "node:module";
import { availableParallelism } from "node:os";
import { Worker } from "node:worker_threads";

const WORKER_SOURCE = `
const { parentPort, workerData } = require("node:worker_threads");
const bcrypt = require(workerData.bcryptPath);
parentPort.on("message", (task) => {
  try {
    const result = task.kind === "hash" ? bcrypt.hashSync(task.password, task.cost) : bcrypt.compareSync(task.password, task.hash);
    parentPort.postMessage({ id: task.id, result });
  } catch (error) {
    parentPort.postMessage({ id: task.id, error: String((error && error.message) || error) });
  }
});
`;

type Task = { kind: "hash"; password: string; cost: number } | { kind: "compare"; password: string; hash: string };

interface Pending {
  resolve(value: string | boolean): void;
  reject(error: Error): void;
}

interface PoolWorker {
  worker: Worker;
  /** Ids of the tasks it is working on. */
  tasks: Set<number>;
}

/** One thread per spare core, at least one, at most four: hashing must not starve the server. */
const POOL_SIZE = Math.max(1, Math.min(4, availableParallelism() - 1));

const bcryptPath = createRequire(import.meta.url).resolve("bcryptjs");
const pool: PoolWorker[] = [];
const pending = new Map<number, Pending>();
let nextId = 1;

function startWorker(): PoolWorker {
  const entry: PoolWorker = { worker: new Worker(WORKER_SOURCE, { eval: true, workerData: { bcryptPath } }), tasks: new Set() };
  entry.worker.on("message", (message: { id: number; result?: string | boolean; error?: string }) => {
    const task = pending.get(message.id);
    pending.delete(message.id);
    entry.tasks.delete(message.id);
    // An idle thread must not keep a script or a test process alive.
    if (entry.tasks.size === 0) entry.worker.unref();
    if (!task) return;
    if (message.error !== undefined) task.reject(new Error(message.error));
    else task.resolve(message.result!);
  });
  entry.worker.on("error", (error) => {
    // A thread that died takes its tasks with it; they fail and the next task gets a new thread.
    pool.splice(pool.indexOf(entry), 1);
    for (const id of entry.tasks) {
      pending.get(id)?.reject(error);
      pending.delete(id);
    }
  });
  entry.worker.unref();
  return entry;
}

function leastBusy(): PoolWorker {
  if (pool.length < POOL_SIZE && pool.every((w) => w.tasks.size > 0)) pool.push(startWorker());
  return pool.reduce((best, w) => (w.tasks.size < best.tasks.size ? w : best));
}

function run<T extends string | boolean>(task: Task): Promise<T> {
  const entry = leastBusy();
  const id = nextId++;
  return new Promise<T>((resolve, reject) => {
    pending.set(id, { resolve: resolve as Pending["resolve"], reject });
    if (entry.tasks.size === 0) entry.worker.ref();
    entry.tasks.add(id);
    entry.worker.postMessage({ id, ...task });
  });
}

export function bcryptHash(password: string, cost: number): Promise<string> {
  return run<string>({ kind: "hash", password, cost });
}

export function bcryptCompare(password: string, hash: string): Promise<boolean> {
  return run<boolean>({ kind: "compare", password, hash });
}
