// Earth faults where the vector groups leave no zero-sequence path (methods: a delta is open
// from its own terminals, an unearthed star is open, generators are open in zero sequence,
// common practice): I"k1 = 0 and the reading says "unearthed system at this bus".
import { describe, expect, it } from "vitest";
import { computeFaultLevels } from "#solver/faults/index.ts";
import { validateNetwork, type Network, type NetworkInput } from "#solver/schema.ts";

const UNEARTHED = "unearthed system at this bus";

function chain(groups: string[], extra: Partial<NetworkInput> = {}): Network {
  const levels = [132, 33, 11, 0.4];
  const checked = validateNetwork({
    format: "kilostep.network",
    version: 1,
    name: "earth paths",
    frequencyHz: 50,
    buses: levels.slice(0, groups.length + 1).map((kv, i) => ({ id: `b${i}`, name: `${kv} kV`, nominalKV: kv })),
    sources: [{ id: "q", name: "Grid", bus: "b0", kind: "grid", control: "slack", shortCircuitMVA: 2000, xOverR: 10 }],
    transformers: groups.map((vectorGroup, i) => ({
      id: `t${i}`,
      name: `T${i}`,
      hvBus: `b${i}`,
      lvBus: `b${i + 1}`,
      ratedMVA: 10,
      hvKV: levels[i],
      lvKV: levels[i + 1],
      impedancePct: 8,
      xOverR: 15,
      vectorGroup,
    })),
    ...extra,
  });
  if (!checked.ok) throw new Error(JSON.stringify(checked.issues));
  return checked.network;
}

const byId = (net: Network) => new Map(computeFaultLevels(net).buses.map((b) => [b.id, b]));

describe("no zero-sequence path", () => {
  it("the delta side of a YNd11 step-down has no earth fault current", () => {
    const r = byId(chain(["YNd11"]));
    expect(r.get("b1")!.ik1kA).toBe(0);
    expect(r.get("b1")!.note).toBe(UNEARTHED);
    expect(r.get("b1")!.ik3kA).toBeGreaterThan(0);
    // The earthed star side still sees the infeed and the transformer's own earth path.
    expect(r.get("b0")!.ik1kA).toBeGreaterThan(r.get("b0")!.ik3kA);
    expect(r.get("b0")!.note).toBeUndefined();
  });

  it("a generator behind a YNd11 step-up leaves its delta-side bus unearthed", () => {
    const checked = validateNetwork({
      format: "kilostep.network",
      version: 1,
      name: "unit",
      frequencyHz: 50,
      buses: [
        { id: "gen", name: "Generator 11 kV", nominalKV: 11 },
        { id: "hv", name: "66 kV", nominalKV: 66 },
      ],
      sources: [
        { id: "g", name: "Unit", bus: "gen", kind: "generator", control: "slack", ratedMVA: 30, xdSubtransientPct: 15, xOverR: 40 },
      ],
      transformers: [
        { id: "t", name: "Step-up", hvBus: "hv", lvBus: "gen", ratedMVA: 30, hvKV: 66, lvKV: 11, impedancePct: 10, xOverR: 30, vectorGroup: "YNd11" },
      ],
    });
    if (!checked.ok) throw new Error(JSON.stringify(checked.issues));
    const r = byId(checked.network);
    expect(r.get("gen")!.ik1kA).toBe(0);
    expect(r.get("gen")!.note).toBe(UNEARTHED);
    expect(r.get("hv")!.ik1kA).toBeGreaterThan(0);
  });

  it.each(["Yd1", "Dd0", "Yyn0", "Dy11", "YNy0", "Dz0"])("%s leaves the LV side unearthed", (group) => {
    const r = byId(chain([group]));
    expect(r.get("b1")!.ik1kA).toBe(0);
    expect(r.get("b1")!.note).toBe(UNEARTHED);
  });

  it("an earthed LV star only sees the earth path that its partner winding can balance", () => {
    // Dyn11 then YNyn0: the 11 kV yn winding passes through to 0.4 kV, earthed at 33 kV by the Dyn11.
    const r = byId(chain(["YNd11", "Dyn11", "YNyn0"]));
    expect(r.get("b1")!.note).toBe(UNEARTHED);
    expect(r.get("b2")!.ik1kA).toBeGreaterThan(0);
    expect(r.get("b3")!.ik1kA).toBeGreaterThan(0);
  });
});

describe("zigzag windings", () => {
  it("an earthing ZNyn11 unit gives an unearthed 11 kV system its zero-sequence path", () => {
    const base = chain(["YNd11", "Dd0"]);
    const before = byId(base);
    expect(before.get("b2")!.note).toBe(UNEARTHED);

    // ZNyn11 11/0.4 kV with nothing on its LV side, z0OverZ1 given: Z(0) at the 11 kV bus is
    // K_T·z0OverZ1·Z_T referred to the 11 kV winding (IEC 60909-0 K_T on zero sequence too).
    const net: Network = {
      ...base,
      buses: [...base.buses, { id: "earthing-lv", name: "Earthing unit LV", nominalKV: 0.4, vMinPu: 0.95, vMaxPu: 1.05 }],
      transformers: [
        ...base.transformers,
        { id: "te", name: "Earthing unit", hvBus: "b2", lvBus: "earthing-lv", ratedMVA: 1, hvKV: 11, lvKV: 0.4, impedancePct: 5, xOverR: 4, tapPct: 0, vectorGroup: "ZNyn11", z0OverZ1: 0.3 },
      ],
    };
    const after = byId(net);
    expect(after.get("b2")!.note).toBeUndefined();
    expect(after.get("b2")!.ik3kA).toBeCloseTo(before.get("b2")!.ik3kA, 9);
    // The zigzag does not pass zero sequence across: the yn LV side stays unearthed.
    expect(after.get("earthing-lv")!.note).toBe(UNEARTHED);

    const zE = 0.3 * 0.05 * (11 * 11) / 1; // ohms on the 11 kV winding before K_T
    // K_T takes c_max of the LV side's voltage level: 1.05 at 0.4 kV.
    const kT = (0.95 * 1.05) / (1 + 0.6 * 0.05 * 4 / Math.sqrt(17));
    const r0 = (kT * zE) / Math.sqrt(17);
    const x0 = 4 * r0;
    // Z(1) at b2 from the three-phase result: |Z(1)| = c·U_n/(√3·I"k3), angle from R/X.
    const b2 = after.get("b2")!;
    const z1 = (1.1 * 11) / (Math.sqrt(3) * b2.ik3kA);
    const x1 = z1 / Math.sqrt(1 + b2.rOverX ** 2);
    const r1 = x1 * b2.rOverX;
    const ik1 = (Math.sqrt(3) * 1.1 * 11) / Math.hypot(2 * r1 + r0, 2 * x1 + x0);
    expect(b2.ik1kA / ik1 - 1).toBeCloseTo(0, 9);
  });

  it("Yzn11 earths its LV side with a low default zero-sequence impedance (0.1 × Z_T, from memory)", () => {
    const zn = byId(chain(["Yzn11"])).get("b1")!;
    const yn = byId(chain(["Dyn11"])).get("b1")!;
    expect(zn.note).toBeUndefined();
    expect(zn.ik3kA).toBeCloseTo(yn.ik3kA, 9);
    // Less zero-sequence impedance than a Dyn11's Z(0) = Z(1): more earth fault current.
    expect(zn.ik1kA).toBeGreaterThan(yn.ik1kA);
  });
});
