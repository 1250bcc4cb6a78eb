import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { diffRevisions, diffSummary, unitOfField } from "#app/lib/revisionDiff.ts";
import { validateNetwork, type Network } from "#solver/schema.ts";

function demo(): Network {
  const checked = validateNetwork(JSON.parse(readFileSync("tests/fixtures/tarn-head-calder-flats.json", "utf8")));
  if (!checked.ok) throw new Error("the demo fixture must validate");
  return checked.network;
}

const ELEMENT_COUNT = 6 + 1 + 2 + 3 + 2 + 1; // buses, sources, transformers, lines, loads, shunts of the fixture

describe("diffRevisions", () => {
  it("finds nothing between a revision and itself", () => {
    const diff = diffRevisions(demo(), demo());
    expect(diff).toEqual({ network: [], added: [], removed: [], changed: [], unchanged: ELEMENT_COUNT });
    expect(diffSummary(diff)).toBe("no differences");
  });

  it("lists changed fields with their units, in the document's reading order", () => {
    const before = demo();
    const after = demo();
    const line = after.lines.find((l) => l.id === "l-fell")!;
    line.lengthKm = 52;
    line.rOhmPerKm = 0.12;
    line.name = "Fell crossing 66 kV (rerouted)";
    const diff = diffRevisions(before, after);
    expect(diff.changed).toHaveLength(1);
    const [change] = diff.changed;
    expect(change).toMatchObject({ id: "l-fell", kind: "Line", name: "Fell crossing 66 kV (rerouted)" });
    expect(change.changes.map((c) => [c.field, c.fromText, c.toText])).toEqual([
      ["name", "Fell crossing 66 kV", "Fell crossing 66 kV (rerouted)"],
      ["lengthKm", "48 km", "52 km"],
      ["rOhmPerKm", "0.105 Ω/km", "0.12 Ω/km"],
    ]);
    expect(change.changes[1]).toMatchObject({ label: "Length", unit: "km", from: 48, to: 52 });
    expect(diff.unchanged).toBe(ELEMENT_COUNT - 1);
    expect(diffSummary(diff)).toBe("1 changed");
  });

  it("reports elements added and removed by id, not by position in the list", () => {
    const before = demo();
    const after = demo();
    after.shunts = [];
    after.loads.push({ id: "ld-quarry", name: "Quarry", bus: "b-town", pMW: 1.5, qMvar: 0.4, model: "constant-power" });
    after.loads.reverse();
    const diff = diffRevisions(before, after);
    expect(diff.removed).toEqual([{ id: "c-calder", name: "Calder Flats capacitor bank", kind: "Shunt", collection: "shunts" }]);
    expect(diff.added).toEqual([{ id: "ld-quarry", name: "Quarry", kind: "Load", collection: "loads" }]);
    expect(diff.changed).toEqual([]);
    expect(diffSummary(diff)).toBe("1 added, 1 removed");
  });

  it("names buses in changed connections and a field that became set or unset", () => {
    const before = demo();
    const after = demo();
    const load = after.loads.find((l) => l.id === "ld-town")!;
    load.bus = "b-calder-11";
    const bus = after.buses.find((b) => b.id === "b-tarn-11")!;
    delete bus.breakingKA;
    const line = after.lines.find((l) => l.id === "l-town")!;
    line.bMicroSiemensPerKm = 2.8;
    const diff = diffRevisions(before, after);
    const byId = new Map(diff.changed.map((c) => [c.id, c.changes]));
    expect(byId.get("ld-town")).toEqual([
      expect.objectContaining({ field: "bus", fromText: "Calder Flats town 11 kV", toText: "Calder Flats 11 kV" }),
    ]);
    expect(byId.get("b-tarn-11")).toEqual([expect.objectContaining({ field: "breakingKA", fromText: "25 kA", toText: "(none)", to: undefined })]);
    expect(byId.get("l-town")).toEqual([expect.objectContaining({ field: "bMicroSiemensPerKm", fromText: "(none)", toText: "2.8 µS/km" })]);
  });

  it("shows a move on the sheet as one change, and network fields apart from elements", () => {
    const before = demo();
    const after = demo();
    const bus = after.buses.find((b) => b.id === "b-mine")!;
    bus.x = 1000;
    bus.y = -80;
    after.name = "Tarn Head, 2027 option";
    after.frequencyHz = 60;
    const diff = diffRevisions(before, after);
    expect(diff.changed).toEqual([
      expect.objectContaining({
        id: "b-mine",
        changes: [{ field: "position", label: "Place on the sheet", unit: null, from: null, to: null, fromText: "x 960, y -120", toText: "x 1000, y -80" }],
      }),
    ]);
    expect(diff.network.map((c) => [c.field, c.fromText, c.toText])).toEqual([
      ["name", "Tarn Head to Calder Flats (fictional)", "Tarn Head, 2027 option"],
      ["frequencyHz", "50 Hz", "60 Hz"],
    ]);
    expect(diffSummary(diff)).toBe("2 network fields changed, 1 changed");
  });
});

describe("unitOfField", () => {
  // The unit each field name of network-format.md carries.
  it.each([
    ["nominalKV", "kV"],
    ["breakingKA", "kA"],
    ["shortCircuitMVA", "MVA"],
    ["qMvar", "Mvar"],
    ["qMinMvar", "Mvar"],
    ["pMW", "MW"],
    ["loadLossKW", "kW"],
    ["impedancePct", "%"],
    ["vMinPu", "pu"],
    ["lengthKm", "km"],
    ["rOhmPerKm", "Ω/km"],
    ["x0OhmPerKm", "Ω/km"],
    ["bMicroSiemensPerKm", "µS/km"],
    ["angleDeg", "°"],
    ["frequencyHz", "Hz"],
    ["ampacityA", "A"],
    ["xOverR", null],
    ["z0OverZ1", null],
    ["ratedPowerFactor", null],
    ["vectorGroup", null],
    ["name", null],
  ])("%s → %s", (field, unit) => {
    expect(unitOfField(field)).toBe(unit);
  });
});
