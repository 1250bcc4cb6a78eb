import { readdirSync, readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { validateNetwork, type Network } from "#solver/schema.ts";
import { arrangeLeftToRight } from "#app/components/sheet/arrange.ts";
import { documentToFlow, GRID_PX, sheetGeometry, type SheetContent } from "#app/components/sheet/flowModel.ts";
import { overlappingBoxes, sheetBoxes, textWidthPx, type LabelBox, type ShownReadings } from "#app/components/sheet/labelBoxes.ts";
import { previewLoadsCsv } from "#app/lib/imports/loadsCsv.ts";
import { sheetFeeder } from "../../../../bench/sheetFeeder.ts";

const fixtures = readdirSync("tests/fixtures").filter((f) => f.endsWith(".json"));

function load(file: string): Network {
  const parsed = validateNetwork(JSON.parse(readFileSync(`tests/fixtures/${file}`, "utf8")));
  if (!parsed.ok) throw new Error(`${file} does not validate`);
  return parsed.network;
}

/** Overlapping pairs of boxes (symbols, bars, names, Readings), named for the failure message. */
function overlaps(content: SheetContent, shown: ShownReadings = { faults: false }): string[] {
  return overlappingBoxes(sheetBoxes(sheetGeometry(content.document, content.layout), shown)).map(([a, b]) => `${a.owner} ${a.part} × ${b.owner} ${b.part}`);
}

/** A large loads import: 120 rows spread over every busbar, names short and long. */
function withImportedLoads(network: Network): Network {
  const rows = ["bus,name,P (MW),Q (Mvar)"];
  for (let i = 0; i < 120; i++) {
    const bus = network.buses[i % network.buses.length];
    const name = i % 3 === 0 ? `Feeder ${i}` : i % 3 === 1 ? `Calder Flats industrial estate unit ${i}` : `Pump house ${i} (summer)`;
    rows.push(`${bus.id},${name},${(0.05 + (i % 7) * 0.11).toFixed(2)},${(0.01 + (i % 5) * 0.07).toFixed(2)}`);
  }
  const preview = previewLoadsCsv(rows.join("\n"), network);
  if (!preview.ok || !preview.network) throw new Error(`import refused: ${preview.fileError ?? JSON.stringify(preview.rowErrors.slice(0, 3))}`);
  return preview.network;
}

/** The demo with its 66 kV line doubled and tripled (same buses, same data, new ids). */
function withParallelLines(network: Network, copies: number): Network {
  const line = network.lines.find((l) => l.id === "l-fell")!;
  const extra = Array.from({ length: copies }, (_, i) => ({ ...line, id: `l-fell-${i + 2}`, name: `${line.name} circuit ${i + 2}` }));
  return { ...network, lines: [...network.lines, ...extra] };
}

describe("arrange left to right", () => {
  for (const file of fixtures) {
    it(`lays ${file} out on the grid with no two boxes (symbols, names, Readings) overlapping`, () => {
      const doc = load(file);
      const arranged = arrangeLeftToRight({ document: doc, layout: {} });
      const { nodes } = documentToFlow(arranged.document, arranged.layout);
      for (const n of nodes) {
        expect(Math.abs(n.position.x % GRID_PX)).toBe(0);
        expect(Math.abs(n.position.y % GRID_PX)).toBe(0);
      }
      expect(overlaps(arranged)).toEqual([]);
      // Arranged with fault levels shown, their longer Readings are kept clear too.
      const withFaults = { faults: true };
      expect(overlaps(arrangeLeftToRight({ document: doc, layout: {} }, withFaults), withFaults)).toEqual([]);
      // the document changed only in bus positions
      expect(arranged.document.buses.map((b) => b.id)).toEqual(doc.buses.map((b) => b.id));
      expect(arranged.document.lines).toBe(doc.lines);
    });
  }

  it("leaves no overlapping words after a large loads import, on every fixture", () => {
    for (const file of fixtures) {
      const imported = withImportedLoads(load(file));
      expect(imported.loads.length).toBeGreaterThanOrEqual(120);
      expect(overlaps(arrangeLeftToRight({ document: imported, layout: {} })), file).toEqual([]);
      expect(overlaps(arrangeLeftToRight({ document: imported, layout: {} }, { faults: true }), { faults: true }), `${file} with fault levels`).toEqual([]);
    }
  });

  it("keeps parallel lines and their words apart, arranged and as first drawn", () => {
    for (const copies of [1, 2, 3]) {
      const doc = withParallelLines(load("tarn-head-calder-flats.json"), copies);
      expect(overlaps(arrangeLeftToRight({ document: doc, layout: {} })), `${copies + 1} circuits`).toEqual([]);
      // Before any arranging, the default places fan the circuits out instead of stacking them.
      const drawn = overlappingBoxes(sheetBoxes(sheetGeometry(doc, {}), { faults: false })).filter(([a, b]) => a.part === "symbol" && b.part === "symbol");
      expect(drawn.map(([a, b]) => `${a.owner} × ${b.owner}`)).toEqual([]);
    }
  });

  it("arranges a 400-bus drawing in one sweep with nothing overlapping", () => {
    const { network } = sheetFeeder(4 + 5 * 200);
    expect(network.buses.length).toBeGreaterThanOrEqual(400);
    const started = performance.now();
    const arranged = arrangeLeftToRight({ document: network, layout: {} });
    // Layered by distance from the slack and walked once (the general graph layout it replaced
    // took about 30 s here).
    expect(performance.now() - started).toBeLessThan(10_000);
    expect(overlaps(arranged)).toEqual([]);
  });

  it("keeps room for the envelope's Readings, which name the case that sets each figure", () => {
    const doc = load("tarn-head-calder-flats.json");
    const longest = (doc.cases ?? []).map((c) => c.name).reduce((a, b) => (b.length > a.length ? b : a), "");
    expect(longest.length).toBeGreaterThan(0);
    for (const faults of [false, true]) {
      const shown = { faults, envelopeCase: longest };
      expect(overlaps(arrangeLeftToRight({ document: withImportedLoads(doc), layout: {} }, shown), shown)).toEqual([]);
    }
  });

  it("runs the hydro chain from the generator towards the loads", () => {
    const arranged = arrangeLeftToRight({ document: load("tarn-head-calder-flats.json"), layout: {} });
    const x = (id: string) => documentToFlow(arranged.document, arranged.layout).nodes.find((n) => n.id === id)!.position.x;
    const chain = ["g-tarn", "b-tarn-11", "t-tarn", "b-tarn-66", "l-fell", "b-calder-66", "t-calder", "b-calder-11", "l-mine", "b-mine", "ld-mine"];
    for (let i = 1; i < chain.length; i++) expect(x(chain[i]), `${chain[i - 1]} before ${chain[i]}`).toBeGreaterThan(x(chain[i - 1]));
  });

  it("keeps the main chain on one row", () => {
    const arranged = arrangeLeftToRight({ document: load("tarn-head-calder-flats.json"), layout: {} });
    const y = (id: string) => arranged.document.buses.find((b) => b.id === id)!.y;
    expect(new Set(["b-tarn-11", "b-tarn-66", "b-calder-66", "b-calder-11"].map(y)).size).toBe(1);
  });

  it("starts the solar example from its grid infeed, the slack", () => {
    const arranged = arrangeLeftToRight({ document: load("hollin-moor-solar.json"), layout: {} });
    const bus = (id: string) => arranged.document.buses.find((b) => b.id === id)!.x!;
    expect(bus("b-greyscar")).toBeLessThan(bus("b-hollin-132"));
    expect(bus("b-hollin-132")).toBeLessThan(bus("b-hollin-33"));
  });
});

describe("label boxes", () => {
  it("counts the same overlapping pairs as comparing every pair, each once", () => {
    let seed = 7;
    const random = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
    const boxes: LabelBox[] = Array.from({ length: 300 }, (_, i) => {
      const l = random() * 2000;
      const t = random() * 2000;
      // a few tall boxes (bars) span many buckets
      const tall = i % 25 === 0 ? 900 : 10 + random() * 60;
      return { owner: `e${i}`, part: "name", l, r: l + 10 + random() * 120, t, b: t + tall };
    });
    let expected = 0;
    for (let i = 0; i < boxes.length; i++)
      for (let j = i + 1; j < boxes.length; j++) {
        const [a, b] = [boxes[i], boxes[j]];
        if (a.l < b.r && b.l < a.r && a.t < b.b && b.t < a.b) expected++;
      }
    expect(expected).toBeGreaterThan(10);
    expect(overlappingBoxes(boxes)).toHaveLength(expected);
  });

  it("measures words by Barlow's widths", () => {
    // 10 × "0" at 0.54 em, 11 px: 59.4 px, plus the spare pixel
    expect(textWidthPx("0000000000", 11)).toBe(61);
    expect(textWidthPx("Tarn Head 11 kV", 11)).toBeGreaterThan(textWidthPx("Tarn", 11));
  });
});
