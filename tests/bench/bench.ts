import { loadavg } from "node:os";

// What a benchmark offers the runner: a name to select it by and a run that prints its figures.
export interface Bench {
  name: string;
  run(): unknown;
}

/** The machine's 1, 5 and 15 minute load averages, printed beside every figure. */
export function loadAverage(): string {
  return loadavg()
    .map((l) => l.toFixed(1))
    .join(" / ");
}
