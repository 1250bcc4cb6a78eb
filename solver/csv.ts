// Results as RFC 4180 CSV: comma-separated, CRLF line ends, fields with a comma, quote or line
// break in double quotes with inner quotes doubled. Units are in the header names.
import { roundForCsv } from "#solver/quantities.ts";
import { branchColumns, branchRows, busColumns, busRows, faultColumns, faultRows, sourceColumns, sourceRows, type BusRow, type FaultRow, type ResultColumn } from "#solver/resultTables.ts";
import type { SolveResult } from "#solver/results.ts";
import type { Network } from "#solver/schema.ts";

type Cell = string | number | null | undefined;

/** Quotes one field when RFC 4180 needs it. */
export function csvField(value: Cell): string {
  if (value === null || value === undefined) return "";
  const text = typeof value === "number" ? String(value) : guardFormula(value);
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/**
 * Text that a spreadsheet would run as a formula (starting with = + - @, tab or carriage return)
 * gets a leading apostrophe, so that a shared network's names cannot execute when the file is opened.
 */
function guardFormula(text: string): string {
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}

export function toCsv(header: readonly string[], rows: readonly Cell[][]): string {
  return [header, ...rows].map((row) => row.map(csvField).join(",")).join("\r\n") + "\r\n";
}

/** A table of the shared results columns, each number at the CSV's precision. */
export function columnsCsv<Row>(columns: readonly ResultColumn<Row>[], rows: readonly Row[]): string {
  const header = columns.map((c) => c.csv ?? c.key);
  const cells = rows.map((row) =>
    columns.map((c) => {
      const value = c.value(row);
      return typeof value === "number" ? roundForCsv(value) : value;
    }),
  );
  return toCsv(header, cells);
}

export function busesCsv(network: Network, result: SolveResult): string {
  const c = busColumns;
  const rows = busRows(network, result);
  if (result.faults === undefined) return columnsCsv([c.id, c.name, c.nominalKV, c.vPu, c.vKV, c.angleDeg], rows);
  const faults = new Map(faultRows(network, result).map((f) => [f.id, f]));
  const f = faultColumns;
  const withFault = (column: ResultColumn<FaultRow>): ResultColumn<BusRow> => ({
    ...column,
    value: (row) => {
      const fault = faults.get(row.id);
      return fault ? column.value(fault) : undefined;
    },
  });
  return columnsCsv([c.id, c.name, c.nominalKV, c.vPu, c.vKV, c.angleDeg, ...[f.ik3kA, f.ik3MVA, f.ip3kA, f.ik1kA, f.rOverX, f.note, f.ik3MinKA, f.sk3MinMVA, f.ik1MinKA, f.minFaultMVA, f.ipMethod].map(withFault)], rows);
}

export function branchesCsv(network: Network, result: SolveResult): string {
  const c = branchColumns;
  return columnsCsv(
    [c.id, c.name, c.kind, c.fromBus, c.toBus, c.pFromMW, c.qFromMvar, c.pToMW, c.qToMvar, c.lossKW, c.currentA, c.loadingPct, c.fromCurrentA, c.toCurrentA, c.tapPct, c.tapNote],
    branchRows(network, result),
  );
}

export function sourcesCsv(network: Network, result: SolveResult): string {
  const c = sourceColumns;
  return columnsCsv([c.id, c.name, c.busId, c.kind, c.control, c.pMW, c.qMvar, c.ratedMVA, c.scr, c.scrAsked], sourceRows(network, result));
}

/** The tables the results CSV offers. */
export const CSV_TABLES = ["buses", "branches", "sources"] as const;
export type CsvTable = (typeof CSV_TABLES)[number];

export function isCsvTable(value: unknown): value is CsvTable {
  return (CSV_TABLES as readonly unknown[]).includes(value);
}

export function resultsCsv(table: CsvTable, network: Network, result: SolveResult): string {
  return table === "buses" ? busesCsv(network, result) : table === "branches" ? branchesCsv(network, result) : sourcesCsv(network, result);
}
