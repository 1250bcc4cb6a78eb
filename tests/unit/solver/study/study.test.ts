// The study engine against plain solves: each case's numbers are those of the same network with
// the case applied by hand and solved by solveNetwork (the engine adds nothing to the physics).
import { describe, expect, it } from "vitest";
import { solveNetwork } from "#solver/index.ts";
import { runStudy, runStudySync, type Study } from "#solver/study/index.ts";
import type { NetworkInput } from "#solver/schema.ts";
import { fixtureDocument, tarnWithCases, twinTransformers } from "./networks.ts";

function studyOf(doc: NetworkInput, request: object = {}): Study {
  const outcome = runStudySync(doc, request);
  if (!outcome.ok) throw new Error(outcome.issues.map((i) => `${i.path}: ${i.message}`).join("; "));
  return outcome.study;
}

function plainSolve(doc: NetworkInput) {
  const outcome = solveNetwork(doc);
  if (!outcome.ok) throw new Error(outcome.issues.map((i) => i.message).join("; "));
  return outcome.result;
}

describe("operating cases", () => {
  it("gives each case the numbers of a plain solve of the network with that case applied by hand", () => {
    const study = studyOf(
      tarnWithCases([
        { id: "peak", name: "Winter peak", loads: { "ld-town": 1.1 } },
        { id: "light", name: "Light load", loadScale: 0.4, sources: { "g-tarn": { voltagePu: 1.01 } }, outOfService: ["c-calder"] },
      ]),
    );

    const byHandPeak = fixtureDocument("tarn-head-calder-flats.json");
    const town = byHandPeak.loads!.find((l) => l.id === "ld-town")!;
    town.pMW *= 1.1;
    town.qMvar! *= 1.1;
    const peak = plainSolve(byHandPeak);
    expect(study.cases[0].loadFlow).toEqual(peak.loadFlow);
    expect(study.cases[0].faults).toEqual(peak.faults);
    expect(study.cases[0].checks).toEqual(peak.checks.map((c) => ({ ...c, case: "peak" })));

    const byHandLight = fixtureDocument("tarn-head-calder-flats.json");
    for (const load of byHandLight.loads!) {
      load.pMW *= 0.4;
      load.qMvar! *= 0.4;
    }
    byHandLight.sources![0].voltagePu = 1.01;
    byHandLight.shunts = [];
    const light = plainSolve(byHandLight);
    expect(study.cases[1].loadFlow).toEqual(light.loadFlow);
    expect(study.cases[1].checks).toEqual(light.checks.map((c) => ({ ...c, case: "light" })));
  });

  it("studies a network without cases as one case, as drawn", () => {
    const { cases: _cases, growth: _growth, ...doc } = fixtureDocument("tarn-head-calder-flats.json");
    const study = studyOf(doc);
    expect(study.cases.map((c) => c.id)).toEqual(["as-drawn"]);
    expect(study.cases[0].loadFlow).toEqual(plainSolve(doc).loadFlow);
  });

  it("takes a source out with inService false, and counts the load it leaves unsupplied as lost", () => {
    const study = studyOf(tarnWithCases([{ id: "dark", name: "Station out", sources: { "g-tarn": { inService: false } } }]));
    // Mine 9 MW + town 7 MW: every load of the demo hangs on the one station.
    expect(study.cases[0].lostLoadMW).toBeCloseTo(16, 9);
    expect(study.cases[0].deenergisedBuses).toHaveLength(6);
    expect(study.cases[0].checks).toEqual([]);
  });
});

describe("the envelope", () => {
  it("keeps each bus's lowest and highest voltage and each branch's highest loading with the case that sets it", () => {
    const study = studyOf(
      tarnWithCases([
        { id: "peak", name: "Peak", loadScale: 1 },
        { id: "light", name: "Light", loadScale: 0.3 },
        { id: "middle", name: "Middle", loadScale: 0.6 },
      ]),
    );
    for (const bus of study.envelope.buses) {
      const readings = study.cases.map((c) => ({ case: c.id, vPu: c.loadFlow.buses.find((b) => b.id === bus.id)!.vPu }));
      const lowest = readings.reduce((a, b) => (b.vPu < a.vPu ? b : a));
      const highest = readings.reduce((a, b) => (b.vPu > a.vPu ? b : a));
      expect([bus.vMinPu, bus.vMinCase, bus.vMaxPu, bus.vMaxCase]).toEqual([lowest.vPu, lowest.case, highest.vPu, highest.case]);
    }
    // More load, more current: every rated branch peaks in the peak case (common practice).
    expect(study.envelope.branches.length).toBeGreaterThan(0);
    for (const branch of study.envelope.branches) expect(branch.maxLoadingCase).toBe("peak");
  });
});

