import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { validateNetwork, type Network } from "#solver/schema.ts";
import { chainEnds, chainTo } from "#solver/topology.ts";

function load(file: string): Network {
  const parsed = validateNetwork(JSON.parse(readFileSync(`tests/fixtures/${file}`, "utf8")));
  if (!parsed.ok) throw new Error(`${file} does not validate`);
  return parsed.network;
}

describe("the chain along which the voltage profile is drawn", () => {
  it("runs from the hydro station's slack bus to the town", () => {
    const doc = load("tarn-head-calder-flats.json");
    expect(chainTo(doc, "b-town")).toEqual(["b-tarn-11", "b-tarn-66", "b-calder-66", "b-calder-11", "b-town"]);
    expect(chainEnds(doc).sort()).toEqual(["b-mine", "b-town"]);
  });

  it("runs from the grid infeed to the solar park in the second example", () => {
    const doc = load("hollin-moor-solar.json");
    expect(chainTo(doc, "b-hollin-33")).toEqual(["b-greyscar", "b-hollin-132", "b-hollin-33"]);
  });

  it("is empty for a bus cut off from every slack", () => {
    const doc = load("tarn-head-calder-flats.json");
    const cut = { ...doc, lines: doc.lines.filter((l) => l.id !== "l-town") };
    expect(chainTo(cut, "b-town")).toEqual([]);
  });
});
