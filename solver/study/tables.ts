// The study's tables, defined once (as resultTables.ts does for one solve): the case × element
// table, the envelope, the N-1 table, firm capacity and the years table, each as rows and columns
// with a header, a quantity and a CSV name. The study page, the report and the CSV downloads pick
// from these; none builds its own. Every function is one pass over the study (maps, no searches).
import type { Quantity } from "#solver/quantities.ts";
import type { ResultColumn } from "#solver/resultTables.ts";
import type { CheckKind } from "#solver/results.ts";
import type { Network } from "#solver/schema.ts";
import type { Study, StudyCheck } from "#solver/study/results.ts";

export interface StudyCaseColumn {
  id: string;
  name: string;
  hoursPerYear: number | null;
  converged: boolean;
  /** The load flow's own sentence when it did not converge, or when no bus had supply. */
  message: string | null;
  lostLoadMW: number;
}

export interface CaseElementRow {
  id: string;
  name: string;
  kind: "bus" | "line" | "transformer";
  quantity: "pu" | "pct";
  /** One value per case, in the study's case order; null where the element has no supply or the case did not converge. */
  values: (number | null)[];
  /** The band a voltage is judged against, or 100 % for a loading. */
  low: number | null;
  high: number;
}

export interface CaseName {
  id: string;
  name: string;
}

export interface BusEnvelopeRow {
  id: string;
  name: string;
  nominalKV: number;
  vMinPu: number;
  vMinCase: CaseName;
  vMaxPu: number;
  vMaxCase: CaseName;
  bandLowPu: number;
  bandHighPu: number;
}

export interface BranchEnvelopeRow {
  id: string;
  name: string;
  kind: "line" | "transformer";
  maxLoadingPct: number;
  maxLoadingCase: CaseName;
}

export interface OutageRow {
  key: string;
  case: CaseName;
  elementId: string;
  elementName: string;
  kind: "line" | "transformer";
  lostLoadMW: number;
  deenergisedBuses: number;
  converged: boolean;
  limitsBroken: number;
  checks: StudyCheck[];
  highestLoadingId: string | null;
  highestLoadingName: string | null;
  highestLoadingPct: number | null;
  lowestVoltageId: string | null;
  lowestVoltageName: string | null;
  lowestVoltagePu: number | null;
}

/** An outage row without its checks: what the columns read. */
export type OutageSummary = Omit<OutageRow, "checks">;

export interface FirmCapacityRow {
  key: string;
  hvBus: string;
  lvBus: string;
  substation: string;
  transformerIds: string[];
  transformers: string;
  installedMVA: number;
  firmMVA: number;
  peakDemandMVA: number;
  peakCase: CaseName;
  withinFirm: boolean;
}

export interface YearRow {
  key: string;
  elementId: string;
  elementName: string;
  kind: CheckKind;
  firstYear: number;
  case: CaseName;
  value: number;
  limit: number;
  message: string;
}

export const LIMIT_WORDS: Record<CheckKind, string> = {
  undervoltage: "voltage below band",
  overvoltage: "voltage above band",
  "line-overload": "line over ampacity",
  "transformer-overload": "transformer over rating",
  "breaking-current": "fault current over breaking",
  "minimum-fault-level": "fault level below minimum",
  "weak-grid": "short-circuit ratio low",
  "not-converged": "load not carried",
};

/** Names of the network's buses, lines and transformers by id, built once per table. */
function namesOf(network: Network) {
  const names = new Map<string, string>();
  for (const b of network.buses) names.set(b.id, b.name);
  for (const l of network.lines) names.set(l.id, l.name);
  for (const t of network.transformers) names.set(t.id, t.name);
  for (const l of network.loads) names.set(l.id, l.name);
  for (const s of network.sources) names.set(s.id, s.name);
  for (const s of network.shunts) names.set(s.id, s.name);
  return (id: string) => names.get(id) ?? id;
}

function caseNamesOf(study: Study) {
  const names = new Map(study.cases.map((c) => [c.id, c.name]));
  return (id: string): CaseName => ({ id, name: names.get(id) ?? id });
}