describe("energy over the cases' hours", () => {
  it("sums case loss × hours over a three-step load-duration curve (hand arithmetic)", () => {
    const steps = [
      { id: "high", name: "High", hoursPerYear: 1000, loadScale: 1 },
      { id: "mid", name: "Middle", hoursPerYear: 4000, loadScale: 0.6 },
      { id: "low", name: "Low", hoursPerYear: 3760, loadScale: 0.25 },
    ];
    const study = studyOf(tarnWithCases(steps));
    const lossOf = (scale: number) => {
      const doc = fixtureDocument("tarn-head-calder-flats.json");
      for (const load of doc.loads!) {
        load.pMW *= scale;
        load.qMvar! *= scale;
      }
      return plainSolve(doc).loadFlow.totals.lossMW;
    };
    const byHand = lossOf(1) * 1000 + lossOf(0.6) * 4000 + lossOf(0.25) * 3760;
    expect(study.energy.method).toBe("case-hours");
    expect(study.energy.hoursCovered).toBe(8760);
    expect(study.energy.lossMWhPerYear).toBeCloseTo(byHand, 9);
  });

  it("falls back to the loss load factor when no case carries hours", () => {
    const study = studyOf(tarnWithCases([{ id: "peak", name: "Peak" }, { id: "light", name: "Light", loadScale: 0.3 }]));
    const peak = plainSolve(fixtureDocument("tarn-head-calder-flats.json")).loadFlow;
    const vPu = (bus: string) => peak.buses.find((b) => b.id === bus)!.vPu;
    // Core loss runs all year: 17 kW and 16 kW at the square of each HV terminal's voltage.
    const coreMW = (17 * vPu("b-tarn-66") ** 2 + 16 * vPu("b-calder-66") ** 2) / 1000;
    // LLF = 0.3·0.6 + 0.7·0.6² = 0.432 (Buller and Woodrow, k = 0.3, LF = 0.6).
    expect(study.energy).toMatchObject({ method: "loss-load-factor", peakCase: "peak", loadFactor: 0.6 });
    expect(study.energy.lossLoadFactor).toBeCloseTo(0.432, 12);
    expect(study.energy.lossMWhPerYear).toBeCloseTo((peak.totals.lossMW - coreMW) * 0.432 * 8760 + coreMW * 8760, 6);
  });
});

describe("outages (N-1)", () => {
  it("doubles the survivor's loading when one of two identical parallel transformers is out (common practice)", () => {
    const study = studyOf(twinTransformers(6), { outages: true });
    const both = study.cases[0].loadFlow.branches.find((b) => b.id === "t2")!.loadingPct!;
    const t1Out = study.outages!.find((o) => o.element === "t1")!;
    expect(t1Out.lostLoadMW).toBe(0);
    expect(t1Out.highestLoading!.element).toBe("t2");
    // Twice the load on one unit. Its doubled voltage drop, ΔV ≈ (PR + QX)/V ≈ 2 % here, raises
    // a constant-power load's current by about as much, and its reactive loss I²X adds a little.
    const ratio = t1Out.highestLoading!.loadingPct / both;
    expect(ratio).toBeGreaterThan(2);
    expect(ratio).toBeLessThan(2.03);
  });

  it("states the firm capacity of a substation with parallel transformers: installed less the largest unit", () => {
    const study = studyOf(twinTransformers(12), { outages: true });
    expect(study.firmCapacity).toHaveLength(1);
    const firm = study.firmCapacity![0];
    expect([firm.installedMVA, firm.firmMVA]).toEqual([20, 10]);
    // 12 MW at Q = 0.33 P is about 12.6 MVA at the load, more than one unit's 10 MVA.
    expect(firm.peakDemandMVA).toBeGreaterThan(12.6);
    expect(firm.withinFirm).toBe(false);
    expect(study.outages!.find((o) => o.element === "t1")!.checks.map((c) => [c.element, c.kind, c.case])).toContainEqual(["t2", "transformer-overload", "as-drawn"]);
  });

  it("reports the load an outage islands as lost load, not as a failed solve", () => {
    const study = studyOf(tarnWithCases([{ id: "peak", name: "Peak" }]), { outages: true });
    const townLineOut = study.outages!.find((o) => o.element === "l-town")!;
    expect(townLineOut.converged).toBe(true);
    // The town's 7 MW hangs on that one line (the demo's data).
    expect(townLineOut.lostLoadMW).toBeCloseTo(7, 12);
    expect(townLineOut.deenergisedBuses).toEqual(["b-town"]);
    const stepUpOut = study.outages!.find((o) => o.element === "t-tarn")!;
    expect(stepUpOut.lostLoadMW).toBeCloseTo(16, 12);
    // Every line and transformer out in turn.
    expect(study.outages!.map((o) => o.element).sort()).toEqual(["l-fell", "l-mine", "l-town", "t-calder", "t-tarn"]);
  });

  it("runs outages only in the cases asked for, and names a case that does not exist", () => {
    const doc = tarnWithCases([{ id: "peak", name: "Peak" }, { id: "light", name: "Light", loadScale: 0.3 }]);
    expect(new Set(studyOf(doc, { outages: ["light"] }).outages!.map((o) => o.case))).toEqual(new Set(["light"]));
    expect(runStudySync(doc, { outages: ["dusk"] })).toEqual({
      ok: false,
      issues: [{ path: "outages[0]", message: 'there is no operating case "dusk" (the cases are "peak", "light")' }],
    });
  });
});

