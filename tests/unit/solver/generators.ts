// fast-check generators of random radial network documents: a tree of buses at mixed voltage
// levels, joined by lines within a level and transformers down to the next, with modest loads.
import fc from "fast-check";
import type { NetworkInput } from "#solver/schema.ts";

const LEVELS = [
  { kV: 132, lineKm: [10, 60], loadMW: 20, ratedMVA: [60, 120] },
  { kV: 33, lineKm: [2, 15], loadMW: 5, ratedMVA: [20, 60] },
  { kV: 11, lineKm: [0.5, 4], loadMW: 1.2, ratedMVA: [5, 20] },
  { kV: 0.4, lineKm: [0.05, 0.3], loadMW: 0.04, ratedMVA: [0.5, 1.6] },
] as const;

const MODELS = ["constant-power", "constant-current", "constant-impedance"] as const;

const unit = fc.double({ min: 0, max: 1, noNaN: true });

const busPlan = fc.record({
  parent: fc.nat(),
  stepDown: fc.boolean(),
  lengthShare: unit,
  rShare: unit,
  xShare: unit,
  charging: fc.boolean(),
  ratingShare: unit,
  ukPct: fc.double({ min: 4, max: 12, noNaN: true }),
  tapPct: fc.constantFrom(-5, -2.5, 0, 2.5, 5),
  windingShift: fc.constantFrom(0.95, 1, 1.05),
  useLoadLoss: fc.boolean(),
  load: fc.option(fc.record({ pShare: unit, pf: fc.double({ min: 0.8, max: 1, noNaN: true }), leading: fc.boolean(), model: fc.constantFrom(...MODELS) }), { nil: undefined }),
  capacitorShare: fc.option(unit, { nil: undefined }),
});

const planArbitrary = fc.record({
  topLevel: fc.integer({ min: 0, max: 2 }),
  buses: fc.array(busPlan, { minLength: 1, maxLength: 13 }),
  slackPu: fc.double({ min: 0.98, max: 1.05, noNaN: true }),
  baseMVA: fc.constantFrom(10, 100),
  generator: fc.option(
    fc.record({ at: fc.nat(), pShare: unit, setPu: fc.double({ min: 0.98, max: 1.04, noNaN: true }), qLimitShare: unit }),
    { nil: undefined },
  ),
});

export type NetworkPlan = typeof planArbitrary extends fc.Arbitrary<infer T> ? T : never;

export function documentFromPlan(plan: NetworkPlan): NetworkInput {
  const lerp = ([lo, hi]: readonly [number, number], share: number) => lo + (hi - lo) * share;
  const levelOf: number[] = [plan.topLevel];
  const doc: NetworkInput = {
    format: "kilostep.network",
    version: 1,
    name: "Random radial network (fictional)",
    frequencyHz: 50,
    baseMVA: plan.baseMVA,
    buses: [{ id: "b0", name: "Bus 0", nominalKV: LEVELS[plan.topLevel].kV }],
    sources: [{ id: "s0", name: "Infeed", bus: "b0", kind: "grid", control: "slack", voltagePu: plan.slackPu, shortCircuitMVA: 2000, xOverR: 10 }],
    transformers: [],
    lines: [],
    loads: [],
    shunts: [],
  };
  plan.buses.forEach((b, k) => {
    const id = `b${k + 1}`;
    const parent = b.parent % (k + 1);
    const parentLevel = levelOf[parent];
    const stepDown = b.stepDown && parentLevel < LEVELS.length - 1;
    const level = stepDown ? parentLevel + 1 : parentLevel;
    levelOf.push(level);
    const spec = LEVELS[level];
    doc.buses.push({ id, name: `Bus ${k + 1}`, nominalKV: spec.kV, vMinPu: 0.5, vMaxPu: 1.5 });
    if (stepDown) {
      const hv = LEVELS[parentLevel];
      doc.transformers!.push({
        id: `t${k + 1}`,
        name: `Transformer ${k + 1}`,
        hvBus: `b${parent}`,
        lvBus: id,
        ratedMVA: lerp(hv.ratedMVA, b.ratingShare) / 2,
        hvKV: hv.kV,
        lvKV: spec.kV * b.windingShift,
        impedancePct: b.ukPct,
        ...(b.useLoadLoss ? { loadLossKW: lerp(hv.ratedMVA, b.ratingShare) * 2 } : { xOverR: 5 + 20 * b.rShare }),
        noLoadLossKW: b.charging ? lerp(hv.ratedMVA, b.ratingShare) * 0.4 : undefined,
        tapPct: b.tapPct,
        vectorGroup: "Dyn11",
      });
    } else {
      doc.lines!.push({
        id: `l${k + 1}`,
        name: `Line ${k + 1}`,
        fromBus: `b${parent}`,
        toBus: id,
        kind: b.charging ? "cable" : "overhead",
        lengthKm: lerp(spec.lineKm, b.lengthShare),
        rOhmPerKm: 0.04 + 0.3 * b.rShare,
        xOhmPerKm: 0.08 + 0.32 * b.xShare,
        bMicroSiemensPerKm: b.charging ? 60 : undefined,
      });
    }
    if (b.load) {
      const p = spec.loadMW * (0.05 + 0.3 * b.load.pShare);
      const q = p * Math.tan(Math.acos(b.load.pf)) * (b.load.leading ? -1 : 1);
      doc.loads!.push({ id: `ld${k + 1}`, name: `Load ${k + 1}`, bus: id, pMW: p, qMvar: q, model: b.load.model });
    }
    if (b.capacitorShare !== undefined)
      doc.shunts!.push({ id: `c${k + 1}`, name: `Capacitor ${k + 1}`, bus: id, qMvar: spec.loadMW * 0.2 * b.capacitorShare });
  });
  if (plan.generator) {
    const at = 1 + (plan.generator.at % plan.buses.length);
    const spec = LEVELS[levelOf[at]];
    const q = spec.loadMW * 0.3 * plan.generator.qLimitShare;
    doc.sources!.push({
      id: "g1",
      name: "Generator",
      bus: `b${at}`,
      kind: "generator",
      control: "pv",
      voltagePu: plan.generator.setPu,
      pMW: spec.loadMW * 0.4 * plan.generator.pShare,
      qMinMvar: -q,
      qMaxMvar: q,
      ratedMVA: spec.loadMW,
      xdSubtransientPct: 20,
    });
  }
  return doc;
}

export const radialNetwork = planArbitrary.map(documentFromPlan);
