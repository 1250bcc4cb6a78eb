// Runs before every unit test file: a database file of its own (so files never share state), a
// cheap password hash cost, and a rule that any console.error fails the test that logged it.
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, afterEach, beforeEach } from "vitest";

const databaseDir = mkdtempSync(join(tmpdir(), "kilostep-unit-"));
process.env.DATABASE_PATH = join(databaseDir, "test.sqlite");
process.env.PASSWORD_HASH_COST = "4";
// Links in mail and share answers start here, whatever Host a test request carries.
process.env.APP_ORIGIN = "http://kilostep.test";

afterAll(() => rmSync(databaseDir, { recursive: true, force: true }));

const originalConsoleError = console.error;
let errorsLogged: unknown[][] = [];

beforeEach(() => {
  errorsLogged = [];
  console.error = (...args: unknown[]) => {
    errorsLogged.push(args);
  };
});

afterEach(() => {
  console.error = originalConsoleError;
  if (errorsLogged.length > 0) {
    const first = errorsLogged[0].map((part) => (part instanceof Error ? part.stack : String(part))).join(" ");
    throw new Error(`The test logged ${errorsLogged.length} console.error message(s); the first: ${first}`);
  }
});
