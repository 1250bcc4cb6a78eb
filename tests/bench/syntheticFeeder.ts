// Synthetic radial feeders for the benchmarks: a 132 kV infeed, a 132/33 kV transformer, a 33 kV
// trunk, and at every trunk bus a 33/11 kV transformer feeding an 11 kV lateral with side spurs
// that ends in an 11/0.4 kV transformer and two low-voltage buses. The total load is held near
// 40 MW whatever the size, so every size is a feeder that solves in the ordinary range.
import {
  busSchema,
  lineSchema,
  loadSchema,
  shuntSchema,
  sourceSchema,
  transformerSchema,
  type Network,
  type NetworkInput,
} from "#solver/schema.ts";

type Document = NetworkInput & Required<Pick<NetworkInput, "buses" | "sources" | "lines" | "transformers" | "loads">>;

const LATERAL_MV_BUSES = 16;
const SPUR_EVERY = 4;
const LV_BUSES = 2;
/** Trunk bus + MV chain + spurs + LV buses. */
const UNIT_BUSES = 1 + LATERAL_MV_BUSES + LATERAL_MV_BUSES / SPUR_EVERY + LV_BUSES;
const TOTAL_LOAD_MW = 40;
const TRUNK_KM = 25;
const MODELS = ["constant-power", "constant-current", "constant-impedance"] as const;

