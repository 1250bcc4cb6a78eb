import { readFileSync } from "node:fs";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  busSchema,
  lineSchema,
  loadSchema,
  shuntSchema,
  sourceSchema,
  transformerSchema,
  validateNetwork,
  type Network,
} from "#solver/schema.ts";
import { documentToFlow, replaceElement, sheetGeometry, type SheetContent } from "#app/components/sheet/flowModel.ts";
import { indexElements } from "#app/lib/networkElements.ts";
import {
  connectTerminal,
  copyItems,
  deleteItems,
  newPartElement,
  partKinds,
  pasteClipboard,
  placePart,
} from "#app/components/sheet/sheetEdits.ts";

function demo(): Network {
  const parsed = validateNetwork(JSON.parse(readFileSync("tests/fixtures/tarn-head-calder-flats.json", "utf8")));
  if (!parsed.ok) throw new Error("demo network does not validate");
  return parsed.network;
}

const empty: Network = {
  format: "kilostep.network", version: 1, name: "Empty", frequencyHz: 50, baseMVA: 100,
  buses: [], sources: [], transformers: [], lines: [], loads: [], shunts: [],
};

describe("placing parts", () => {
  it("gives every part values its own schema accepts, apart from the bus it is not yet wired to", () => {
    const schemas = {
      busbar: busSchema, grid: sourceSchema, generator: sourceSchema, transformer: transformerSchema,
      overhead: lineSchema, cable: lineSchema, load: loadSchema, capacitor: shuntSchema,
    };
    for (const part of partKinds) {
      const element = newPartElement(empty, part, "x-1");
      const parsed = schemas[part].safeParse(element);
      const paths = parsed.success ? [] : parsed.error.issues.map((i) => i.path.join("."));
      expect(paths.every((p) => ["bus", "hvBus", "lvBus", "fromBus", "toBus"].includes(p)), `${part}: ${paths}`).toBe(true);
    }
  });

  it("starts a transformer at 10 MVA, 33/11 kV, 8 %, Dyn11 and a line at 5 km of 0.2 ohm/km", () => {
    expect(newPartElement(empty, "transformer", "t")).toMatchObject({ ratedMVA: 10, hvKV: 33, lvKV: 11, impedancePct: 8, vectorGroup: "Dyn11" });
    expect(newPartElement(empty, "overhead", "l")).toMatchObject({ kind: "overhead", lengthKm: 5, rOhmPerKm: 0.2 });
  });

  it("gives unique ids and names and keeps the drop position", () => {
    let content: SheetContent = { document: empty, layout: {} };
    const ids: string[] = [];
    for (let i = 0; i < 3; i++) {
      const placed = placePart(content, "load", { x: 100 * i, y: 40 });
      content = placed;
      ids.push(placed.id);
    }
    expect(new Set(ids).size).toBe(3);
    expect(new Set(content.document.loads.map((l) => l.name)).size).toBe(3);
    const flow = documentToFlow(content.document, content.layout);
    expect(flow.nodes.find((n) => n.id === ids[2])!.position).toEqual({ x: 200, y: 40 });
    expect(flow.edges).toHaveLength(0);
  });

  it("connects a load dropped onto a busbar", () => {
    const placed = placePart({ document: demo(), layout: {} }, "load", { x: 962, y: 140 }, "b-town");
    expect(placed.document.loads.find((l) => l.id === placed.id)!.bus).toBe("b-town");
  });
});

