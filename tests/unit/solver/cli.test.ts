// The command line as a planner runs it: exit status, standard output only for results.
// The logic runs in-process with the real file reader; one spawn proves the wiring of `npm run solve`.
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { runCommandLine } from "#solver/commandLine.ts";
import { FIXTURE_DIR } from "./fixtures.ts";

const ROOT = join(FIXTURE_DIR, "..", "..");
const scratch = mkdtempSync(join(tmpdir(), "kilostep-cli-"));

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

function scratchFile(name: string, text: string): string {
  const path = join(scratch, name);
  writeFileSync(path, text);
  return path;
}

describe("npm run solve", () => {
  it("exit 0 on a solved network, with only the results JSON on standard output", () => {
    const { status, stdout, stderr } = run([join(FIXTURE_DIR, "ring-brackenwold.json")]);
    expect(status).toBe(0);
    expect(stderr).toBe("");
    const result = JSON.parse(stdout);
    expect(result.loadFlow.converged).toBe(true);
    expect(result.loadFlow.buses).toHaveLength(5);
    expect(Array.isArray(result.checks)).toBe(true);
  });

  it("exit 1 when the load flow does not converge, the JSON still printed with its sentence", () => {
    const { status, stdout } = run([join(FIXTURE_DIR, "overloaded-fellbeck.json")]);
    expect(status).toBe(1);
    const result = JSON.parse(stdout);
    expect(result.loadFlow.converged).toBe(false);
    expect(result.loadFlow.message).toMatch(/could carry about \d+ % of its load/);
  });

  it("exit 2 on an invalid file: each wrong path on standard error, nothing on standard output", () => {
    const path = scratchFile(
      "invalid.json",
      JSON.stringify({
        format: "kilostep.network",
        version: 1,
        name: "Broken (fictional)",
        frequencyHz: 50,
        buses: [{ id: "a", name: "A", nominalKV: -11 }],
        lines: [{ id: "l", name: "L", fromBus: "a", toBus: "nowhere", kind: "cable", lengthKm: 1, rOhmPerKm: 0.1, xOhmPerKm: 0.1, colour: "red" }],
      }),
    );
    const { status, stdout, stderr } = run([path]);
    expect(status).toBe(2);
    expect(stdout).toBe("");
    expect(stderr).toContain("buses[0].nominalKV");
    expect(stderr).toContain("lines[0]");
    expect(stderr).toContain('"colour"');
  });

  it("exit 2 on malformed JSON and on a file that cannot be read, nothing on standard output", () => {
    const malformed = run([scratchFile("malformed.json", '{ "format": ')]);
    expect(malformed.status).toBe(2);
    expect(malformed.stdout).toBe("");
    expect(malformed.stderr).toMatch(/not valid JSON/);
    const missing = run([join(scratch, "no-such-file.json")]);
    expect(missing.status).toBe(2);
    expect(missing.stdout).toBe("");
    expect(missing.stderr).toMatch(/cannot be read \(ENOENT\)/);
  });

  it("--csv buses and --csv branches print CSV with units in the header", () => {
    const buses = run([join(FIXTURE_DIR, "zip-mirewater.json"), "--csv", "buses"]);
    expect(buses.status).toBe(0);
    expect(buses.stdout.split("\r\n")[0]).toMatch(/^bus_id,bus_name,nominal_kV,voltage_pu,voltage_kV,angle_deg/);
    const branches = run([join(FIXTURE_DIR, "zip-mirewater.json"), "--csv", "branches", "--no-faults"]);
    expect(branches.stdout.split("\r\n")[0]).toBe("branch_id,branch_name,kind,from_bus,to_bus,p_from_MW,q_from_Mvar,p_to_MW,q_to_Mvar,loss_kW,current_A,loading_pct,current_from_A,current_to_A,tap_pct,tap_changer");
    expect(branches.stdout.split("\r\n").filter(Boolean)).toHaveLength(5);
    const wrong = run([join(FIXTURE_DIR, "zip-mirewater.json"), "--csv", "loads"]);
    expect(wrong.status).toBe(2);
    expect(wrong.stdout).toBe("");
  });

  it("exit 2 with the usage line on a bad command line", () => {
    for (const args of [[], ["a.json", "b.json"], ["--colour"], [join(FIXTURE_DIR, "zip-mirewater.json"), "--csv"]]) {
      const { status, stdout, stderr } = run(args);
      expect(status).toBe(2);
      expect(stdout).toBe("");
      expect(stderr).toContain("usage: npm run solve -- FILE.json");
    }
  });

  it("npm run -s solve, as a process, prints only the JSON and exits 0", { timeout: 120_000 }, () => {
    const out = spawnSync("npm", ["run", "-s", "solve", "--", join(FIXTURE_DIR, "hollin-moor-solar.json")], { cwd: ROOT, encoding: "utf8", timeout: 60_000 });
    expect(out.status).toBe(0);
    expect(out.stderr).toBe("");
    expect(out.stdout.trimStart().startsWith("{")).toBe(true);
    expect(JSON.parse(out.stdout).loadFlow.converged).toBe(true);
  });
});