export function studyCaseColumns(study: Study): StudyCaseColumn[] {
  return study.cases.map((c) => ({
    id: c.id,
    name: c.name,
    hoursPerYear: c.hoursPerYear ?? null,
    converged: c.loadFlow.converged,
    message: c.loadFlow.message ?? null,
    lostLoadMW: c.lostLoadMW,
  }));
}

/** One row per bus (voltage in each case) and per rated line or transformer (loading in each case). */
export function caseElementRows(network: Network, study: Study): CaseElementRow[] {
  const converged = study.cases.map((c) => c.loadFlow.converged);
  const voltages = study.cases.map((c) => new Map(c.loadFlow.buses.map((b) => [b.id, b.vPu])));
  const loadings = study.cases.map((c) => new Map(c.loadFlow.branches.map((b) => [b.id, b.loadingPct])));
  const valuesOf = (maps: Map<string, number | null>[], id: string) => maps.map((m, i) => (converged[i] ? (m.get(id) ?? null) : null));
  const rows: CaseElementRow[] = [];
  for (const bus of network.buses) {
    const values = valuesOf(voltages, bus.id);
    rows.push({ id: bus.id, name: bus.name, kind: "bus", quantity: "pu", values, low: bus.vMinPu, high: bus.vMaxPu });
  }
  // Transformers have a rating; a line shows a loading only when it has an ampacity.
  const branches = [
    ...network.transformers.map((t) => ({ id: t.id, name: t.name, kind: "transformer" as const })),
    ...network.lines.filter((l) => l.ampacityA !== undefined).map((l) => ({ id: l.id, name: l.name, kind: "line" as const })),
  ];
  for (const branch of branches) rows.push({ ...branch, quantity: "pct", values: valuesOf(loadings, branch.id), low: null, high: 100 });
  return rows;
}

export function busEnvelopeRows(network: Network, study: Study): BusEnvelopeRow[] {
  const caseName = caseNamesOf(study);
  const buses = new Map(network.buses.map((b) => [b.id, b]));
  return study.envelope.buses.flatMap((e) => {
    const bus = buses.get(e.id);
    if (!bus) return [];
    return [{
      id: e.id,
      name: bus.name,
      nominalKV: bus.nominalKV,
      vMinPu: e.vMinPu,
      vMinCase: caseName(e.vMinCase),
      vMaxPu: e.vMaxPu,
      vMaxCase: caseName(e.vMaxCase),
      bandLowPu: bus.vMinPu,
      bandHighPu: bus.vMaxPu,
    }];
  });
}

export function branchEnvelopeRows(network: Network, study: Study): BranchEnvelopeRow[] {
  const caseName = caseNamesOf(study);
  const name = namesOf(network);
  const transformers = new Set(network.transformers.map((t) => t.id));
  return study.envelope.branches.map((e) => ({
    id: e.id,
    name: name(e.id),
    kind: transformers.has(e.id) ? "transformer" : "line",
    maxLoadingPct: e.maxLoadingPct,
    maxLoadingCase: caseName(e.maxLoadingCase),
  }));
}

/** Each outage of the study, in the order studied (case by case, element by element). */
export function outageRows(network: Network, study: Study): OutageRow[] {
  const caseName = caseNamesOf(study);
  const name = namesOf(network);
  return (study.outages ?? []).map((o) => ({
    key: `${o.case}\u0000${o.element}`,
    case: caseName(o.case),
    elementId: o.element,
    elementName: name(o.element),
    kind: o.kind,
    lostLoadMW: o.lostLoadMW,
    deenergisedBuses: o.deenergisedBuses.length,
    converged: o.converged,
    limitsBroken: o.checks.filter((c) => c.kind !== "not-converged").length,
    checks: o.checks,
    highestLoadingId: o.highestLoading?.element ?? null,
    highestLoadingName: o.highestLoading ? name(o.highestLoading.element) : null,
    highestLoadingPct: o.highestLoading?.loadingPct ?? null,
    lowestVoltageId: o.lowestVoltage?.bus ?? null,
    lowestVoltageName: o.lowestVoltage ? name(o.lowestVoltage.bus) : null,
    lowestVoltagePu: o.lowestVoltage?.vPu ?? null,
  }));
}

