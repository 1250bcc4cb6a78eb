// The sheet's case picker: one operating case's readings equal a plain solve of the network with
// that case applied by hand (the reference the study issue sets), and the envelope's extremes are
// the lowest and highest of those plain solves, each with its case.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { solveNetwork } from "#solver/index.ts";
import { validateNetwork, type Network } from "#solver/schema.ts";
import { availableView, caseChoices } from "#app/components/sheet/caseView.ts";
import { solveInView } from "#app/components/sheet/caseSolve.ts";
import { solveForSheet as solveForSheetAsDrawn } from "#app/components/sheet/liveSolve.ts";
import type { CaseView } from "#app/components/sheet/caseView.ts";

const solveForSheet = (document: Network, view: CaseView) => solveForSheetAsDrawn(document, view, solveInView);

function demo(): Network {
  const parsed = validateNetwork(JSON.parse(readFileSync("tests/fixtures/tarn-head-calder-flats.json", "utf8")));
  if (!parsed.ok) throw new Error("demo network does not validate");
  return parsed.network;
}

/** The demo with a case applied by hand: the plain network a planner would draw for it. */
function byHand(change: (network: Network) => Network) {
  const { cases: _cases, growth: _growth, ...plain } = demo();
  const solved = solveNetwork(change(plain as Network));
  if (!solved.ok) throw new Error("the hand-made case does not solve");
  return solved.result;
}

const summerLightByHand = () =>
  byHand((n) => ({
    ...n,
    loads: n.loads.map((l) => ({ ...l, pMW: l.pMW * 0.5, qMvar: l.qMvar * 0.5 })),
    sources: n.sources.map((s) => (s.id === "g-tarn" ? { ...s, voltagePu: 0.97 } : s)),
  }));

const townOutByHand = () =>
  byHand((n) => ({
    ...n,
    lines: n.lines.filter((l) => l.id !== "l-town"),
    buses: n.buses.filter((b) => b.id !== "b-town"),
    loads: n.loads.filter((l) => l.bus !== "b-town"),
    sources: n.sources.map((s) => (s.id === "g-tarn" ? { ...s, voltagePu: 1.0 } : s)),
  }));

describe("the case picker", () => {
  it("offers as drawn, each case and the envelope, and nothing for a network without cases", () => {
    expect(caseChoices(demo()).map((c) => c.label)).toEqual([
      "As drawn",
      "Winter peak",
      "Summer light load, capacitor in",
      "Town feeder out, mine at peak",
      "Envelope of all cases",
    ]);
    expect(caseChoices({ ...demo(), cases: undefined })).toEqual([]);
    expect(caseChoices({ ...demo(), cases: [] })).toEqual([]);
  });

  it("falls back to as drawn for a case the network no longer has", () => {
    expect(availableView(demo(), { kind: "case", id: "gone" })).toEqual({ kind: "as-drawn" });
    expect(availableView({ cases: undefined }, { kind: "envelope" })).toEqual({ kind: "as-drawn" });
    const state = solveForSheet(demo(), { kind: "case", id: "gone" });
    expect(state.kind === "solved" && state.readings.shownCase).toBeUndefined();
    expect(state.kind).toBe("solved");
  });

  it("reads one case exactly as a plain solve of the network with the case applied by hand", () => {
    const state = solveForSheet(demo(), { kind: "case", id: "summer-light" });
    if (state.kind !== "solved") throw new Error(`expected readings, got ${state.kind}`);
    expect(state.readings.shownCase).toMatchObject({ id: "summer-light", name: "Summer light load, capacitor in", lostLoadMW: 0 });
    expect(state.readings.shownCase?.outOfService.size).toBe(0);
    const reference = summerLightByHand();
    for (const bus of reference.loadFlow.buses) expect(state.readings.buses.get(bus.id)).toEqual(bus);
    for (const branch of reference.loadFlow.branches) expect(state.readings.branches.get(branch.id)).toEqual(branch);
    expect(state.readings.result.checks).toEqual(reference.checks);
    expect(state.readings.faults.size).toBe(6);
  });

  it("marks what a case takes out, with the buses it leaves without supply, and reads the rest as drawn by hand", () => {
    const state = solveForSheet(demo(), { kind: "case", id: "town-feeder-out" });
    if (state.kind !== "solved") throw new Error(`expected readings, got ${state.kind}`);
    expect([...state.readings.shownCase!.outOfService].sort()).toEqual(["b-town", "l-town", "ld-town"].sort());
    expect(state.readings.shownCase!.lostLoadMW).toBeCloseTo(7, 9);
    const reference = townOutByHand();
    expect([...state.readings.buses.keys()].sort()).toEqual(reference.loadFlow.buses.map((b) => b.id).sort());
    for (const bus of reference.loadFlow.buses) expect(state.readings.buses.get(bus.id)).toEqual(bus);
  });

  it("gives the envelope: each bus's lowest and highest voltage and each branch's highest loading over the plain solves, with the case", () => {
    const state = solveForSheet(demo(), { kind: "envelope" });
    if (state.kind !== "envelope") throw new Error(`expected the envelope, got ${state.kind}`);
    const peak = byHand((n) => n);
    const solves = [
      { name: "Winter peak", result: peak },
      { name: "Summer light load, capacitor in", result: summerLightByHand() },
      { name: "Town feeder out, mine at peak", result: townOutByHand() },
    ];
    for (const bus of demo().buses) {
      const seen = solves.flatMap((s) => s.result.loadFlow.buses.filter((b) => b.id === bus.id).map((b) => ({ v: b.vPu, name: s.name })));
      const lowest = seen.reduce((a, b) => (b.v < a.v ? b : a));
      const highest = seen.reduce((a, b) => (b.v > a.v ? b : a));
      const row = state.envelope.buses.get(bus.id)!;
      expect([row.vMinPu, row.vMinCase.name, row.vMaxPu, row.vMaxCase.name]).toEqual([lowest.v, lowest.name, highest.v, highest.name]);
    }
    const transformer = state.envelope.branches.get("t-calder")!;
    const loadings = solves.map((s) => s.result.loadFlow.branches.find((b) => b.id === "t-calder")!.loadingPct!);
    expect(transformer.maxLoadingPct).toBe(Math.max(...loadings));
    expect(state.envelope.study.cases.map((c) => c.id)).toEqual(["winter-peak", "summer-light", "town-feeder-out"]);
  });
});
