import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { validateNetwork, type Network } from "#solver/schema.ts";
import { placePart } from "#app/components/sheet/sheetEdits.ts";
import {
  applyMoves,
  busAt,
  documentToFlow,
  freeSpotNear,
  parseWireId,
  sheetGeometry,
  wireId,
  type SheetContent,
} from "#app/components/sheet/flowModel.ts";
import { chainNetwork, crowdedBusNetwork, starNetwork } from "../../../largeNetworks.ts";

function demo(): Network {
  const parsed = validateNetwork(JSON.parse(readFileSync("tests/fixtures/tarn-head-calder-flats.json", "utf8")));
  if (!parsed.ok) throw new Error("demo network does not validate");
  return parsed.network;
}

describe("document to flow", () => {
  const doc = demo();
  const { nodes, edges } = documentToFlow(doc, {});

  it("draws one node per element and one wire per bus reference", () => {
    expect(nodes).toHaveLength(6 + 1 + 2 + 3 + 2 + 1);
    // references: 1 source + 2×2 transformers + 3×2 lines + 2 loads + 1 shunt
    expect(edges).toHaveLength(1 + 4 + 6 + 2 + 1);
    const busIds = new Set(doc.buses.map((b) => b.id));
    for (const edge of edges) {
      expect(busIds.has(edge.target)).toBe(true);
      expect(edge.targetHandle).toBe("bar");
      expect(edge.id).toBe(wireId(edge.source, edge.sourceHandle as never));
    }
    const hv = edges.find((e) => e.id === "t-calder~hv")!;
    expect(hv.target).toBe("b-calder-66");
  });

  it("puts busbars where the document says and hangs elements beside them", () => {
    const at = (id: string) => nodes.find((n) => n.id === id)!.position;
    expect(at("b-tarn-66")).toEqual({ x: 240, y: 0 });
    expect(at("b-mine")).toEqual({ x: 960, y: -120 });
    // transformer and line halfway between their buses
    expect(at("t-tarn")).toEqual({ x: 120, y: 0 });
    expect(at("l-mine")).toEqual({ x: 840, y: -60 });
    // the source on the left of its bus, loads on the right
    expect(at("g-tarn").x).toBeLessThan(0);
    expect(at("ld-mine").x).toBeGreaterThan(960);
    expect(at("ld-mine").y).toBe(-120);
  });

  it("turns terminals towards their buses", () => {
    const sides = (id: string) => nodes.find((n) => n.id === id)!.data.sides;
    // Tarn Head step-up: the 66 kV bus is to the right of the 11 kV bus
    expect(sides("t-tarn")).toEqual({ hv: "right", lv: "left" });
    expect(sides("t-calder")).toEqual({ hv: "left", lv: "right" });
    expect(sides("g-tarn")).toEqual({ t: "right" });
    expect(sides("ld-town")).toEqual({ t: "left" });
  });

  it("routes wires straight onto the busbar and grows the bar to reach them", () => {
    const wire = edges.find((e) => e.id === "t-tarn~hv")!;
    // terminal at the transformer's right edge (120 + 84/2), landing on the bar's left face (240 − 3)
    expect(wire.data!.points).toEqual([
      { x: 162, y: 0 },
      { x: 237, y: 0 },
    ]);
    const calder = nodes.find((n) => n.id === "b-calder-11")!;
    // wires to the two feeders land 60 px above and below the bus centre
    expect(calder.data.bar!.top).toBeLessThanOrEqual(-60 - 3);
    expect(calder.data.bar!.bottom).toBeGreaterThanOrEqual(60 + 3);
    expect(calder.height).toBe(2 * Math.max(-calder.data.bar!.top, calder.data.bar!.bottom));
    // a bar reaches only as far as its wires: the mine bus's feeder arrives from below its centre
    const mine = nodes.find((n) => n.id === "b-mine")!;
    expect(mine.data.bar!.top).toBe(-40);
    expect(mine.data.bar!.bottom).toBeGreaterThanOrEqual(60);
  });

  it("marks selected nodes and wires and leaves the document untouched", () => {
    const before = JSON.stringify(doc);
    const flow = documentToFlow(doc, {}, { selection: new Set(["b-town", "l-town~to"]) });
    expect(flow.nodes.filter((n) => n.selected).map((n) => n.id)).toEqual(["b-town"]);
    expect(flow.edges.filter((e) => e.selected).map((e) => e.id)).toEqual(["l-town~to"]);
    expect(JSON.stringify(doc)).toBe(before);
  });

  it("reads wire ids back", () => {
    expect(parseWireId("t-tarn~hv")).toEqual({ elementId: "t-tarn", terminal: "hv" });
    expect(parseWireId("a~b~from")).toEqual({ elementId: "a~b", terminal: "from" });
    expect(parseWireId("b-town")).toBeUndefined();
    expect(parseWireId("x~nope")).toBeUndefined();
  });

  it("finds the busbar under a drop point", () => {
    const geometry = sheetGeometry(doc, {});
    expect(busAt(geometry, { x: 244, y: 10 })).toBe("b-tarn-66");
    expect(busAt(geometry, { x: 360, y: 0 })).toBeUndefined();
  });
});

