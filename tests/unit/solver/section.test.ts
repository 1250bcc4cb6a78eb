import { describe, expect, it } from "vitest";
import { findSection } from "#solver/section.ts";
import { validateNetwork } from "#solver/schema.ts";
import { loadFixture } from "./ladderFixtures.ts";

// Expected sections read off the demo drawings by hand: transformers bound a voltage level, lines do not.
describe("findSection", () => {
  const tarn = loadFixture("tarn-head-calder-flats.json");
  const hollin = loadFixture("hollin-moor-solar.json");

  it("finds the 66 kV link of the hydro demo between its two transformers", () => {
    expect(findSection(tarn, "b-calder-66")).toEqual({
      nominalKV: 66,
      busIds: ["b-tarn-66", "b-calder-66"],
      lineIds: ["l-fell"],
      facingWindings: [
        { transformerId: "t-tarn", winding: "hv" },
        { transformerId: "t-calder", winding: "hv" },
      ],
      sourceIds: [],
      endBusIds: ["b-tarn-66", "b-calder-66"],
    });
  });

  it("finds the 11 kV distribution of the hydro demo with its two spurs as ends", () => {
    const section = findSection(tarn, "b-town")!;
    expect(section.busIds).toEqual(["b-calder-11", "b-mine", "b-town"]);
    expect(section.lineIds).toEqual(["l-mine", "l-town"]);
    expect(section.facingWindings).toEqual([{ transformerId: "t-calder", winding: "lv" }]);
    expect(section.endBusIds).toEqual(["b-calder-11", "b-mine", "b-town"]);
  });

  it("finds a single-bus section at the hydro station with its generator", () => {
    const section = findSection(tarn, "b-tarn-11")!;
    expect(section.busIds).toEqual(["b-tarn-11"]);
    expect(section.lineIds).toEqual([]);
    expect(section.sourceIds).toEqual(["g-tarn"]);
    expect(section.endBusIds).toEqual(["b-tarn-11"]);
  });

  it("finds the 132 kV export line of the solar demo with the grid infeed at its far end", () => {
    expect(findSection(hollin, "b-greyscar")).toEqual({
      nominalKV: 132,
      busIds: ["b-hollin-132", "b-greyscar"],
      lineIds: ["l-moor"],
      facingWindings: [{ transformerId: "t-hollin", winding: "hv" }],
      sourceIds: ["g-greyscar"],
      endBusIds: ["b-hollin-132", "b-greyscar"],
    });
    const collector = findSection(hollin, "b-hollin-33")!;
    expect(collector.facingWindings).toEqual([{ transformerId: "t-hollin", winding: "lv" }]);
    expect(collector.sourceIds).toEqual(["g-solar"]);
  });

  it("keeps a middle bus of a through line out of the ends", () => {
    const chain = validateNetwork({
      format: "kilostep.network",
      version: 1,
      name: "Three buses in a row",
      frequencyHz: 50,
      buses: ["a", "b", "c"].map((id) => ({ id, name: id, nominalKV: 33 })),
      sources: [{ id: "g", name: "Grid", bus: "a", kind: "grid", control: "slack", shortCircuitMVA: 500, xOverR: 10 }],
      lines: [
        { id: "ab", name: "ab", fromBus: "a", toBus: "b", kind: "overhead", lengthKm: 5, rOhmPerKm: 0.2, xOhmPerKm: 0.4 },
        { id: "bc", name: "bc", fromBus: "b", toBus: "c", kind: "overhead", lengthKm: 5, rOhmPerKm: 0.2, xOhmPerKm: 0.4 },
      ],
    });
    if (!validated(chain)) return;
    expect(findSection(chain.network, "b")!.endBusIds).toEqual(["a", "c"]);
  });

  it("answers undefined for a bus that is not there", () => {
    expect(findSection(tarn, "b-nowhere")).toBeUndefined();
  });
});

function validated(result: ReturnType<typeof validateNetwork>): result is Extract<typeof result, { ok: true }> {
  expect(result).toMatchObject({ ok: true });
  return result.ok;
}
