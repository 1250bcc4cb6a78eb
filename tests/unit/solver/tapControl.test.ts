// On-load tap changer, hand-worked on two buses: a 33 kV slack at 1.0 pu, a 10 MVA 33/11 kV
// transformer (u_k 8 %, 80 kW copper loss, so r = 0.08 and x ≈ 0.8 pu on 100 MVA), 8 MW + 3 Mvar at
// 11 kV. With the HV tap at τ % the LV side sees a source of 1/(1 + τ/100) pu behind R + jX, and the
// closed-form two-bus load flow (standard textbook derivation)
//   V_r⁴ + (2(PR + QX) − V_s²)·V_r² + (P² + Q²)(R² + X²) = 0
// gives the LV voltage at each tap. Holding 1.00 ± 0.01 pu from tap 0 in steps of 1.25 %:
// 0 % → 0.9667, −1.25 % → 0.9798, −2.5 % → 0.9933 (inside the band), so the tap settles at −2.5 %.
import { describe, expect, it } from "vitest";
import { solveNetwork } from "#solver/index.ts";
import { runLoadFlow } from "#solver/loadFlow/index.ts";
import { validateNetwork } from "#solver/schema.ts";
import { regulateTaps } from "#solver/tapControl.ts";

const P = 0.08;
const Q = 0.03;
const R = 0.08;
const X = Math.sqrt(0.8 * 0.8 - R * R);

function closedFormLvPu(tapPct: number, sourcePu = 1, p = P, q = Q): number {
  const vs = sourcePu / (1 + tapPct / 100);
  const b = 2 * (p * R + q * X) - vs * vs;
  const c = (p * p + q * q) * (R * R + X * X);
  return Math.sqrt((-b + Math.sqrt(b * b - 4 * c)) / 2);
}

function twoBus(tap: Record<string, unknown>, bandPu = 0.02) {
  return {
    format: "kilostep.network",
    version: 2,
    name: "tap changer",
    frequencyHz: 50,
    buses: [
      { id: "hv", name: "HV", nominalKV: 33 },
      { id: "lv", name: "LV", nominalKV: 11, vMinPu: 0.9, vMaxPu: 1.1 },
    ],
    sources: [{ id: "g", name: "Grid", bus: "hv", kind: "grid", control: "slack", voltagePu: 1, shortCircuitMVA: 1000 }],
    transformers: [
      {
        id: "t", name: "T", hvBus: "hv", lvBus: "lv", ratedMVA: 10, hvKV: 33, lvKV: 11, impedancePct: 8, loadLossKW: 80,
        vectorGroup: "Dyn11", tapPct: 0, tapStepPct: 1.25, ...tap,
        tapControl: { bus: "lv", targetPu: 1, bandPu },
      },
    ],
    loads: [{ id: "ld", name: "Load", bus: "lv", pMW: 8, qMvar: 3 }],
  };
}

function solved(doc: unknown) {
  const outcome = solveNetwork(doc, { faults: false });
  if (!outcome.ok) throw new Error(JSON.stringify(outcome.issues));
  return outcome.result.loadFlow;
}

