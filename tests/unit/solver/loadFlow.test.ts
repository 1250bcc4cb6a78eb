// Load flow behaviour: balance on every fixture, reactive limits, loops, islands, ZIP loads and
// the planner's sentence when a chain cannot carry its load.
import { describe, expect, it } from "vitest";
import { solveNetwork } from "#solver/index.ts";
import type { LoadFlowResult } from "#solver/results.ts";
import type { NetworkInput } from "#solver/schema.ts";
import { referenceLoadFlow } from "./reference/nodalReference.ts";
import { fixture, validFixtures } from "./fixtures.ts";
import { nonFiniteNumbers } from "./finite.ts";
import { validateNetwork } from "#solver/schema.ts";

function loadFlowOf(document: unknown): LoadFlowResult {
  const outcome = solveNetwork(document, { faults: false });
  if (!outcome.ok) throw new Error(JSON.stringify(outcome.issues));
  return outcome.result.loadFlow;
}

function edited(file: string, edit: (doc: NetworkInput) => void): NetworkInput {
  const doc = structuredClone(fixture(file).document) as NetworkInput;
  edit(doc);
  return doc;
}

describe("power balance (methods: generation = load + losses to 1e-6 MW)", () => {
  for (const { file, document } of validFixtures()) {
    it(`${file}: balances, losses add up branch by branch, and every number is finite`, () => {
      const lf = loadFlowOf(document);
      expect(nonFiniteNumbers(lf)).toEqual([]);
      if (!lf.converged) return;
      const t = lf.totals;
      expect(Math.abs(t.generationMW - t.loadMW - t.lossMW)).toBeLessThan(1e-6);
      const branchLossMW = lf.branches.reduce((sum, b) => sum + b.lossKW / 1000, 0);
      expect(Math.abs(branchLossMW - t.lossMW)).toBeLessThan(1e-9);
      for (const b of lf.branches) expect(Math.abs(b.lossKW - (b.pFromMW + b.pToMW) * 1000)).toBeLessThan(1e-6);
      expect(lf.iterations).toBeLessThanOrEqual(30);
    });
  }
});

describe("PV sources and reactive limits", () => {
  it("a PV generator past its upper limit is held at qMaxMvar and its bus falls below the set point", () => {
    const lf = loadFlowOf(fixture("pv-limit-scarth.json").document);
    const hydro = lf.sources.find((s) => s.id === "g-beck")!;
    expect(hydro.qMvar).toBeCloseTo(2.5, 9);
    expect(hydro.pMW).toBe(6);
    expect(lf.buses.find((b) => b.id === "b-beck-11")!.vPu).toBeLessThan(1.04);
  });

  it("with room to spare the same generator holds its set point within its limits", () => {
    const lf = loadFlowOf(edited("pv-limit-scarth.json", (d) => (d.sources![1].qMaxMvar = 20)));
    const hydro = lf.sources.find((s) => s.id === "g-beck")!;
    expect(lf.buses.find((b) => b.id === "b-beck-11")!.vPu).toBeCloseTo(1.04, 12);
    expect(hydro.qMvar).toBeGreaterThan(2.5);
    expect(hydro.qMvar).toBeLessThan(20);
  });

  it("a set point below what the grid gives drives it to its lower limit, the bus staying above the set point", () => {
    const lf = loadFlowOf(
      edited("pv-limit-scarth.json", (d) => {
        d.sources![1].voltagePu = 0.96;
        d.sources![1].qMinMvar = -1;
      }),
    );
    expect(lf.sources.find((s) => s.id === "g-beck")!.qMvar).toBeCloseTo(-1, 9);
    expect(lf.buses.find((b) => b.id === "b-beck-11")!.vPu).toBeGreaterThan(0.96);
  });

  it("two PV sources at one bus share the reactive output in proportion to their ranges", () => {
    const doc = edited("pv-limit-scarth.json", (d) => {
      d.sources![1].qMaxMvar = 20;
      d.sources!.push({ ...d.sources![1], id: "g-beck-2", name: "Scarth Beck hydro 2", pMW: 2, qMinMvar: -1, qMaxMvar: 4 });
      d.sources![1].qMinMvar = -2;
      d.sources![1].qMaxMvar = 8;
    });
    const lf = loadFlowOf(doc);
    const a = lf.sources.find((s) => s.id === "g-beck")!;
    const b = lf.sources.find((s) => s.id === "g-beck-2")!;
    expect((a.qMvar + 2) / 10).toBeCloseTo((b.qMvar + 1) / 5, 9);
    expect(lf.buses.find((x) => x.id === "b-beck-11")!.vPu).toBeCloseTo(1.04, 12);
    expect(Math.abs(lf.totals.generationMW - lf.totals.loadMW - lf.totals.lossMW)).toBeLessThan(1e-6);
  });
});

