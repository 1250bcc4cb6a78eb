import { describe, expect, it } from "vitest";
import { fixed, readingAgainstLimit, readingNumber, readingText } from "#app/lib/format.ts";
import { upperLimitStatus, voltageStatus } from "#app/lib/limitStatus.ts";
import { roundForCsv } from "#solver/quantities.ts";

// Expected texts worked by hand from each quantity's significant figures.
describe("readings at their quantity's precision", () => {
  it("rounds lengths, powers and voltages to sensible digits, whatever their size", () => {
    expect(readingText(60.0285312, "km")).toBe("60.0 km");
    expect(readingText(2.56373602, "Mvar")).toBe("2.564 Mvar");
    expect(readingText(11.440000000000001, "kV")).toBe("11.44 kV");
    expect(readingText(0.41523, "kV")).toBe("0.415 kV");
    expect(readingText(132.04, "kV")).toBe("132.0 kV");
    expect(readingText(-5.2345, "deg")).toBe("−5.23°");
    expect(readingText(451.2, "A")).toBe("451 A");
    expect(readingNumber(1e-12, "MW")).toBe("0.000");
    expect(readingNumber(null, "MW")).toBe("–");
    expect(fixed(-0.0001, 2)).toBe("0.00");
  });

  it("writes a CSV number with six significant figures, never binary noise", () => {
    expect(roundForCsv(11.440000000000001)).toBe(11.44);
    expect(roundForCsv(0.1 + 0.2)).toBe(0.3);
    expect(roundForCsv(123456.789)).toBe(123457);
    expect(roundForCsv(-0.0000001)).toBe(0);
  });
});

describe("limits judged on the value shown", () => {
  it("shows 451 A on a 450 A line as 100.2 %, beyond its limit, never a flagged 100 %", () => {
    const loadingPct = (451 / 450) * 100;
    expect(readingNumber(loadingPct, "pct")).toBe("100");
    expect(readingAgainstLimit(loadingPct, [100], "pct")).toBe("100.2");
    expect(upperLimitStatus(loadingPct, 100, "pct")).toBe("beyond");
  });

  it("keeps a value that only rounds onto its limit within it, and says so with the digits", () => {
    expect(readingAgainstLimit(99.96, [100], "pct")).toBe("99.96");
    expect(upperLimitStatus(99.96, 100, "pct")).toBe("near");
    expect(readingAgainstLimit(1.0504, [0.95, 1.05], "pu")).toBe("1.0504");
    expect(voltageStatus(1.0504, 0.95, 1.05)).toBe("beyond");
    expect(readingAgainstLimit(1.04, [0.95, 1.05], "pu")).toBe("1.040");
  });

  it("judges a value beyond its limit only in digits never shown as within it", () => {
    // Six decimals at most: 100.0000001 % shows as 100.000000, so it is judged as the limit itself.
    expect(upperLimitStatus(100.0000001, 100, "pct")).toBe("near");
    expect(readingAgainstLimit(100.0000001, [100], "pct")).toBe("100.000000");
  });
});
