// Command line: `npm run solve -- FILE.json [--csv buses|branches|sources] [--no-faults]`.
// The only solver file that touches Node: it hands the process's arguments, files and streams to
// `runCommandLine` and sets the exit status (0 solved, 1 not converged, 2 unusable input).
import { readFileSync } from "node:fs";
import { runCommandLine } from "#solver/commandLine.ts";

process.exitCode = runCommandLine(process.argv.slice(2), {
  readFile: (path) => readFileSync(path, "utf8"),
  stdout: (text) => process.stdout.write(text),
  stderr: (text) => process.stderr.write(text),
});
