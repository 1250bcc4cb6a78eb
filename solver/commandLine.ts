// The command line's logic, free of the process: the arguments, a file reader and the two output
// streams in, the exit status out. `cli.ts` wires it to Node; tests call it directly.
// Results go to standard output and nothing else does; every complaint goes to standard error.
// Exit status: 0 solved (also with check violations), 1 load flow not converged, 2 unusable input.
import { solveNetwork, type ValidationIssue } from "#solver/index.ts";
import { isCsvTable, resultsCsv, type CsvTable } from "#solver/csv.ts";
import { runStudySync } from "#solver/study/index.ts";

export const USAGE =
  "usage: npm run solve -- FILE.json [--csv buses|branches|sources] [--no-faults]\n" +
  "       npm run solve -- FILE.json --study [--outages] [--years] [--no-faults]";

export type ExitStatus = 0 | 1 | 2;

export interface CommandLineIo {
  /** The file's text; throws (with a `code` such as ENOENT where there is one) if it cannot be read. */
  readFile(path: string): string;
  stdout(text: string): void;
  stderr(text: string): void;
}

interface Arguments {
  file: string;
  csv?: CsvTable;
  faults: boolean;
  /** The study object (operating cases, envelope, energy) instead of one load flow. */
  study: boolean;
  outages: boolean;
  years: boolean;
}

function parseArguments(argv: readonly string[]): Arguments | string {
  let file: string | undefined;
  let csv: Arguments["csv"];
  let faults = true;
  const study = { study: false, outages: false, years: false };
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    if (arg === "--csv") {
      const what = argv[++i];
      if (!isCsvTable(what)) return `--csv needs "buses", "branches" or "sources", not ${what === undefined ? "nothing" : `"${what}"`}`;
      csv = what;
    } else if (arg === "--no-faults") faults = false;
    else if (arg === "--study") study.study = true;
    else if (arg === "--outages") study.outages = true;
    else if (arg === "--years") study.years = true;
    else if (arg.startsWith("-")) return `unknown option ${arg}`;
    else if (file === undefined) file = arg;
    else return `only one file at a time (got "${file}" and "${arg}")`;
  }
  if (file === undefined) return "no network file given";
  if (!study.study && (study.outages || study.years)) return "--outages and --years belong to --study";
  if (study.study && csv) return "--csv prints one load flow; a study prints JSON";
  return { file, csv, faults, ...study };
}

export function runCommandLine(argv: readonly string[], io: CommandLineIo): ExitStatus {
  const fail = (message: string): ExitStatus => {
    io.stderr(`${message}\n`);
    return 2;
  };
  const args = parseArguments(argv);
  if (typeof args === "string") return fail(`${args}\n${USAGE}`);

  let text: string;
  try {
    text = io.readFile(args.file);
  } catch (error) {
    return fail(`${args.file}: cannot be read (${(error as { code?: string }).code ?? (error as Error).message})`);
  }
  let document: unknown;
  try {
    document = JSON.parse(text);
  } catch (error) {
    return fail(`${args.file}: not valid JSON (${(error as Error).message})`);
  }

  const invalid = (issues: readonly ValidationIssue[]) => {
    const lines = issues.map((issue) => `${args.file}: ${issue.path || "(document)"}: ${issue.message}`);
    return fail(`${lines.join("\n")}\n${issues.length} problem${issues.length > 1 ? "s" : ""}; nothing was solved.`);
  };

  if (args.study) {
    const studied = runStudySync(document, { outages: args.outages, years: args.years, faults: args.faults });
    if (!studied.ok) return invalid(studied.issues);
    io.stdout(`${JSON.stringify(studied.study, null, 2)}\n`);
    return studied.study.cases.every((c) => c.loadFlow.converged) ? 0 : 1;
  }

  const outcome = solveNetwork(document, { faults: args.faults });
  if (!outcome.ok) return invalid(outcome.issues);

  const { network, result } = outcome;
  if (args.csv) io.stdout(resultsCsv(args.csv, network, result));
  else io.stdout(`${JSON.stringify(result, null, 2)}\n`);

  if (result.loadFlow.converged) return 0;
  if (args.csv) io.stderr(`${result.loadFlow.message ?? "The load flow did not converge."}\n`);
  return 1;
}
