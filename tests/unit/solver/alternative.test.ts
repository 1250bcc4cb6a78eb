import { describe, expect, it } from "vitest";
import { deriveAlternative, renameVoltage } from "#solver/alternative.ts";
import { findSection } from "#solver/section.ts";
import { validateNetwork, type Network } from "#solver/schema.ts";
import { loadFixture } from "./ladderFixtures.ts";

function derived(result: ReturnType<typeof deriveAlternative>): Network {
  if (!result.ok) throw new Error(JSON.stringify(result.issues));
  return result.network;
}

describe("deriveAlternative on the hydro demo", () => {
  const tarn = loadFixture("tarn-head-calder-flats.json");
  const section = findSection(tarn, "b-tarn-66")!;

  it.each([33, 66, 110, 132])("gives a network at %s kV that the network validator accepts", (kv) => {
    const alternative = derived(deriveAlternative(tarn, section, kv));
    expect(validateNetwork(JSON.parse(JSON.stringify(alternative)))).toMatchObject({ ok: true });
  });

  it("re-rates the section buses and the windings facing them, and keeps everything else", () => {
    const before = JSON.stringify(tarn);
    const alternative = derived(deriveAlternative(tarn, section, 132));
    expect(JSON.stringify(tarn)).toBe(before);

    const bus = (id: string) => alternative.buses.find((b) => b.id === id)!;
    expect(bus("b-tarn-66")).toMatchObject({ nominalKV: 132, breakingKA: 25, name: "Tarn Head 132 kV" });
    expect(bus("b-calder-66")).toMatchObject({ nominalKV: 132, breakingKA: 25, name: "Calder Flats 132 kV" });
    expect(bus("b-calder-11")).toEqual(tarn.buses.find((b) => b.id === "b-calder-11"));

    const transformer = (id: string) => alternative.transformers.find((t) => t.id === id)!;
    const original = (id: string) => tarn.transformers.find((t) => t.id === id)!;
    for (const id of ["t-tarn", "t-calder"]) {
      const { ratedMVA, impedancePct, tapPct } = original(id);
      expect(transformer(id)).toMatchObject({ hvKV: 132, lvKV: 11, ratedMVA, impedancePct, tapPct });
    }

    expect(alternative.lines[0]).toEqual({ ...tarn.lines[0], name: "Fell crossing 132 kV" });
    expect(alternative.lines.slice(1)).toEqual(tarn.lines.slice(1));
    expect(alternative.loads).toEqual(tarn.loads);
    expect(alternative.sources).toEqual(tarn.sources);
  });

  // Conductor data: ACSR Falcon, CRC Electric Power Engineering Handbook tables (methods list):
  // 0.0408 Ω/km, 0.312 Ω/km at 60 Hz (× 5/6 for 50 Hz), 1380 A.
  it("swaps the conductor of the section lines, dropping the old conductor's own data", () => {
    const falcon = { name: "ACSR Falcon", rOhmPerKm: 0.0408, xOhmPerKm: (0.312 * 5) / 6, ampacityA: 1380 };
    const line = derived(deriveAlternative(tarn, section, 132, { conductor: falcon })).lines[0];
    expect(line).toMatchObject({ rOhmPerKm: 0.0408, xOhmPerKm: 0.26, ampacityA: 1380, bMicroSiemensPerKm: tarn.lines[0].bMicroSiemensPerKm });

    const withZeroSequence = { ...tarn, lines: [{ ...tarn.lines[0], r0OhmPerKm: 0.4, x0OhmPerKm: 1.2 }, ...tarn.lines.slice(1)] };
    const swapped = derived(deriveAlternative(withZeroSequence, section, 132, { conductor: { rOhmPerKm: 0.1, xOhmPerKm: 0.35 } })).lines[0];
    expect(swapped.r0OhmPerKm).toBeUndefined();
    expect(swapped.x0OhmPerKm).toBeUndefined();
    expect(swapped.ampacityA).toBeUndefined();
  });

  it("applies per-element overrides last, and only the fields they name", () => {
    const alternative = derived(
      deriveAlternative(tarn, section, 132, {
        conductor: { rOhmPerKm: 0.1, xOhmPerKm: 0.35, ampacityA: 500 },
        lines: { "l-fell": { ampacityA: 650 } },
        transformers: { "t-calder": { tapPct: 0, hvKV: 138 } },
        buses: { "b-calder-66": { breakingKA: 31.5 } },
      }),
    );
    expect(alternative.lines[0]).toMatchObject({ rOhmPerKm: 0.1, ampacityA: 650 });
    expect(alternative.transformers[1]).toMatchObject({ tapPct: 0, hvKV: 138, tapMinPct: -10 });
    expect(alternative.transformers[0].tapPct).toBe(tarn.transformers[0].tapPct);
    expect(alternative.buses[2]).toMatchObject({ breakingKA: 31.5, vMinPu: 0.95 });
  });

  it("names each wrong override field", () => {
    const result = deriveAlternative(tarn, section, 132, {
      transformers: { "t-calder": { hvBus: "b-tarn-11", ratedMVA: -5 } },
      lines: { "l-nowhere": { ampacityA: 600 } },
      buses: { "b-tarn-66": { nominalKV: 110 } },
      colour: "red",
    });
    expect(result.ok).toBe(false);
    if (result.ok) return;
    const found = result.issues.map((i) => `${i.path}: ${i.message}`);
    expect(found).toContain(`overrides: "colour" is not a field that can be given here`);
    expect(found.some((f) => f.startsWith(`overrides.transformers.t-calder: "hvBus" cannot be changed per alternative`))).toBe(true);
    expect(found.some((f) => f.startsWith("overrides.transformers.t-calder.ratedMVA:"))).toBe(true);
    expect(found.some((f) => f.startsWith(`overrides.buses.b-tarn-66: "nominalKV" cannot be changed`))).toBe(true);
  });

  it("names an override of an element that does not exist", () => {
    expect(deriveAlternative(tarn, section, 132, { lines: { "l-nowhere": { ampacityA: 600 } } })).toEqual({
      ok: false,
      issues: [{ path: "overrides.lines.l-nowhere", message: `there is no line "l-nowhere" in the network` }],
    });
  });

  it("refuses a candidate that would put an HV winding at or below its LV winding", () => {
    const result = deriveAlternative(tarn, section, 11);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.issues[0]).toMatchObject({ path: "transformers[0]" });
    expect(result.issues[0].message).toMatch(/HV winding at 11 kV, not above its other winding \(11 kV\)/);
  });

  it("passes on what the network validator finds, with the candidate voltage", () => {
    const result = deriveAlternative(tarn, section, 132, { transformers: { "t-calder": { hvKV: 66 } } });
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.issues).toHaveLength(1);
    expect(result.issues[0].path).toBe("transformers[1].hvKV");
    expect(result.issues[0].message).toMatch(/^at 132 kV: .*more than 15 %/);
  });

  it("refuses a voltage that is not a positive number", () => {
    expect(deriveAlternative(tarn, section, -33)).toMatchObject({ ok: false, issues: [{ path: "voltageKV" }] });
    expect(deriveAlternative(tarn, section, Number.POSITIVE_INFINITY)).toMatchObject({ ok: false });
  });
});

