import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { validateNetwork, type Network } from "#solver/schema.ts";
import { chainEnds, chainTo, distanceFromSlack } from "#solver/topology.ts";
import { findSection } from "#solver/section.ts";
import { chainNetwork, crowdedBusNetwork, starNetwork } from "../largeNetworks.ts";

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

// Shapes at the size a planner's largest studies reach; each walk must be linear (an O(n²) walk
// would take minutes here and a recursive one would overflow the stack). The expected answers
// follow from how the networks are built.
describe("the topology helpers at scale", { timeout: 300_000 }, () => {
  const n = 50_000;
  const chain = chainNetwork(n);
  const star = starNetwork(n);
  const crowded = crowdedBusNetwork(20_000);

  it("walks a 50,000-bus chain from its slack bus to its far end", () => {
    const path = chainTo(chain, `b${n - 1}`);
    expect(path).toHaveLength(n);
    expect(path[0]).toBe("b0");
    expect(path[n - 1]).toBe(`b${n - 1}`);
    expect(chainEnds(chain)).toEqual([`b${n - 1}`]);
    const distance = distanceFromSlack(chain);
    expect(distance.get(`b${n - 1}`)).toBe(n - 1);
  });

  it("finds every spur end of a 50,000-spur star, each two buses from the slack", () => {
    expect(chainEnds(star)).toHaveLength(n);
    expect(chainTo(star, `b${n}`)).toEqual(["b0", `b${n}`]);
    expect(distanceFromSlack(star).get(`b${n}`)).toBe(1);
  });

  it("finds one section per voltage level and all its ends, linear in the buses", () => {
    const section = findSection(chain, `b${n - 1}`)!;
    expect(section.busIds).toHaveLength(n);
    expect(section.lineIds).toHaveLength(n - 1);
    expect(section.endBusIds).toEqual(["b0", `b${n - 1}`]);
    const starSection = findSection(star, "b1")!;
    expect(starSection.endBusIds).toHaveLength(n + 1);
    const crowdedSection = findSection(crowded, "b1")!;
    expect(crowdedSection.busIds).toEqual(["b1"]);
    expect(crowdedSection.facingWindings).toEqual([{ transformerId: "t1", winding: "lv" }]);
  });
});
