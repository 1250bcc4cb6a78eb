// Loads from a CSV list (a utility's metering records, a client's schedule) into a network: each
// row names its bus, the load, P, and Q or a power factor. A row whose load already exists (by
// id, or by name when the file has no id column) updates it; any other row adds a load. The
// preview lists every row error and the resulting change; the change applies only when there are
// none and the document still validates.
import { ELEMENT_COLLECTIONS } from "#solver/elements.ts";
import { validateNetwork, type Bus, type Load, type Network } from "#solver/schema.ts";
import {
  cellOf,
  headerKey,
  listedRowErrors,
  matchColumns,
  readCsvTable,
  readQuantityCell,
  type ColumnSpec,
  type CsvRow,
  type MatchedColumn,
  type RowError,
} from "./csvTable.ts";

type LoadField = "id" | "bus" | "name" | "pMW" | "qMvar" | "powerFactor" | "model";

export const loadColumns: ColumnSpec<LoadField>[] = [
  { field: "id", header: "id", names: ["id", "loadid"], required: false },
  { field: "bus", header: "bus", names: ["bus", "busid", "busname"], required: true },
  { field: "name", header: "name", names: ["name", "load", "loadname"], required: true },
  {
    field: "pMW",
    header: "P (MW)",
    names: ["p", "pmw", "activepower"],
    kind: "MW",
    unitBases: ["p", "activepower"],
    required: true,
  },
  {
    field: "qMvar",
    header: "Q (Mvar)",
    names: ["q", "qmvar", "reactivepower"],
    kind: "Mvar",
    unitBases: ["q", "reactivepower"],
    required: false,
  },
  { field: "powerFactor", header: "power factor", names: ["pf", "powerfactor", "cosphi", "cosφ"], required: false },
  { field: "model", header: "model", names: ["model", "loadmodel"], required: false },
];

type LoadModel = Load["model"];

const modelSpellings: Record<string, LoadModel> = {
  constantpower: "constant-power",
  power: "constant-power",
  p: "constant-power",
  pq: "constant-power",
  constantcurrent: "constant-current",
  current: "constant-current",
  i: "constant-current",
  constantimpedance: "constant-impedance",
  impedance: "constant-impedance",
  z: "constant-impedance",
};

export interface LoadChange {
  row: number;
  action: "new" | "update";
  load: Load;
  /** The load as it was, for an update. */
  previous?: Load;
  /** How a power factor was read, e.g. "power factor 0.9 lagging gives Q = 2.18 Mvar". */
  note?: string;
}

export interface LoadsImportPreview {
  /** True when the change can be applied: no file or row errors and the result validates. */
  ok: boolean;
  /** Why the whole file cannot be read, if so. */
  fileError?: string;
  rowErrors: RowError[];
  totalRowErrors: number;
  changes: LoadChange[];
  /** Headers the import does not use, so the planner sees nothing was silently taken. */
  ignoredColumns: string[];
  delimiter?: string;
  /** The network after the change, validated; present only when `ok`. */
  network?: Network;
}

function failedFile(fileError: string): LoadsImportPreview {
  return { ok: false, fileError, rowErrors: [], totalRowErrors: 0, changes: [], ignoredColumns: [] };
}

const normalName = (text: string) => text.trim().toLowerCase().replace(/\s+/g, " ");

function significant(value: number): number {
  return Number(value.toPrecision(10));
}

type PowerFactor = { ok: true; value: number; leading: boolean } | { ok: false; error: string };

/** "0.9", "0.9 lagging", "0.95 leading", "0,92 lag": lagging when not said (common practice for loads). */
export function readPowerFactor(cell: string, delimiter: string): PowerFactor {
  const text = delimiter === "," ? cell.trim() : cell.trim().replace(/(\d),(\d)/, "$1.$2");
  const match = /^(\d*\.?\d+)\s*(lagging|lag|inductive|ind|leading|lead|capacitive|cap)?$/i.exec(text);
  if (!match) return { ok: false, error: `cannot read "${cell}" as a power factor such as 0.9, 0.9 lagging or 0.95 leading` };
  const value = Number(match[1]);
  if (!(value > 0 && value <= 1)) return { ok: false, error: `a power factor must be above 0 and at most 1, not ${match[1]}` };
  const leading = /^(leading|lead|capacitive|cap)$/i.test(match[2] ?? "");
  return { ok: true, value, leading };
}

/** Q from P and a power factor: Q = P·tan(arccos pf); positive (absorbed) when lagging. */
export function reactivePowerMvar(pMW: number, powerFactor: number, leading: boolean): number {
  const q = (pMW * Math.sqrt(1 - powerFactor * powerFactor)) / powerFactor;
  return significant(leading ? -q : q);
}

