// `npm run solve -- FILE --study` prints the study object the API and the pages get (in-process;
// the wiring of `npm run solve` itself is proved once in ../cli.test.ts).
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { runCommandLine } from "#solver/commandLine.ts";
import { runStudySync } from "#solver/study/index.ts";
import { tarnWithCases } from "./networks.ts";

function run(args: string[]) {
  let stdout = "";
  let stderr = "";
  const status = runCommandLine(args, {
    readFile: (path) => readFileSync(path, "utf8"),
    stdout: (text) => void (stdout += text),
    stderr: (text) => void (stderr += text),
  });
  return { status, stdout, stderr };
}

describe("npm run solve -- FILE --study", () => {
  const doc = tarnWithCases(
    [
      { id: "peak", name: "Peak", hoursPerYear: 3000 },
      { id: "light", name: "Light", hoursPerYear: 5760, loadScale: 0.3 },
    ],
    { ratePctPerYear: 2, years: 5 },
  );
  const file = join(mkdtempSync(join(tmpdir(), "kilostep-study-cli-")), "tarn.json");
  writeFileSync(file, JSON.stringify(doc));

  it("prints the same study as the engine, with outages and years when asked", () => {
    const { status, stdout, stderr } = run([file, "--study", "--outages", "--years"]);
    expect([status, stderr]).toEqual([0, ""]);
    const engine = runStudySync(doc, { outages: true, years: true });
    expect(engine.ok && JSON.parse(stdout)).toEqual(engine.ok && JSON.parse(JSON.stringify(engine.study)));
  });

  it("refuses study options without --study, and CSV with it (exit 2, nothing on standard output)", () => {
    const outages = run([file, "--outages"]);
    expect([outages.status, outages.stdout]).toEqual([2, ""]);
    expect(outages.stderr).toContain("--outages and --years belong to --study");
    const csv = run([file, "--study", "--csv", "buses"]);
    expect([csv.status, csv.stdout]).toEqual([2, ""]);
  });

  it("names what the study request lacks: years without a growth", () => {
    const bare = join(mkdtempSync(join(tmpdir(), "kilostep-study-cli-")), "bare.json");
    writeFileSync(bare, JSON.stringify(tarnWithCases([{ id: "peak", name: "Peak" }])));
    const { status, stdout, stderr } = run([bare, "--study", "--years"]);
    expect([status, stdout]).toEqual([2, ""]);
    expect(stderr).toContain("years: the network gives no load growth");
  });
});
