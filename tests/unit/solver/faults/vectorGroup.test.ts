// IEC 60076-1 vector group notation and the zero-sequence paths the methods assign to it:
// an earthed star (YN/yn) passes zero-sequence current, a delta closes it inside the
// transformer and is open from its terminals, an unearthed star is open. Earthed zigzag:
// zero-sequence ampere-turns cancel on each limb, so it earths its own side and is decoupled
// from the other winding (our documented choice).
import { describe, expect, it } from "vitest";
import { computeFaultLevels } from "#solver/faults/index.ts";
import { parseVectorGroup, zeroSequenceCoupling } from "#solver/faults/vectorGroup.ts";
import { validateNetwork, type Network } from "#solver/schema.ts";

describe("parseVectorGroup", () => {
  it("reads HV letters, LV letters and the clock number", () => {
    expect(parseVectorGroup("YNd11")).toEqual({
      hv: { connection: "star", neutralEarthed: true },
      lv: { connection: "delta", neutralEarthed: false },
      clockNumber: 11,
    });
    expect(parseVectorGroup("Dyn11").lv).toEqual({ connection: "star", neutralEarthed: true });
    expect(parseVectorGroup("ZNyn11").hv).toEqual({ connection: "zigzag", neutralEarthed: true });
    expect(parseVectorGroup("Yzn11").lv).toEqual({ connection: "zigzag", neutralEarthed: true });
    expect(parseVectorGroup("Dz0").lv).toEqual({ connection: "zigzag", neutralEarthed: false });
    expect(parseVectorGroup("YNyn0").clockNumber).toBe(0);
    expect(parseVectorGroup("Yd1").hv).toEqual({ connection: "star", neutralEarthed: false });
  });

  it.each([
    ["Xyz1", "not IEC 60076-1 notation"],
    ["dYN11", "not IEC 60076-1 notation"],
    ["YNd", "not IEC 60076-1 notation"],
    ["", "not IEC 60076-1 notation"],
    ["Dyn13", "clock number 13 must be 0 to 11"],
    ["Yd0", "cannot be wound"],
    ["Dyn4", "cannot be wound"],
    ["YNyn1", "cannot be wound"],
  ])("rejects %s with a message", (code, message) => {
    expect(() => parseVectorGroup(code)).toThrow(message);
  });

  it("the fault calculation names the transformer with an unknown vector group", () => {
    const checked = validateNetwork({
      format: "kilostep.network",
      version: 1,
      name: "bad group",
      frequencyHz: 50,
      buses: [
        { id: "a", name: "A", nominalKV: 33 },
        { id: "b", name: "B", nominalKV: 11 },
      ],
      sources: [{ id: "g", name: "G", bus: "a", kind: "grid", control: "slack", shortCircuitMVA: 500 }],
      transformers: [{ id: "t-odd", name: "T", hvBus: "a", lvBus: "b", ratedMVA: 10, hvKV: 33, lvKV: 11, impedancePct: 8, xOverR: 10, vectorGroup: "Dyn11" }],
    });
    if (!checked.ok) throw new Error(JSON.stringify(checked.issues));
    // The schema refuses such a group; a network built in code bypasses it.
    const net: Network = { ...checked.network, transformers: [{ ...checked.network.transformers[0], vectorGroup: "Dyn2" }] };
    expect(() => computeFaultLevels(net)).toThrow(/transformer "t-odd": vector group "Dyn2" cannot be wound/);
  });
});

describe("zeroSequenceCoupling", () => {
  it.each([
    ["YNyn0", { kind: "series" }],
    ["YNd11", { kind: "shunt", side: "hv" }],
    ["Dyn11", { kind: "shunt", side: "lv" }],
    ["Yd1", { kind: "open" }],
    ["Dd0", { kind: "open" }],
    ["Yyn0", { kind: "open" }],
    ["YNy0", { kind: "open" }],
    ["Dy11", { kind: "open" }],
    ["Yzn11", { kind: "shunt", side: "lv" }],
    ["Dzn0", { kind: "shunt", side: "lv" }],
    ["ZNyn11", { kind: "shunt", side: "hv" }],
    ["ZNd0", { kind: "shunt", side: "hv" }],
    ["ZNzn0", { kind: "shunt-both" }],
    ["Dz0", { kind: "open" }],
  ])("%s", (code, expected) => {
    expect(zeroSequenceCoupling(parseVectorGroup(code))).toEqual(expected);
  });
});
