// The voltage ladder sizing each alternative's conductor from the library (the sheet's sizing,
// conductorSizing.ts). Outside references: the adiabatic withstand S ≥ I·√t / k (IEC 60949) with k
// from IEC 60364-5-54 (from memory: copper XLPE 143, aluminium XLPE 94, ACSR about 87), worked by
// hand from each candidate's cross-section; the loading test as the current against the type's
// ampacity, the current being about S / (√3·U) (three-phase power, common practice).
import { describe, expect, it } from "vitest";
import { runLadder, type Ladder, type LadderRequest } from "#solver/ladder.ts";
import { builtInLadderConductors } from "#app/lib/conductorCandidates.ts";
import { builtInConductorTypes } from "#app/lib/equipmentLibrary.ts";
import { validateNetwork, type Network } from "#solver/schema.ts";
import { loadFixture } from "./ladderFixtures.ts";

function ladderOf(network: Network, request: LadderRequest): Ladder {
  const outcome = runLadder(network, request, undefined, builtInLadderConductors);
  if (!outcome.ok) throw new Error(JSON.stringify(outcome.issues));
  return outcome.ladder;
}

/** IEC 60364-5-54 k values (from memory), written out here rather than taken from the solver. */
const K_BY_MATERIAL = { copper: 143, aluminium: 94, acsr: 87 } as const;

function typeOf(id: string) {
  return builtInConductorTypes.find((t) => t.id === id)!;
}

/**
 * A strong 11 kV source behind a 60 MVA 11/33 kV step-up, 8 km of 33 kV cable, a 33/11 kV
 * step-down and 5 MW: the fault at the cable's ends is some 9 kA, so over 3 s the smaller
 * aluminium cables cannot withstand it while they carry the load easily.
 */
function cableLink(): Network {
  const checked = validateNetwork({
    format: "kilostep.network",
    version: 1,
    name: "Cable link (fictional)",
    frequencyHz: 50,
    buses: [
      { id: "gen", name: "Source 11 kV", nominalKV: 11 },
      { id: "send", name: "Send 33 kV", nominalKV: 33 },
      { id: "recv", name: "Receive 33 kV", nominalKV: 33 },
      { id: "load", name: "Load 11 kV", nominalKV: 11, vMinPu: 0.9, vMaxPu: 1.1 },
    ],
    sources: [{ id: "g", name: "Grid", bus: "gen", kind: "grid", control: "slack", voltagePu: 1.02, shortCircuitMVA: 1000, xOverR: 10 }],
    transformers: [
      { id: "tu", name: "Step-up", hvBus: "send", lvBus: "gen", ratedMVA: 60, hvKV: 33, lvKV: 11, impedancePct: 6, xOverR: 30, vectorGroup: "YNd11" },
      { id: "td", name: "Step-down", hvBus: "recv", lvBus: "load", ratedMVA: 20, hvKV: 33, lvKV: 11, impedancePct: 8, xOverR: 20, vectorGroup: "Dyn11" },
    ],
    lines: [{ id: "cab", name: "Link 33 kV", fromBus: "send", toBus: "recv", kind: "cable", lengthKm: 8, rOhmPerKm: 0.32, xOhmPerKm: 0.14, ampacityA: 234 }],
    loads: [{ id: "ld", name: "Works", bus: "load", pMW: 5, qMvar: 1.5 }],
  });
  if (!checked.ok) throw new Error(JSON.stringify(checked.issues));
  return checked.network;
}