describe("connecting terminals", () => {
  it("sets the reference and keeps the element where it was drawn", () => {
    const placed = placePart({ document: demo(), layout: {} }, "capacitor", { x: 1100, y: 300 });
    const connected = connectTerminal(placed, placed.id, "t", "b-town");
    expect(connected.document.shunts.find((s) => s.id === placed.id)!.bus).toBe("b-town");
    const centre = sheetGeometry(connected.document, connected.layout).centers.get(placed.id);
    expect(centre).toEqual({ x: 1100, y: 300 });
  });

  it("adopts the bus voltage for a transformer winding more than 15 % away, and says so", () => {
    const placed = placePart({ document: demo(), layout: {} }, "transformer", { x: 600, y: 300 });
    const connected = connectTerminal(placed, placed.id, "hv", "b-calder-66");
    expect(connected.document.transformers.find((t) => t.id === placed.id)!.hvKV).toBe(66);
    expect(connected.notice).toMatch(/HV winding .* set to 66 kV/);
    // 11 kV is the new transformer's LV winding already: nothing to adjust
    const both = connectTerminal(connected, placed.id, "lv", "b-calder-11");
    expect(both.notice).toBeUndefined();
  });

  it("ignores a wire to something that is not a busbar", () => {
    const content = { document: demo(), layout: {} };
    expect(connectTerminal(content, "ld-town", "t", "l-town")).toBe(content);
    expect(connectTerminal(content, "b-town", "t", "b-mine")).toBe(content);
  });
});

describe("deleting", () => {
  it("removes an element and loosens the wires of a deleted busbar without moving anything", () => {
    const content = { document: demo(), layout: {} };
    const before = sheetGeometry(content.document, content.layout);
    const after = deleteItems(content, ["b-town"]);
    expect(after.document.buses.some((b) => b.id === "b-town")).toBe(false);
    expect(after.document.loads.find((l) => l.id === "ld-town")!.bus).toBe("");
    expect(after.document.lines.find((l) => l.id === "l-town")!.toBus).toBe("");
    const geometry = sheetGeometry(after.document, after.layout);
    expect(geometry.centers.get("ld-town")).toEqual(before.centers.get("ld-town"));
    expect(geometry.centers.get("l-town")).toEqual(before.centers.get("l-town"));
  });

  it("takes a deleted element out of the operating cases that mention it, so the network still validates", () => {
    const doc = { ...demo(), cases: [{ id: "repair", name: "Repair", loadScale: 1, loads: { "ld-town": 0.5, "ld-mine": 1.2 }, outOfService: ["l-town", "c-calder"] }] };
    const after = deleteItems({ document: doc, layout: {} }, ["c-calder", "ld-town"]);
    expect(after.document.cases![0]).toMatchObject({ loads: { "ld-mine": 1.2 }, outOfService: ["l-town"] });
    expect(validateNetwork(after.document).ok).toBe(true);
  });

  it("cuts a single wire by its id", () => {
    const after = deleteItems({ document: demo(), layout: {} }, ["t-tarn~lv"]);
    expect(after.document.transformers.find((t) => t.id === "t-tarn")).toMatchObject({ hvBus: "b-tarn-66", lvBus: "" });
  });
});

describe("copy and paste", () => {
  it("renews ids and remaps references among the copies", () => {
    const content = { document: demo(), layout: {} };
    const clip = copyItems(content, ["b-mine", "ld-mine"])!;
    const pasted = pasteClipboard(content, clip, { x: 40, y: 40 });
    expect(pasted.ids).toHaveLength(2);
    const newBus = pasted.document.buses.find((b) => pasted.ids.includes(b.id))!;
    const newLoad = pasted.document.loads.find((l) => pasted.ids.includes(l.id))!;
    expect(newBus.id).not.toBe("b-mine");
    expect(newLoad.bus).toBe(newBus.id);
    expect(newBus).toMatchObject({ x: 1000, y: -80, nominalKV: 11 });
    const ids = [...indexElements(pasted.document).keys()];
    expect(new Set(ids).size).toBe(ids.length);
  });

  it("lets references to uncopied buses come loose, placed at the shifted position", () => {
    const content = { document: demo(), layout: {} };
    const before = sheetGeometry(content.document, content.layout).centers.get("ld-town")!;
    const pasted = pasteClipboard(content, copyItems(content, ["ld-town"])!, { x: 40, y: 40 });
    const load = pasted.document.loads.find((l) => l.id === pasted.ids[0])!;
    expect(load.bus).toBe("");
    expect(sheetGeometry(pasted.document, pasted.layout).centers.get(load.id)).toEqual({ x: before.x + 40, y: before.y + 40 });
  });
});

