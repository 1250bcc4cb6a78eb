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

  it("solves the complete part of a drawing with a loose load, marks the load and says why", () => {
    const placed = placePart({ document: demo(), layout: {} }, "load", { x: 0, y: 0 });
    const state = solveForSheet(placed.document);
    expect(state.kind).toBe("solved");
    if (state.kind !== "solved") return;
    expect([...state.readings.leftOut]).toEqual([placed.id]);
    expect(state.readings.problems[0].message).toMatch(/connect its terminal to a busbar/);
    // The rest reads as the complete demo does: the same solver on the document without the load.
    const complete = solveForSheet(demo());
    if (complete.kind !== "solved") throw new Error("the demo solves");
    expect(state.readings.buses.get("b-town")!.vPu).toBeCloseTo(complete.readings.buses.get("b-town")!.vPu, 12);
  });

  it("has nothing to solve when no busbar has a source", () => {
    const bare = placePart({ document: { ...demo(), sources: [] }, layout: {} }, "load", { x: 0, y: 0 });
    expect(solveForSheet(bare.document).kind).toBe("invalid");
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
