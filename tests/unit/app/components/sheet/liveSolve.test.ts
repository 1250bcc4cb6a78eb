import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { solveNetwork } from "#solver/index.ts";
import { validateNetwork, type Network } from "#solver/schema.ts";
import { solveForSheet } from "#app/components/sheet/liveSolve.ts";
import { placePart } from "#app/components/sheet/sheetEdits.ts";

function demo(): Network {
  const parsed = validateNetwork(JSON.parse(readFileSync("tests/fixtures/tarn-head-calder-flats.json", "utf8")));
  if (!parsed.ok) throw new Error("demo network does not validate");
  return parsed.network;
}

describe("solving for the sheet", () => {
  it("draws the shared solver's numbers, not a copy of its own", () => {
    const state = solveForSheet(demo());
    expect(state.kind).toBe("solved");
    if (state.kind !== "solved") return;
    const direct = solveNetwork(demo());
    if (!direct.ok) throw new Error("solver refused the demo");
    for (const bus of direct.result.loadFlow.buses) expect(state.readings.buses.get(bus.id)).toEqual(bus);
    expect(state.readings.branches.size).toBe(5);
    expect(state.readings.faults.size).toBe(6);
    expect(state.readings.elapsedMs).toBeGreaterThanOrEqual(0);
  });

  it("shows why a drawing cannot be solved yet instead of numbers", () => {
    const placed = placePart({ document: demo(), layout: {} }, "load", { x: 0, y: 0 });
    const state = solveForSheet(placed.document);
    expect(state.kind).toBe("invalid");
    if (state.kind === "invalid") expect(state.issues[0].message).toMatch(/connect its terminal to a busbar/);
  });

  it("keeps no bus numbers when the load flow does not converge", () => {
    const doc = demo();
    const heavy = { ...doc, loads: doc.loads.map((l) => ({ ...l, pMW: l.pMW * 40, qMvar: l.qMvar * 40 })) };
    const state = solveForSheet(heavy);
    expect(state.kind).toBe("solved");
    if (state.kind !== "solved") return;
    expect(state.readings.result.loadFlow.converged).toBe(false);
    expect(state.readings.result.loadFlow.message).toBeTruthy();
    expect(state.readings.buses.size).toBe(0);
    expect(state.readings.branches.size).toBe(0);
  });
});