describe("deriveAlternative on the solar demo", () => {
  const hollin = loadFixture("hollin-moor-solar.json");

  it("re-rates a generator's rated voltage when it sits on the section", () => {
    // The demo's plant is a converter; drawn as a machine with its rated voltage it is re-rated.
    const machine = {
      ...hollin,
      sources: hollin.sources.map((s) =>
        s.id === "g-solar" ? { ...s, kind: "generator" as const, control: "pq" as const, ratedKV: 33, xdSubtransientPct: 90, faultCurrentPct: undefined } : s,
      ),
    };
    const collector = findSection(machine, "b-hollin-33")!;
    const alternative = derived(deriveAlternative(machine, collector, 22));
    expect(alternative.sources.find((s) => s.id === "g-solar")).toMatchObject({ ratedKV: 22, pMW: 40 });
    expect(alternative.transformers[0]).toMatchObject({ hvKV: 132, lvKV: 22 });
    expect(alternative.buses[0]).toMatchObject({ nominalKV: 22, name: "Hollin Moor 22 kV collector" });
  });

  it("keeps the grid infeed's fault level when its bus is re-rated", () => {
    const exportLine = findSection(hollin, "b-greyscar")!;
    const alternative = derived(deriveAlternative(hollin, exportLine, 66));
    expect(alternative.sources.find((s) => s.id === "g-greyscar")).toEqual(hollin.sources[0]);
    expect(alternative.transformers[0]).toMatchObject({ hvKV: 66, lvKV: 33 });
  });
});

describe("renameVoltage", () => {
  it("replaces the voltage in a name and leaves other numbers alone", () => {
    expect(renameVoltage("Fell crossing 66 kV", 66, 132)).toBe("Fell crossing 132 kV");
    expect(renameVoltage("Line 166 kV-ish 66kV", 66, 33)).toBe("Line 166 kV-ish 33kV");
    expect(renameVoltage("Feeder 6.6 kV", 6.6, 11)).toBe("Feeder 11 kV");
    expect(renameVoltage("Bay 66", 66, 33)).toBe("Bay 66");
  });
});
