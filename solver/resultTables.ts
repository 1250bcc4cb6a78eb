// The results tables, defined once: which rows and columns the sheet's results, the report and the
// CSV show, each column with its header, its quantity (unit and precision) and its CSV name. A view
// picks the columns it has room for; none writes its own.
import { UNEARTHED_NOTE } from "#solver/faults/index.ts";
import type { Quantity } from "#solver/quantities.ts";
import type { SolveResult } from "#solver/results.ts";
import type { Network } from "#solver/schema.ts";
import { minShortCircuitRatio } from "#solver/equipmentRules.ts";

export interface BusRow {
  id: string;
  name: string;
  nominalKV: number;
  vMinPu: number;
  vMaxPu: number;
  vPu: number;
  vKV: number;
  angleDeg: number;
}

export interface FaultRow {
  id: string;
  name: string;
  nominalKV: number;
  ik3kA: number;
  ik3MVA: number;
  ip3kA: number;
  /** Null where no earth path lets a single-phase fault current flow: an unearthed system. */
  ik1kA: number | null;
  rOverX: number;
  breakingKA: number | undefined;
  note: string;
  /** IEC 60909-0 minimum case (c_min, weakest infeeds, conductors at end-of-fault temperature, no converters). */
  ik3MinKA: number;
  /** S″k3min = √3 · U_n · I″k3min. */
  sk3MinMVA: number;
  /** Null where the bus is unearthed, as for the maximum. */
  ik1MinKA: number | null;
  /** The minimum S″k3 the planner asks of the bus, where asked. */
  minFaultMVA: number | undefined;
  /** How i_p was found at this bus. */
  ipMethod: "radial" | "branch-sum" | "equivalent-frequency";
}

/** How each bus's peak current was found, in words (IEC 60909-0 methods for κ). */
export const IP_METHOD_WORDS: Record<FaultRow["ipMethod"], string> = {
  radial: "κ from R/X (one radial path)",
  "branch-sum": "sum of partial peaks by branch",
  "equivalent-frequency": "method C (equivalent frequency)",
};

export type BranchKind = "transformer" | "overhead" | "cable";

/** One end of a branch: its bus, the power into the branch there, and the current through that end. */
export interface BranchEnd {
  busId: string;
  busName: string;
  /** "HV" or "LV" for a transformer's windings; empty for a line. */
  winding: "HV" | "LV" | "";
  pMW: number;
  qMvar: number;
  currentA: number;
}

export interface BranchRow {
  id: string;
  name: string;
  kind: BranchKind;
  /** The ends as the network file names them: a line's from and to, a transformer's HV and LV. */
  from: BranchEnd;
  to: BranchEnd;
  /** The ends in the direction active power flows: power enters at `sending`, leaves at `receiving`. */
  sending: BranchEnd;
  receiving: BranchEnd;
  lossKW: number;
  /** The larger of the two ends' currents. */
  currentA: number;
  loadingPct: number | null;
  /** Transformers: the tap in use (after regulation where it regulates). */
  tapPct: number | undefined;
  /** Regulating transformers: whether it regulates, and whether the range ran out before the band. */
  regulating: boolean;
  tapLimited: boolean;
}

export interface SourceRow {
  id: string;
  name: string;
  busId: string;
  busName: string;
  kind: "grid" | "generator" | "converter";
  control: "slack" | "pv" | "pq" | "pf";
  pMW: number;
  qMvar: number;
  /** Converter plants: rated MVA and the short-circuit ratio at the plant's bus (S″k3min / rated MVA). */
  ratedMVA: number | undefined;
  scr: number | undefined;
  /** The lowest SCR asked of a converter plant (its minShortCircuitRatio, else 3). */
  scrAsked: number | undefined;
}

export interface ResultColumn<Row> {
  key: string;
  header: string;
  quantity?: Quantity;
  value(row: Row): number | string | null | undefined;
  /** The column's name in the CSV download; absent for a column the CSV leaves out. */
  csv?: string;
}

function lookups(network: Network, result: SolveResult) {
  const busName = new Map(network.buses.map((b) => [b.id, b.name]));
  const vKV = new Map(result.loadFlow.buses.map((b) => [b.id, b.vKV]));
  return { busName: (id: string) => busName.get(id) ?? "a bus not in the network", vKV: (id: string) => vKV.get(id) };
}

