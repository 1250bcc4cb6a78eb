import { describe, expect, it } from "vitest";
import { UNEARTHED_NOTE } from "#solver/faults/index.ts";
import { solveNetwork } from "#solver/index.ts";
import { branchRows, busRows, endCurrentA, faultRows, sourceRows } from "#solver/resultTables.ts";
import type { FaultBusReading } from "#solver/results.ts";
import type { NetworkInput } from "#solver/schema.ts";
import { chainNetwork, crowdedBusNetwork, starNetwork } from "../largeNetworks.ts";
import { fixture } from "./fixtures.ts";

describe("the results rows every table is built from", () => {
  it("lists a step-up transformer in the direction it exports, positive power in, both winding currents", () => {
    // The solar demo's park transformer steps its 33 kV collector up to 132 kV and exports.
    const outcome = solveNetwork(fixture("hollin-moor-solar.json").document as NetworkInput);
    if (!outcome.ok) throw new Error("fixture invalid");
    const rows = branchRows(outcome.network, outcome.result);
    const transformer = rows.find((r) => r.kind === "transformer")!;
    expect(transformer.from.winding).toBe("HV");
    expect(transformer.to.winding).toBe("LV");
    expect(transformer.sending).toBe(transformer.to);
    expect(transformer.sending.pMW).toBeGreaterThan(0);
    expect(transformer.sending.busName).not.toMatch(/^b-/);
    // Three-phase power: I = |S| / (√3 U) at each winding, so the LV current exceeds the HV
    // current by about the turns ratio 132/33 (from memory of the power formula).
    expect(transformer.to.currentA / transformer.from.currentA).toBeCloseTo(132 / 33, 0);
    for (const row of rows) {
      expect(row.sending.pMW).toBeGreaterThanOrEqual(0);
      expect(Math.max(row.from.currentA, row.to.currentA)).toBeCloseTo(row.currentA, 0);
    }
  });

  it("says a bus is unearthed with no single-phase current rather than a current of zero", () => {
    const network = chainNetwork(3);
    const result = fakeResult(network);
    result.faults.buses[1] = { ...result.faults.buses[1], ik1kA: 0, note: UNEARTHED_NOTE };
    const rows = faultRows(network, result);
    expect(rows[1]).toMatchObject({ ik1kA: null, note: UNEARTHED_NOTE });
    expect(rows[0].ik1kA).toBe(9);
  });

  it("computes a winding current from the three-phase power formula", () => {
    // 10 MVA at 11 kV: I = 10e6 / (√3 · 11e3) = 524.86 A (the standard three-phase formula).
    expect(endCurrentA(8, 6, 11)).toBeCloseTo(524.86, 2);
    expect(endCurrentA(1, 1, undefined)).toBe(0);
  });

  it("builds every table of a solved 50,000-bus chain, a 50,000-spur star and a bus with 20,000 loads in one pass", { timeout: 300_000 }, () => {
    for (const network of [chainNetwork(50_000), starNetwork(50_000), crowdedBusNetwork(20_000)]) {
      const result = fakeResult(network);
      expect(busRows(network, result)).toHaveLength(network.buses.length);
      expect(branchRows(network, result)).toHaveLength(network.lines.length + network.transformers.length);
      expect(sourceRows(network, result)).toHaveLength(1);
      expect(faultRows(network, result)).toHaveLength(network.buses.length);
    }
  });
});

/** Readings of the right shape for every element; the rows' job is bookkeeping, not the numbers. */
function fakeResult(network: ReturnType<typeof chainNetwork>) {
  return {
    loadFlow: {
      converged: true,
      iterations: 3,
      method: "test",
      buses: network.buses.map((b) => ({ id: b.id, vPu: 1, vKV: b.nominalKV, angleDeg: 0 })),
      branches: [
        ...network.transformers.map((t) => ({ id: t.id, kind: "transformer" as const, fromBus: t.hvBus, toBus: t.lvBus })),
        ...network.lines.map((l) => ({ id: l.id, kind: "line" as const, fromBus: l.fromBus, toBus: l.toBus })),
      ].map((b) => ({ ...b, pFromMW: 1, qFromMvar: 0, pToMW: -1, qToMvar: 0, lossKW: 0, currentA: 52.5, loadingPct: null })),
      sources: network.sources.map((s) => ({ id: s.id, pMW: 1, qMvar: 0 })),
      totals: { generationMW: 1, loadMW: 1, lossMW: 0, lossPct: 0 },
    },
    faults: {
      method: "IEC 60909-0" as const,
      buses: network.buses.map((b): FaultBusReading => ({ id: b.id, ik3kA: 10, ik3MVA: 190, ip3kA: 25, ik1kA: 9, rOverX: 0.1, ik3MinKA: 8, ik1MinKA: 7, ipMethod: "radial" })),
      converters: [],
    },
    checks: [],
  };
}
