import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  annualEnergyLost,
  capitalCost,
  costAtVoltage,
  growingLossPresentWorthFactor,
  lossLoadFactor,
  lossMoney,
  moneyInputSchema,
  presentWorthFactor,
  priceSensitivity,
  rankByTotalCost,
} from "#solver/economics.ts";

const defaults = moneyInputSchema.parse({});

describe("loss load factor (Buller and Woodrow)", () => {
  // Methods, "Check values": LF = 0.65, k = 0.3 gives LLF = 0.49075.
  it("gives 0.49075 for LF 0.65 and k 0.3", () => {
    expect(lossLoadFactor(0.65, 0.3)).toBeCloseTo(0.49075, 12);
    expect(lossLoadFactor(0.65)).toBeCloseTo(0.49075, 12);
  });

  // Methods: LLF always lies between LF² (flat load) and LF (on-off load).
  it("always lies between LF² and LF", () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), (lf, k) => {
        const llf = lossLoadFactor(lf, k);
        return llf >= lf * lf - 1e-15 && llf <= lf + 1e-15;
      }),
    );
  });
});

describe("present-worth factor", () => {
  // Standard interest tables: (P/A, 8 %, 20) = 9.8181.
  it("is 9.8181 at 8 % over 20 years", () => {
    expect(presentWorthFactor(0.08, 20)).toBeCloseTo(9.8181, 4);
  });

  // Standard interest tables, from memory: (P/A, 10 %, 10) = 6.1446; (P/A, 5 %, 25) = 14.0939.
  it("matches other table entries", () => {
    expect(presentWorthFactor(0.1, 10)).toBeCloseTo(6.1446, 4);
    expect(presentWorthFactor(0.05, 25)).toBeCloseTo(14.0939, 4);
  });

  it("is the number of years when money is not discounted", () => {
    expect(presentWorthFactor(0, 25)).toBe(25);
  });

  // Definition: the sum of 1/(1 + i)^y for y = 1..n.
  it("equals the discounted sum of one a year", () => {
    fc.assert(
      fc.property(fc.double({ min: 0.001, max: 0.3, noNaN: true }), fc.integer({ min: 1, max: 60 }), (i, n) => {
        let sum = 0;
        for (let y = 1; y <= n; y++) sum += 1 / (1 + i) ** y;
        return Math.abs(presentWorthFactor(i, n) - sum) < 1e-9 * sum;
      }),
    );
  });
});

describe("losses that grow with the load", () => {
  // Methods: with g = 0 the growing series is the plain annuity.
  it("reduces to the plain annuity when the load does not grow", () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 0.3, noNaN: true }), fc.integer({ min: 1, max: 60 }), (i, n) =>
        Math.abs(growingLossPresentWorthFactor(i, n, 0) - presentWorthFactor(i, n)) < 1e-9 * n,
      ),
    );
  });

  // Geometric series (any algebra text): sum_{y=0}^{n-1} q^y/(1+i) = (1 − qⁿ)/((1 − q)(1 + i)), q = (1+g)²/(1+i).
  it("matches the closed-form geometric series", () => {
    const i = 0.08;
    const g = 0.02;
    const n = 25;
    const q = (1 + g) ** 2 / (1 + i);
    const closedForm = (1 - q ** n) / ((1 - q) * (1 + i));
    expect(growingLossPresentWorthFactor(i, n, g)).toBeCloseTo(closedForm, 10);
    expect(growingLossPresentWorthFactor(i, n, g)).toBeGreaterThan(presentWorthFactor(i, n));
  });
});

describe("energy and money of losses", () => {
  // Methods: E = P_loss,peak × LLF × 8760 h + P0 × 8760 h; by hand 1 × 0.49075 × 8760 = 4298.97 MWh.
  it("prices the load-dependent part by the loss load factor and the core part all year", () => {
    const energy = annualEnergyLost(1, 0.031, 0.49075);
    expect(energy.loadDependentMWh).toBeCloseTo(4298.97, 2);
    expect(energy.coreMWh).toBeCloseTo(271.56, 2);
    expect(energy.totalMWh).toBeCloseTo(4570.53, 2);
  });

  // By hand from the default inputs: LLF = 0.3·0.6 + 0.7·0.36 = 0.432; PWF(8 %, 25) = 10.6748 (interest tables).
  it("gives the present value of one peak megawatt of loss at the default inputs", () => {
    const money = lossMoney(1, 0, defaults);
    expect(money.lossLoadFactor).toBeCloseTo(0.432, 12);
    expect(money.lossCostFirstYear).toBeCloseTo(0.432 * 8760 * 80, 6);
    expect(money.presentValueOfLosses / (0.432 * 8760 * 80)).toBeCloseTo(10.6748, 4);
  });
});