describe("loops", () => {
  it("two identical parallel lines give the same voltages as one line of half the impedance and twice the charging (parallel impedances)", () => {
    const twin = edited("parallel-ashgill.json", (d) => (d.lines![1] = { ...d.lines![0], id: "l-ash-2", name: "Ashgill circuit 2" }));
    const single = edited("parallel-ashgill.json", (d) => {
      const one = d.lines![0];
      d.lines = [{ ...one, rOhmPerKm: one.rOhmPerKm / 2, xOhmPerKm: one.xOhmPerKm / 2, bMicroSiemensPerKm: one.bMicroSiemensPerKm! * 2 }];
    });
    const a = loadFlowOf(twin);
    const b = loadFlowOf(single);
    a.buses.forEach((bus, i) => {
      expect(bus.vPu).toBeCloseTo(b.buses[i].vPu, 11);
      expect(bus.angleDeg).toBeCloseTo(b.buses[i].angleDeg, 9);
    });
    expect(a.branches[0].pFromMW).toBeCloseTo(b.branches[0].pFromMW / 2, 9);
  });

  it("parallel lines of different impedance share the flow inversely to their impedance (current divider), losses counted on each", () => {
    const lf = loadFlowOf(fixture("parallel-ashgill.json").document);
    const [one, two] = lf.branches;
    expect(Math.abs(two.pFromMW)).toBeGreaterThan(Math.abs(one.pFromMW));
    expect(one.lossKW).toBeGreaterThan(0);
    expect(two.lossKW).toBeGreaterThan(0);
  });

  it("a ring carries current both ways round to the load furthest from the supply (mathjs reference agrees)", () => {
    const { document, network } = fixture("ring-brackenwold.json");
    const lf = loadFlowOf(document);
    const ref = referenceLoadFlow(network);
    expect(ref.converged).toBe(true);
    const intoHarrow = lf.branches.filter((b) => b.id === "l-ling-harrow" || b.id === "l-harrow-ox");
    expect(intoHarrow.map((b) => (b.toBus === "b-harrow" ? b.pToMW : b.pFromMW)).every((p) => p < 0)).toBe(true);
    lf.buses.forEach((bus, i) => expect(Math.abs(bus.vPu - ref.vPu[i])).toBeLessThan(1e-8));
  });

  it("two separate groups, each with its own slack, solve together", () => {
    const doc = edited("ring-brackenwold.json", (d) => {
      const other = fixture("hollin-moor-solar.json").document as NetworkInput;
      d.version = 2;
      d.buses.push(...other.buses);
      d.sources!.push(...other.sources!);
      d.transformers!.push(...other.transformers!);
      d.lines!.push(...other.lines!);
      d.loads!.push(...other.loads!);
    });
    const lf = loadFlowOf(doc);
    const alone = loadFlowOf(fixture("hollin-moor-solar.json").document);
    expect(lf.converged).toBe(true);
    for (const bus of alone.buses) expect(lf.buses.find((b) => b.id === bus.id)!.vPu).toBeCloseTo(bus.vPu, 10);
  });
});

describe("loads and sources", () => {
  it("each ZIP load draws P₀·|V|^k at its solved voltage, k = 0, 1, 2 (methods)", () => {
    const { document, network } = fixture("zip-mirewater.json");
    const lf = loadFlowOf(document);
    const v = new Map(lf.buses.map((b) => [b.id, b.vPu]));
    const k = { "constant-power": 0, "constant-current": 1, "constant-impedance": 2 } as const;
    const expected = network.loads.reduce((sum, l) => sum + l.pMW * v.get(l.bus)! ** k[l.model], 0);
    expect(lf.totals.loadMW).toBeCloseTo(expected, 10);
    expect(lf.totals.loadMW).not.toBeCloseTo(network.loads.reduce((s, l) => s + l.pMW, 0), 3);
  });

  it("a PQ source is a negative load: its output is exactly its schedule", () => {
    const lf = loadFlowOf(fixture("zip-mirewater.json").document);
    expect(lf.sources.find((s) => s.id === "g-dale-wind")).toEqual({ id: "g-dale-wind", pMW: 1.5, qMvar: -0.3 });
  });

  it("an exporting plant makes the slack negative; loss per cent is of the power fed in", () => {
    const lf = loadFlowOf(fixture("hollin-moor-solar.json").document);
    const grid = lf.sources.find((s) => s.id === "g-greyscar")!;
    expect(grid.pMW).toBeLessThan(0);
    expect(lf.totals.lossPct).toBeCloseTo((lf.totals.lossMW / 40) * 100, 9);
  });

  it("the slack angle sets every angle in its group (Yy0 reporting)", () => {
    const lf = loadFlowOf(fixture("zip-mirewater.json").document);
    expect(lf.buses[0].angleDeg).toBeCloseTo(-30, 12);
    expect(lf.buses.every((b) => b.angleDeg < -29 && b.angleDeg > -40)).toBe(true);
  });
});