function slug(name: string): string {
  return name
    .normalize("NFKD")
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 40);
}

function allIds(network: Network): Set<string> {
  const ids = new Set<string>();
  for (const key of ELEMENT_COLLECTIONS)
    for (const element of network[key]) ids.add(element.id);
  return ids;
}

function newLoadId(name: string, taken: Set<string>): string {
  const base = `ld-${slug(name) || "load"}`;
  let id = base;
  for (let n = 2; taken.has(id); n++) id = `${base}-${n}`;
  taken.add(id);
  return id;
}

interface Lookup {
  busById: Map<string, Bus>;
  busesByName: Map<string, Bus[]>;
  loadById: Map<string, Load>;
  loadsByName: Map<string, Load[]>;
}

function lookup(network: Network): Lookup {
  const group = <T extends { name: string }>(items: T[]) => {
    const map = new Map<string, T[]>();
    for (const item of items) map.set(normalName(item.name), [...(map.get(normalName(item.name)) ?? []), item]);
    return map;
  };
  return {
    busById: new Map(network.buses.map((b) => [b.id, b])),
    busesByName: group(network.buses),
    loadById: new Map(network.loads.map((l) => [l.id, l])),
    loadsByName: group(network.loads),
  };
}

type Columns = Map<LoadField, MatchedColumn<LoadField>>;

/** Reads one row into a change, or the errors that stop it. */
function readRow(
  row: CsvRow,
  columns: Columns,
  delimiter: string,
  known: Lookup,
): { change?: Omit<LoadChange, "row">; errors: Omit<RowError, "row">[] } {
  const errors: Omit<RowError, "row">[] = [];
  const column = (field: LoadField) => columns.get(field);
  const cell = (field: LoadField) => cellOf(row, column(field));
  const fail = (field: LoadField, message: string) => errors.push({ column: column(field)?.header ?? "", message });

  const idCell = cell("id");
  const nameCell = cell("name");
  let previous: Load | undefined;
  if (idCell) previous = known.loadById.get(idCell);
  else if (nameCell) {
    const sameName = known.loadsByName.get(normalName(nameCell)) ?? [];
    if (sameName.length > 1)
      fail("name", `${sameName.length} loads in the network are named "${nameCell}"; add an id column to say which`);
    else previous = sameName[0];
  }
  if (!nameCell && !previous) fail("name", "a new load needs a name");
  if (idCell.length > 100) fail("id", "an id may have at most 100 characters");

  let bus: Bus | undefined;
  const busCell = cell("bus");
  if (!busCell) fail("bus", "give the bus by its id or its name");
  else {
    bus = known.busById.get(busCell);
    if (!bus) {
      const byName = known.busesByName.get(normalName(busCell)) ?? [];
      if (byName.length > 1) fail("bus", `${byName.length} buses are named "${busCell}"; give the bus id instead`);
      else if (byName.length === 0) fail("bus", `no bus has the id or name "${busCell}"`);
      else bus = byName[0];
    }
  }

  let pMW: number | undefined;
  const pCell = cell("pMW");
  if (!pCell) fail("pMW", "P is required");
  else {
    const read = readQuantityCell(pCell, column("pMW")!, delimiter);
    if (read.ok) pMW = read.value;
    else fail("pMW", read.error);
  }

  let qMvar: number | undefined;
  let note: string | undefined;
  const qCell = cell("qMvar");
  const pfCell = cell("powerFactor");
  if (qCell && pfCell) fail("qMvar", "give Q or a power factor, not both");
  else if (qCell) {
    const read = readQuantityCell(qCell, column("qMvar")!, delimiter);
    if (read.ok) qMvar = read.value;
    else fail("qMvar", read.error);
  } else if (pfCell) {
    const pf = readPowerFactor(pfCell, delimiter);
    if (!pf.ok) fail("powerFactor", pf.error);
    else if (pMW !== undefined && pMW < 0)
      fail("powerFactor", "a power factor needs a positive P; for a load that exports, give Q instead");
    else if (pMW !== undefined) {
      qMvar = reactivePowerMvar(pMW, pf.value, pf.leading);
      note = `power factor ${pf.value} ${pf.leading ? "leading" : "lagging"} gives Q = ${qMvar} Mvar`;
    }
  } else fail(columns.has("qMvar") ? "qMvar" : "powerFactor", "give Q or a power factor");

  let model: LoadModel = previous?.model ?? "constant-power";
  const modelCell = cell("model");
  if (modelCell) {
    const read = modelSpellings[headerKey(modelCell)];
    if (read) model = read;
    else fail("model", `"${modelCell}" is not a load model; use constant-power, constant-current or constant-impedance`);
  }

  if (errors.length > 0 || !bus || pMW === undefined || qMvar === undefined) return { errors };
  const load: Load = {
    id: previous?.id ?? idCell,
    name: nameCell || previous!.name,
    bus: bus.id,
    pMW,
    qMvar,
    model,
  };
  return { change: { action: previous ? "update" : "new", load, previous, note }, errors };
}

