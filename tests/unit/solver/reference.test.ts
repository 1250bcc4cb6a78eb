// Agreement with an independent method: every fixture solved by the production sparse
// Newton–Raphson and by the dense mathjs nodal solve in ./reference (which shares no model code).
import { describe, expect, it } from "vitest";
import { solveNetwork } from "#solver/index.ts";
import { largestVoltageGap, referenceLoadFlow } from "./reference/nodalReference.ts";
import { validFixtures } from "./fixtures.ts";

const fixtures = validFixtures();

describe("production load flow against the independent mathjs nodal solve", () => {
  it("has fixtures to compare, including the five solver fixtures", () => {
    const files = fixtures.map((f) => f.file);
    for (const f of ["ring-brackenwold.json", "parallel-ashgill.json", "pv-limit-scarth.json", "overloaded-fellbeck.json", "zip-mirewater.json"])
      expect(files).toContain(f);
  });

  for (const { file, document, network } of fixtures) {
    it(`${file}: same outcome, bus voltages within 1e-8 pu, losses, currents and slack power within 1e-6 relative (mathjs reference)`, () => {
      const outcome = solveNetwork(document, { faults: false });
      if (!outcome.ok) throw new Error(`fixture rejected: ${JSON.stringify(outcome.issues)}`);
      const lf = outcome.result.loadFlow;
      const ref = referenceLoadFlow(network);
      expect(lf.converged).toBe(ref.converged);
      if (!ref.converged) return;

      expect(largestVoltageGap(ref.voltage, lf.buses)).toBeLessThan(1e-8);
      for (const refBranch of ref.branches) {
        const b = lf.branches.find((x) => x.id === refBranch.id)!;
        expect(Math.abs(b.lossKW - refBranch.lossKW)).toBeLessThan(1e-6 * Math.max(1, Math.abs(refBranch.lossKW)));
        expect(Math.abs(b.currentA - refBranch.currentA)).toBeLessThan(1e-6 * Math.max(1, refBranch.currentA));
        expect(Math.abs(b.pFromMW - refBranch.pFromMW)).toBeLessThan(1e-6);
        expect(Math.abs(b.qToMvar - refBranch.qToMvar)).toBeLessThan(1e-6);
      }
      for (const [id, mw] of Object.entries(ref.slackMW))
        expect(Math.abs(lf.sources.find((s) => s.id === id)!.pMW - mw)).toBeLessThan(1e-6);
      expect(Math.abs(lf.totals.loadMW - ref.loadMW)).toBeLessThan(1e-6);
    });
  }
});
