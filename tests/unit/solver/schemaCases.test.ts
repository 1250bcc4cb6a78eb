// Version 2 of the network file: operating cases and load growth, and that version 1 reads as before.
import { describe, expect, it } from "vitest";
import { validateNetwork, type NetworkInput } from "#solver/schema.ts";
import { fixture } from "./fixtures.ts";

// The demo as a version 1 file: its drawing without the cases it ships with.
const { cases: _cases, growth: _growth, ...drawing } = fixture("tarn-head-calder-flats.json").document as NetworkInput;
// Its regulating tap changer is a version 2 field too: a version 1 file keeps its taps as drawn.
const tarn: NetworkInput = { ...drawing, version: 1, transformers: drawing.transformers?.map(({ tapControl: _tap, ...t }) => t) };

function withCases(edit: (doc: NetworkInput) => void): NetworkInput {
  const doc = structuredClone(tarn);
  doc.version = 2;
  edit(doc);
  return doc;
}

function issuesOf(doc: unknown) {
  const result = validateNetwork(doc);
  if (result.ok) throw new Error("expected the document to be rejected");
  return result.issues;
}

describe("operating cases and growth in the network file", () => {
  it("accepts cases and growth in a version 2 file and fills the load scale", () => {
    const result = validateNetwork(
      withCases((d) => {
        d.cases = [
          { id: "peak", name: "Winter peak", hoursPerYear: 1500, loads: { "ld-town": 1.1 } },
          { id: "light", name: "Summer light load", hoursPerYear: 4000, loadScale: 0.3, outOfService: ["l-town"], sources: { "g-tarn": { voltagePu: 1.02 } } },
        ];
        d.growth = { ratePctPerYear: 2, years: 20 };
      }),
    );
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.network.cases?.map((c) => c.loadScale)).toEqual([1, 0.3]);
    expect(result.network.growth).toEqual({ ratePctPerYear: 2, years: 20 });
  });

  it("reads a version 1 file as before, with no cases", () => {
    const result = validateNetwork(tarn);
    expect(result.ok && result.network.cases).toBeUndefined();
  });

  it("asks for version 2 when a version 1 file carries cases or growth", () => {
    const doc = structuredClone(tarn);
    doc.version = 1;
    doc.cases = [{ id: "peak", name: "Peak" }];
    doc.growth = { ratePctPerYear: 1, years: 5 };
    expect(issuesOf(doc)).toEqual([
      { path: "cases", message: 'operating cases need "version": 2' },
      { path: "growth", message: 'load growth needs "version": 2' },
    ]);
  });

  it("names a case's reference to a load, source or element that does not exist", () => {
    const issues = issuesOf(
      withCases((d) => {
        d.cases = [{ id: "peak", name: "Peak", loads: { "ld-nowhere": 1 }, sources: { "g-none": { pMW: 3 } }, outOfService: ["b-town"] }];
      }),
    );
    expect(issues).toEqual([
      { path: "cases[0].loads.ld-nowhere", message: 'Case "Peak" (peak) scales load "ld-nowhere", which does not exist' },
      { path: "cases[0].sources.g-none", message: 'Case "Peak" (peak) sets source "g-none", which does not exist' },
      {
        path: "cases[0].outOfService[0]",
        message: 'Case "Peak" (peak) takes "b-town" out of service, but no line, transformer, load, shunt or source has that id',
      },
    ]);
  });

  it("rejects a repeated case id and cases worth more than a year's hours", () => {
    const issues = issuesOf(
      withCases((d) => {
        d.cases = [
          { id: "peak", name: "Peak", hoursPerYear: 5000 },
          { id: "peak", name: "Peak again", hoursPerYear: 4000 },
        ];
      }),
    );
    expect(issues).toEqual([
      { path: "cases[1].id", message: 'case id "peak" is already used by cases[0]' },
      { path: "cases", message: "the cases stand for 9000 hours together, more than the 8784 hours of a year" },
    ]);
  });

  it("rejects a fractional growth horizon", () => {
    const issues = issuesOf(withCases((d) => (d.growth = { ratePctPerYear: 2, years: 2.5 })));
    expect(issues).toEqual([{ path: "growth.years", message: "must be a whole number of years" }]);
  });

  it("rejects an unknown field in a source override", () => {
    const issues = issuesOf(withCases((d) => (d.cases = [{ id: "p", name: "P", sources: { "g-tarn": { pMw: 3 } as never } }])));
    expect(issues).toContainEqual({ path: "cases[0].sources.g-tarn", message: 'unknown field "pMw"' });
  });
});
