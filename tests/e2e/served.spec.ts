// The served checks (tests/served/servedChecks.ts) as part of the browser test run, where the build
// they need is fresh: two servers side by side sending mail, the access log, the security headers.
import { execFileSync } from "node:child_process";
import { join } from "node:path";
import { expect, test } from "@playwright/test";

test("two servers send mail side by side; the log hides secrets; every answer carries the security headers", () => {
  test.setTimeout(180_000);
  const repository = join(import.meta.dirname, "..", "..");
  const output = execFileSync(process.execPath, [join(repository, "node_modules", "tsx", "dist", "cli.mjs"), "tests/served/servedChecks.ts"], {
    cwd: repository,
    encoding: "utf8",
    timeout: 170_000,
  });
  console.log(output.trim());
  expect(output).toMatch(/security headers on pages/);
});
