// The crash check (tests/crash/crashRecovery.ts) as part of the browser test run, where the
// build it needs is fresh: its own server on its own database, killed with SIGKILL mid save loop.
import { execFileSync } from "node:child_process";
import { join } from "node:path";
import { expect, test } from "@playwright/test";

test("a server killed mid save loop restarts with an intact database and every acknowledged save", () => {
  test.setTimeout(180_000);
  const repository = join(import.meta.dirname, "..", "..");
  const output = execFileSync(process.execPath, [join(repository, "node_modules", "tsx", "dist", "cli.mjs"), "tests/crash/crashRecovery.ts"], {
    cwd: repository,
    encoding: "utf8",
    timeout: 170_000,
  });
  console.log(output.trim());
  expect(output).toMatch(/all present, database intact/);
});
