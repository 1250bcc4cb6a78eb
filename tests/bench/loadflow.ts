// Load-flow benchmark: synthetic radial feeders of 1,000, 10,000 and 100,000 buses, each measured
// in a fresh process so that its peak memory is its own. The time is `runLoadFlow` on a network
// already read (admittance matrix, ordering, Newton iterations and the result objects); the
// document-wide validation is timed once after it, in its own column. Peak RSS is the whole
// process: Node itself, the feeder's elements, the load flow and its results; "solve MB" is what
// one load flow adds to the heap and array buffers, its result still held.
import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";
import { runLoadFlow } from "#solver/loadFlow/index.ts";
import { validateNetwork } from "#solver/schema.ts";
import { networkFromElements, syntheticFeeder } from "./syntheticFeeder.ts";
import { loadAverage, type Bench } from "./bench.ts";

const SIZES = [1_000, 10_000, 100_000];
const TARGET_MS: Record<number, number> = { 10_000: 20, 100_000: 300 };
const TARGET_PEAK_MB = 200;

interface Measurement {
  buses: number;
  converged: boolean;
  iterations: number;
  medianMs: number;
  fastestMs: number;
  /** CPU time of the process per run (user + system), a steadier figure on a shared machine. */
  medianCpuMs: number;
  runs: number;
  lowestPu: number;
  highestPu: number;
  startRssMB: number;
  peakRssMB: number;
  /** Heap and array buffers grown over one solve, its result still held: the load flow's own share. */
  solveMB: number;
  validateMs: number;
}

/** Collects garbage before the memory reading (a collection before every timed run would slow the runs: the heap shrinks and regrows). */
const collectGarbage = (globalThis as { gc?: () => void }).gc ?? (() => undefined);

function heldBytes(): number {
  const usage = process.memoryUsage();
  return usage.heapUsed + usage.arrayBuffers;
}

function measure(busCount: number): Measurement {
  const startRssMB = process.memoryUsage().rss / 2 ** 20;
  const network = networkFromElements(syntheticFeeder(busCount));
  const runs = busCount >= 100_000 ? 7 : busCount >= 10_000 ? 15 : 31;
  runLoadFlow(network);
  const times: number[] = [];
  const cpuTimes: number[] = [];
  let result = runLoadFlow(network);
  for (let r = 0; r < runs; r++) {
    const cpuStarted = process.cpuUsage();
    const started = performance.now();
    result = runLoadFlow(network);
    times.push(performance.now() - started);
    const cpu = process.cpuUsage(cpuStarted);
    cpuTimes.push((cpu.user + cpu.system) / 1000);
  }
  cpuTimes.sort((a, b) => a - b);
  collectGarbage();
  const heldBefore = heldBytes();
  result = runLoadFlow(network);
  const solveMB = (heldBytes() - heldBefore) / 2 ** 20;
  const peakRssMB = process.resourceUsage().maxRSS / 1024;
  times.sort((a, b) => a - b);
  const doc = syntheticFeeder(busCount);
  const started = performance.now();
  const validated = validateNetwork(doc);
  const validateMs = performance.now() - started;
  if (!validated.ok) throw new Error(`synthetic feeder invalid: ${validated.issues[0].path} ${validated.issues[0].message}`);
  const voltages = result.buses.map((b) => b.vPu);
  return {
    buses: network.buses.length,
    converged: result.converged,
    iterations: result.iterations,
    medianMs: times[Math.floor(times.length / 2)],
    fastestMs: times[0],
    medianCpuMs: cpuTimes[Math.floor(cpuTimes.length / 2)],
    runs,
    lowestPu: Math.min(...voltages),
    highestPu: Math.max(...voltages),
    startRssMB,
    peakRssMB,
    solveMB,
    validateMs,
  };
}

function measureInChild(busCount: number): Measurement {
  const child = spawnSync(process.execPath, [...process.execArgv, "--expose-gc", fileURLToPath(import.meta.url), "--size", String(busCount)], {
    encoding: "utf8",
    maxBuffer: 1 << 20,
  });
  if (child.status !== 0) throw new Error(`load-flow bench at ${busCount} buses failed:\n${child.stderr}`);
  return JSON.parse(child.stdout.trim().split("\n").pop()!) as Measurement;
}

function printTable(rows: Measurement[]): void {
  const header = ["buses", "converged", "iterations", "median ms", "fastest ms", "median CPU ms", "runs", "target ms", "peak RSS MB", "start RSS MB", "solve MB", "V min–max pu", "validate ms"];
  const lines = rows.map((m) => [
    m.buses.toLocaleString("en-GB"),
    m.converged ? "yes" : "NO",
    String(m.iterations),
    m.medianMs.toFixed(1),
    m.fastestMs.toFixed(1),
    m.medianCpuMs.toFixed(1),
    String(m.runs),
    TARGET_MS[m.buses] ? `≤ ${TARGET_MS[m.buses]}${m.medianMs <= TARGET_MS[m.buses] ? " ok" : " MISSED"}` : "–",
    `${m.peakRssMB.toFixed(0)}${m.buses >= 100_000 ? (m.peakRssMB <= TARGET_PEAK_MB ? " ok" : " MISSED") : ""}`,
    m.startRssMB.toFixed(0),
    m.solveMB.toFixed(0),
    `${m.lowestPu.toFixed(3)}–${m.highestPu.toFixed(3)}`,
    m.validateMs.toFixed(0),
  ]);
  const widths = header.map((h, c) => Math.max(h.length, ...lines.map((l) => l[c].length)));
  const row = (cells: string[]) => cells.map((cell, c) => cell.padStart(widths[c])).join("  ");
  console.log(row(header));
  for (const l of lines) console.log(row(l));
}

export const loadFlowBench: Bench = {
  name: "loadflow",
  run(): void {
    console.log(
      `load flow: synthetic radial feeders (132/33 kV infeed, 33 kV trunk, 33/11 kV laterals with spurs, 11/0.4 kV ends), ` +
        `median of repeated solves, each size in its own process ` +
        `(peak RSS target ≤ ${TARGET_PEAK_MB} MB at 100,000 buses); load average now ${loadAverage()}`,
    );
    printTable(SIZES.map(measureInChild));
  },
};

const sizeFlag = process.argv.indexOf("--size");
if (sizeFlag > 0 && fileURLToPath(import.meta.url) === process.argv[1]) {
  console.log(JSON.stringify(measure(Number(process.argv[sizeFlag + 1]))));
}
