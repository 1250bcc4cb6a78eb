import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { validateNetwork, type Network } from "#solver/schema.ts";
import { checkField, fieldsFor } from "#app/components/sheet/elementFields.ts";
import { perUnitNotes } from "#app/components/sheet/perUnitNotes.ts";

function demo(): Network {
  const parsed = validateNetwork(JSON.parse(readFileSync("tests/fixtures/tarn-head-calder-flats.json", "utf8")));
  if (!parsed.ok) throw new Error("demo network does not validate");
  return parsed.network;
}

describe("per-unit notes beside impedances (Z_base = kV²/MVA)", () => {
  // A hand-made chain, so that the expected values are worked here and not read from a fixture.
  const doc: Network = {
    format: "kilostep.network", version: 1, name: "Hand check", frequencyHz: 50, baseMVA: 100,
    buses: [
      { id: "b11", name: "Plant 11 kV", nominalKV: 11, vMinPu: 0.95, vMaxPu: 1.05 },
      { id: "b66", name: "Plant 66 kV", nominalKV: 66, vMinPu: 0.95, vMaxPu: 1.05 },
      { id: "r66", name: "Remote 66 kV", nominalKV: 66, vMinPu: 0.95, vMaxPu: 1.05 },
    ],
    sources: [
      { id: "g", name: "Unit", bus: "b11", kind: "generator", control: "slack", voltagePu: 1, angleDeg: 0, pMW: 0, qMvar: 0, ratedMVA: 24, ratedKV: 11, xdSubtransientPct: 17 },
    ],
    transformers: [
      { id: "t", name: "Step-up", hvBus: "b66", lvBus: "b11", ratedMVA: 25, hvKV: 66, lvKV: 11, impedancePct: 8.5, loadLossKW: 118, tapPct: 0, vectorGroup: "YNd11" },
    ],
    lines: [{ id: "l", name: "Link", fromBus: "b66", toBus: "r66", kind: "overhead", lengthKm: 48, rOhmPerKm: 0.158, xOhmPerKm: 0.382 }],
    loads: [],
    shunts: [],
  };
  const s = (v: number) => Number(v.toPrecision(4));

  it("gives a line's impedance in ohms and per unit", () => {
    // 0.158 × 48 = 7.584 Ω, 0.382 × 48 = 18.336 Ω; Z_base = 66²/100 = 43.56 Ω
    expect(perUnitNotes("line", doc.lines[0], doc)).toEqual([
      "Z = 7.584 + j18.34 Ω over 48 km",
      "z = 0.1741 + j0.4209 pu on 100 MVA, 66 kV",
    ]);
  });

  it("gives a transformer's impedance on its own rating and on the system base", () => {
    // r = 118 kW / 25 MVA = 0.00472; x = √(0.085² − r²) = 0.08487; × 100/25 on the same 11 kV base
    const r = 118 / 25000;
    const x = Math.sqrt(0.085 ** 2 - r ** 2);
    expect(s(x)).toBe(0.08487);
    expect(perUnitNotes("transformer", doc.transformers[0], doc)).toEqual([
      `z = ${s(r)} + j${s(x)} pu on its own 25 MVA`,
      `z = ${s(4 * r)} + j${s(4 * x)} pu on 100 MVA`,
    ]);
  });

  it("gives a generator's subtransient reactance on the system base", () => {
    // 17 % on 24 MVA → 0.17 × 100/24 = 0.7083
    expect(perUnitNotes("source", doc.sources[0], doc)).toEqual(["x″d = 0.7083 pu on 100 MVA"]);
  });

  it("gives a grid infeed's impedance with the IEC 60909-0 voltage factor", () => {
    const grid = { id: "q", name: "Grid", bus: "b66", kind: "grid" as const, control: "slack" as const, voltagePu: 1, angleDeg: 0, pMW: 0, qMvar: 0, shortCircuitMVA: 2000 };
    // c = 1.1 above 1 kV; Z_Q = 1.1 × 66² / 2000 = 2.3958 Ω; in pu 1.1 × 100/2000 = 0.055
    expect(perUnitNotes("source", grid, doc)).toEqual(["Z_Q = c·U²/S″kQ = 2.396 Ω = 0.055 pu on 100 MVA (c = 1.1)"]);
  });
});

describe("Details field checks use the element schemas", () => {
  const doc = demo();
  const t = doc.transformers[0];
  it("accepts a valid value and refuses one the schema refuses, in words", () => {
    const ok = checkField("transformer", t, "impedancePct", 10);
    expect(ok.ok && (ok.element as typeof t).impedancePct).toBe(10);
    expect(checkField("transformer", t, "ratedMVA", 0)).toEqual({ ok: false, message: "must be 0.0001 or more" });
    const group = checkField("transformer", t, "vectorGroup", "XY7");
    expect(group.ok).toBe(false);
    if (!group.ok) expect(group.message).toMatch(/vector group/);
  });

  it("clears an optional field and refuses to clear a required one", () => {
    const cleared = checkField("transformer", t, "noLoadLossKW", undefined);
    expect(cleared.ok && "noLoadLossKW" in cleared.element).toBe(false);
    expect(checkField("transformer", t, "hvKV", undefined)).toEqual({ ok: false, message: "is required" });
  });

  it("does not block a field on a terminal that is not connected yet", () => {
    const loose = { ...doc.loads[0], bus: "" };
    expect(checkField("load", loose, "pMW", 3).ok).toBe(true);
  });

  it("shows the fields a source's kind and control need", () => {
    const keys = (s: Parameters<typeof fieldsFor>[1]) => fieldsFor("source", s).map((f) => f.key);
    expect(keys(doc.sources[0])).toContain("xdSubtransientPct");
    expect(keys(doc.sources[0])).not.toContain("pMW");
    expect(keys({ ...doc.sources[0], control: "pq", kind: "grid" })).toEqual(
      expect.arrayContaining(["pMW", "qMvar", "shortCircuitMVA"]),
    );
  });
});
