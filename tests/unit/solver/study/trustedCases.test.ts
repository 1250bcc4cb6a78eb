// A study validates its network once and solves each case without validating again. Each case's
// result must equal a full solveNetwork of the same case (validation included), and a case that
// validation would refuse must still be refused with validation's own words.
import { describe, expect, it } from "vitest";
import { solveNetwork, validateNetwork, type Network, type NetworkInput } from "#solver/index.ts";
import { applyCase, operatingCases, solveCase } from "#solver/study/index.ts";
import { fixtureDocument, tarnWithCases, twinTransformers } from "./networks.ts";

function validated(doc: NetworkInput): Network {
  const checked = validateNetwork(doc);
  if (!checked.ok) throw new Error(checked.issues.map((i) => `${i.path}: ${i.message}`).join("; "));
  return checked.network;
}

describe("cases solved without validating again", () => {
  it("give what solveNetwork gives for the same case, on every fixture, every case and every single outage", () => {
    const files = ["tarn-head-calder-flats.json", "ring-brackenwold.json", "hollin-moor-solar.json", "parallel-ashgill.json", "overloaded-fellbeck.json"];
    let compared = 0;
    for (const file of files) {
      const network = validated(fixtureDocument(file));
      for (const c of operatingCases(network)) {
        const outages = [undefined, ...network.lines.map((l) => l.id), ...network.transformers.map((t) => t.id)];
        for (const out of outages) {
          const adjustment = out ? { outOfService: [out] } : {};
          const applied = applyCase(network, c, adjustment);
          if (!applied.document) continue;
          const plain = solveNetwork(JSON.parse(JSON.stringify(applied.document)));
          if (!plain.ok) throw new Error(`${file} ${c.id} ${out}: ${plain.issues[0].message}`);
          expect(solveCase(network, c, adjustment).result, `${file} ${c.id} ${out ?? "intact"}`).toEqual(plain.result);
          compared++;
        }
      }
    }
    expect(compared).toBeGreaterThan(20);
  });

  it("refuse a case whose loads grow past the schema's bound, in validation's words", () => {
    const network = validated({ ...twinTransformers(2000), cases: [{ id: "x100", name: "A hundred times", loadScale: 100 }] });
    const solved = solveCase(network, network.cases![0]);
    expect(solved.result.loadFlow.converged).toBe(false);
    expect(solved.result.loadFlow.message).toContain("loads[0].pMW: must be at most 100000 MW");
  });

  it("refuse a case that leaves a regulating transformer's controlled bus de-energised, in validation's words", () => {
    const doc = tarnWithCases([{ id: "town-off", name: "Town feeder out", outOfService: ["l-town"] }]);
    const calder = doc.transformers!.find((t) => t.id === "t-calder")!;
    calder.tapControl = { ...calder.tapControl!, bus: "b-town" };
    const network = validated(doc);
    const solved = solveCase(network, network.cases![0]);
    expect(solved.result.loadFlow.message).toContain('regulates bus "b-town", which does not exist');
  });
});
