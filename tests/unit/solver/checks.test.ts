// Limit checks: each names the element, its value, the limit and the rule.
import { describe, expect, it } from "vitest";
import { solveNetwork } from "#solver/index.ts";
import type { NetworkInput } from "#solver/schema.ts";
import { fixture } from "./fixtures.ts";

function solve(document: unknown) {
  const outcome = solveNetwork(document, { faults: false });
  if (!outcome.ok) throw new Error(JSON.stringify(outcome.issues));
  return outcome.result;
}

describe("load flow checks", () => {
  const doc = structuredClone(fixture("zip-mirewater.json").document) as NetworkInput;
  doc.buses.find((b) => b.id === "b-pike")!.vMinPu = 0.99;
  doc.buses.find((b) => b.id === "b-mire-11")!.vMaxPu = 1.01;
  doc.lines!.find((l) => l.id === "l-dale")!.ampacityA = 100;
  doc.transformers!.find((t) => t.id === "t-pike")!.ratedMVA = 0.5;
  const result = solve(doc);
  const lf = result.loadFlow;
  const byKind = (kind: string) => result.checks.filter((c) => c.kind === kind);

  it("undervoltage: the bus below its vMinPu, with its value, limit and the voltage band rule", () => {
    const [check] = byKind("undervoltage");
    const reading = lf.buses.find((b) => b.id === "b-pike")!;
    expect(check).toMatchObject({ element: "b-pike", value: reading.vPu, limit: 0.99 });
    expect(check.message).toContain("Pike Lane 11 kV");
    expect(check.message).toContain(reading.vPu.toFixed(3));
    expect(check.message).toContain("0.990 pu");
    expect(check.message).toMatch(/rule: voltage band 0.99–1.05 pu/);
  });

  it("overvoltage: the bus above its vMaxPu", () => {
    const [check] = byKind("overvoltage");
    expect(check).toMatchObject({ element: "b-mire-11", limit: 1.01 });
    expect(check.value).toBeGreaterThan(1.01);
    expect(check.message).toContain("Mirewater 11 kV");
    expect(check.message).toMatch(/above its maximum 1\.010 pu/);
  });

  it("line thermal: current in amperes against ampacity", () => {
    const [check] = byKind("line-overload");
    const reading = lf.branches.find((b) => b.id === "l-dale")!;
    expect(check).toMatchObject({ element: "l-dale", value: reading.currentA, limit: 100 });
    expect(check.message).toContain("Dale Row feeder");
    expect(check.message).toContain(`${reading.currentA.toFixed(0)} A`);
    expect(check.message).toMatch(/ampacity 100 A.*rule: line current within its thermal rating/);
  });

  it("transformer overload: apparent power in MVA against rated MVA", () => {
    const [check] = byKind("transformer-overload");
    const reading = lf.branches.find((b) => b.id === "t-pike")!;
    expect(check.element).toBe("t-pike");
    expect(check.limit).toBe(0.5);
    expect(check.value).toBeCloseTo(Math.max(Math.hypot(reading.pFromMW, reading.qFromMvar), Math.hypot(reading.pToMW, reading.qToMvar)), 12);
    expect(check.value / 0.5).toBeCloseTo(reading.loadingPct! / 100, 12);
    expect(check.message).toMatch(/rule: apparent power within rated MVA/);
  });

  it("no check on a network within every limit", () => {
    expect(solve(fixture("parallel-ashgill.json").document).checks).toEqual([]);
  });

  it("not converged: one check carrying the share of the load that solves and the planner's sentence", () => {
    const failed = solve(fixture("overloaded-fellbeck.json").document);
    expect(failed.checks).toHaveLength(1);
    const [check] = failed.checks;
    expect(check.kind).toBe("not-converged");
    expect(check.value).toBe(failed.loadFlow.loadabilityPct);
    expect(check.limit).toBe(100);
    expect(check.message).toContain(failed.loadFlow.message!);
  });
});
