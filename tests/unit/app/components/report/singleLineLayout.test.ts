import { readdirSync, readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { COLUMN_WIDTH, layoutSingleLine, ROW_HEIGHT } from "#app/components/report/singleLineLayout.ts";
import { chainEnds, chainTo } from "#solver/topology.ts";
import { validateNetwork, type Network } from "#solver/schema.ts";
import { chainNetwork, crowdedBusNetwork, starNetwork } from "../../../largeNetworks.ts";

const fixturesDir = new URL("../../../../fixtures/", import.meta.url);
function fixture(file: string): Network {
  const checked = validateNetwork(JSON.parse(readFileSync(new URL(file, fixturesDir), "utf8")));
  if (!checked.ok) throw new Error(`${file}: ${JSON.stringify(checked.issues)}`);
  return checked.network;
}
const allFixtures = readdirSync(fixturesDir).filter((f) => f.endsWith(".json"));

describe("the single-line drawing of the hydro demo", () => {
  const network = fixture("tarn-head-calder-flats.json");
  const layout = layoutSingleLine(network);
  const bus = (id: string) => layout.buses.find((b) => b.id === id)!;
  const branch = (id: string) => layout.branches.find((b) => b.id === id)!;

  it("puts each bus one column further from the source than the bus that feeds it", () => {
    expect(["b-tarn-11", "b-tarn-66", "b-calder-66", "b-calder-11", "b-mine", "b-town"].map((id) => bus(id).column)).toEqual([0, 1, 2, 3, 4, 4]);
    expect(bus("b-tarn-66").x - bus("b-tarn-11").x).toBe(COLUMN_WIDTH);
  });

  it("keeps the chain from the source to the first end on one straight row", () => {
    const rows = ["t-tarn", "l-fell", "t-calder", "l-mine"].map((id) => branch(id).y);
    expect(new Set(rows).size).toBe(1);
    expect(branch("l-town").y - branch("l-mine").y).toBe(ROW_HEIGHT);
  });

  it("lets the bus that feeds two branches and a capacitor span their three rows, and no other", () => {
    expect([bus("b-calder-11").firstRow, bus("b-calder-11").lastRow]).toEqual([0, 2]);
    expect([bus("b-tarn-11").firstRow, bus("b-tarn-11").lastRow]).toEqual([0, 0]);
    const capacitor = layout.attachments.find((a) => a.id === "c-calder")!;
    expect(capacitor).toMatchObject({ kind: "capacitor", side: "right", busId: "b-calder-11" });
    expect(capacitor.y).toBe(branch("l-town").y + ROW_HEIGHT);
  });

  it("draws the slack generator on the left of its bus and the loads on the right of theirs", () => {
    expect(layout.attachments.find((a) => a.id === "g-tarn")).toMatchObject({ kind: "generator", side: "left", busId: "b-tarn-11" });
    expect(layout.attachments.filter((a) => a.kind === "load").map((a) => [a.busId, a.side])).toEqual([
      ["b-mine", "right"],
      ["b-town", "right"],
    ]);
  });

  it("faces each transformer's HV winding towards its HV bus", () => {
    expect(branch("t-tarn")).toMatchObject({ leftBusId: "b-tarn-11", rightBusId: "b-tarn-66", hvOnLeft: false });
    expect(branch("t-calder")).toMatchObject({ leftBusId: "b-calder-66", rightBusId: "b-calder-11", hvOnLeft: true });
  });

  it("draws the chain a profile follows from the source to each end left to right, branch by branch", () => {
    expect(chainEnds(network)).toEqual(["b-mine", "b-town"]);
    const drawn = new Set(layout.branches.map((b) => `${b.leftBusId}>${b.rightBusId}`));
    for (const end of chainEnds(network)) {
      const chain = chainTo(network, end);
      expect(chain[0]).toBe("b-tarn-11");
      for (let i = 1; i < chain.length; i++) expect(drawn.has(`${chain[i - 1]}>${chain[i]}`)).toBe(true);
    }
  });
});

describe("the single-line drawing of every fixture", () => {
  it.each(allFixtures)("%s: every element drawn once, inside the drawing", (file) => {
    const network = fixture(file);
    const layout = layoutSingleLine(network);
    expect(layout.buses.map((b) => b.id).sort()).toEqual(network.buses.map((b) => b.id).sort());
    expect([...layout.branches, ...layout.loops].map((b) => b.id).sort()).toEqual([...network.lines, ...network.transformers].map((e) => e.id).sort());
    expect(layout.attachments.map((a) => a.id).sort()).toEqual([...network.sources, ...network.loads, ...network.shunts].map((e) => e.id).sort());
    // A tree of n buses has n − 1 branches (each connected group one fewer); the rest close loops.
    expect(layout.branches.length).toBeLessThanOrEqual(network.buses.length - 1);
    for (const b of layout.buses) {
      expect(b.x).toBeGreaterThan(layout.minX);
      expect(b.x).toBeLessThan(layout.minX + layout.width);
      expect(b.yTop).toBeGreaterThan(0);
      expect(b.yBottom).toBeLessThan(layout.height);
    }
    // No two things hang on the same row at the same bus.
    const places = [...layout.branches.map((b) => `${b.leftBusId}@${b.y}`), ...layout.attachments.filter((a) => a.side === "right").map((a) => `${a.busId}@${a.y}`)];
    expect(new Set(places).size).toBe(places.length);
  });

  it("draws the branch that closes the ring under the drawing, between its two buses", () => {
    const network = fixture("ring-brackenwold.json");
    const layout = layoutSingleLine(network);
    expect(layout.loops.length).toBeGreaterThan(0);
    const lowest = Math.max(...layout.buses.map((b) => b.yBottom));
    for (const loop of layout.loops) {
      expect(loop.y).toBeGreaterThan(lowest);
      expect(loop.y).toBeLessThan(layout.height);
    }
  });
});

// Built iteratively and with maps throughout: a 50,000-bus chain must neither overflow the stack
// (the drawing used to recurse once per bus) nor take quadratic time.
describe("the single-line drawing at scale", { timeout: 300_000 }, () => {
  it("draws a 50,000-bus chain on one row, each bus one column further out", () => {
    const layout = layoutSingleLine(chainNetwork(50_000));
    expect(layout.buses).toHaveLength(50_000);
    expect(layout.buses[49_999].column).toBe(49_999);
    expect(new Set(layout.branches.map((b) => b.y)).size).toBe(1);
    expect(layout.loops).toEqual([]);
  });

  it("draws a 50,000-spur star with each spur on a row of its own", () => {
    const layout = layoutSingleLine(starNetwork(50_000));
    const hub = layout.buses.find((b) => b.id === "b0")!;
    expect([hub.firstRow, hub.lastRow]).toEqual([0, 49_999]);
    expect(new Set(layout.branches.map((b) => b.y)).size).toBe(50_000);
  });

  it("hangs 20,000 loads off one bus, one row each", () => {
    const layout = layoutSingleLine(crowdedBusNetwork(20_000));
    const loads = layout.attachments.filter((a) => a.kind === "load");
    expect(loads).toHaveLength(20_000);
    expect(new Set(loads.map((a) => a.y)).size).toBe(20_000);
  });
});
