// Conductor sizing: each candidate put in the line's place and solved. The withstand test is the
// adiabatic S ≥ I·√t/k (IEC 60949, k from IEC 60364-5-54, from memory: Cu XLPE 143, Al XLPE 94,
// ACSR about 87); loading against ampacity; the lifetime cost is capital plus the present value
// of losses (P/A at 8 %, 20 years = 9.8181, standard interest tables).
import { describe, expect, it } from "vitest";
import { ADIABATIC_K, minimumCrossSectionMm2, withstandCurrentA } from "#solver/conductorWithstand.ts";
import { sizeConductor, type SizingCandidate } from "#solver/conductorSizing.ts";
import { validateNetwork, type Network } from "#solver/schema.ts";
import { builtInConductorTypes } from "#app/lib/equipmentLibrary.ts";

describe("adiabatic withstand (IEC 60949; k per IEC 60364-5-54, from memory)", () => {
  it("k: copper XLPE 143, aluminium XLPE 94, ACSR 87", () => {
    expect(ADIABATIC_K).toEqual({ copper: 143, aluminium: 94, acsr: 87 });
  });

  it("20 kA for 1 s needs 20000/143 = 139.9 mm² of copper; for 0.25 s half that", () => {
    expect(minimumCrossSectionMm2(20_000, 1, "copper")).toBeCloseTo(139.86, 2);
    expect(minimumCrossSectionMm2(20_000, 0.25, "copper")).toBeCloseTo(69.93, 2);
    expect(withstandCurrentA(185, 1, "aluminium")).toBeCloseTo(17_390, 0);
  });
});

function feeder(loadMW: number): Network {
  const checked = validateNetwork({
    format: "kilostep.network",
    version: 1,
    name: "sizing",
    frequencyHz: 50,
    buses: [
      { id: "src", name: "Source 33 kV", nominalKV: 33 },
      { id: "far", name: "Far 33 kV", nominalKV: 33, vMinPu: 0.94, vMaxPu: 1.06 },
    ],
    sources: [{ id: "g", name: "Grid", bus: "src", kind: "grid", control: "slack", voltagePu: 1.02, shortCircuitMVA: 800, xOverR: 10 }],
    lines: [{ id: "cab", name: "Cable", fromBus: "src", toBus: "far", kind: "cable", lengthKm: 6, rOhmPerKm: 0.32, xOhmPerKm: 0.14, ampacityA: 234 }],
    loads: [{ id: "ld", name: "Load", bus: "far", pMW: loadMW, qMvar: loadMW * 0.33 }],
  });
  if (!checked.ok) throw new Error(JSON.stringify(checked.issues));
  return checked.network;
}

const candidates: SizingCandidate[] = builtInConductorTypes
  .filter((c) => c.kind === "cable" && c.nominalKV === 33)
  .map((c) => ({ ...c, kind: c.kind, material: c.material!, crossSectionMm2: c.crossSectionMm2!, costPerKm: 100_000 + 500 * c.crossSectionMm2! }));

describe("sizing a 33 kV cable for 20 MW", () => {
  const network = feeder(20);
  const outcome = sizeConductor(network, "cab", candidates, { clearingTimeS: 1, money: { discountRatePct: 8, studyYears: 20 } });
  if (!outcome.ok) throw new Error(outcome.message);

  it("lists every candidate with a reason for each test", () => {
    expect(outcome.verdicts).toHaveLength(candidates.length);
    for (const v of outcome.verdicts) for (const t of v.tests) expect(t.reason.length).toBeGreaterThan(10);
  });

  it("fails the loading test exactly where current exceeds ampacity (I = S/(√3·V) ≈ 370 A at 20 MW, pf 0.95)", () => {
    for (const v of outcome.verdicts) {
      const candidate = candidates.find((c) => c.id === v.candidateId)!;
      const loading = v.tests.find((t) => t.test === "loading")!;
      // Common practice: the current is about S/(√3·V), within a few per cent of voltage drop.
      const approxA = (Math.hypot(20, 6.6) / (Math.sqrt(3) * 33)) * 1000;
      expect((v.loadingPct! / 100) * candidate.ampacityA).toBeGreaterThan(approxA * 0.97);
      expect((v.loadingPct! / 100) * candidate.ampacityA).toBeLessThan(approxA * 1.1);
      expect(loading.passes).toBe(v.loadingPct! <= 100);
    }
    expect(outcome.verdicts.find((v) => v.candidateId === "xlpe-33kv-al-95")!.tests[0].passes).toBe(false);
    expect(outcome.verdicts.find((v) => v.candidateId === "xlpe-33kv-cu-300")!.tests[0].passes).toBe(true);
  });

  it("withstand follows S ≥ I·√t/k with the fault current at the line's ends", () => {
    for (const v of outcome.verdicts) {
      const candidate = candidates.find((c) => c.id === v.candidateId)!;
      const withstand = v.tests.find((t) => t.test === "withstand")!;
      const needed = (v.faultKA! * 1000 * Math.sqrt(1)) / ADIABATIC_K[candidate.material];
      expect(withstand.passes).toBe(candidate.crossSectionMm2 >= needed);
    }
  });

  it("lifetime cost = capital + losses × LLF × 8760 h × price × 9.8181", () => {
    const v = outcome.verdicts.find((x) => x.candidateId === "xlpe-33kv-cu-300")!;
    expect(v.capitalCost).toBeCloseTo((100_000 + 500 * 300) * 6, 6);
    expect(v.lifetimeCost!).toBeCloseTo(v.capitalCost + v.lossesPresentValue!, 6);
    const llf = 0.3 * 0.6 + 0.7 * 0.36; // Buller and Woodrow, defaults LF 0.6, k 0.3
    const solvedLossMW = v.lossesPresentValue! / (llf * 8760 * 80 * 9.8181);
    expect(solvedLossMW).toBeGreaterThan(0);
    expect(solvedLossMW).toBeLessThan(0.5);
  });

  it("marks the cheapest candidate that passes every test", () => {
    const passing = outcome.verdicts.filter((v) => v.passes);
    expect(passing.length).toBeGreaterThan(0);
    const cheapest = passing.reduce((a, b) => (a.lifetimeCost! <= b.lifetimeCost! ? a : b));
    expect(outcome.cheapestPassing).toBe(cheapest.candidateId);
  });

  it("names the bus that leaves its band", () => {
    const heavy = sizeConductor(feeder(40), "cab", candidates, { clearingTimeS: 0.5 });
    if (!heavy.ok) throw new Error(heavy.message);
    const al95 = heavy.verdicts.find((v) => v.candidateId === "xlpe-33kv-al-95")!;
    const voltage = al95.tests.find((t) => t.test === "voltage" || t.test === "solve")!;
    expect(voltage.passes).toBe(false);
  });

  it("answers a sentence for a line that does not exist", () => {
    expect(sizeConductor(network, "nope", candidates, { clearingTimeS: 1 })).toEqual({ ok: false, message: 'There is no line "nope" in the network.' });
  });
});
