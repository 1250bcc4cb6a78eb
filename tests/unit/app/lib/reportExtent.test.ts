import { describe, expect, it } from "vitest";
import { reportPart } from "#app/lib/reportExtent.ts";
import { solveNetwork } from "#solver/index.ts";
import { syntheticFeeder } from "../../../bench/syntheticFeeder.ts";
import { fixture } from "../../solver/fixtures.ts";

function solved(document: unknown) {
  const outcome = solveNetwork(document);
  if (!outcome.ok) throw new Error("fixture must solve");
  return outcome;
}

describe("what a report lists of a large network", () => {
  it("lists everything of a network within the limit", () => {
    const { network, result } = solved(fixture("tarn-head-calder-flats.json").document);
    const part = reportPart(network, result);
    expect(part.extent.trimmed).toBe(false);
    expect(part.network).toBe(network);
    expect(part.result).toBe(result);
  });

  it("lists the first buses of a 3,000-bus feeder, the branches wholly among them, and counts everything", () => {
    const { network, result } = solved(syntheticFeeder(3000));
    const part = reportPart(network, result, { max: 100 });
    expect(part.extent).toMatchObject({ trimmed: true, counts: { buses: network.buses.length, lines: network.lines.length } });
    expect(part.extent.buses.total).toBe(network.buses.length);
    const busIds = new Set(part.network.buses.map((b) => b.id));
    // Every listed branch has both ends listed, so no table row names a bus by its id.
    for (const l of part.network.lines) expect(busIds.has(l.fromBus) && busIds.has(l.toBus)).toBe(true);
    for (const t of part.network.transformers) expect(busIds.has(t.hvBus) && busIds.has(t.lvBus)).toBe(true);
    for (const load of part.network.loads) expect(busIds.has(load.bus)).toBe(true);
    expect(part.result.loadFlow.buses.map((b) => b.id).every((id) => busIds.has(id))).toBe(true);
    expect(part.result.loadFlow.branches.length).toBe(part.extent.branches.listed);
    expect(part.extent.branches.listed).toBeLessThan(part.extent.branches.total);
    // Totals and convergence still describe the whole network.
    expect(part.result.loadFlow.totals).toEqual(result.loadFlow.totals);
    expect(JSON.stringify(part).length).toBeLessThan(JSON.stringify({ network, result }).length / 10);
  });

  it("keeps the element each listed check names, and a ladder section's buses, wherever they are in the file", () => {
    const { network, result } = solved(syntheticFeeder(3000));
    const lastBus = network.buses[network.buses.length - 1];
    const farLine = network.lines[network.lines.length - 1];
    const withChecks = {
      ...result,
      checks: [{ element: farLine.id, kind: "line-overload" as const, value: 120, limit: 100, message: "over its ampacity" }],
    };
    const part = reportPart(network, withChecks, { max: 50, alsoBuses: [lastBus.id] });
    const busIds = new Set(part.network.buses.map((b) => b.id));
    expect(busIds.has(lastBus.id)).toBe(true);
    expect(part.network.lines.some((l) => l.id === farLine.id)).toBe(true);
    expect(busIds.has(farLine.fromBus) && busIds.has(farLine.toBus)).toBe(true);
  });
});