describe("drawing the hydro chain from the parts shelf", () => {
  it("gives a document that validates and matches the demo's topology", () => {
    let content: SheetContent = { document: { ...empty, name: "Drawn" }, layout: {} };
    const place = (part: Parameters<typeof placePart>[1], x: number, y = 0) => {
      const placed = placePart(content, part, { x, y });
      content = placed;
      return placed.id;
    };
    const set = (id: string, values: Record<string, unknown>) => {
      const entry = indexElements(content.document).get(id)!;
      content = { ...content, document: replaceElement(content.document, entry, { ...entry.element, ...values } as never) };
    };
    const connect = (id: string, terminal: Parameters<typeof connectTerminal>[2], bus: string) => {
      content = connectTerminal(content, id, terminal, bus);
    };
    const b11 = place("busbar", 0);
    const b66 = place("busbar", 240);
    const c66 = place("busbar", 480);
    const c11 = place("busbar", 720);
    set(b66, { nominalKV: 66 });
    set(c66, { nominalKV: 66 });
    const gen = place("generator", -120);
    connect(gen, "t", b11);
    const up = place("transformer", 120);
    connect(up, "hv", b66);
    connect(up, "lv", b11);
    const line = place("overhead", 360);
    connect(line, "from", b66);
    connect(line, "to", c66);
    const down = place("transformer", 600);
    connect(down, "hv", c66);
    connect(down, "lv", c11);
    const load = place("load", 840);
    connect(load, "t", c11);
    const result = validateNetwork(content.document);
    expect(result.ok ? [] : result.issues).toEqual([]);
    expect(content.document.transformers.map((t) => [t.hvKV, t.lvKV])).toEqual([[66, 11], [66, 11]]);
    expect(content.document.sources[0].control).toBe("slack");
  });
});

describe("random edits (property)", () => {
  it("never throw, keep ids unique and never wire to a missing bus", () => {
    const step = fc.oneof(
      fc.record({ op: fc.constant("place" as const), part: fc.constantFrom(...partKinds), x: fc.integer({ min: -500, max: 500 }) }),
      fc.record({ op: fc.constant("connect" as const), a: fc.nat(), b: fc.nat() }),
      fc.record({ op: fc.constant("delete" as const), a: fc.nat() }),
      fc.record({ op: fc.constant("paste" as const), a: fc.nat() }),
    );
    fc.assert(
      fc.property(fc.array(step, { maxLength: 30 }), (steps) => {
        let content: SheetContent = { document: demo(), layout: {} };
        for (const s of steps) {
          const ids = [...indexElements(content.document).keys()];
          if (s.op === "place") content = placePart(content, s.part, { x: s.x, y: 0 });
          else if (s.op === "delete" && ids.length) content = deleteItems(content, [ids[s.a % ids.length]]);
          else if (s.op === "paste" && ids.length) {
            const clip = copyItems(content, [ids[s.a % ids.length]]);
            if (clip) content = pasteClipboard(content, clip, { x: 40, y: 40 });
          } else if (s.op === "connect" && ids.length && content.document.buses.length) {
            const id = ids[s.a % ids.length];
            const bus = content.document.buses[s.b % content.document.buses.length].id;
            for (const t of ["t", "hv", "from"] as const) content = connectTerminal(content, id, t, bus);
          }
        }
        const all = [...indexElements(content.document).keys()];
        // Every element collection; the operating cases are not elements.
        const count = Object.entries(content.document)
          .filter(([key, list]) => Array.isArray(list) && key !== "cases")
          .reduce((n, [, list]) => n + (list as unknown[]).length, 0);
        expect(all.length).toBe(count);
        const buses = new Set(content.document.buses.map((b) => b.id));
        for (const edge of documentToFlow(content.document, content.layout).edges) expect(buses.has(edge.target)).toBe(true);
      }),
      { numRuns: 60 },
    );
  });
});