describe("a chain that cannot carry its load", () => {
  const { document } = fixture("overloaded-fellbeck.json");
  const lf = loadFlowOf(document);

  it("returns converged false, no numbers, and a sentence naming the loads, the chain and the share it could carry", () => {
    expect(lf.converged).toBe(false);
    expect(lf.buses).toEqual([]);
    expect(lf.branches).toEqual([]);
    expect(nonFiniteNumbers(lf)).toEqual([]);
    const message = lf.message!;
    for (const name of ["Fellbeck mill", "Fellbeck farms", "Mosshead grid", "Mosshead transformer", "Fellbeck spur first section", "Fellbeck spur second section"])
      expect(message).toContain(name);
    expect(message).toMatch(new RegExp(`about ${lf.loadabilityPct} % of its load`));
    expect(lf.loadabilityPct).toBeGreaterThan(50);
    expect(lf.loadabilityPct).toBeLessThan(100);
  });

  it("the share it could carry is right: the mathjs reference solves 3 % below it and fails 3 % above it", () => {
    const scaled = (share: number) => {
      const doc = structuredClone(document) as NetworkInput;
      for (const l of doc.loads!) {
        l.pMW *= share;
        l.qMvar = (l.qMvar ?? 0) * share;
      }
      const v = validateNetwork(doc);
      if (!v.ok) throw new Error("scaled fixture invalid");
      return { doc, network: v.network };
    };
    const below = scaled((lf.loadabilityPct! - 3) / 100);
    const above = scaled((lf.loadabilityPct! + 3) / 100);
    expect(referenceLoadFlow(below.network).converged).toBe(true);
    expect(loadFlowOf(below.doc).converged).toBe(true);
    expect(referenceLoadFlow(above.network).converged).toBe(false);
    expect(loadFlowOf(above.doc).converged).toBe(false);
  });

  it("a network that fails even without load says so instead of guessing a share", () => {
    const doc = edited("pv-limit-scarth.json", (d) => {
      d.sources![1].pMW = 400;
    });
    const result = loadFlowOf(doc);
    expect(result.converged).toBe(false);
    expect(result.message).toMatch(/even with every load set to zero/);
    expect(nonFiniteNumbers(result)).toEqual([]);
  });
});

describe("the sentence on a long overloaded chain", () => {
  it("names the three largest loads, counts the rest, and shortens a long chain to its ends", () => {
    const sections = 9;
    const doc: NetworkInput = {
      format: "kilostep.network",
      version: 1,
      name: "Long spur (fictional)",
      frequencyHz: 50,
      buses: Array.from({ length: sections + 1 }, (_, k) => ({ id: `b${k}`, name: `Pole ${k}`, nominalKV: 11 })),
      sources: [{ id: "g", name: "Spur infeed", bus: "b0", kind: "grid", control: "slack", shortCircuitMVA: 200, xOverR: 5 }],
      lines: Array.from({ length: sections }, (_, k) => ({
        id: `l${k + 1}`,
        name: `Span ${k + 1}`,
        fromBus: `b${k}`,
        toBus: `b${k + 1}`,
        kind: "overhead" as const,
        lengthKm: 3,
        rOhmPerKm: 0.5,
        xOhmPerKm: 0.4,
      })),
      loads: Array.from({ length: sections }, (_, k) => ({ id: `ld${k + 1}`, name: `Farm ${k + 1}`, bus: `b${k + 1}`, pMW: 0.4 + 0.1 * k, qMvar: 0.2 })),
    };
    const lf = loadFlowOf(doc);
    expect(lf.converged).toBe(false);
    expect(lf.message).toContain("Farm 9 (1.2 MW), Farm 8 (1.1 MW), Farm 7 (1.0 MW) and 6 other loads, 7.2 MW in all");
    expect(lf.message).toContain("Span 1, Span 2, Span 3, … Span 8 and Span 9 (9 branches in all)");
    expect(lf.message).toContain("Pole 9 is down to");
  });
});