describe("years of load growth", () => {
  const RATE = 3;
  it("finds the first year whose solve with load × (1 + g)^n breaks each limit", () => {
    const doc = tarnWithCases([{ id: "peak", name: "Peak" }], { ratePctPerYear: RATE, years: 15 });
    const study = studyOf(doc, { years: true });
    const limitsInYear = (year: number) => {
      const byHand = fixtureDocument("tarn-head-calder-flats.json");
      for (const load of byHand.loads!) {
        load.pMW *= (1 + RATE / 100) ** year;
        load.qMvar! *= (1 + RATE / 100) ** year;
      }
      return plainSolve(byHand).checks.map((c) => `${c.element} ${c.kind}`);
    };
    const stepUp = study.years!.find((y) => y.element === "t-tarn" && y.kind === "transformer-overload")!;
    expect(stepUp.case).toBe("peak");
    expect(limitsInYear(stepUp.firstYear)).toContain("t-tarn transformer-overload");
    expect(limitsInYear(stepUp.firstYear - 1)).not.toContain("t-tarn transformer-overload");
    // The station's 24 MVA against about 19 MVA at year 0: ln(24/19)/ln(1.03) ≈ 7.9, so within a
    // year or two of 8 once losses and reactive power grow too (compound growth, by hand).
    expect(stepUp.firstYear).toBeGreaterThanOrEqual(5);
    expect(stepUp.firstYear).toBeLessThanOrEqual(9);
  });

  it("names the year the chain stops carrying its load, the first whose solve does not converge", () => {
    const study = studyOf(tarnWithCases([{ id: "peak", name: "Peak" }], { ratePctPerYear: 10, years: 30 }), { years: true });
    const year = study.growth!.loadNotCarriedYear!;
    expect(study.growth!.loadNotCarriedCase).toBe("peak");
    const carries = (y: number) => {
      const byHand = fixtureDocument("tarn-head-calder-flats.json");
      for (const load of byHand.loads!) {
        load.pMW *= 1.1 ** y;
        load.qMvar! *= 1.1 ** y;
      }
      return plainSolve(byHand).loadFlow.converged;
    };
    expect([carries(year - 1), carries(year)]).toEqual([true, false]);
  });

  it("asks for a growth when the network has none", () => {
    expect(runStudySync(tarnWithCases([{ id: "peak", name: "Peak" }]), { years: true })).toMatchObject({ ok: false, issues: [{ path: "years" }] });
  });
});

describe("a study a little at a time", () => {
  const doc = tarnWithCases([{ id: "peak", name: "Peak" }, { id: "light", name: "Light", loadScale: 0.3 }], { ratePctPerYear: 2, years: 10 });

  it("reports progress to the end and returns what the whole run returns", async () => {
    const seen: number[] = [];
    const outcome = await runStudy(doc, { outages: true, years: true }, { onProgress: (p) => seen.push(p.done / p.total) });
    expect(seen.at(-1)).toBe(1);
    expect(outcome).toEqual(runStudySync(doc, { outages: true, years: true }));
  });

  it("does not start when its signal is already aborted", async () => {
    const controller = new AbortController();
    controller.abort();
    await expect(runStudy(doc, { outages: true }, { signal: controller.signal })).rejects.toMatchObject({ name: "AbortError" });
  });

  it("stops between two load flows when its signal is aborted while it runs", async () => {
    const controller = new AbortController();
    let reports = 0;
    const running = runStudy(doc, { outages: true, years: true }, {
      signal: controller.signal,
      onProgress: () => {
        reports++;
        controller.abort();
      },
    });
    await expect(running).rejects.toMatchObject({ name: "AbortError" });
    expect(reports).toBe(1);
  });
});
