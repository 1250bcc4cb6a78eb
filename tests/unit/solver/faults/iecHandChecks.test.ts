// Hand-worked chains from IEC 60909-0's formulas (equivalent voltage source at the fault,
// Z_Q = c·U_nQ²/S"kQ, K_T = 0.95·c_max/(1 + 0.6·x_T), K_G = (U_n/U_rG)·c_max/(1 + x"_d·sin φ_rG),
// κ = 1.02 + 0.98·e^(−3R/X), I"k1 = √3·c·U_n/|2Z(1) + Z(0)|). Each expected value is either the
// figure in the methods' hand check or worked here in ohms, apart from the solver's per-unit path.
import { describe, expect, it } from "vitest";
import { computeFaultLevels } from "#solver/faults/index.ts";
import { validateNetwork, type Network, type NetworkInput } from "#solver/schema.ts";

function network(doc: Omit<NetworkInput, "format" | "version" | "name" | "frequencyHz">): Network {
  const checked = validateNetwork({ format: "kilostep.network", version: 1, name: "hand check", frequencyHz: 50, ...doc });
  if (!checked.ok) throw new Error(JSON.stringify(checked.issues));
  return checked.network;
}

const reading = (net: Network, id: string) => {
  const found = computeFaultLevels(net).buses.find((b) => b.id === id);
  if (!found) throw new Error(`no reading for ${id}`);
  return found;
};

/** |a + jb| */
const abs = (re: number, im: number) => Math.hypot(re, im);

describe("IEC 60909-0 hand check: 500 MVA at 33 kV, 20 MVA 33/11 kV Dyn11, fault at 11 kV", () => {
  // Methods' check values (worked from the standard's formulas): R/X 0.1 infeed, u_k 10 %,
  // R_T neglected, Z(0)T = Z(1)T, c = 1.1.
  const net = network({
    buses: [
      { id: "hv", name: "33 kV", nominalKV: 33 },
      { id: "lv", name: "11 kV", nominalKV: 11 },
    ],
    sources: [{ id: "q", name: "Infeed", bus: "hv", kind: "grid", control: "slack", shortCircuitMVA: 500, xOverR: 10, z0OverZ1: 1 }],
    transformers: [
      { id: "t", name: "T", hvBus: "hv", lvBus: "lv", ratedMVA: 20, hvKV: 33, lvKV: 11, impedancePct: 10, loadLossKW: 0, vectorGroup: "Dyn11", z0OverZ1: 1 },
    ],
  });
  const lv = reading(net, "lv");

  it('I"k3 = 8.107 kA, S"k3 = √3·11 kV·I"k3', () => {
    expect(lv.ik3kA).toBeCloseTo(8.107, 3);
    expect(lv.ik3MVA).toBeCloseTo(Math.sqrt(3) * 11 * lv.ik3kA, 9);
  });

  it("κ = 1.914 and i_p = 21.94 kA", () => {
    expect(1.02 + 0.98 * Math.exp(-3 * lv.rOverX)).toBeCloseTo(1.914, 3);
    expect(lv.ip3kA).toBeCloseTo(21.94, 2);
  });

  it('I"k1 = 9.035 kA (delta HV blocks the infeed, Z(0) is the transformer alone)', () => {
    expect(lv.ik1kA).toBeCloseTo(9.035, 3);
    expect(lv.note).toBeUndefined();
  });

  it("applies K_T = 0.9858: the uncorrected 8.027 kA and 8.936 kA are not what comes out", () => {
    // Without K_T the same chain gives 8.027 / 8.936 kA (methods' hand check); K_T·Z_T is
    // 0.9858 × 0.605 Ω, which raises both currents by about 1 %.
    expect(0.95 * 1.1 / (1 + 0.6 * 0.1)).toBeCloseTo(0.9858, 4);
    expect(lv.ik3kA / 8.027).toBeGreaterThan(1.008);
    expect(lv.ik1kA / 8.936).toBeGreaterThan(1.009);
  });
});

