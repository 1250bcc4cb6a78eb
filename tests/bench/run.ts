// `npm run bench [-- NAME...]`: runs every benchmark below, or those named. Benchmarks print; they never fail.
// To add one, import it here and list it in `benches`.
import type { Bench } from "./bench.ts";
import { loadFlowBench } from "./loadflow.ts";
import { runFaultBench } from "./faults.ts";
import { targetsBench } from "./targets.ts";
import { studyBench } from "./study.ts";

const benches: Bench[] = [targetsBench, loadFlowBench, { name: "faults", run: () => runFaultBench() }, studyBench];

const chosen = process.argv.slice(2);
const unknown = chosen.filter((name) => !benches.some((b) => b.name === name));
if (unknown.length > 0) {
  console.error(`unknown benchmark ${unknown.join(", ")}; choose from ${benches.map((b) => b.name).join(", ")}`);
  process.exitCode = 2;
} else {
  for (const bench of benches.filter((b) => chosen.length === 0 || chosen.includes(b.name))) {
    console.log(`\n== ${bench.name}`);
    await bench.run();
  }
}
