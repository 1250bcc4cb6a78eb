// Results as RFC 4180 CSV: comma-separated, CRLF line ends, fields with a comma, quote or line
// break in double quotes with inner quotes doubled. Units are in the header names.
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

export function busesCsv(network: Network, result: SolveResult): string {
  const readings = new Map(result.loadFlow.buses.map((b) => [b.id, b]));
  const faults = new Map((result.faults?.buses ?? []).map((f) => [f.id, f]));
  const withFaults = result.faults !== undefined;
  const header = ["bus_id", "bus_name", "nominal_kV", "voltage_pu", "voltage_kV", "angle_deg"];
  if (withFaults) header.push("ik3_kA", "sk3_MVA", "ip3_kA", "ik1_kA", "r_over_x", "fault_note");
  const rows: Cell[][] = [];
  for (const bus of network.buses) {
    const r = readings.get(bus.id);
    if (!r) continue;
    const row: Cell[] = [bus.id, bus.name, bus.nominalKV, r.vPu, r.vKV, r.angleDeg];
    if (withFaults) {
      const f = faults.get(bus.id);
      row.push(f?.ik3kA, f?.ik3MVA, f?.ip3kA, f?.ik1kA, f?.rOverX, f?.note);
    }
    rows.push(row);
  }
  return toCsv(header, rows);
}

export function branchesCsv(network: Network, result: SolveResult): string {
  const names = new Map<string, string>([...network.lines, ...network.transformers].map((e) => [e.id, e.name]));
  const header = [
    "branch_id",
    "branch_name",
    "kind",
    "from_bus",
    "to_bus",
    "p_from_MW",
    "q_from_Mvar",
    "p_to_MW",
    "q_to_Mvar",
    "loss_kW",
    "current_A",
    "loading_pct",
  ];
  const rows: Cell[][] = result.loadFlow.branches.map((b) => [
    b.id,
    names.get(b.id),
    b.kind,
    b.fromBus,
    b.toBus,
    b.pFromMW,
    b.qFromMvar,
    b.pToMW,
    b.qToMvar,
    b.lossKW,
    b.currentA,
    b.loadingPct,
  ]);
  return toCsv(header, rows);
}
