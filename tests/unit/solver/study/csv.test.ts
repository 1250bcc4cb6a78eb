// The study's tables as CSV: one row per element or outage or limit, the numbers of the study.
import { describe, expect, it } from "vitest";
import { caseElementCsv, outagesCsv, yearsCsv } from "#solver/study/csv.ts";
import { runStudySync } from "#solver/study/index.ts";
import { fixtureDocument } from "./networks.ts";

describe("study CSV", () => {
  const outcome = runStudySync(fixtureDocument("tarn-head-calder-flats.json"), { outages: true, years: true });
  if (!outcome.ok) throw new Error("the demo must study");
  const study = outcome.study;
  const rows = (csv: string) => csv.trimEnd().split("\r\n").map((line) => line.split(","));

  it("puts each case in a column of the case × element table, each value the case's own reading", () => {
    const table = rows(caseElementCsv(study));
    expect(table[0]).toEqual(["element_id", "quantity", "winter-peak", "summer-light", "town-feeder-out"]);
    const town = table.find((r) => r[0] === "b-town")!;
    expect(Number(town[2])).toBe(study.cases[0].loadFlow.buses.find((b) => b.id === "b-town")!.vPu);
    // The town is off supply with its feeder out: no reading in that column.
    expect(town[4]).toBe("");
  });

  it("lists each outage with the load it loses, and each limit with its first year", () => {
    const outages = rows(outagesCsv(study));
    expect(outages).toHaveLength(1 + study.outages!.length);
    expect(outages.find((r) => r[0] === "winter-peak" && r[1] === "l-town")![3]).toBe("7");
    const years = rows(yearsCsv(study));
    expect(years.slice(1).map((r) => r[0] + " " + r[2])).toEqual(study.years!.map((y) => `${y.element} ${y.firstYear}`));
  });
});