describe("c_max by voltage level and impedances referred with the rated ratio", () => {
  it("11/0.42 kV transformer on a 0.4 kV bus: c = 1.05 at LV, 1.1 for the 11 kV infeed, ratio 11:0.42", () => {
    const net = network({
      buses: [
        { id: "mv", name: "11 kV", nominalKV: 11 },
        { id: "lv", name: "0.4 kV", nominalKV: 0.4 },
      ],
      sources: [{ id: "q", name: "Infeed", bus: "mv", kind: "grid", control: "slack", shortCircuitMVA: 250, xOverR: 10 }],
      transformers: [
        { id: "t", name: "T", hvBus: "mv", lvBus: "lv", ratedMVA: 1, hvKV: 11, lvKV: 0.42, impedancePct: 6, loadLossKW: 10.5, vectorGroup: "Dyn11" },
      ],
    });
    // In ohms at the 0.4 kV bus: Z_Q = 1.1·11²/250 referred by (0.42/11)²; Z_T on the 0.42 kV winding.
    const zQ = (1.1 * 11 * 11) / 250 * (0.42 / 11) ** 2;
    const rQ = zQ / Math.sqrt(101);
    const xQ = 10 * rQ;
    const zT = 0.06 * 0.42 ** 2;
    const rT = 0.0105 * 0.42 ** 2;
    const xT = Math.sqrt(zT ** 2 - rT ** 2);
    const kT = (0.95 * 1.05) / (1 + 0.6 * xT / 0.42 ** 2);
    const r1 = rQ + kT * rT;
    const x1 = xQ + kT * xT;
    const lv = reading(net, "lv");
    const ik3 = (1.05 * 0.4) / (Math.sqrt(3) * abs(r1, x1));
    expect(lv.ik3kA / ik3 - 1).toBeCloseTo(0, 9);
    expect(lv.rOverX).toBeCloseTo(r1 / x1, 9);
    // Z(0) = K_T·Z_T alone (Dyn: the delta closes zero-sequence current inside the transformer).
    const ik1 = (Math.sqrt(3) * 1.05 * 0.4) / abs(2 * r1 + kT * rT, 2 * x1 + kT * xT);
    expect(lv.ik1kA / ik1 - 1).toBeCloseTo(0, 9);
    expect(lv.ik3kA).toBeGreaterThan(20);
    expect(lv.ik3kA).toBeLessThan(30);
  });

  it("windings 34.5/11.5 kV on 33/11 kV buses: infeed referred by (11.5/34.5)², Z_T on the 11.5 kV winding", () => {
    const net = network({
      buses: [
        { id: "hv", name: "33 kV", nominalKV: 33 },
        { id: "lv", name: "11 kV", nominalKV: 11 },
      ],
      sources: [{ id: "q", name: "Infeed", bus: "hv", kind: "grid", control: "slack", shortCircuitMVA: 500, xOverR: 10 }],
      transformers: [
        { id: "t", name: "T", hvBus: "hv", lvBus: "lv", ratedMVA: 20, hvKV: 34.5, lvKV: 11.5, impedancePct: 10, xOverR: 20, tapPct: 5, vectorGroup: "YNyn0" },
      ],
    });
    const zQ = (1.1 * 33 * 33) / 500;
    const refer = (11.5 / 34.5) ** 2;
    const rQ = (zQ / Math.sqrt(101)) * refer;
    const xQ = 10 * rQ;
    const zT = (0.1 * 11.5 ** 2) / 20;
    const rT = zT / Math.sqrt(401);
    const xT = 20 * rT;
    const kT = (0.95 * 1.1) / (1 + 0.6 * (xT / (11.5 ** 2 / 20)));
    const r1 = rQ + kT * rT;
    const x1 = xQ + kT * xT;
    const lv = reading(net, "lv");
    // The tap (+5 %) is ignored: IEC 60909-0 takes transformers at rated ratio.
    expect(lv.ik3kA / ((1.1 * 11) / (Math.sqrt(3) * abs(r1, x1))) - 1).toBeCloseTo(0, 9);
    // YNyn0 passes the infeed's zero sequence (Z(0)Q = Z_Q by default) through K_T·Z_T.
    const ik1 = (Math.sqrt(3) * 1.1 * 11) / abs(2 * r1 + rQ + kT * rT, 2 * x1 + xQ + kT * xT);
    expect(lv.ik1kA / ik1 - 1).toBeCloseTo(0, 9);
  });
});

