// The minimum fault level a planner asks of a bus (minFaultMVA) and a converter plant's
// short-circuit ratio, checked against the IEC 60909-0 minimum case.
import { describe, expect, it } from "vitest";
import { solveNetwork } from "#solver/index.ts";
import { faultRows, sourceRows } from "#solver/resultTables.ts";
import type { NetworkInput } from "#solver/schema.ts";
import { DEFAULT_MIN_SHORT_CIRCUIT_RATIO, withNeededVersion } from "#solver/equipmentRules.ts";

/** One 132 kV busbar fed by a grid infeed: 2,000 MVA at most, 1,500 MVA at weakest, and a converter plant. */
function busbar(minFaultMVA: number | undefined, plantMVA: number, minShortCircuitRatio?: number): NetworkInput {
  return {
    format: "kilostep.network",
    version: 2,
    name: "Busbar (fictional)",
    frequencyHz: 50,
    buses: [{ id: "b", name: "Busbar", nominalKV: 132, ...(minFaultMVA === undefined ? {} : { minFaultMVA }) }],
    sources: [
      { id: "g", name: "Grid", bus: "b", kind: "grid", control: "slack", shortCircuitMVA: 2000, shortCircuitMinMVA: 1500, xOverR: 10 },
      { id: "pv", name: "Solar park", bus: "b", kind: "converter", control: "pq", pMW: 10, ratedMVA: plantMVA, faultCurrentPct: 120, ...(minShortCircuitRatio === undefined ? {} : { minShortCircuitRatio }) },
    ],
  };
}

function solved(doc: NetworkInput) {
  const outcome = solveNetwork(doc);
  if (!outcome.ok) throw new Error(JSON.stringify(outcome.issues));
  return outcome;
}

describe("minimum fault level and short-circuit ratio checks", () => {
  it("a bus fed straight from the infeed has S″k3min = S″kQmin: c_min cancels in Z_Q = c·U²/S″kQ (IEC 60909-0 network feeder, hand arithmetic)", () => {
    const { network, result } = solved(busbar(undefined, 44));
    const [row] = faultRows(network, result);
    expect(row.sk3MinMVA).toBeCloseTo(1500, 6);
    // I″k3min = S″k3min / (√3 · U_n) = 1500 / (√3 · 132) = 6.5608 kA (three-phase power formula).
    expect(row.ik3MinKA).toBeCloseTo(1500 / (Math.sqrt(3) * 132), 6);
    expect(result.checks).toEqual([]);
  });

  it("flags the bus when the planner asks more than the minimum case gives, and not when it asks less", () => {
    const asking = solved(busbar(1600, 44));
    const check = asking.result.checks.find((c) => c.kind === "minimum-fault-level")!;
    expect(check).toMatchObject({ element: "b", limit: 1600 });
    expect(check.value).toBeCloseTo(1500, 6);
    expect(check.message).toContain("below the 1600 MVA asked of it");
    expect(solved(busbar(1400, 44)).result.checks).toEqual([]);
  });

  it("gives the plant's SCR as S″k3min / rated MVA (its definition) and calls it weak below 3 (common practice)", () => {
    const strong = solved(busbar(undefined, 44));
    const plant = sourceRows(strong.network, strong.result).find((r) => r.id === "pv")!;
    expect(plant.scr).toBeCloseTo(1500 / 44, 6);
    const weak = solved(busbar(undefined, 600));
    expect(weak.result.faults!.converters[0].scr).toBeCloseTo(2.5, 6);
    expect(weak.result.checks).toContainEqual(expect.objectContaining({ kind: "weak-grid", element: "pv", limit: DEFAULT_MIN_SHORT_CIRCUIT_RATIO }));
  });

  it("checks the SCR against the plant's own minShortCircuitRatio where the planner sets one (S″k3min / rated MVA = 1500 / 300 = 5, hand arithmetic)", () => {
    const plain = solved(busbar(undefined, 300));
    expect(plain.result.faults!.converters[0].scr).toBeCloseTo(5, 6);
    expect(plain.result.checks.filter((c) => c.kind === "weak-grid")).toEqual([]);
    const asking = solved(busbar(undefined, 300, 6));
    const check = asking.result.checks.find((c) => c.kind === "weak-grid")!;
    expect(check).toMatchObject({ element: "pv", limit: 6 });
    expect(check.message).toContain("below 6 asked of it");
    const lenient = solved(busbar(undefined, 600, 2));
    expect(lenient.result.checks.filter((c) => c.kind === "weak-grid")).toEqual([]);
  });

  it("refuses a minimum short-circuit ratio on a source that is not a converter plant, naming it", () => {
    const doc = busbar(undefined, 44);
    (doc.sources![0] as Record<string, unknown>).minShortCircuitRatio = 3;
    const outcome = solveNetwork(doc);
    expect(outcome.ok).toBe(false);
    if (!outcome.ok) expect(outcome.issues).toContainEqual({ path: "sources[0].minShortCircuitRatio", message: 'Source "Grid" (g): only a converter plant has a minimum short-circuit ratio' });
  });

  it("a version 1 drawing that gains a minimum fault level becomes version 2, and one without stays as it was", () => {
    const v1 = { ...busbar(undefined, 44), version: 1 as const, sources: [busbar(undefined, 44).sources![0]] };
    const withMinimum = { ...v1, buses: [{ ...v1.buses[0], minFaultMVA: 100 }] };
    const plain = { ...v1, sources: [{ ...v1.sources[0], shortCircuitMinMVA: undefined }] };
    expect(withNeededVersion(plain as never)).toBe(plain);
    expect((withNeededVersion(withMinimum as never) as { version: number }).version).toBe(2);
  });
});