describe("flow to document", () => {
  const content: SheetContent = { document: demo(), layout: {} };

  it("writes a moved bus into the document and carries its elements along", () => {
    const moved = applyMoves(content, { "b-mine": { x: 1000, y: -200 } });
    expect(moved.document.buses.find((b) => b.id === "b-mine")).toMatchObject({ x: 1000, y: -200 });
    expect(moved.layout).toEqual({});
    const load = documentToFlow(moved.document, moved.layout).nodes.find((n) => n.id === "ld-mine")!;
    expect(load.position).toEqual({ x: 1120, y: -200 });
  });

  it("keeps other elements' moves in the layout, not in the document", () => {
    const moved = applyMoves(content, { "ld-mine": { x: 1100, y: -80 } });
    expect(moved.document).toBe(content.document);
    expect(moved.layout["ld-mine"]).toEqual({ x: 140, y: 40 });
    const load = documentToFlow(moved.document, moved.layout).nodes.find((n) => n.id === "ld-mine")!;
    expect(load.position).toEqual({ x: 1100, y: -80 });
  });

  it("keeps a load's offset when it is dragged together with its bus", () => {
    const once = applyMoves(content, { "ld-mine": { x: 1100, y: -80 } });
    const both = applyMoves(once, { "b-mine": { x: 1060, y: -120 }, "ld-mine": { x: 1200, y: -80 } });
    expect(both.layout["ld-mine"]).toEqual({ x: 140, y: 40 });
  });
});

describe("default places beside busbars", () => {
  const load = (file: string) => {
    const parsed = validateNetwork(JSON.parse(readFileSync(`tests/fixtures/${file}`, "utf8")));
    if (!parsed.ok) throw new Error(`${file} does not validate`);
    return parsed.network;
  };

  for (const file of ["tarn-head-calder-flats.json", "hollin-moor-solar.json"]) {
    it(`keeps every element of ${file} at least a slot apart, labels included`, () => {
      const { nodes } = documentToFlow(load(file), {});
      // a node's box grown by its name above and its readings below (about 30 px each)
      const box = (n: (typeof nodes)[number]) => ({ id: n.id, l: n.position.x - n.width! / 2, r: n.position.x + n.width! / 2, t: n.position.y - n.height! / 2 - 30, b: n.position.y + n.height! / 2 + 30 });
      const parts = nodes.filter((n) => n.type !== "bus").map(box);
      for (const a of parts)
        for (const b of parts)
          if (a.id < b.id) expect(a.l < b.r && b.l < a.r && a.t < b.b && b.t < a.b, `${a.id} overlaps ${b.id}`).toBe(false);
    });
  }

  it("moves an infeed to the free side of its bar when a branch leaves on its usual side", () => {
    const { nodes } = documentToFlow(load("hollin-moor-solar.json"), {});
    const at = (id: string) => nodes.find((n) => n.id === id)!.position;
    // the export line arrives at the grid bus from the left, so the infeed hangs on the right
    expect(at("g-greyscar").x).toBeGreaterThan(at("b-greyscar").x);
    expect(at("g-greyscar").y).toBe(at("b-greyscar").y);
  });
});

describe("placing from the keyboard", () => {
  it("finds a free spot instead of dropping a part onto a busbar or a wire", () => {
    const doc = demo();
    const geometry = sheetGeometry(doc, {});
    // the centre of the Calder Flats 66 kV bus: taken by the bar and its wires
    const spot = freeSpotNear(geometry, { x: 480, y: 0 }, { width: 60, height: 40 });
    expect(spot).not.toEqual({ x: 480, y: 0 });
    const placed = placePart({ document: doc, layout: {} }, "capacitor", spot);
    const after = sheetGeometry(placed.document, placed.layout);
    expect(busAt(after, spot, 40)).toBeUndefined();
    // an empty corner is taken as it is
    expect(freeSpotNear(geometry, { x: 0, y: 600 }, { width: 60, height: 40 })).toEqual({ x: 0, y: 600 });
  });
});

// The drawing's geometry is derived on every edit, so it must stay linear at any size.
describe("document to flow at scale", () => {
  // Generous time for a loaded machine: the check is the answer; quadratic work would need hours.
  it("lays out a 50,000-bus chain and a 50,000-spur star: every element placed, one wire per reference", { timeout: 300_000 }, () => {
    for (const network of [chainNetwork(50_000), starNetwork(50_000)]) {
      const geometry = sheetGeometry(network, {});
      const elements = network.buses.length + network.sources.length + network.lines.length + network.loads.length;
      expect(geometry.centers.size).toBe(elements);
      expect(geometry.wires).toHaveLength(network.sources.length + 2 * network.lines.length + network.loads.length);
    }
  });

  it("places the loads of a bus with 20,000 of them, the first beside the bar and none on another's spot", { timeout: 300_000 }, () => {
    const network = crowdedBusNetwork(20_000);
    const geometry = sheetGeometry(network, {});
    const bar = geometry.busCenters.get("b1")!;
    expect(geometry.centers.get("ld0")).toEqual({ x: bar.x + 120, y: bar.y });
    const spots = new Set(network.loads.slice(0, 100).map((l) => JSON.stringify(geometry.centers.get(l.id))));
    expect(spots.size).toBe(100);
  });
});