export function firmCapacityRows(network: Network, study: Study): FirmCapacityRow[] {
  const caseName = caseNamesOf(study);
  const name = namesOf(network);
  return (study.firmCapacity ?? []).map((f) => ({
    key: `${f.hvBus}\u0000${f.lvBus}`,
    hvBus: f.hvBus,
    lvBus: f.lvBus,
    substation: `${name(f.hvBus)} → ${name(f.lvBus)}`,
    transformerIds: f.transformers,
    transformers: f.transformers.map(name).join(", "),
    installedMVA: f.installedMVA,
    firmMVA: f.firmMVA,
    peakDemandMVA: f.peakDemandMVA,
    peakCase: caseName(f.peakCase),
    withinFirm: f.withinFirm,
  }));
}

/** Each limit that load growth breaks, by the year it first breaks. */
export function yearRows(network: Network, study: Study): YearRow[] {
  const caseName = caseNamesOf(study);
  const name = namesOf(network);
  return (study.years ?? [])
    .map((y) => ({
      key: `${y.element}\u0000${y.kind}`,
      elementId: y.element,
      elementName: name(y.element),
      kind: y.kind,
      firstYear: y.firstYear,
      case: caseName(y.case),
      value: y.value,
      limit: y.limit,
      message: y.message,
    }))
    .sort((a, b) => a.firstYear - b.firstYear);
}

/** The unit a limit's value is read in. */
export function limitQuantity(kind: CheckKind): Quantity {
  switch (kind) {
    case "undervoltage":
    case "overvoltage":
      return "pu";
    case "line-overload":
      return "A";
    case "transformer-overload":
      return "MVA";
    case "breaking-current":
      return "kA";
    case "minimum-fault-level":
      return "MVA";
    case "weak-grid":
      return "ratio";
    case "not-converged":
      return "pct";
  }
}

export const busEnvelopeColumns = {
  id: { key: "id", header: "Id", value: (r) => r.id, csv: "bus_id" },
  name: { key: "name", header: "Bus", value: (r) => r.name, csv: "bus_name" },
  nominalKV: { key: "nominalKV", header: "Nominal", quantity: "kV", value: (r) => r.nominalKV, csv: "nominal_kV" },
  vMinPu: { key: "vMinPu", header: "Lowest", quantity: "pu", value: (r) => r.vMinPu, csv: "v_min_pu" },
  vMinCase: { key: "vMinCase", header: "In case", value: (r) => r.vMinCase.name },
  vMinCaseId: { key: "vMinCaseId", header: "Case id", value: (r) => r.vMinCase.id, csv: "v_min_case_id" },
  vMaxPu: { key: "vMaxPu", header: "Highest", quantity: "pu", value: (r) => r.vMaxPu, csv: "v_max_pu" },
  vMaxCase: { key: "vMaxCase", header: "In case", value: (r) => r.vMaxCase.name },
  vMaxCaseId: { key: "vMaxCaseId", header: "Case id", value: (r) => r.vMaxCase.id, csv: "v_max_case_id" },
  bandLowPu: { key: "bandLowPu", header: "Band from", quantity: "pu", value: (r) => r.bandLowPu, csv: "band_min_pu" },
  bandHighPu: { key: "bandHighPu", header: "Band to", quantity: "pu", value: (r) => r.bandHighPu, csv: "band_max_pu" },
} satisfies Record<string, ResultColumn<BusEnvelopeRow>>;

export const branchEnvelopeColumns = {
  id: { key: "id", header: "Id", value: (r) => r.id, csv: "branch_id" },
  name: { key: "name", header: "Branch", value: (r) => r.name, csv: "branch_name" },
  kind: { key: "kind", header: "Kind", value: (r) => r.kind, csv: "kind" },
  maxLoadingPct: { key: "maxLoadingPct", header: "Highest loading", quantity: "pct", value: (r) => r.maxLoadingPct, csv: "max_loading_pct" },
  maxLoadingCase: { key: "maxLoadingCase", header: "In case", value: (r) => r.maxLoadingCase.name },
  maxLoadingCaseId: { key: "maxLoadingCaseId", header: "Case id", value: (r) => r.maxLoadingCase.id, csv: "max_loading_case_id" },
} satisfies Record<string, ResultColumn<BranchEnvelopeRow>>;

