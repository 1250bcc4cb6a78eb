// The voltage ladder across the operating cases: an alternative qualifies only if it keeps every
// limit in every case, its losses are priced from the cases' hours, and the recommendation names
// the case that decided it.
import { describe, expect, it } from "vitest";
import { presentWorthFactor } from "#solver/economics.ts";
import { runLadder, type Ladder } from "#solver/ladder.ts";
import { loadFixture } from "./ladderFixtures.ts";

function ladderOf(file: "tarn-head-calder-flats.json" | "hollin-moor-solar.json", request: object): Ladder {
  const outcome = runLadder(loadFixture(file, { withCases: true }), request);
  if (!outcome.ok) throw new Error(JSON.stringify(outcome.issues));
  return outcome.ladder;
}

describe("the ladder across the hydro demo's cases", () => {
  const ladder = ladderOf("tarn-head-calder-flats.json", { sectionBus: "b-calder-66", voltagesKV: [33, 66, 132] });
  const [at33, at66, at132] = ladder.alternatives;

  it("solves every alternative in every case", () => {
    for (const a of ladder.alternatives) expect(a.cases.map((c) => c.id)).toEqual(["winter-peak", "summer-light", "town-feeder-out"]);
  });

  it("rules out an alternative that breaks a limit in any one case, naming the case", () => {
    expect(at33.withinLimits).toBe(false);
    expect(at33.studyChecks).toContainEqual(expect.objectContaining({ kind: "not-converged", case: "winter-peak" }));
    for (const check of at33.studyChecks) expect(["winter-peak", "summer-light", "town-feeder-out"]).toContain(check.case);
    // Calder Flats' on-load tap changer re-taps in every case at 132 kV too, so 132 kV keeps
    // every limit and is judged on its money, not ruled out by the 66 kV tap as drawn.
    expect(at132.withinLimits).toBe(true);
    expect(at132.studyChecks).toEqual([]);
    expect(at132.money.totalCost!).toBeGreaterThan(at66.money.totalCost!);
    expect(at66.withinLimits).toBe(true);
    expect(at66.studyChecks).toEqual([]);
  });

  it("prices the losses from Σ case loss × hours (hand arithmetic), the outage case carrying no hours", () => {
    // Growth 0 by default, so every year costs the same: PV = MWh × price × (P/A, 8 %, 25 years).
    const mwh = at66.cases[0].lossMW! * 2200 + at66.cases[1].lossMW! * 6560;
    expect(at66.energy.lossMWhPerYear).toBeCloseTo(mwh, 9);
    expect(at66.money.losses!.lossLoadFactor).toBeNull();
    expect(at66.money.losses!.presentValueOfLosses).toBeCloseTo(mwh * 80 * presentWorthFactor(0.08, 25), 3);
  });

  it("says which case decided: the one in which the cheaper alternative fails", () => {
    expect(ladder.cheapest).toMatchObject({ voltageKV: 66, withinLimits: true, decidingCase: { id: "winter-peak", reason: "limits" } });
    expect(at33.money.capital.total).toBeLessThan(at66.money.totalCost!);
    expect(ladder.cheapest!.note).toContain('The case that decided: "Winter peak", in which 33 kV, though cheaper, cannot carry the load.');
  });

  it("holds every alternative to N-1 as well when asked", () => {
    const n1 = ladderOf("tarn-head-calder-flats.json", { sectionBus: "b-calder-66", voltagesKV: [66], outages: true });
    const checks = n1.alternatives[0].studyChecks;
    expect(checks.length).toBeGreaterThan(0);
    expect(n1.alternatives[0].withinLimits).toBe(false);
  });
});

describe("the ladder across the solar demo's cases", () => {
  it("decides on money when nothing cheaper is ruled out, naming the case whose losses weigh most", () => {
    const ladder = ladderOf("hollin-moor-solar.json", { sectionBus: "b-hollin-132", voltagesKV: [66, 132] });
    const chosen = ladder.alternatives[ladder.cheapest!.index];
    const byCase = chosen.energy.byCase;
    const heaviest = byCase.reduce((a, b) => (b.lossMWh! > a.lossMWh! ? b : a));
    expect(ladder.cheapest!.decidingCase).toMatchObject({ id: heaviest.case, reason: "losses" });
    // Export at midday: 40 MW through the link for 2200 h outweighs the night's no-load losses.
    expect(heaviest.case).toBe("midday-export");
  });
});