describe("the ladder sizes each alternative's section conductor (withstand decides)", () => {
  const ladder = ladderOf(cableLink(), { sectionBus: "send", voltagesKV: [33, 66], sizing: { clearingTimeS: 3 } });

  it("judges every candidate's withstand by S ≥ I·√t / k, worked by hand from its cross-section and material", () => {
    for (const alternative of ladder.alternatives) {
      const sizing = alternative.sizing!;
      expect(sizing.verdicts.length).toBeGreaterThan(0);
      for (const verdict of sizing.verdicts) {
        const type = typeOf(verdict.candidateId);
        expect(type.kind).toBe("cable");
        expect(type.nominalKV).toBe(alternative.voltageKV);
        // Hand: the current the cross-section withstands for 3 s, k·S/√t, against the fault at the ends.
        const withstandKA = (K_BY_MATERIAL[type.material!] * type.crossSectionMm2!) / Math.sqrt(3) / 1000;
        expect(verdict.tests.find((t) => t.test === "withstand")!.passes).toBe(withstandKA >= verdict.faultKA!);
      }
    }
  });

  it("at 33 kV the 95 mm² cables fail only on withstand (about 9 kA for 3 s needs more than 95 mm² of either metal), and the choice withstands", () => {
    const sizing = ladder.alternatives[0].sizing!;
    const faultKA = sizing.verdicts[0].faultKA!;
    expect(faultKA).toBeGreaterThan(8);
    expect(faultKA).toBeLessThan(11);
    for (const id of ["xlpe-33kv-al-95", "xlpe-33kv-cu-95"]) {
      const verdict = sizing.verdicts.find((v) => v.candidateId === id)!;
      expect(verdict.tests.filter((t) => !t.passes).map((t) => t.test)).toEqual(["withstand"]);
    }
    const chosen = typeOf(sizing.chosen!.candidateId);
    // Hand: S ≥ I·√t / k.
    expect(chosen.crossSectionMm2!).toBeGreaterThanOrEqual((faultKA * 1000 * Math.sqrt(3)) / K_BY_MATERIAL[chosen.material!]);
    expect(sizing.note).toContain(chosen.label);
    expect(sizing.note).toContain("withstand");
  });

  it("chooses the least lifetime cost among the candidates that pass, and costs and solves the alternative with it", () => {
    for (const alternative of ladder.alternatives) {
      const sizing = alternative.sizing!;
      const passing = sizing.verdicts.filter((v) => v.passes);
      const cheapest = Math.min(...passing.map((v) => v.lifetimeCost!));
      expect(sizing.chosen!.lifetimeCost).toBe(cheapest);
      const type = typeOf(sizing.chosen!.candidateId);
      const line = alternative.network.lines.find((l) => l.id === "cab")!;
      expect(line.rOhmPerKm).toBe(type.rOhmPerKm);
      expect(line.ampacityA).toBe(type.ampacityA);
      expect(alternative.money.capital.lines[0].costPerKm).toBeCloseTo(sizing.chosen!.costPerKm, 9);
      expect(alternative.money.capital.lines[0].cost).toBeCloseTo(sizing.chosen!.costPerKm * 8, 6);
    }
  });
});

describe("the ladder sizes the Tarn Head overhead line at each voltage (loading and voltage decide)", () => {
  const tarn = loadFixture("tarn-head-calder-flats.json");
  const ladder = ladderOf(tarn, { sectionBus: "b-tarn-66", voltagesKV: [33, 66, 132], sizing: { clearingTimeS: 0.5 } });

  it("keeps the line overhead and compares each candidate's current with its ampacity (about S/(√3·U) through the line)", () => {
    for (const alternative of ladder.alternatives.filter((a) => a.converged)) {
      const sizing = alternative.sizing!;
      const branch = alternative.result.loadFlow.branches.find((b) => b.id === tarn.lines.find((l) => l.kind === "overhead" && l.lengthKm === 48)!.id)!;
      const apparentMVA = Math.hypot(branch.pFromMW, branch.qFromMvar);
      // Three-phase power: I = S / (√3·U), within the voltage's few per cent off nominal.
      const approxA = (apparentMVA / (Math.sqrt(3) * alternative.voltageKV)) * 1000;
      expect(branch.currentA).toBeGreaterThan(approxA * 0.9);
      expect(branch.currentA).toBeLessThan(approxA * 1.1);
      expect(branch.currentA).toBeLessThanOrEqual(typeOf(sizing.chosen!.candidateId).ampacityA);
      for (const verdict of sizing.verdicts) {
        expect(typeOf(verdict.candidateId).kind).toBe("overhead");
        const loading = verdict.tests.find((t) => t.test === "loading");
        if (loading) expect(loading.passes).toBe(verdict.loadingPct! <= 100);
      }
    }
  });

  it("at 33 kV no conductor carries the load, says so and keeps the drawn one; 66 kV remains the cheapest alternative within limits", () => {
    const at33 = ladder.alternatives[0];
    expect(at33.converged).toBe(false);
    expect(at33.sizing!.chosen).toBeNull();
    expect(at33.sizing!.note).toMatch(/^None of the 8 library overhead conductors passes at 33 kV/);
    expect(ladder.alternatives[1].sizing!.chosen).not.toBeNull();
    expect(ladder.alternatives[2].sizing!.chosen).not.toBeNull();
    expect(ladder.cheapest?.voltageKV).toBe(66);
  });

  it("keeps a conductor the planner gave an alternative, and refuses sizing without a library", () => {
    const given = ladderOf(tarn, {
      sectionBus: "b-tarn-66",
      voltagesKV: [66],
      sizing: { clearingTimeS: 0.5 },
      overrides: [{ conductor: { name: "Our own", rOhmPerKm: 0.1, xOhmPerKm: 0.35, ampacityA: 700 } }],
    });
    expect(given.alternatives[0].sizing!.chosen).toBeNull();
    expect(given.alternatives[0].sizing!.note).toContain("Our own");
    const refused = runLadder(tarn, { sectionBus: "b-tarn-66", voltagesKV: [66], sizing: { clearingTimeS: 0.5 } });
    expect(refused.ok).toBe(false);
    const zero = runLadder(tarn, { sectionBus: "b-tarn-66", voltagesKV: [66], sizing: { clearingTimeS: 0 } }, undefined, builtInLadderConductors);
    expect(zero.ok).toBe(false);
    if (!zero.ok) expect(zero.issues[0]).toEqual({ path: "sizing.clearingTimeS", message: "must be a time above 0 s" });
  });
});