export function busRows(network: Network, result: SolveResult): BusRow[] {
  const readings = new Map(result.loadFlow.buses.map((b) => [b.id, b]));
  return network.buses.flatMap((bus) => {
    const r = readings.get(bus.id);
    if (!r) return [];
    return [{ id: bus.id, name: bus.name, nominalKV: bus.nominalKV, vMinPu: bus.vMinPu, vMaxPu: bus.vMaxPu, vPu: r.vPu, vKV: r.vKV, angleDeg: r.angleDeg }];
  });
}

export function faultRows(network: Network, result: SolveResult): FaultRow[] {
  const faults = new Map((result.faults?.buses ?? []).map((f) => [f.id, f]));
  return network.buses.flatMap((bus) => {
    const f = faults.get(bus.id);
    if (!f) return [];
    const unearthed = f.note === UNEARTHED_NOTE;
    return [{
      id: bus.id,
      name: bus.name,
      nominalKV: bus.nominalKV,
      ik3kA: f.ik3kA,
      ik3MVA: f.ik3MVA,
      ip3kA: f.ip3kA,
      ik1kA: unearthed ? null : f.ik1kA,
      rOverX: f.rOverX,
      breakingKA: bus.breakingKA,
      note: f.note ?? "",
      ik3MinKA: f.ik3MinKA,
      sk3MinMVA: Math.sqrt(3) * bus.nominalKV * f.ik3MinKA,
      ik1MinKA: unearthed ? null : f.ik1MinKA,
      minFaultMVA: bus.minFaultMVA,
      ipMethod: f.ipMethod,
    }];
  });
}

/** The current through one end, from the power there and that bus's voltage: I = |S| / (√3 U). */
export function endCurrentA(pMW: number, qMvar: number, vKV: number | undefined): number {
  if (vKV === undefined || vKV <= 0) return 0;
  return (Math.hypot(pMW, qMvar) / (Math.sqrt(3) * vKV)) * 1000;
}

/** Transformers first, then lines, each in file order, as the solver reports them. */
export function branchRows(network: Network, result: SolveResult): BranchRow[] {
  const { busName, vKV } = lookups(network, result);
  const regulating = new Set(network.transformers.filter((t) => t.tapControl).map((t) => t.id));
  const elements = new Map<string, { name: string; kind: BranchKind }>([
    ...network.transformers.map((t): [string, { name: string; kind: BranchKind }] => [t.id, { name: t.name, kind: "transformer" }]),
    ...network.lines.map((l): [string, { name: string; kind: BranchKind }] => [l.id, { name: l.name, kind: l.kind }]),
  ]);
  return result.loadFlow.branches.map((b) => {
    const element = elements.get(b.id) ?? { name: b.id, kind: b.kind === "transformer" ? "transformer" : "overhead" };
    const isTransformer = element.kind === "transformer";
    const end = (busId: string, winding: BranchEnd["winding"], pMW: number, qMvar: number): BranchEnd => ({
      busId,
      busName: busName(busId),
      winding: isTransformer ? winding : "",
      pMW,
      qMvar,
      currentA: endCurrentA(pMW, qMvar, vKV(busId)),
    });
    const from = end(b.fromBus, "HV", b.pFromMW, b.qFromMvar);
    const to = end(b.toBus, "LV", b.pToMW, b.qToMvar);
    const forwards = b.pFromMW >= 0;
    return {
      id: b.id,
      name: element.name,
      kind: element.kind,
      from,
      to,
      sending: forwards ? from : to,
      receiving: forwards ? to : from,
      lossKW: b.lossKW,
      currentA: b.currentA,
      loadingPct: b.loadingPct,
      tapPct: b.tapPct,
      regulating: regulating.has(b.id),
      tapLimited: b.tapLimited === true,
    };
  });
}

