// A study's tables as RFC 4180 CSV with units in the header: the case × element table (bus
// voltages and branch loadings in each case), the envelope, the N-1 table, firm capacity and the
// years table. Rows and columns come from tables.ts, the definitions the pages and the report use.
import { columnsCsv, toCsv } from "#solver/csv.ts";
import { roundForCsv } from "#solver/quantities.ts";
import type { ResultColumn } from "#solver/resultTables.ts";
import type { Network } from "#solver/schema.ts";
import type { Study } from "#solver/study/results.ts";
import {
  branchEnvelopeColumns,
  branchEnvelopeRows,
  busEnvelopeRows,
  caseElementRows,
  firmCapacityColumns,
  firmCapacityRows,
  outageColumns,
  outageRows,
  yearColumns,
  yearRows,
} from "#solver/study/tables.ts";

/** The tables a study downloads as, by the name in their address. */
export const STUDY_CSV_TABLES = ["cases", "envelope", "outages", "firm-capacity", "years"] as const;
export type StudyCsvTable = (typeof STUDY_CSV_TABLES)[number];

const number = (value: number | null | undefined) => (typeof value === "number" ? roundForCsv(value) : value);

/** One row per bus or rated branch, one column per case (by id): voltage (pu) or loading (%). */
export function caseElementCsv(network: Network, study: Study): string {
  const header = ["element_id", "element_name", "quantity", ...study.cases.map((c) => c.id)];
  return toCsv(
    header,
    caseElementRows(network, study).map((r) => [r.id, r.name, r.quantity === "pu" ? "voltage_pu" : "loading_pct", ...r.values.map(number)]),
  );
}

/** Buses then branches, each with its extreme and the case that sets it. */
export function envelopeCsv(network: Network, study: Study): string {
  const buses = busEnvelopeRows(network, study).flatMap((r) => [
    [r.id, r.name, "bus", "voltage_min_pu", number(r.vMinPu), r.vMinCase.id, number(r.bandLowPu)],
    [r.id, r.name, "bus", "voltage_max_pu", number(r.vMaxPu), r.vMaxCase.id, number(r.bandHighPu)],
  ]);
  const branches = branchEnvelopeRows(network, study).map((r) => [r.id, r.name, r.kind, "loading_max_pct", number(r.maxLoadingPct), r.maxLoadingCase.id, 100]);
  return toCsv(["element_id", "element_name", "kind", "quantity", "value", "case_id", "limit"], [...buses, ...branches]);
}

const csvColumns = <Row,>(columns: Record<string, ResultColumn<Row>>) => Object.values(columns).filter((c) => c.csv !== undefined);

export function outagesCsv(network: Network, study: Study): string {
  return columnsCsv(csvColumns<ReturnType<typeof outageRows>[number]>(outageColumns), outageRows(network, study));
}

export function firmCapacityCsv(network: Network, study: Study): string {
  return columnsCsv(csvColumns<ReturnType<typeof firmCapacityRows>[number]>(firmCapacityColumns), firmCapacityRows(network, study));
}

export function yearsCsv(network: Network, study: Study): string {
  return columnsCsv(csvColumns<ReturnType<typeof yearRows>[number]>(yearColumns), yearRows(network, study));
}

export function studyCsv(table: StudyCsvTable, network: Network, study: Study): string {
  switch (table) {
    case "cases":
      return caseElementCsv(network, study);
    case "envelope":
      return envelopeCsv(network, study);
    case "outages":
      return outagesCsv(network, study);
    case "firm-capacity":
      return firmCapacityCsv(network, study);
    case "years":
      return yearsCsv(network, study);
  }
}