describe("on-load tap changer holding a bus (hand-worked two-bus case)", () => {
  it("the closed form gives 0.9667, 0.9798 and 0.9933 pu at taps 0, −1.25 and −2.5 %", () => {
    expect(closedFormLvPu(0)).toBeCloseTo(0.9667, 4);
    expect(closedFormLvPu(-1.25)).toBeCloseTo(0.9798, 4);
    expect(closedFormLvPu(-2.5)).toBeCloseTo(0.9933, 4);
  });

  it("steps to the first position inside the band, −2.5 %, and the load flow there matches the closed form", () => {
    const lf = solved(twoBus({ tapMinPct: -10, tapMaxPct: 10 }));
    const t = lf.branches.find((b) => b.id === "t")!;
    expect(t.tapPct).toBe(-2.5);
    expect(t.tapLimited).toBe(false);
    expect(lf.buses.find((b) => b.id === "lv")!.vPu).toBeCloseTo(closedFormLvPu(-2.5), 6);
  });

  it("says so when the range runs out first", () => {
    const lf = solved(twoBus({ tapMinPct: -1.25, tapMaxPct: 10 }));
    const t = lf.branches.find((b) => b.id === "t")!;
    expect(t.tapPct).toBe(-1.25);
    expect(t.tapLimited).toBe(true);
    expect(lf.buses.find((b) => b.id === "lv")!.vPu).toBeCloseTo(closedFormLvPu(-1.25), 6);
  });

  it("does not oscillate when the band is narrower than one step: it stops within one step of the target", () => {
    const lf = solved(twoBus({ tapMinPct: -10, tapMaxPct: 10 }, 0.002));
    const t = lf.branches.find((b) => b.id === "t")!;
    const v = lf.buses.find((b) => b.id === "lv")!.vPu;
    expect(Math.abs(v - 1)).toBeLessThan(Math.abs(closedFormLvPu(t.tapPct!) - closedFormLvPu(t.tapPct! + 1.25)));
    expect([-2.5, -3.75]).toContain(t.tapPct);
  });

  it("regulates down as well: a light load with the source at 1.06 pu lowers the LV side by raising the HV tap", () => {
    const doc = twoBus({ tapMinPct: -10, tapMaxPct: 10 });
    doc.sources[0].voltagePu = 1.06;
    doc.loads[0].pMW = 1;
    doc.loads[0].qMvar = 0;
    const lf = solved(doc);
    expect(lf.branches.find((b) => b.id === "t")!.tapPct).toBeGreaterThan(0);
    expect(Math.abs(lf.buses.find((b) => b.id === "lv")!.vPu - 1)).toBeLessThanOrEqual(0.01);
  });

  it("a version 1 file keeps its drawn tap and reports it", () => {
    const doc = { ...twoBus({}), version: 1 } as Record<string, unknown>;
    const transformers = (doc.transformers as Record<string, unknown>[]).map(({ tapControl: _, ...t }) => ({ ...t, tapPct: 1.25 }));
    const lf = solved({ ...doc, transformers });
    expect(lf.branches.find((b) => b.id === "t")!.tapPct).toBe(1.25);
    expect(lf.branches.find((b) => b.id === "t")!.tapLimited).toBeUndefined();
  });

  it("moves by the steps the voltage error calls for: 8 steps of 1.25 % in at most 3 solves, to the same tap as one step at a time", () => {
    // Source at 0.90 pu, 2 MW + 0.5 Mvar: the LV bus sits near 0.89 pu and needs about −10 % of tap.
    const doc = twoBus({ tapMinPct: -15, tapMaxPct: 15 });
    doc.sources[0].voltagePu = 0.9;
    doc.loads[0].pMW = 2;
    doc.loads[0].qMvar = 0.5;
    const validated = validateNetwork(doc);
    if (!validated.ok) throw new Error(JSON.stringify(validated.issues));
    // One step at a time by the closed form: the first position whose LV voltage reaches 0.99 pu.
    let handTap = 0;
    while (closedFormLvPu(handTap, 0.9, 0.02, 0.005) < 0.99) handTap -= 1.25;
    expect(handTap).toBe(-10);
    const regulated = regulateTaps(validated.network, runLoadFlow);
    expect(regulated.taps[0].tapPct).toBe(handTap);
    expect(regulated.taps[0].tapLimited).toBe(false);
    expect(regulated.solves).toBeLessThanOrEqual(3);
    expect(regulated.result.buses.find((b) => b.id === "lv")!.vPu).toBeCloseTo(closedFormLvPu(handTap, 0.9, 0.02, 0.005), 6);
  });

  it("a long way outside a narrow band still ends within one step of the target in a few solves, never returning to a tap it tried", () => {
    const doc = twoBus({ tapMinPct: -20, tapMaxPct: 20 }, 0.002);
    doc.sources[0].voltagePu = 0.88;
    const validated = validateNetwork(doc);
    if (!validated.ok) throw new Error(JSON.stringify(validated.issues));
    const tried: number[] = [];
    const regulated = regulateTaps(validated.network, (net) => {
      tried.push(net.transformers[0].tapPct);
      return runLoadFlow(net);
    });
    expect(new Set(tried).size).toBe(tried.length);
    expect(regulated.solves).toBeLessThanOrEqual(6);
    const tap = regulated.taps[0].tapPct;
    const v = regulated.result.buses.find((b) => b.id === "lv")!.vPu;
    expect(Math.abs(v - 1)).toBeLessThan(Math.abs(closedFormLvPu(tap, 0.88) - closedFormLvPu(tap + 1.25, 0.88)));
  });

  it("refuses a regulating transformer whose highest tap is not above its lowest, naming it", () => {
    const outcome = solveNetwork(twoBus({ tapMinPct: 5, tapMaxPct: -5 }), { faults: false });
    expect(outcome.ok).toBe(false);
    if (!outcome.ok)
      expect(outcome.issues).toContainEqual({ path: "transformers[0].tapMaxPct", message: 'Transformer "T" (t): its highest tap -5 % must be above its lowest 5 % for the tap changer to regulate' });
  });
});
