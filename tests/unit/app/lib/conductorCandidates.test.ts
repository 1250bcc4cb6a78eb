// Sizing a conductor on the demo from the library: which types are candidates, and that every
// candidate comes back with the reason it passes or fails each test.
import { describe, expect, it } from "vitest";
import { sizeConductor } from "#solver/conductorSizing.ts";
import { validateNetwork } from "#solver/schema.ts";
import { builtInConductorTypes } from "#app/lib/equipmentLibrary.ts";
import { lineNominalKV, sizingCandidates } from "#app/lib/conductorCandidates.ts";
import { applyConductorType } from "#app/components/sheet/equipmentApply.ts";
import tarn from "#app/lib/demo/tarnHeadCalderFlats.json";

const checked = validateNetwork(tarn);
if (!checked.ok) throw new Error("demo invalid");
const network = checked.network;

describe("conductor sizing candidates from the library", () => {
  it("offers every overhead conductor and only the cables made for the line's voltage, X scaled to the network's frequency (X = 2πfL)", () => {
    const candidates = sizingCandidates(builtInConductorTypes, 33, 50);
    const overhead = builtInConductorTypes.filter((t) => t.kind === "overhead");
    expect(candidates.filter((c) => c.kind === "overhead")).toHaveLength(overhead.length);
    const cables = candidates.filter((c) => c.kind === "cable");
    expect(cables.length).toBeGreaterThan(0);
    for (const c of cables) expect(c.id).toMatch(/^xlpe-33kv-/);
    const hawk = candidates.find((c) => c.id === "acsr-hawk")!;
    expect(hawk.xOhmPerKm).toBeCloseTo((0.357 * 50) / 60, 6);
  });

  it("leaves out a team type that does not say its material and cross-section", () => {
    const bare = { id: "team-1", label: "Bare", kind: "overhead" as const, frequencyHz: 50 as const, rOhmPerKm: 0.1, xOhmPerKm: 0.3, ampacityA: 500, source: "Team library" };
    expect(sizingCandidates([bare], 33, 50)).toEqual([]);
  });

  it("sizes the demo's 33 kV Fell crossing: every candidate with a reason per test, the withstand by S ≥ I·√t / k (IEC 60949 adiabatic)", () => {
    const line = network.lines.find((l) => l.id === "l-fell")!;
    const candidates = sizingCandidates(builtInConductorTypes, lineNominalKV(line, network.buses), network.frequencyHz);
    const outcome = sizeConductor(network, "l-fell", candidates, { clearingTimeS: 0.5 });
    if (!outcome.ok) throw new Error(outcome.message);
    expect(outcome.verdicts).toHaveLength(candidates.length);
    for (const v of outcome.verdicts) {
      expect(v.tests.length).toBeGreaterThan(0);
      for (const t of v.tests) expect(t.reason.length).toBeGreaterThan(10);
      const withstand = v.tests.find((t) => t.test === "withstand");
      if (!withstand || v.faultKA === null) continue;
      const candidate = candidates.find((c) => c.id === v.candidateId)!;
      const k = { copper: 143, aluminium: 94, acsr: 87 }[candidate.material];
      expect(withstand.passes).toBe(candidate.crossSectionMm2 >= (v.faultKA * 1000 * Math.sqrt(0.5)) / k);
    }
    if (outcome.cheapestPassing) expect(outcome.verdicts.find((v) => v.candidateId === outcome.cheapestPassing)!.passes).toBe(true);
  });

  it("applying a cable makes the line a cable with the type's values", () => {
    const line = network.lines.find((l) => l.id === "l-fell")!;
    const cable = builtInConductorTypes.find((t) => t.id === "xlpe-33kv-cu-300")!;
    const applied = applyConductorType(line, cable, 50).line;
    expect(applied).toMatchObject({ kind: "cable", rOhmPerKm: cable.rOhmPerKm, ampacityA: cable.ampacityA, bMicroSiemensPerKm: cable.bMicroSiemensPerKm });
  });
});
