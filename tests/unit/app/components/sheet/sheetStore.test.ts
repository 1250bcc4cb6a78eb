import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { validateNetwork, type Network } from "#solver/schema.ts";
import { createSheetStore } from "#app/components/sheet/sheetStore.ts";

function demo(): Network {
  const parsed = validateNetwork(JSON.parse(readFileSync("tests/fixtures/tarn-head-calder-flats.json", "utf8")));
  if (!parsed.ok) throw new Error("demo network does not validate");
  return parsed.network;
}

const make = (readOnly = false) => createSheetStore({ networkId: "7", document: demo(), revision: 3, readOnly });

describe("sheet store", () => {
  it("is a new store per editor", () => {
    const a = make();
    const b = make();
    a.getState().actions.place("load", { x: 0, y: 400 });
    expect(a.getState().document.loads).toHaveLength(3);
    expect(b.getState().document.loads).toHaveLength(2);
  });

  it("undoes and redoes every edit", () => {
    const store = make();
    const { actions } = store.getState();
    const original = store.getState().document;
    const id = actions.place("capacitor", { x: 0, y: 400 })!;
    expect(store.getState().selection).toEqual([id]);
    actions.connect(id, "t", "b-town");
    expect(store.getState().document.shunts.find((s) => s.id === id)!.bus).toBe("b-town");
    actions.undo();
    expect(store.getState().document.shunts.find((s) => s.id === id)!.bus).toBe("");
    actions.undo();
    expect(store.getState().document).toBe(original);
    actions.redo();
    actions.redo();
    expect(store.getState().document.shunts.find((s) => s.id === id)!.bus).toBe("b-town");
  });

  it("makes a whole drag one undo step, and selection none", () => {
    const store = make();
    const { actions } = store.getState();
    actions.select(["b-mine", "ld-mine"]);
    for (let step = 1; step <= 10; step++) actions.dragTo({ "b-mine": { x: 960 + 4 * step, y: -120 }, "ld-mine": { x: 1080 + 4 * step, y: -120 } });
    expect(store.temporal.getState().pastStates).toHaveLength(0);
    actions.commitMoves({ "b-mine": { x: 1000, y: -120 }, "ld-mine": { x: 1120, y: -120 } });
    expect(store.temporal.getState().pastStates).toHaveLength(1);
    expect(store.getState().dragPositions).toBeNull();
    expect(store.getState().document.buses.find((b) => b.id === "b-mine")!.x).toBe(1000);
    actions.undo();
    expect(store.getState().document.buses.find((b) => b.id === "b-mine")!.x).toBe(960);
  });

  it("copies, pastes with new ids and selects the copies", () => {
    const store = make();
    const { actions } = store.getState();
    actions.select(["ld-town"]);
    actions.copySelection();
    actions.paste();
    const selected = store.getState().selection;
    expect(selected).toHaveLength(1);
    expect(selected[0]).not.toBe("ld-town");
    expect(store.getState().document.loads.map((l) => l.id)).toContain(selected[0]);
  });

  it("deletes the selection, wires included", () => {
    const store = make();
    const { actions } = store.getState();
    actions.select(["c-calder", "l-town~to"]);
    actions.deleteSelection();
    const doc = store.getState().document;
    expect(doc.shunts).toHaveLength(0);
    expect(doc.lines.find((l) => l.id === "l-town")!.toBus).toBe("");
    expect(store.getState().selection).toEqual([]);
  });

  it("arranges the chain as one undo step", async () => {
    const store = make();
    await store.getState().actions.arrange();
    expect(store.temporal.getState().pastStates).toHaveLength(1);
    const xs = ["b-tarn-11", "b-tarn-66", "b-calder-66", "b-calder-11"].map((id) => store.getState().document.buses.find((b) => b.id === id)!.x!);
    expect([...xs].sort((a, b) => a - b)).toEqual(xs);
  });

  it("changes nothing in read-only mode", async () => {
    const store = make(true);
    const { actions } = store.getState();
    const before = store.getState().document;
    actions.place("load", { x: 0, y: 0 });
    actions.select(["b-town"]);
    actions.deleteSelection();
    await actions.arrange();
    expect(store.getState().document).toBe(before);
    expect(store.temporal.getState().pastStates).toHaveLength(0);
  });
});
