// Random but valid networks for the fault tests: a grid infeed at the root, a tree of lines and
// transformers across IEC 60038 voltage levels (winding voltages off nominal by up to ±10 %),
// every vector group family, some generators, and optionally extra lines that close rings or
// run in parallel.
import { validateNetwork, type Network, type NetworkInput } from "#solver/schema.ts";

export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const levelsKV = [132, 33, 11, 0.4];
const vectorGroups = ["YNd11", "Dyn11", "YNyn0", "Yd1", "Yyn0", "Dd0", "Yzn11", "Dzn0", "ZNyn11", "YNd1", "Dy11", "YNy0", "Dz0", "ZNd0", "ZNzn0"];

export interface RandomNetworkOptions {
  busCount: number;
  /** Extra lines between buses of one voltage level: rings and parallel pairs. */
  loopCount?: number;
  generators?: boolean;
}

export function randomNetwork(seed: number, options: RandomNetworkOptions): Network {
  const rnd = seededRandom(seed);
  const pick = <T>(items: readonly T[]): T => items[Math.floor(rnd() * items.length)];
  const between = (lo: number, hi: number) => lo + (hi - lo) * rnd();
  const maybe = <T>(p: number, value: () => T): T | undefined => (rnd() < p ? value() : undefined);

  const doc: NetworkInput & Required<Pick<NetworkInput, "sources" | "transformers" | "lines">> = {
    format: "kilostep.network",
    version: 1,
    name: `random ${seed}`,
    frequencyHz: 50,
    baseMVA: pick([10, 100, 250]),
    buses: [],
    sources: [],
    transformers: [],
    lines: [],
  };
  const level: number[] = [];
  const addBus = (levelIndex: number) => {
    const id = `b${doc.buses.length}`;
    doc.buses.push({ id, name: `Bus ${doc.buses.length}`, nominalKV: levelsKV[levelIndex] });
    level.push(levelIndex);
    return doc.buses.length - 1;
  };
  const winding = (levelIndex: number) => levelsKV[levelIndex] * between(0.9, 1.1);
  const addLine = (a: number, b: number) => {
    const r = between(0.02, 0.6);
    doc.lines.push({
      id: `l${doc.lines.length}`,
      name: `Line ${doc.lines.length}`,
      fromBus: doc.buses[a].id,
      toBus: doc.buses[b].id,
      kind: pick(["overhead", "cable"] as const),
      lengthKm: level[a] === 3 ? between(0.05, 0.5) : between(0.5, 40),
      rOhmPerKm: r,
      xOhmPerKm: between(0.05, 0.45),
      r0OhmPerKm: maybe(0.4, () => r * between(1.5, 4)),
      x0OhmPerKm: maybe(0.4, () => between(0.5, 1.5)),
    });
  };
  const addTransformer = (hv: number, lv: number) => {
    const ratedMVA = level[lv] === 3 ? between(0.2, 2) : between(5, 120);
    const impedancePct = between(4, 16);
    const useLoss = rnd() < 0.6;
    doc.transformers.push({
      id: `t${doc.transformers.length}`,
      name: `Transformer ${doc.transformers.length}`,
      hvBus: doc.buses[hv].id,
      lvBus: doc.buses[lv].id,
      ratedMVA,
      hvKV: winding(level[hv]),
      lvKV: winding(level[lv]),
      impedancePct,
      loadLossKW: useLoss ? ratedMVA * 1000 * (impedancePct / 100) * between(0.02, 0.3) : undefined,
      xOverR: useLoss ? undefined : between(3, 60),
      tapPct: between(-10, 10),
      vectorGroup: pick(vectorGroups),
      z0OverZ1: maybe(0.3, () => between(0.3, 1.2)),
    });
  };

  const root = addBus(Math.floor(rnd() * 3));
  doc.sources.push({
    id: "grid",
    name: "Grid",
    bus: doc.buses[root].id,
    kind: "grid",
    control: "slack",
    shortCircuitMVA: between(50, 5000) * (level[root] === 0 ? 4 : 1),
    xOverR: maybe(0.8, () => between(2, 20)),
    z0OverZ1: maybe(0.7, () => between(0.5, 3)),
  });

  while (doc.buses.length < options.busCount) {
    const parent = Math.floor(rnd() * doc.buses.length);
    const p = level[parent];
    const choice = rnd();
    if (choice < 0.55) addLine(parent, addBus(p));
    else if (choice < 0.9 && p < levelsKV.length - 1) addTransformer(parent, addBus(p + 1 + Math.floor(rnd() * Math.min(2, levelsKV.length - 1 - p))));
    else if (p > 0) addTransformer(addBus(p - 1), parent);
    else addLine(parent, addBus(p));
  }

  if (options.generators)
    for (let k = 1; k < doc.buses.length; k++)
      if (rnd() < 0.15) {
        const kv = levelsKV[level[k]];
        doc.sources.push({
          id: `gen${k}`,
          name: `Generator ${k}`,
          bus: doc.buses[k].id,
          kind: "generator",
          control: "pv",
          ratedMVA: kv < 1 ? between(0.1, 1) : between(5, 200),
          ratedKV: maybe(0.6, () => kv * between(0.95, 1.05)),
          xdSubtransientPct: between(10, 30),
          xOverR: maybe(0.5, () => between(10, 80)),
          ratedPowerFactor: maybe(0.5, () => between(0.8, 0.95)),
        });
      }

  for (let extra = 0; extra < (options.loopCount ?? 0); extra++) {
    const a = Math.floor(rnd() * doc.buses.length);
    const sameLevel = doc.buses.map((_, i) => i).filter((i) => i !== a && level[i] === level[a]);
    if (sameLevel.length > 0) addLine(a, pick(sameLevel));
  }

  const checked = validateNetwork(doc);
  if (!checked.ok) throw new Error(`random network ${seed} is invalid: ${JSON.stringify(checked.issues)}`);
  return checked.network;
}
