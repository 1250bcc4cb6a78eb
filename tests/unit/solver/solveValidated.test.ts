// solveValidated skips the validation for a network already validated (a stored revision): on the
// validator's output it must give exactly what solveNetwork gives for the document.
import { describe, expect, it } from "vitest";
import { solveNetwork, solveValidated } from "#solver/index.ts";
import { validFixtures } from "./fixtures.ts";

describe("solveValidated", () => {
  it("gives what solveNetwork gives, on every fixture", () => {
    const fixtures = validFixtures();
    expect(fixtures.length).toBeGreaterThan(0);
    for (const f of fixtures) {
      const stored = JSON.parse(JSON.stringify(f.network));
      expect(solveValidated(stored)).toEqual(solveNetwork(f.document));
    }
  });
});