/** The network's loads after the changes: updates in place, new loads at the end. */
function mergedLoads(network: Network, changes: LoadChange[]): Load[] {
  const updates = new Map(changes.filter((c) => c.action === "update").map((c) => [c.previous!.id, c.load]));
  return [
    ...network.loads.map((load) => updates.get(load.id) ?? load),
    ...changes.filter((c) => c.action === "new").map((c) => c.load),
  ];
}

/** The network with the changes applied (pure), validated. */
export function applyLoadChanges(network: Network, changes: LoadChange[]): ReturnType<typeof validateNetwork> {
  return validateNetwork({ ...network, loads: mergedLoads(network, changes) });
}

/** Reads a loads CSV against a network: the changes it makes and every row error. */
export function previewLoadsCsv(text: string, network: Network, byteLength?: number): LoadsImportPreview {
  const reading = readCsvTable(text, "A loads file", byteLength);
  if (!reading.ok) return failedFile(reading.error);
  const { table } = reading;
  const matched = matchColumns(table.headers, loadColumns);
  if (!matched.ok) return failedFile(matched.error);
  const { columns } = matched;
  if (!columns.has("qMvar") && !columns.has("powerFactor"))
    return failedFile('The header needs a "Q (Mvar)" column or a "power factor" column.');

  const known = lookup(network);
  const rowErrors: RowError[] = [...reading.rowErrors];
  const changes: LoadChange[] = [];
  const claimedBy = new Map<string, number>();
  const newIds = allIds(network);

  for (const row of table.rows) {
    const { change, errors } = readRow(row, columns, table.delimiter, known);
    rowErrors.push(...errors.map((e) => ({ ...e, row: row.row })));
    if (!change) continue;
    // Two rows changing one load, or adding two loads of one name, is almost always a slip.
    const claimKey = change.previous ? `id:${change.previous.id}` : `new:${normalName(change.load.name)}`;
    const earlier = claimedBy.get(claimKey);
    if (earlier !== undefined) {
      rowErrors.push({
        row: row.row,
        column: columns.get(change.previous ? (columns.has("id") ? "id" : "name") : "name")!.header,
        message: change.previous
          ? `row ${earlier} already changes load "${change.previous.name}" (${change.previous.id})`
          : `row ${earlier} already adds a load named "${change.load.name}"`,
      });
      continue;
    }
    claimedBy.set(claimKey, row.row);
    if (change.action === "new") {
      if (change.load.id === "") change.load.id = newLoadId(change.load.name, newIds);
      else if (newIds.has(change.load.id)) {
        rowErrors.push({ row: row.row, column: columns.get("id")!.header, message: `id "${change.load.id}" is already used by another element` });
        continue;
      } else newIds.add(change.load.id);
    }
    changes.push({ ...change, row: row.row });
  }

  const base = {
    ignoredColumns: matched.ignored,
    delimiter: table.delimiter,
    changes,
  };
  if (rowErrors.length > 0)
    return { ...base, ok: false, rowErrors: listedRowErrors(rowErrors), totalRowErrors: rowErrors.length };

  const applied = applyLoadChanges(network, changes);
  if (!applied.ok) {
    // Map a problem on loads[i] back to the row that wrote that load.
    const rowOfLoad = new Map<string, number>(changes.map((c) => [c.load.id, c.row]));
    const finalLoads = mergedLoads(network, changes);
    const documentErrors = applied.issues.map((issue) => {
      const index = /^loads\[(\d+)\]/.exec(issue.path);
      const load = index ? finalLoads[Number(index[1])] : undefined;
      return { row: (load && rowOfLoad.get(load.id)) ?? 0, column: "", message: `${issue.path}: ${issue.message}` };
    });
    return { ...base, ok: false, rowErrors: listedRowErrors(documentErrors), totalRowErrors: documentErrors.length };
  }
  return { ...base, ok: true, rowErrors: [], totalRowErrors: 0, network: applied.network };
}