describe("generator correction K_G and the fictitious resistance", () => {
  it("50 MVA 10.5 kV generator on an 11 kV bus, x\"d 18 %, cos φ 0.85, no R/X given: R_Gf = 0.07·X\"d", () => {
    const net = network({
      buses: [{ id: "g", name: "11 kV", nominalKV: 11 }],
      sources: [
        { id: "gen", name: "Unit", bus: "g", kind: "generator", control: "slack", ratedMVA: 50, ratedKV: 10.5, xdSubtransientPct: 18, ratedPowerFactor: 0.85 },
      ],
    });
    const kG = (11 / 10.5) * 1.1 / (1 + 0.18 * Math.sqrt(1 - 0.85 ** 2));
    expect(kG).toBeCloseTo(1.05257, 5);
    const xG = kG * (0.18 * 10.5 ** 2) / 50;
    // Fictitious R_Gf = 0.07 X"d for U_rG > 1 kV, S_rG < 100 MVA (from memory).
    const rG = 0.07 * xG;
    const g = reading(net, "g");
    const ik3 = (1.1 * 11) / (Math.sqrt(3) * abs(rG, xG));
    expect(ik3).toBeCloseTo(16.68, 2);
    expect(g.ik3kA / ik3 - 1).toBeCloseTo(0, 9);
    expect(g.rOverX).toBeCloseTo(0.07, 12);
    expect(g.ip3kA / ((1.02 + 0.98 * Math.exp(-0.21)) * Math.SQRT2 * ik3) - 1).toBeCloseTo(0, 9);
    // Open in zero sequence (common practice): no earth path at all.
    expect(g.ik1kA).toBe(0);
    expect(g.note).toBe("unearthed system at this bus");
  });

  it("fictitious R_Gf/X\"d: 0.05 at ≥ 100 MVA above 1 kV, 0.15 at or below 1 kV (from memory)", () => {
    const single = (ratedMVA: number, kv: number) =>
      reading(
        network({
          buses: [{ id: "g", name: "G", nominalKV: kv }],
          sources: [{ id: "gen", name: "Unit", bus: "g", kind: "generator", control: "slack", ratedMVA, xdSubtransientPct: 20 }],
        }),
        "g",
      ).rOverX;
    expect(single(150, 15.75)).toBeCloseTo(0.05, 12);
    expect(single(99, 15.75)).toBeCloseTo(0.07, 12);
    expect(single(0.5, 0.4)).toBeCloseTo(0.15, 12);
  });
});

describe("S\"k3 at a grid infeed's own bus equals its S\"kQ (c cancels in c·U_n/(√3·c·U_n²/S\"kQ))", () => {
  for (const [kv, sk, xOverR] of [
    [132, 3000, 12],
    [33, 500, 3],
    [11, 250, 0.5],
    [0.4, 20, 2],
  ] as const) {
    it(`${sk} MVA at ${kv} kV (c = ${kv > 1 ? "1.10" : "1.05"}), X/R ${xOverR}`, () => {
      const net = network({
        buses: [
          { id: "q", name: "Infeed bus", nominalKV: kv },
          { id: "far", name: "Far end", nominalKV: kv },
        ],
        sources: [{ id: "g", name: "Infeed", bus: "q", kind: "grid", control: "slack", shortCircuitMVA: sk, xOverR }],
        lines: [{ id: "l", name: "Spur", fromBus: "q", toBus: "far", kind: "cable", lengthKm: 1, rOhmPerKm: 0.1, xOhmPerKm: 0.1 }],
      });
      const q = reading(net, "q");
      expect(q.ik3MVA / sk - 1).toBeCloseTo(0, 12);
      expect(q.ik3kA / (sk / (Math.sqrt(3) * kv)) - 1).toBeCloseTo(0, 12);
      expect(q.rOverX).toBeCloseTo(1 / xOverR, 12);
      // Z(0)Q = Z_Q when z0OverZ1 is not given, so I"k1 = I"k3 at the infeed.
      expect(q.ik1kA / q.ik3kA - 1).toBeCloseTo(0, 12);
    });
  }

  it("R_Q = 0.1·X_Q when the infeed's X/R is not given (IEC 60909-0 allowance, from memory)", () => {
    const net = network({
      buses: [{ id: "q", name: "Q", nominalKV: 66 }],
      sources: [{ id: "g", name: "Infeed", bus: "q", kind: "grid", control: "slack", shortCircuitMVA: 1500 }],
    });
    expect(reading(net, "q").rOverX).toBeCloseTo(0.1, 12);
  });
});
