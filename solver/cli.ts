// Command line: `npm run solve -- FILE.json [--csv buses|branches] [--no-faults]`.
// Results go to standard output and nothing else does; every complaint goes to standard error.
// Exit status: 0 solved (also with check violations), 1 load flow not converged, 2 unusable input.
import { readFileSync } from "node:fs";
import { branchesCsv, busesCsv, solveNetwork } from "#solver/index.ts";

const USAGE = "usage: npm run solve -- FILE.json [--csv buses|branches] [--no-faults]";

interface Arguments {
  file: string;
  csv?: "buses" | "branches";
  faults: boolean;
}

function parseArguments(argv: string[]): Arguments | string {
  let file: string | undefined;
  let csv: Arguments["csv"];
  let faults = true;
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    if (arg === "--csv") {
      const what = argv[++i];
      if (what !== "buses" && what !== "branches") return `--csv needs "buses" or "branches", not ${what === undefined ? "nothing" : `"${what}"`}`;
      csv = what;
    } else if (arg === "--no-faults") faults = false;
    else if (arg.startsWith("-")) return `unknown option ${arg}`;
    else if (file === undefined) file = arg;
    else return `only one file at a time (got "${file}" and "${arg}")`;
  }
  if (file === undefined) return "no network file given";
  return { file, csv, faults };
}

function fail(message: string): void {
  process.stderr.write(`${message}\n`);
  process.exitCode = 2;
}

function main(argv: string[]): void {
  const args = parseArguments(argv);
  if (typeof args === "string") return fail(`${args}\n${USAGE}`);

  let text: string;
  try {
    text = readFileSync(args.file, "utf8");
  } catch (error) {
    return fail(`${args.file}: cannot be read (${(error as NodeJS.ErrnoException).code ?? (error as Error).message})`);
  }
  let document: unknown;
  try {
    document = JSON.parse(text);
  } catch (error) {
    return fail(`${args.file}: not valid JSON (${(error as Error).message})`);
  }

  const outcome = solveNetwork(document, { faults: args.faults });
  if (!outcome.ok) {
    const lines = outcome.issues.map((issue) => `${args.file}: ${issue.path || "(document)"}: ${issue.message}`);
    return fail(`${lines.join("\n")}\n${outcome.issues.length} problem${outcome.issues.length > 1 ? "s" : ""}; nothing was solved.`);
  }

  const { network, result } = outcome;
  if (args.csv === "buses") process.stdout.write(busesCsv(network, result));
  else if (args.csv === "branches") process.stdout.write(branchesCsv(network, result));
  else process.stdout.write(`${JSON.stringify(result, null, 2)}\n`);

  if (!result.loadFlow.converged) {
    if (args.csv) process.stderr.write(`${result.loadFlow.message ?? "The load flow did not converge."}\n`);
    process.exitCode = 1;
  }
}

main(process.argv.slice(2));