export function syntheticFeeder(busCount: number): Document {
  const units = Math.max(1, Math.floor((busCount - 2) / UNIT_BUSES));
  const loadedBuses = units * (LATERAL_MV_BUSES + LATERAL_MV_BUSES / SPUR_EVERY + LV_BUSES);
  const loadMW = TOTAL_LOAD_MW / loadedBuses;
  const doc: Document = {
    format: "kilostep.network",
    version: 1,
    name: `Synthetic feeder of ${busCount} buses (fictional)`,
    frequencyHz: 50,
    buses: [
      { id: "grid", name: "Grid 132 kV", nominalKV: 132 },
      { id: "primary", name: "Primary 33 kV", nominalKV: 33 },
    ],
    sources: [{ id: "infeed", name: "Grid infeed", bus: "grid", kind: "grid", control: "slack", voltagePu: 1.02, shortCircuitMVA: 3000, xOverR: 12 }],
    transformers: [
      { id: "t-primary", name: "Primary transformer", hvBus: "grid", lvBus: "primary", ratedMVA: 90, hvKV: 132, lvKV: 33, impedancePct: 12, loadLossKW: 300, noLoadLossKW: 45, tapPct: -2.5, vectorGroup: "YNd11" },
    ],
    lines: [],
    loads: [],
  };
  let loadIndex = 0;
  const addLoad = (bus: string) => {
    const model = MODELS[loadIndex % 3];
    doc.loads.push({ id: `ld${loadIndex}`, name: `Load ${loadIndex}`, bus, pMW: loadMW, qMvar: loadMW * 0.33, model });
    loadIndex++;
  };
  let previousTrunk = "primary";
  for (let u = 0; u < units; u++) {
    const trunk = `tr${u}`;
    doc.buses.push({ id: trunk, name: `Trunk ${u}`, nominalKV: 33 });
    doc.lines.push({ id: `ltr${u}`, name: `Trunk section ${u}`, fromBus: previousTrunk, toBus: trunk, kind: "overhead", lengthKm: TRUNK_KM / units, rOhmPerKm: 0.0408, xOhmPerKm: 0.312, bMicroSiemensPerKm: 3.6 });
    previousTrunk = trunk;
    const head = `mv${u}-0`;
    doc.buses.push({ id: head, name: `Lateral ${u} head`, nominalKV: 11 });
    doc.transformers.push({ id: `tl${u}`, name: `Lateral ${u} transformer`, hvBus: trunk, lvBus: head, ratedMVA: 5, hvKV: 33, lvKV: 11, impedancePct: 7, xOverR: 10, tapPct: 0, vectorGroup: "Dyn11" });
    addLoad(head);
    let previous = head;
    for (let k = 1; k < LATERAL_MV_BUSES; k++) {
      const id = `mv${u}-${k}`;
      doc.buses.push({ id, name: `Lateral ${u} bus ${k}`, nominalKV: 11 });
      doc.lines.push({ id: `lmv${u}-${k}`, name: `Lateral ${u} section ${k}`, fromBus: previous, toBus: id, kind: "cable", lengthKm: 0.3, rOhmPerKm: 0.164, xOhmPerKm: 0.11 });
      addLoad(id);
      previous = id;
      if (k % SPUR_EVERY === 0) {
        const spur = `sp${u}-${k}`;
        doc.buses.push({ id: spur, name: `Lateral ${u} spur ${k}`, nominalKV: 11 });
        doc.lines.push({ id: `lsp${u}-${k}`, name: `Lateral ${u} spur line ${k}`, fromBus: id, toBus: spur, kind: "overhead", lengthKm: 0.5, rOhmPerKm: 0.27, xOhmPerKm: 0.35 });
        addLoad(spur);
      }
    }
    const spurEnd = `sp${u}-end`;
    doc.buses.push({ id: spurEnd, name: `Lateral ${u} end spur`, nominalKV: 11 });
    doc.lines.push({ id: `lsp${u}-end`, name: `Lateral ${u} end spur line`, fromBus: previous, toBus: spurEnd, kind: "overhead", lengthKm: 0.5, rOhmPerKm: 0.27, xOhmPerKm: 0.35 });
    addLoad(spurEnd);
    const lv = `lv${u}-0`;
    doc.buses.push({ id: lv, name: `Lateral ${u} LV`, nominalKV: 0.4 });
    doc.transformers.push({ id: `td${u}`, name: `Lateral ${u} distribution transformer`, hvBus: previous, lvBus: lv, ratedMVA: 0.5, hvKV: 11, lvKV: 0.4, impedancePct: 4.5, loadLossKW: 5.5, noLoadLossKW: 0.7, vectorGroup: "Dyn11" });
    addLoad(lv);
    const lvEnd = `lv${u}-1`;
    doc.buses.push({ id: lvEnd, name: `Lateral ${u} LV end`, nominalKV: 0.4 });
    doc.lines.push({ id: `llv${u}`, name: `Lateral ${u} LV cable`, fromBus: lv, toBus: lvEnd, kind: "cable", lengthKm: 0.15, rOhmPerKm: 0.32, xOhmPerKm: 0.08 });
    addLoad(lvEnd);
  }
  // Fill up to the exact size with a 33 kV stub off the last trunk bus.
  for (let k = doc.buses.length; k < busCount; k++) {
    const id = `stub${k}`;
    doc.buses.push({ id, name: `Stub ${k}`, nominalKV: 33 });
    doc.lines.push({ id: `lstub${k}`, name: `Stub section ${k}`, fromBus: previousTrunk, toBus: id, kind: "overhead", lengthKm: 0.2, rOhmPerKm: 0.0408, xOhmPerKm: 0.312 });
    previousTrunk = id;
  }
  return doc;
}

/**
 * The feeder as a `Network`, each element read through its own schema (defaults applied) but
 * without the document-wide rules, so that a benchmark can measure the load flow and the
 * validation apart. Elements are replaced one by one, so the document is not held twice.
 */
export function networkFromElements(doc: NetworkInput): Network {
  const each = <T>(list: unknown[] | undefined, parse: (element: unknown) => T): T[] => {
    const out = (list ?? []) as unknown[];
    for (let i = 0; i < out.length; i++) out[i] = parse(out[i]);
    return out as T[];
  };
  return {
    format: doc.format,
    version: doc.version,
    name: doc.name,
    frequencyHz: doc.frequencyHz,
    baseMVA: doc.baseMVA ?? 100,
    buses: each(doc.buses, (b) => busSchema.parse(b)),
    sources: each(doc.sources, (e) => sourceSchema.parse(e)),
    transformers: each(doc.transformers, (e) => transformerSchema.parse(e)),
    lines: each(doc.lines, (e) => lineSchema.parse(e)),
    loads: each(doc.loads, (e) => loadSchema.parse(e)),
    shunts: each(doc.shunts, (e) => shuntSchema.parse(e)),
  };
}
