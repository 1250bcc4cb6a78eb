// The library page's form for a conductor: construction, material, cross-section, cable voltage and source.
import { describe, expect, it } from "vitest";
import { readTypeForm } from "#app/lib/libraryForm.ts";

const cable = { name: "Dale 11 kV 185 Cu", kind: "cable", frequencyHz: "50", rOhmPerKm: "0.0991 ohm/km", xOhmPerKm: "0.11", ampacityA: "430 A" };

describe("the library form for a conductor", () => {
  it("takes a cable with its material, cross-section, system voltage and source", () => {
    const read = readTypeForm("conductor", { ...cable, material: "copper", crossSectionMm2: "185 mm²", nominalKV: "11 kV", source: "from memory" });
    expect(read).toEqual({
      ok: true,
      kind: "conductor",
      name: "Dale 11 kV 185 Cu",
      data: { kind: "cable", frequencyHz: 50, rOhmPerKm: 0.0991, xOhmPerKm: 0.11, ampacityA: 430, material: "copper", crossSectionMm2: 185, nominalKV: 11, source: "from memory" },
    });
  });

  it("leaves the optional fields out when they are empty, and names a cross-section that is not a number", () => {
    const plain = readTypeForm("conductor", { ...cable, kind: "overhead", material: "", crossSectionMm2: "", nominalKV: "", source: "" });
    expect(plain.ok && plain.data).toEqual({ kind: "overhead", frequencyHz: 50, rOhmPerKm: 0.0991, xOhmPerKm: 0.11, ampacityA: 430 });
    expect(readTypeForm("conductor", { ...cable, crossSectionMm2: "big" })).toEqual({ ok: false, fieldErrors: { crossSectionMm2: "must be a number such as 300" } });
  });
});
