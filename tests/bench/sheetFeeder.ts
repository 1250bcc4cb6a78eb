// A drawn radial feeder of a given element count for the sheet benchmark (fictional names):
// a 132 kV grid infeed, a 132/33 kV primary transformer, then units along a 33 kV trunk, each a
// trunk busbar, the trunk section reaching it, a 33/11 kV transformer, an 11 kV busbar and its
// load. A capacitor bank on the primary busbar makes up the count. Busbars carry positions, so
// the sheet draws the units in rows (left to right, then right to left) as a planner would.
import { validateNetwork, type Network, type NetworkInput } from "#solver/schema.ts";

type Document = NetworkInput & Required<Pick<NetworkInput, "buses" | "sources" | "lines" | "transformers" | "loads" | "shunts">>;

/** Grid busbar, infeed, primary busbar and primary transformer. */
const HEAD_ELEMENTS = 4;
/** Trunk busbar, trunk section, transformer, 11 kV busbar, load. */
const UNIT_ELEMENTS = 5;
const UNITS_PER_ROW = 10;
const COLUMN_PX = 360;
const ROW_PX = 520;
const LOAD_MW = 0.3;

export function sheetFeeder(elementCount: number): { network: Network; loadIds: string[]; trunkBusIds: string[] } {
  const units = Math.floor((elementCount - HEAD_ELEMENTS) / UNIT_ELEMENTS);
  if (units < 1) throw new Error(`a feeder needs at least ${HEAD_ELEMENTS + UNIT_ELEMENTS} elements; ${elementCount} asked`);
  const doc: Document = {
    format: "kilostep.network",
    version: 1,
    name: `Brackenfold feeder, ${elementCount} elements (fictional)`,
    frequencyHz: 50,
    buses: [
      { id: "b-grid", name: "Brackenfold grid 132 kV", nominalKV: 132, x: -2 * COLUMN_PX, y: 0 },
      { id: "b-primary", name: "Brackenfold primary 33 kV", nominalKV: 33, x: -COLUMN_PX, y: 0 },
    ],
    sources: [{ id: "g-grid", name: "Grid infeed", bus: "b-grid", kind: "grid", control: "slack", voltagePu: 1.02, shortCircuitMVA: 2500, xOverR: 12 }],
    transformers: [
      { id: "t-primary", name: "Primary transformer", hvBus: "b-grid", lvBus: "b-primary", ratedMVA: 60, hvKV: 132, lvKV: 33, impedancePct: 12, loadLossKW: 220, noLoadLossKW: 35, vectorGroup: "YNd11" },
    ],
    lines: [],
    loads: [],
    shunts: [],
  };
  const loadIds: string[] = [];
  const trunkBusIds: string[] = [];
  let previous = "b-primary";
  for (let u = 0; u < units; u++) {
    const row = Math.floor(u / UNITS_PER_ROW);
    const inRow = u % UNITS_PER_ROW;
    const column = row % 2 === 0 ? inRow : UNITS_PER_ROW - 1 - inRow;
    const x = column * COLUMN_PX;
    const y = row * ROW_PX;
    const trunk = `b-trunk-${u}`;
    const local = `b-local-${u}`;
    doc.buses.push({ id: trunk, name: `Fellside trunk ${u} 33 kV`, nominalKV: 33, x, y });
    doc.buses.push({ id: local, name: `Fellside ${u} 11 kV`, nominalKV: 11, vMinPu: 0.94, vMaxPu: 1.06, x: x + COLUMN_PX / 2, y: y + ROW_PX / 2 });
    doc.lines.push({ id: `l-trunk-${u}`, name: `Trunk section ${u}`, fromBus: previous, toBus: trunk, kind: "overhead", lengthKm: 0.3, rOhmPerKm: 0.06, xOhmPerKm: 0.31, bMicroSiemensPerKm: 3.7, ampacityA: 900 });
    doc.transformers.push({ id: `t-local-${u}`, name: `Fellside ${u} transformer`, hvBus: trunk, lvBus: local, ratedMVA: 2.5, hvKV: 33, lvKV: 11, impedancePct: 7, loadLossKW: 20, vectorGroup: "Dyn11" });
    doc.loads.push({ id: `ld-${u}`, name: `Fellside ${u} demand`, bus: local, pMW: LOAD_MW, qMvar: LOAD_MW * 0.3 });
    loadIds.push(`ld-${u}`);
    trunkBusIds.push(trunk);
    previous = trunk;
  }
  for (let s = 0; s < elementCount - HEAD_ELEMENTS - units * UNIT_ELEMENTS; s++) {
    doc.shunts.push({ id: `c-primary-${s}`, name: `Primary capacitor bank ${s + 1}`, bus: "b-primary", qMvar: 2 });
  }
  const checked = validateNetwork(doc);
  if (!checked.ok) throw new Error(checked.issues.map((i) => `${i.path}: ${i.message}`).join("\n"));
  return { network: checked.network, loadIds, trunkBusIds };
}

export function elementCountOf(network: Network): number {
  return network.buses.length + network.sources.length + network.transformers.length + network.lines.length + network.loads.length + network.shunts.length;
}
