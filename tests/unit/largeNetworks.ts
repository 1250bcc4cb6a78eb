// Large networks of the three shapes every helper must handle in linear (or n log n) time: a chain
// of buses, a star of spurs from one bus, and one bus with many loads. Built directly in the
// validated shape (defaults filled), since the helpers take a validated network.
import type { Bus, Line, Load, Network, Source, Transformer } from "#solver/schema.ts";

const bus = (i: number, nominalKV = 11): Bus => ({ id: `b${i}`, name: `Bus ${i}`, nominalKV, vMinPu: 0.9, vMaxPu: 1.1 });
const line = (i: number, fromBus: string, toBus: string): Line => ({
  id: `l${i}`,
  name: `Line ${i}`,
  fromBus,
  toBus,
  kind: "overhead",
  lengthKm: 0.1,
  rOhmPerKm: 0.2,
  xOhmPerKm: 0.35,
});
const load = (i: number, busId: string): Load => ({ id: `ld${i}`, name: `Load ${i}`, bus: busId, pMW: 0.01, qMvar: 0.002, model: "constant-power" });
const grid: Source = {
  id: "grid",
  name: "Grid infeed",
  bus: "b0",
  kind: "grid",
  control: "slack",
  voltagePu: 1,
  angleDeg: 0,
  pMW: 0,
  qMvar: 0,
  shortCircuitMVA: 500,
};

function network(name: string, buses: Bus[], lines: Line[], loads: Load[], transformers: Transformer[] = []): Network {
  return { format: "kilostep.network", version: 1, name, frequencyHz: 50, baseMVA: 100, buses, sources: [grid], transformers, lines, loads, shunts: [] };
}

/** b0 – b1 – … – b(n−1), the grid infeed at b0 and a load at the far end. */
export function chainNetwork(busCount: number): Network {
  const buses = Array.from({ length: busCount }, (_, i) => bus(i));
  const lines = Array.from({ length: busCount - 1 }, (_, i) => line(i, `b${i}`, `b${i + 1}`));
  return network(`Chain of ${busCount}`, buses, lines, [load(0, `b${busCount - 1}`)]);
}

/** b0 with `spurCount` lines out to b1 … b(spurCount), a load at each spur's end. */
export function starNetwork(spurCount: number): Network {
  const buses = Array.from({ length: spurCount + 1 }, (_, i) => bus(i));
  const lines = Array.from({ length: spurCount }, (_, i) => line(i, "b0", `b${i + 1}`));
  const loads = Array.from({ length: spurCount }, (_, i) => load(i, `b${i + 1}`));
  return network(`Star of ${spurCount}`, buses, lines, loads);
}

/** A 33 kV infeed bus b0, a transformer to the 11 kV bus b1, and `loadCount` loads on b1. */
export function crowdedBusNetwork(loadCount: number): Network {
  const transformer: Transformer = {
    id: "t1",
    name: "Primary transformer",
    hvBus: "b0",
    lvBus: "b1",
    ratedMVA: 400,
    hvKV: 33,
    lvKV: 11,
    impedancePct: 10,
    tapPct: 0,
    vectorGroup: "Dyn11",
  };
  const loads = Array.from({ length: loadCount }, (_, i) => load(i, "b1"));
  return network(`Bus with ${loadCount} loads`, [bus(0, 33), bus(1, 11)], [], loads, [transformer]);
}
