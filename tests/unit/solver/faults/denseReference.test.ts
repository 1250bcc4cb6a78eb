// The production fault levels (sparse factorisation, per unit) against an independent dense
// bus impedance inverse on mathjs built in ohms from the network file (denseReference.ts).
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { computeFaultLevels } from "#solver/faults/index.ts";
import { validateNetwork, type Network } from "#solver/schema.ts";
import { referenceFaultLevels, referenceMinimumFaultLevels } from "./denseReference.ts";
import { randomNetwork } from "./randomNetworks.ts";

const fixturesDir = join(import.meta.dirname, "../../../fixtures");
const TOLERANCE_PU = 1e-9;

function expectAgreement(network: Network) {
  const mine = computeFaultLevels(network);
  const reference = referenceFaultLevels(network);
  const minimum = referenceMinimumFaultLevels(network);
  network.buses.forEach((bus, k) => {
    const baseKA = network.baseMVA / (Math.sqrt(3) * bus.nominalKV);
    const got = mine.buses[k];
    const want = reference[k];
    expect(got.id).toBe(bus.id);
    const where = `${network.name}, bus ${bus.id}`;
    expect(Math.abs(got.ik3kA - want.ik3kA) / baseKA, `${where} I"k3`).toBeLessThan(TOLERANCE_PU);
    expect(Math.abs(got.ip3kA - want.ip3kA) / baseKA, `${where} i_p`).toBeLessThan(TOLERANCE_PU);
    expect(Math.abs(got.ik1kA - want.ik1kA) / baseKA, `${where} I"k1`).toBeLessThan(TOLERANCE_PU);
    expect(Math.abs(got.rOverX - want.rOverX), `${where} R/X`).toBeLessThan(1e-9);
    expect(got.note === "unearthed system at this bus", `${where} unearthed note`).toBe(want.z0Ohm === null);
    expect(got.ipMethod, `${where} peak method`).toBe(want.ipMethod);
    const least = minimum[k];
    expect(Math.abs(got.ik3MinKA - least.ik3kA) / baseKA, `${where} I"k3min`).toBeLessThan(TOLERANCE_PU);
    expect(Math.abs(got.ik1MinKA - least.ik1kA) / baseKA, `${where} I"k1min`).toBeLessThan(TOLERANCE_PU);
  });
  for (const converter of mine.converters) {
    const source = network.sources.find((s) => s.id === converter.id)!;
    const k = network.buses.findIndex((b) => b.id === source.bus);
    // SCR = S"k3min / rated MVA with S"k3min = √3·U_n·I"k3min.
    expect(converter.scr).toBeCloseTo((Math.sqrt(3) * network.buses[k].nominalKV * minimum[k].ik3kA) / source.ratedMVA!, 9);
  }
}

/** The same network with converter plants on a few buses (version 2), to exercise the current sources. */
function withConverters(network: Network, seed: number): Network {
  const picked = network.buses.filter((_, i) => (i * 7 + seed) % 5 === 0).slice(0, 3);
  const checked = validateNetwork({
    ...network,
    version: 2,
    sources: [
      ...network.sources,
      ...picked.map((b, n) => ({
        id: `pv-${n}`, name: `Plant ${n}`, bus: b.id, kind: "converter", control: "pq",
        pMW: 5, qMvar: 0, ratedMVA: 10 + 5 * n, faultCurrentPct: 110 + 10 * n,
      })),
    ],
  });
  if (!checked.ok) throw new Error(JSON.stringify(checked.issues));
  return checked.network;
}

describe("fault levels agree with a dense Z-bus inverse on mathjs to 1e-9 pu", () => {
  const fixtures = readdirSync(fixturesDir).filter((f) => f.endsWith(".json"));

  it("finds the demo fixtures", () => {
    expect(fixtures.length).toBeGreaterThanOrEqual(2);
  });

  for (const file of fixtures) {
    it(`fixture ${file}`, () => {
      const checked = validateNetwork(JSON.parse(readFileSync(join(fixturesDir, file), "utf8")));
      if (!checked.ok) throw new Error(`${file}: ${JSON.stringify(checked.issues)}`);
      expectAgreement(checked.network);
    });
  }

  it("random radial networks with every vector group family and generators", () => {
    for (let seed = 1; seed <= 40; seed++) expectAgreement(randomNetwork(seed, { busCount: 25, generators: true }));
  });

  it("random networks with converter plants added (IEC 60909-0:2016 current sources)", () => {
    for (let seed = 201; seed <= 215; seed++) expectAgreement(withConverters(randomNetwork(seed, { busCount: 20, generators: true }), seed));
    for (let seed = 301; seed <= 310; seed++)
      expectAgreement(withConverters(randomNetwork(seed, { busCount: 20, loopCount: 4, generators: true }), seed));
  });

  it("random networks with rings and parallel lines", () => {
    for (let seed = 101; seed <= 130; seed++)
      expectAgreement(randomNetwork(seed, { busCount: 30, loopCount: 6, generators: true }));
  });
});