describe("capital cost", () => {
  const table = [
    { voltageKV: 33, cost: 70_000 },
    { voltageKV: 66, cost: 130_000 },
  ];

  it("reads the table at its points and interpolates on log–log axes between them", () => {
    expect(costAtVoltage(table, 33)).toBeCloseTo(70_000, 6);
    expect(costAtVoltage(table, 66)).toBeCloseTo(130_000, 6);
    // Halfway on a log scale is the geometric mean of both voltage and cost.
    expect(costAtVoltage(table, Math.sqrt(33 * 66))).toBeCloseTo(Math.sqrt(70_000 * 130_000), 4);
    // Beyond the ends the power law of the end segment continues: doubling 66 kV scales by 130/70.
    expect(costAtVoltage(table, 132)).toBeCloseTo((130_000 * 130_000) / 70_000, 4);
  });

  it("costs the section's lines by length and the facing transformers by rating", () => {
    const money = moneyInputSchema.parse({ lineCostPerKmByKV: table, transformerCostPerMVAByKV: [{ voltageKV: 66, cost: 26_000 }], cableCostFactor: 5 });
    const scope = {
      voltageKV: 66,
      lines: [
        { id: "oh", kind: "overhead" as const, lengthKm: 48 },
        { id: "cb", kind: "cable" as const, lengthKm: 2 },
      ],
      transformers: [{ id: "t", ratedMVA: 25, hvKV: 66 }],
    };
    const cost = capitalCost(scope, money);
    expect(cost.lines.map((l) => l.cost)).toEqual([48 * 130_000, 2 * 130_000 * 5]);
    expect(cost.transformers[0].cost).toBeCloseTo(25 * 26_000, 6);
    expect(cost.total).toBeCloseTo(48 * 130_000 + 2 * 650_000 + 650_000, 6);

    const entered = capitalCost(scope, money, { lineCostPerKm: 100_000, transformerCosts: { t: 1_000_000 } });
    expect(entered.total).toBeCloseTo(50 * 100_000 + 1_000_000, 6);
    expect(entered.lines.every((l) => l.basis === "entered")).toBe(true);
    expect(capitalCost(scope, money, { capitalCost: 42 }).total).toBe(42);
  });
});

describe("ranking and the energy price", () => {
  it("ranks by total cost and leaves out alternatives without one", () => {
    expect(rankByTotalCost([3, null, 1, 2])).toEqual([2, 3, 0]);
    expect(rankByTotalCost([2, 2])).toEqual([0, 1]);
  });

  // By hand at the defaults: one peak MW of loss is worth 0.432 × 8760 × 80 × 10.6748 = 3.2317 M.
  // A: 1.0 M capital, 0.5 MW; B: 1.8 M capital, 0.2 MW. B saves 0.3 MW = 0.9695 M at the entered
  // price (cheaper), 0.6787 M at −30 % (dearer), 1.2604 M at +30 % (cheaper).
  it("shows the order moving when the price falls 30 %", () => {
    const sensitivity = priceSensitivity(
      [
        { loadDependentPeakLossMW: 0.5, coreLossMW: 0, capitalCost: 1_000_000 },
        { loadDependentPeakLossMW: 0.2, coreLossMW: 0, capitalCost: 1_800_000 },
        { loadDependentPeakLossMW: null, coreLossMW: null, capitalCost: 500_000 },
      ],
      defaults,
    );
    expect(sensitivity.cases.map((c) => c.priceFactor)).toEqual([0.7, 1, 1.3]);
    expect(sensitivity.cases.map((c) => c.ranking)).toEqual([[0, 1], [1, 0], [1, 0]]);
    expect(sensitivity.cases[1].totalCosts[0]).toBeCloseTo(1_000_000 + 0.5 * 3_231_700, -3);
    expect(sensitivity.cases[1].totalCosts[2]).toBeNull();
    expect(sensitivity.rankingMoves).toBe(true);
  });
});

describe("money inputs", () => {
  it("has the defaults a planner recognises", () => {
    expect(defaults).toMatchObject({
      loadFactor: 0.6,
      lossLoadFactorK: 0.3,
      energyPricePerMWh: 80,
      discountRatePct: 8,
      studyYears: 25,
      loadGrowthPct: 0,
    });
  });

  it("names the field that is out of range", () => {
    const parsed = moneyInputSchema.safeParse({ loadFactor: 1.5, studyYears: 2.5, lineCostPerKmByKV: [] });
    expect(parsed.success).toBe(false);
    const paths = parsed.error!.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
    expect(paths).toContain("loadFactor: must be at most 1");
    expect(paths).toContain("studyYears: must be a whole number of years");
    expect(paths).toContain("lineCostPerKmByKV: needs at least one voltage and cost");
  });
});
