import { describe, expect, it } from "vitest";
import { formatQuantity, parseQuantity, type QuantityKind } from "#app/lib/units.ts";

function value(text: string, kind: QuantityKind): number {
  const parsed = parseQuantity(text, kind);
  if (!parsed.ok) throw new Error(`"${text}" as ${kind}: ${parsed.error}`);
  return parsed.value;
}

function error(text: string, kind: QuantityKind): string {
  const parsed = parseQuantity(text, kind);
  if (parsed.ok) throw new Error(`"${text}" as ${kind} was read as ${parsed.value}`);
  return parsed.error;
}

describe("parseQuantity reads what a planner types", () => {
  it("reads the examples of the network form in the field's own unit", () => {
    expect(value("33 kV", "kV")).toBe(33);
    expect(value("0.12 ohm/km", "ohmPerKm")).toBe(0.12);
    expect(value("500 A", "A")).toBe(500);
    expect(value("25 MVA", "MVA")).toBe(25);
    expect(value("18 %", "pct")).toBe(18);
    expect(value("250 kW", "MW")).toBe(0.25);
    expect(value("2 Mvar", "Mvar")).toBe(2);
  });

  it("takes a plain number in the field's unit", () => {
    expect(value("66", "kV")).toBe(66);
    expect(value("8.5", "pct")).toBe(8.5);
    expect(value("-5", "pct")).toBe(-5);
    expect(value("1.03", "pu")).toBe(1.03);
    expect(value("1e3", "MVA")).toBe(1000);
  });

  it("converts between prefixes and units (SI prefixes; 1 mile = 1.609344 km by definition)", () => {
    expect(value("500 V", "kV")).toBe(0.5);
    expect(value("11000 V", "kV")).toBe(11);
    expect(value("0.42 kA", "A")).toBe(420);
    expect(value("630 kVA", "MVA")).toBe(0.63);
    expect(value("300 kvar", "Mvar")).toBe(0.3);
    expect(value("2.5 MW", "kW")).toBe(2500);
    expect(value("500 m", "km")).toBe(0.5);
    expect(value("1 ohm/mi", "ohmPerKm")).toBeCloseTo(1 / 1.609344, 10);
    expect(value("0.12 mohm/m", "ohmPerKm")).toBe(0.12);
    expect(value("2.9 uS/km", "microSiemensPerKm")).toBe(2.9);
  });

  it("accepts the spellings of the trade: Ω, µ, MVAr, lower-case kv and mw, thousands commas", () => {
    expect(value("0.39 Ω/km", "ohmPerKm")).toBe(0.39);
    expect(value("2.95 µS/km", "microSiemensPerKm")).toBe(2.95);
    expect(value("2 MVAr", "Mvar")).toBe(2);
    expect(value("33 kv", "kV")).toBe(33);
    expect(value("12 mw", "MW")).toBe(12);
    expect(value("3,000 MVA", "MVA")).toBe(3000);
    expect(value("33kV", "kV")).toBe(33);
  });

  it("reads percent as a hundredth in per-unit fields and 'pu' as is", () => {
    expect(value("103 %", "pu")).toBe(1.03);
    expect(value("0.95 pu", "pu")).toBe(0.95);
  });

  it("says what it understood", () => {
    const parsed = parseQuantity("500 V", "kV");
    expect(parsed).toEqual({ ok: true, value: 0.5, understood: "= 0.5 kV" });
    const pct = parseQuantity("18", "pct");
    expect(pct.ok && pct.understood).toBe("= 18 %");
    // 0.1 ohm per mile is 0.0621371192237… ohm/km: stored in full, confirmed in six digits
    const perMile = parseQuantity("0.1 ohm/mi", "ohmPerKm");
    expect(perMile.ok && perMile.understood).toBe("= 0.0621371 Ω/km");
    expect(perMile.ok && perMile.value).toBeCloseTo(0.1 / 1.609344, 12);
  });

  it("refuses units of the wrong kind with a sentence naming what it expected", () => {
    expect(error("33 kV", "A")).toMatch(/current/);
    expect(error("25 MVA", "MW")).toMatch(/active power/);
    expect(error("25 MW", "Mvar")).toMatch(/reactive power/);
    expect(error("2 Mvar", "MVA")).toMatch(/apparent power/);
    expect(error("18 %", "kV")).toMatch(/percentage does not fit/);
    expect(error("1.0 pu", "MW")).toMatch(/per-unit value does not fit/);
    expect(error("0.12 ohm", "ohmPerKm")).toMatch(/impedance per length/);
    expect(error("3 kV", "ratio")).toMatch(/plain number/);
  });

  it("never throws on nonsense and names the problem", () => {
    expect(error("", "kV")).toBe("is required");
    expect(error("   ", "kV")).toBe("is required");
    expect(error("abc", "kV")).toMatch(/cannot read "abc"/);
    expect(error("1,5", "kV")).toMatch(/point for decimals/);
    expect(error("5 kV kV", "kV")).toMatch(/not a voltage/);
    expect(error("1e999", "MW")).toBe("must be a finite number");
    expect(error("abc %", "pct")).toMatch(/percentage/);
  });
});

describe("formatQuantity", () => {
  it("writes the value with the field's unit", () => {
    expect(formatQuantity(33, "kV")).toBe("33 kV");
    expect(formatQuantity(0.1 + 0.2, "ohmPerKm")).toBe("0.3 Ω/km");
    expect(formatQuantity(8, "pct")).toBe("8 %");
    expect(formatQuantity(-5.5, "deg")).toBe("-5.5°");
    expect(formatQuantity(10, "ratio")).toBe("10");
  });
});
