import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { validateNetwork, type Network } from "#solver/schema.ts";
import { arrangeLeftToRight } from "#app/components/sheet/arrange.ts";
import { documentToFlow, GRID_PX } from "#app/components/sheet/flowModel.ts";

function load(file: string): Network {
  const parsed = validateNetwork(JSON.parse(readFileSync(`tests/fixtures/${file}`, "utf8")));
  if (!parsed.ok) throw new Error(`${file} does not validate`);
  return parsed.network;
}

describe("arrange left to right", () => {
  for (const file of ["tarn-head-calder-flats.json", "hollin-moor-solar.json"]) {
    it(`lays ${file} out without overlaps, on the grid`, () => {
      const doc = load(file);
      const arranged = arrangeLeftToRight({ document: doc, layout: {} });
      const { nodes } = documentToFlow(arranged.document, arranged.layout);
      for (const n of nodes) {
        expect(Math.abs(n.position.x % GRID_PX)).toBe(0);
        expect(Math.abs(n.position.y % GRID_PX)).toBe(0);
      }
      const boxes = nodes.map((n) => ({ id: n.id, l: n.position.x - n.width! / 2, r: n.position.x + n.width! / 2, t: n.position.y - n.height! / 2, b: n.position.y + n.height! / 2 }));
      for (const a of boxes)
        for (const b of boxes)
          if (a.id < b.id) {
            const overlap = a.l < b.r && b.l < a.r && a.t < b.b && b.t < a.b;
            expect(overlap, `${a.id} overlaps ${b.id}`).toBe(false);
          }
      // the document changed only in bus positions
      expect(arranged.document.buses.map((b) => b.id)).toEqual(doc.buses.map((b) => b.id));
      expect(arranged.document.lines).toBe(doc.lines);
    });
  }

  it("runs the hydro chain from the generator towards the loads", () => {
    const arranged = arrangeLeftToRight({ document: load("tarn-head-calder-flats.json"), layout: {} });
    const x = (id: string) => documentToFlow(arranged.document, arranged.layout).nodes.find((n) => n.id === id)!.position.x;
    const chain = ["g-tarn", "b-tarn-11", "t-tarn", "b-tarn-66", "l-fell", "b-calder-66", "t-calder", "b-calder-11", "l-mine", "b-mine", "ld-mine"];
    for (let i = 1; i < chain.length; i++) expect(x(chain[i]), `${chain[i - 1]} before ${chain[i]}`).toBeGreaterThan(x(chain[i - 1]));
  });

  it("starts the solar example from its grid infeed, the slack", () => {
    const arranged = arrangeLeftToRight({ document: load("hollin-moor-solar.json"), layout: {} });
    const bus = (id: string) => arranged.document.buses.find((b) => b.id === id)!.x!;
    expect(bus("b-greyscar")).toBeLessThan(bus("b-hollin-132"));
    expect(bus("b-hollin-132")).toBeLessThan(bus("b-hollin-33"));
  });
});