export function sourceRows(network: Network, result: SolveResult): SourceRow[] {
  const { busName } = lookups(network, result);
  const readings = new Map(result.loadFlow.sources.map((s) => [s.id, s]));
  const scr = new Map((result.faults?.converters ?? []).map((c) => [c.id, c.scr]));
  return network.sources.flatMap((s) => {
    const r = readings.get(s.id);
    if (!r) return [];
    const converter = s.kind === "converter";
    return [{
      id: s.id,
      name: s.name,
      busId: s.bus,
      busName: busName(s.bus),
      kind: s.kind,
      control: s.control,
      pMW: r.pMW,
      qMvar: r.qMvar,
      ratedMVA: converter ? s.ratedMVA : undefined,
      scr: converter ? scr.get(s.id) : undefined,
      scrAsked: converter ? minShortCircuitRatio(s) : undefined,
    }];
  });
}

export const SOURCE_KIND_WORDS: Record<SourceRow["kind"], string> = { grid: "grid infeed", generator: "generator", converter: "converter plant" };

export const BRANCH_KIND_WORDS: Record<BranchKind, string> = { transformer: "transformer", overhead: "overhead line", cable: "cable" };

export const busColumns = {
  id: { key: "id", header: "Id", value: (r) => r.id, csv: "bus_id" },
  name: { key: "name", header: "Bus", value: (r) => r.name, csv: "bus_name" },
  nominalKV: { key: "nominalKV", header: "Nominal", quantity: "kV", value: (r) => r.nominalKV, csv: "nominal_kV" },
  vPu: { key: "vPu", header: "Voltage", quantity: "pu", value: (r) => r.vPu, csv: "voltage_pu" },
  vKV: { key: "vKV", header: "Voltage", quantity: "kV", value: (r) => r.vKV, csv: "voltage_kV" },
  angleDeg: { key: "angleDeg", header: "Angle", quantity: "deg", value: (r) => r.angleDeg, csv: "angle_deg" },
} satisfies Record<string, ResultColumn<BusRow>>;

export const faultColumns = {
  ik3kA: { key: "ik3kA", header: "I″k3", quantity: "kA", value: (r) => r.ik3kA, csv: "ik3_kA" },
  ik3MVA: { key: "ik3MVA", header: "S″k3", quantity: "MVA", value: (r) => r.ik3MVA, csv: "sk3_MVA" },
  ip3kA: { key: "ip3kA", header: "ip", quantity: "kA", value: (r) => r.ip3kA, csv: "ip3_kA" },
  ik1kA: { key: "ik1kA", header: "I″k1", quantity: "kA", value: (r) => r.ik1kA, csv: "ik1_kA" },
  rOverX: { key: "rOverX", header: "R/X", quantity: "ratio", value: (r) => r.rOverX, csv: "r_over_x" },
  breakingKA: { key: "breakingKA", header: "Breaking", quantity: "kA", value: (r) => r.breakingKA },
  note: { key: "note", header: "Note", value: (r) => r.note, csv: "fault_note" },
  ik3MinKA: { key: "ik3MinKA", header: "I″k3 min", quantity: "kA", value: (r) => r.ik3MinKA, csv: "ik3min_kA" },
  sk3MinMVA: { key: "sk3MinMVA", header: "S″k3 min", quantity: "MVA", value: (r) => r.sk3MinMVA, csv: "sk3min_MVA" },
  ik1MinKA: { key: "ik1MinKA", header: "I″k1 min", quantity: "kA", value: (r) => r.ik1MinKA, csv: "ik1min_kA" },
  minFaultMVA: { key: "minFaultMVA", header: "S″k3 min asked", quantity: "MVA", value: (r) => r.minFaultMVA, csv: "min_fault_asked_MVA" },
  ipMethod: { key: "ipMethod", header: "ip method", value: (r) => IP_METHOD_WORDS[r.ipMethod], csv: "ip_method" },
} satisfies Record<string, ResultColumn<FaultRow>>;

