// Property tests on random radial networks: balance, agreement with the independent mathjs
// solve, nothing non-finite, and every invalid document rejected with a path.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { solveNetwork } from "#solver/index.ts";
import { validateNetwork, type NetworkInput } from "#solver/schema.ts";
import { largestVoltageGap, referenceLoadFlow } from "./reference/nodalReference.ts";
import { radialNetwork } from "./generators.ts";
import { nonFiniteNumbers } from "./finite.ts";

describe("random radial networks", () => {
  it("solve, balance to 1e-6 MW, contain no NaN and agree with the mathjs nodal solve to 1e-8 pu", () => {
    fc.assert(
      fc.property(radialNetwork, (doc) => {
        const outcome = solveNetwork(doc, { faults: false });
        if (!outcome.ok) throw new Error(`generated document rejected: ${JSON.stringify(outcome.issues)}`);
        const lf = outcome.result.loadFlow;
        expect(nonFiniteNumbers(outcome.result)).toEqual([]);
        const ref = referenceLoadFlow(outcome.network);
        expect(lf.converged).toBe(true);
        expect(ref.converged).toBe(true);
        expect(Math.abs(lf.totals.generationMW - lf.totals.loadMW - lf.totals.lossMW)).toBeLessThan(1e-6);
        expect(largestVoltageGap(ref.voltage, lf.buses)).toBeLessThan(1e-8);
        for (const rb of ref.branches) {
          const b = lf.branches.find((x) => x.id === rb.id)!;
          expect(Math.abs(b.lossKW - rb.lossKW)).toBeLessThan(1e-6 * Math.max(1, Math.abs(rb.lossKW)));
          expect(Math.abs(b.currentA - rb.currentA)).toBeLessThan(1e-6 * Math.max(1, rb.currentA));
        }
      }),
      // A fixed seed keeps the suite repeatable; PROPERTY_SEED=random explores new networks. The
      // network seed 9089567 found (a set point the reactive limits cannot hold) is kept in
      // controlSettles.test.ts.
      { numRuns: 60, seed: process.env.PROPERTY_SEED === "random" ? undefined : Number(process.env.PROPERTY_SEED ?? 20261202) },
    );
  });
});

type Mutation = (doc: NetworkInput, pick: number) => string;

/** Ways to break a valid document; each returns the path prefix the rejection must name. */
const mutations: Record<string, Mutation> = {
  "negative nominal voltage": (doc, pick) => {
    const i = pick % doc.buses.length;
    doc.buses[i].nominalKV = -doc.buses[i].nominalKV;
    return `buses[${i}].nominalKV`;
  },
  "unknown field": (doc, pick) => {
    const i = pick % doc.buses.length;
    (doc.buses[i] as Record<string, unknown>).colour = "red";
    return `buses[${i}]`;
  },
  "reference to a missing bus": (doc, pick) => {
    const i = pick % doc.loads!.length;
    doc.loads![i].bus = "no-such-bus";
    return `loads[${i}].bus`;
  },
  "missing required field": (doc, pick) => {
    const i = pick % doc.buses.length;
    delete (doc.buses[i] as Partial<NetworkInput["buses"][number]>).name;
    return `buses[${i}].name`;
  },
  "repeated id": (doc, pick) => {
    const i = 1 + (pick % (doc.buses.length - 1));
    doc.buses[i].id = doc.buses[0].id;
    return `buses[${i}].id`;
  },
  "text where a number belongs": (doc, pick) => {
    const i = pick % doc.loads!.length;
    (doc.loads![i] as Record<string, unknown>).pMW = "12";
    return `loads[${i}].pMW`;
  },
  "no slack": (doc) => {
    doc.sources = doc.sources!.filter((s) => s.control !== "slack");
    return "buses[0]";
  },
};

describe("invalid documents", () => {
  it("are always rejected, with an issue naming the broken path", () => {
    fc.assert(
      fc.property(radialNetwork, fc.constantFrom(...Object.keys(mutations)), fc.nat(), (valid, name, pick) => {
        fc.pre(valid.loads!.length > 0);
        const doc = structuredClone(valid);
        const path = mutations[name](doc, pick);
        const outcome = solveNetwork(doc);
        expect(outcome.ok).toBe(false);
        if (outcome.ok) return;
        expect(outcome.issues.length).toBeGreaterThan(0);
        expect(outcome.issues.some((issue) => issue.path.startsWith(path))).toBe(true);
        expect(outcome.issues.every((issue) => issue.message.length > 0)).toBe(true);
        expect(validateNetwork(doc).ok).toBe(false);
      }),
      { numRuns: 150 },
    );
  });

  it("anything that is not a network document is rejected without throwing", () => {
    fc.assert(
      fc.property(fc.anything(), (junk) => {
        const outcome = solveNetwork(junk);
        expect(outcome.ok).toBe(false);
      }),
      { numRuns: 200 },
    );
  });
});
