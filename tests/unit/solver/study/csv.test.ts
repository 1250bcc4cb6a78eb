// The study's tables as CSV: one row per element or outage or limit, the numbers of the study.
import { describe, expect, it } from "vitest";
import { caseElementCsv, envelopeCsv, firmCapacityCsv, outagesCsv, studyCsv, STUDY_CSV_TABLES, yearsCsv } from "#solver/study/csv.ts";
import { runStudySync } from "#solver/study/index.ts";
import { fixtureDocument, twinTransformers } from "./networks.ts";

const rows = (csv: string) => csv.trimEnd().split("\r\n").map((line) => line.split(","));

describe("study CSV", () => {
  const outcome = runStudySync(fixtureDocument("tarn-head-calder-flats.json"), { outages: true, years: true });
  if (!outcome.ok) throw new Error("the demo must study");
  const { study, network } = outcome;

  it("puts each case in a column of the case × element table, each value the case's own reading", () => {
    const table = rows(caseElementCsv(network, study));
    expect(table[0]).toEqual(["element_id", "element_name", "quantity", "winter-peak", "summer-light", "town-feeder-out"]);
    const town = table.find((r) => r[0] === "b-town")!;
    expect(town[2]).toBe("voltage_pu");
    expect(Number(town[3])).toBeCloseTo(study.cases[0].loadFlow.buses.find((b) => b.id === "b-town")!.vPu, 5);
    // The town is off supply with its feeder out: no reading in that column.
    expect(town[5]).toBe("");
    const step = table.find((r) => r[0] === "t-calder")!;
    expect(step[2]).toBe("loading_pct");
  });

  it("lists each outage with the load it loses (the town's 7 MW at peak, half of it at half load: by hand), and each limit with its first year", () => {
    const outages = rows(outagesCsv(network, study));
    expect(outages[0].slice(0, 4)).toEqual(["case_id", "element_out", "element_out_name", "kind"]);
    expect(outages).toHaveLength(1 + study.outages!.length);
    const lost = outages[0].indexOf("lost_load_MW");
    expect(outages.find((r) => r[0] === "winter-peak" && r[1] === "l-town")![lost]).toBe("7");
    expect(outages.find((r) => r[0] === "summer-light" && r[1] === "l-town")![lost]).toBe("3.5");
    const years = rows(yearsCsv(network, study));
    expect(years[0]).toEqual(["element_id", "element_name", "limit", "first_year", "case_id", "value", "limit_value"]);
    expect(years.slice(1).map((r) => `${r[0]} ${r[3]}`).sort()).toEqual(study.years!.map((y) => `${y.element} ${y.firstYear}`).sort());
  });

  it("gives each bus's lowest and highest voltage and each branch's highest loading with the case that sets it", () => {
    const table = rows(envelopeCsv(network, study));
    expect(table[0]).toEqual(["element_id", "element_name", "kind", "quantity", "value", "case_id", "limit"]);
    const townLow = table.find((r) => r[0] === "b-town" && r[3] === "voltage_min_pu")!;
    const envelope = study.envelope.buses.find((b) => b.id === "b-town")!;
    expect(Number(townLow[4])).toBeCloseTo(envelope.vMinPu, 5);
    expect(townLow[5]).toBe(envelope.vMinCase);
    expect(table.filter((r) => r[3] === "loading_max_pct")).toHaveLength(study.envelope.branches.length);
  });

  it("answers every named table", () => {
    for (const table of STUDY_CSV_TABLES) expect(studyCsv(table, network, study)).toMatch(/\r\n$/);
  });
});

describe("firm capacity CSV", () => {
  it("is the installed capacity less the largest unit (common practice for N-1): 10 + 10 + 15 MVA holds 20 MVA firm", () => {
    const doc = twinTransformers(12);
    const third = { ...doc.transformers![0], id: "t3", name: "Transformer t3", ratedMVA: 15 };
    const outcome = runStudySync({ ...doc, transformers: [...doc.transformers!, third] }, { outages: true });
    if (!outcome.ok) throw new Error(outcome.issues.map((i) => i.message).join("; "));
    const table = rows(firmCapacityCsv(outcome.network, outcome.study));
    expect(table[0]).toEqual(["hv_bus", "lv_bus", "transformers", "installed_MVA", "firm_MVA", "peak_demand_MVA", "peak_case_id", "within_firm"]);
    expect(table[1].slice(0, 5)).toEqual(["hv", "lv", "t1 t2 t3", "35", "20"]);
    // 12 MW at 0.33 Mvar/MW is 12.64 MVA of load (√(12² + 3.96²)) plus the transformers' own losses.
    expect(Number(table[1][5])).toBeGreaterThan(Math.hypot(12, 3.96));
    expect(Number(table[1][5])).toBeLessThan(Math.hypot(12, 3.96) * 1.05);
    expect(table[1][7]).toBe("yes");
  });
});