export const branchColumns = {
  id: { key: "id", header: "Id", value: (r) => r.id, csv: "branch_id" },
  name: { key: "name", header: "Branch", value: (r) => r.name, csv: "branch_name" },
  kind: { key: "kind", header: "Kind", value: (r) => (r.kind === "transformer" ? "transformer" : "line"), csv: "kind" },
  fromBus: { key: "fromBus", header: "From", value: (r) => r.from.busId, csv: "from_bus" },
  toBus: { key: "toBus", header: "To", value: (r) => r.to.busId, csv: "to_bus" },
  pFromMW: { key: "pFromMW", header: "P from", quantity: "MW", value: (r) => r.from.pMW, csv: "p_from_MW" },
  qFromMvar: { key: "qFromMvar", header: "Q from", quantity: "Mvar", value: (r) => r.from.qMvar, csv: "q_from_Mvar" },
  pToMW: { key: "pToMW", header: "P to", quantity: "MW", value: (r) => r.to.pMW, csv: "p_to_MW" },
  qToMvar: { key: "qToMvar", header: "Q to", quantity: "Mvar", value: (r) => r.to.qMvar, csv: "q_to_Mvar" },
  lossKW: { key: "lossKW", header: "Loss", quantity: "kW", value: (r) => r.lossKW, csv: "loss_kW" },
  currentA: { key: "currentA", header: "Current", quantity: "A", value: (r) => r.currentA, csv: "current_A" },
  loadingPct: { key: "loadingPct", header: "Loading", quantity: "pct", value: (r) => r.loadingPct, csv: "loading_pct" },
  fromCurrentA: { key: "fromCurrentA", header: "Current at from (HV)", quantity: "A", value: (r) => r.from.currentA, csv: "current_from_A" },
  toCurrentA: { key: "toCurrentA", header: "Current at to (LV)", quantity: "A", value: (r) => r.to.currentA, csv: "current_to_A" },
  route: { key: "route", header: "Flow", value: (r) => `${r.sending.busName} → ${r.receiving.busName}` },
  pSendMW: { key: "pSendMW", header: "P", quantity: "MW", value: (r) => r.sending.pMW },
  qSendMvar: { key: "qSendMvar", header: "Q", quantity: "Mvar", value: (r) => r.sending.qMvar },
  pReceiveMW: { key: "pReceiveMW", header: "P out", quantity: "MW", value: (r) => -r.receiving.pMW },
  qReceiveMvar: { key: "qReceiveMvar", header: "Q out", quantity: "Mvar", value: (r) => -r.receiving.qMvar },
  tapPct: { key: "tapPct", header: "Tap", quantity: "pct", value: (r) => r.tapPct, csv: "tap_pct" },
  tapNote: { key: "tapNote", header: "Tap changer", value: (r) => tapWords(r), csv: "tap_changer" },
} satisfies Record<string, ResultColumn<BranchRow>>;

export const sourceColumns = {
  id: { key: "id", header: "Id", value: (r) => r.id, csv: "source_id" },
  name: { key: "name", header: "Source", value: (r) => r.name, csv: "source_name" },
  busName: { key: "busName", header: "Bus", value: (r) => r.busName },
  busId: { key: "busId", header: "Bus id", value: (r) => r.busId, csv: "bus" },
  kind: { key: "kind", header: "Kind", value: (r) => SOURCE_KIND_WORDS[r.kind], csv: "kind" },
  control: { key: "control", header: "Control", value: (r) => r.control, csv: "control" },
  pMW: { key: "pMW", header: "P", quantity: "MW", value: (r) => r.pMW, csv: "p_MW" },
  qMvar: { key: "qMvar", header: "Q", quantity: "Mvar", value: (r) => r.qMvar, csv: "q_Mvar" },
  ratedMVA: { key: "ratedMVA", header: "Rated", quantity: "MVA", value: (r) => r.ratedMVA, csv: "rated_MVA" },
  scr: { key: "scr", header: "SCR", quantity: "ratio", value: (r) => r.scr, csv: "scr" },
  scrAsked: { key: "scrAsked", header: "SCR asked", quantity: "ratio", value: (r) => r.scrAsked, csv: "scr_asked" },
} satisfies Record<string, ResultColumn<SourceRow>>;

/** A transformer's tap changer in words: "regulating", "range ran out", or nothing when the tap is fixed. */
export function tapWords(row: BranchRow): string {
  if (!row.regulating) return "";
  return row.tapLimited ? "regulating; range ran out before the band" : "regulating";
}

/** "HV 90.2 A · LV 524 A" for a transformer, the one current for a line: a label per winding. */
export function windingCurrents(row: BranchRow, text: (amps: number) => string): string {
  if (row.kind !== "transformer") return text(row.currentA);
  return `HV ${text(row.from.currentA)} · LV ${text(row.to.currentA)}`;
}
