// A study of a 300-element feeder: four operating cases and every line and transformer out in
// turn in each (full N-1). Prints the wall time, the load flows solved, and the longest stretch
// the study held the event loop (what other work on the same thread waits at most).
import { runStudy } from "#solver/study/index.ts";
import { sheetFeeder, elementCountOf } from "./sheetFeeder.ts";
import { loadAverage, type Bench } from "./bench.ts";

export const STUDY_BENCH_ELEMENTS = 300;

export function studyBenchDocument() {
  const { network } = sheetFeeder(STUDY_BENCH_ELEMENTS);
  return {
    ...network,
    version: 2 as const,
    cases: [
      { id: "peak", name: "Winter peak", hoursPerYear: 1200, loadScale: 1.15 },
      { id: "day", name: "Working day", hoursPerYear: 3500, loadScale: 0.85 },
      { id: "night", name: "Night", hoursPerYear: 3000, loadScale: 0.4 },
      { id: "light", name: "Summer light load", hoursPerYear: 1060, loadScale: 0.25, outOfService: ["c-primary-0"] },
    ],
  };
}

export const studyBench: Bench = {
  name: "study",
  async run() {
    const doc = studyBenchDocument();
    let longestHoldMs = 0;
    let last = performance.now();
    const ticker = setInterval(() => {
      const now = performance.now();
      longestHoldMs = Math.max(longestHoldMs, now - last);
      last = now;
    }, 1);
    const started = performance.now();
    let solves = 0;
    const outcome = await runStudy(doc, { outages: true }, { onProgress: (p) => (solves = p.done) });
    const wallMs = performance.now() - started;
    clearInterval(ticker);
    if (!outcome.ok) throw new Error(outcome.issues.map((i) => i.message).join("; "));
    console.log(
      `study: ${elementCountOf(outcome.network)} elements, ${outcome.study.cases.length} cases, ` +
        `${outcome.study.outages!.length} outages (full N-1), ${solves} load flows; load average now ${loadAverage()}`,
    );
    console.log(`  wall time ${wallMs.toFixed(0)} ms, ${(wallMs / solves).toFixed(2)} ms per load flow, event loop held at most ${longestHoldMs.toFixed(0)} ms`);
  },
};
