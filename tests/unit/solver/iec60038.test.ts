import { describe, expect, it } from "vitest";
import { candidateVoltagesKV, highestVoltageForEquipmentKV, IEC_60038_VOLTAGES, standardVoltage } from "#solver/iec60038.ts";

describe("IEC 60038 list", () => {
  // Methods, "Check values": highest voltage for equipment 36 kV for 33, 72.5 for 66, 145 for 132.
  it.each([
    [33, 36],
    [66, 72.5],
    [132, 145],
  ])("highest voltage for equipment at %s kV is %s kV (IEC 60038, methods list)", (nominalKV, umKV) => {
    expect(highestVoltageForEquipmentKV(nominalKV)).toBe(umKV);
  });

  // Methods list of IEC 60038 nominal voltages above 1 kV, series by series.
  it("holds the series I, series II and higher nominal voltages of the methods list", () => {
    const of = (series: string, preferred?: boolean) =>
      IEC_60038_VOLTAGES.filter((s) => s.series === series && (preferred === undefined || s.preferred === preferred))
        .map((s) => s.nominalKV)
        .sort((a, b) => a - b);
    expect(of("I", true)).toEqual([3.3, 6.6, 11, 22, 33, 66, 110, 132, 220]);
    expect(of("I", false)).toEqual([3, 6, 10, 15, 20, 35, 45, 150]);
    expect(of("II")).toEqual([4.16, 12.47, 13.2, 13.8, 24.94, 34.5, 69, 115, 138, 230]);
    expect(of("higher")).toEqual([275, 330, 400, 500, 765]);
  });

  // IEC 60038 sets U_m a few per cent to 20 % above U_n (3.6 for 3 kV is the widest); from memory.
  it("puts every highest voltage for equipment between 4 % and 20 % above its nominal voltage", () => {
    for (const s of IEC_60038_VOLTAGES) {
      const ratio = s.highestForEquipmentKV / s.nominalKV;
      expect(ratio, `${s.nominalKV} kV`).toBeGreaterThanOrEqual(1.04);
      expect(ratio, `${s.nominalKV} kV`).toBeLessThanOrEqual(1.2 + 1e-9);
    }
  });

  it("finds a standard voltage however it is written and nothing for a non-standard one", () => {
    expect(standardVoltage(66.0)?.series).toBe("I");
    expect(standardVoltage(69)?.series).toBe("II");
    expect(standardVoltage(50)).toBeUndefined();
    expect(highestVoltageForEquipmentKV(50)).toBeUndefined();
  });
});

describe("candidate voltages by sensible range", () => {
  // Rule of the module: the present series' preferred values and the higher ones from a third
  // to three times the present voltage, plus the present voltage.
  it("offers 33 and 132 kV around a 66 kV link (series I, 22 to 198 kV)", () => {
    expect(candidateVoltagesKV(66)).toEqual([22, 33, 66, 110, 132]);
  });

  it("stays in series II for a 69 kV link (23 to 207 kV)", () => {
    expect(candidateVoltagesKV(69)).toEqual([24.94, 34.5, 69, 115, 138]);
  });

  it("reaches the higher voltages from 132 kV (44 to 396 kV)", () => {
    expect(candidateVoltagesKV(132)).toEqual([66, 110, 132, 220, 275, 330]);
  });

  it("keeps a non-preferred or non-standard present voltage as an alternative", () => {
    expect(candidateVoltagesKV(20)).toEqual([11, 20, 22, 33]);
    expect(candidateVoltagesKV(50, { frequencyHz: 60 })).toEqual([24.94, 34.5, 50, 69, 115, 138]);
    expect(candidateVoltagesKV(50, { frequencyHz: 50 })).toEqual([22, 33, 50, 66, 110, 132]);
  });

  it("offers nothing for a voltage that is not a positive number", () => {
    expect(candidateVoltagesKV(0)).toEqual([]);
    expect(candidateVoltagesKV(Number.NaN)).toEqual([]);
  });
});