export const outageColumns = {
  caseId: { key: "caseId", header: "Case id", value: (r) => r.case.id, csv: "case_id" },
  caseName: { key: "caseName", header: "Case", value: (r) => r.case.name },
  elementId: { key: "elementId", header: "Out", value: (r) => r.elementId, csv: "element_out" },
  elementName: { key: "elementName", header: "Out of service", value: (r) => r.elementName, csv: "element_out_name" },
  kind: { key: "kind", header: "Kind", value: (r) => r.kind, csv: "kind" },
  lostLoadMW: { key: "lostLoadMW", header: "Load lost", quantity: "MW", value: (r) => r.lostLoadMW, csv: "lost_load_MW" },
  converged: { key: "converged", header: "Carried", value: (r) => (r.converged ? "yes" : "no"), csv: "converged" },
  limitsBroken: { key: "limitsBroken", header: "Limits broken", value: (r) => r.limitsBroken, csv: "limits_broken" },
  highestLoadingId: { key: "highestLoadingId", header: "Most loaded", value: (r) => r.highestLoadingId, csv: "highest_loading_element" },
  highestLoadingName: { key: "highestLoadingName", header: "Most loaded", value: (r) => r.highestLoadingName },
  highestLoadingPct: { key: "highestLoadingPct", header: "Loading", quantity: "pct", value: (r) => r.highestLoadingPct, csv: "highest_loading_pct" },
  lowestVoltageId: { key: "lowestVoltageId", header: "Lowest bus", value: (r) => r.lowestVoltageId, csv: "lowest_voltage_bus" },
  lowestVoltageName: { key: "lowestVoltageName", header: "Lowest bus", value: (r) => r.lowestVoltageName },
  lowestVoltagePu: { key: "lowestVoltagePu", header: "Voltage", quantity: "pu", value: (r) => r.lowestVoltagePu, csv: "lowest_voltage_pu" },
} satisfies Record<string, ResultColumn<OutageSummary>>;

export const firmCapacityColumns = {
  substation: { key: "substation", header: "Substation", value: (r) => r.substation },
  hvBus: { key: "hvBus", header: "HV bus", value: (r) => r.hvBus, csv: "hv_bus" },
  lvBus: { key: "lvBus", header: "LV bus", value: (r) => r.lvBus, csv: "lv_bus" },
  transformers: { key: "transformers", header: "Transformers", value: (r) => r.transformers },
  transformerIds: { key: "transformerIds", header: "Transformer ids", value: (r) => r.transformerIds.join(" "), csv: "transformers" },
  installedMVA: { key: "installedMVA", header: "Installed", quantity: "MVA", value: (r) => r.installedMVA, csv: "installed_MVA" },
  firmMVA: { key: "firmMVA", header: "Firm (largest unit out)", quantity: "MVA", value: (r) => r.firmMVA, csv: "firm_MVA" },
  peakDemandMVA: { key: "peakDemandMVA", header: "Peak demand", quantity: "MVA", value: (r) => r.peakDemandMVA, csv: "peak_demand_MVA" },
  peakCase: { key: "peakCase", header: "In case", value: (r) => r.peakCase.name },
  peakCaseId: { key: "peakCaseId", header: "Case id", value: (r) => r.peakCase.id, csv: "peak_case_id" },
  withinFirm: { key: "withinFirm", header: "Within firm", value: (r) => (r.withinFirm ? "yes" : "no"), csv: "within_firm" },
} satisfies Record<string, ResultColumn<FirmCapacityRow>>;

export const yearColumns = {
  elementId: { key: "elementId", header: "Id", value: (r) => r.elementId, csv: "element_id" },
  elementName: { key: "elementName", header: "Element", value: (r) => r.elementName, csv: "element_name" },
  kind: { key: "kind", header: "Limit", value: (r) => LIMIT_WORDS[r.kind], csv: "limit" },
  firstYear: { key: "firstYear", header: "First year", value: (r) => r.firstYear, csv: "first_year" },
  caseName: { key: "caseName", header: "In case", value: (r) => r.case.name },
  caseId: { key: "caseId", header: "Case id", value: (r) => r.case.id, csv: "case_id" },
  value: { key: "value", header: "Value", value: (r) => r.value, csv: "value" },
  limit: { key: "limit", header: "Limit value", value: (r) => r.limit, csv: "limit_value" },
} satisfies Record<string, ResultColumn<YearRow>>;
