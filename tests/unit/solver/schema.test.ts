// The network file's rules, each reported with its path and a message that names the element.
import { describe, expect, it } from "vitest";
import { networkJsonSchema, validateNetwork, type NetworkInput } from "#solver/schema.ts";
import { fixture } from "./fixtures.ts";

const tarn = fixture("tarn-head-calder-flats.json").document as NetworkInput;

/** A deep copy of the demo with one change made by `edit`. */
function changed(edit: (doc: NetworkInput) => void): NetworkInput {
  const doc = structuredClone(tarn);
  edit(doc);
  return doc;
}

function issuesOf(doc: unknown) {
  const result = validateNetwork(doc);
  if (result.ok) throw new Error("expected the document to be rejected");
  return result.issues;
}

describe("the network file's rules", () => {
  it("accepts the demo and fills the documented defaults", () => {
    const result = validateNetwork(tarn);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.network.baseMVA).toBe(100);
    const calder66 = result.network.buses.find((b) => b.id === "b-calder-66")!;
    expect([calder66.vMinPu, calder66.vMaxPu]).toEqual([0.95, 1.05]);
  });

  it("rejects an unknown field, naming it and its path", () => {
    const issues = issuesOf(changed((d) => Object.assign(d.lines![0], { colour: "red" })));
    expect(issues).toContainEqual({ path: "lines[0]", message: 'unknown field "colour"' });
  });

  it("reports a wrong type in the planner's words", () => {
    const issues = issuesOf(changed((d) => Object.assign(d.buses[0], { nominalKV: "11 kV" })));
    expect(issues).toContainEqual({ path: "buses[0].nominalKV", message: 'must be a number, not the text "11 kV"' });
  });

  it("finds a repeated id across collections", () => {
    const issues = issuesOf(changed((d) => (d.loads![0].id = "b-town")));
    expect(issues.find((i) => i.path === "loads[0].id")?.message).toMatch(/"b-town" is already used by buses\[5\]/);
  });

  it("names a reference to a bus that does not exist", () => {
    const issues = issuesOf(changed((d) => (d.loads![1].bus = "b-nowhere")));
    expect(issues.find((i) => i.path === "loads[1].bus")?.message).toMatch(/Calder Flats town.*"b-nowhere", which does not exist/);
  });

  it("wants exactly one slack in each connected group", () => {
    const none = issuesOf(changed((d) => (d.sources![0].control = "pq")));
    expect(none.some((i) => /no slack source/.test(i.message))).toBe(true);

    const two = issuesOf(
      changed((d) =>
        d.sources!.push({ id: "g-second", name: "Second unit", bus: "b-town", kind: "generator", control: "slack", ratedMVA: 5, xdSubtransientPct: 15 }),
      ),
    );
    expect(two).toContainEqual(expect.objectContaining({ path: "sources[1].control", message: expect.stringMatching(/second slack/) }));
  });

  it("allows a winding 15 % off its bus and no more", () => {
    expect(validateNetwork(changed((d) => (d.transformers![0].hvKV = 66 * 1.15))).ok).toBe(true);
    const issues = issuesOf(changed((d) => (d.transformers![0].hvKV = 66 * 1.16)));
    expect(issues.find((i) => i.path === "transformers[0].hvKV")?.message).toMatch(/more than 15 % away/);
  });

  it("keeps a line within one voltage level", () => {
    const issues = issuesOf(changed((d) => (d.lines![0].toBus = "b-calder-11")));
    expect(issues.find((i) => i.path === "lines[0].toBus")?.message).toMatch(/one voltage level/);
  });

  it("wants a voltage band with its minimum below its maximum", () => {
    const issues = issuesOf(changed((d) => Object.assign(d.buses[0], { vMinPu: 1.1, vMaxPu: 1.05 })));
    expect(issues.map((i) => i.path)).toContain("buses[0].vMinPu");
  });

  it("rejects non-positive ratings and lengths", () => {
    const issues = issuesOf(
      changed((d) => {
        d.lines![0].lengthKm = 0;
        d.transformers![0].ratedMVA = -25;
      }),
    );
    expect(issues.map((i) => i.path)).toEqual(expect.arrayContaining(["lines[0].lengthKm", "transformers[0].ratedMVA"]));
  });

  it("needs a transformer's resistance from its load loss or its X/R", () => {
    const issues = issuesOf(changed((d) => delete d.transformers![0].loadLossKW));
    expect(issues.find((i) => i.path === "transformers[0].xOverR")?.message).toMatch(/loadLossKW or xOverR/);
  });

  // IEC 60076-1: star against delta shifts by an odd clock number, like windings by an even one
  // (common practice: Dyn11, YNd11, Yzn11, Dz0, YNyn0, Dd0 exist; Dyn0, YNy1 cannot be wound).
  it.each(["YNd11", "Dyn11", "Dyn1", "YNyn0", "Dd0", "Yzn11", "Dz0", "Yd1"])("accepts the vector group %s", (group) => {
    expect(validateNetwork(changed((d) => (d.transformers![0].vectorGroup = group))).ok).toBe(true);
  });

  it.each(["Dyn0", "YNy1", "Dd11", "Xy0", "Dyn12", "dyn11"])("rejects the vector group %s", (group) => {
    const issues = issuesOf(changed((d) => (d.transformers![0].vectorGroup = group)));
    expect(issues.map((i) => i.path)).toContain("transformers[0].vectorGroup");
  });

  it("reports every problem together rather than the first alone", () => {
    const issues = issuesOf(
      changed((d) => {
        d.loads![0].bus = "b-nowhere";
        d.lines![1].lengthKm = -3;
        d.transformers![1].vectorGroup = "Dyn0";
      }),
    );
    expect(issues.length).toBeGreaterThanOrEqual(2);
  });

  it("never throws on junk", () => {
    for (const junk of [null, 42, "text", [], {}, { format: "kilostep.network" }, { buses: [null] }]) {
      const result = validateNetwork(junk);
      expect(result.ok).toBe(false);
    }
  });

  it("publishes a JSON Schema with the documented required fields", () => {
    const schema = networkJsonSchema() as { required: string[]; properties: Record<string, unknown>; additionalProperties: boolean };
    expect(schema.required).toEqual(expect.arrayContaining(["format", "version", "name", "frequencyHz", "buses"]));
    expect(schema.required).not.toContain("baseMVA");
    expect(schema.additionalProperties).toBe(false);
    expect(Object.keys(schema.properties)).toEqual(
      expect.arrayContaining(["buses", "sources", "transformers", "lines", "loads", "shunts"]),
    );
  });
});
