// A team's equipment types from a CSV (a maker's data sheet, a purchasing list): transformers or
// conductors, one type a row. A row whose name matches a type of the same kind already in the
// library updates it; any other row adds one. Quantities may carry units in the header or the cell.
import { formatPath } from "#solver/schema.ts";
import {
  conductorTypeDataSchema,
  libraryTypeNameSchema,
  transformerTypeDataSchema,
  type ConductorTypeData,
  type LibraryTypeKind,
  type SavedLibraryType,
  type TransformerTypeData,
} from "#app/lib/libraryTypes.ts";
import {
  cellOf,
  columnFor,
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

type TransformerField = "name" | keyof TransformerTypeData;
type ConductorField = "name" | keyof ConductorTypeData;

export const transformerColumns: ColumnSpec<TransformerField>[] = [
  { field: "name", header: "name", names: ["name", "type", "typename"], required: true },
  { field: "ratedMVA", header: "ratedMVA", names: ["ratedmva", "rating", "ratedpower"], kind: "MVA", unitBases: ["rated", "rating", "ratedpower"], required: true },
  { field: "hvKV", header: "hvKV", names: ["hvkv", "hv"], kind: "kV", unitBases: ["hv"], required: true },
  { field: "lvKV", header: "lvKV", names: ["lvkv", "lv"], kind: "kV", unitBases: ["lv"], required: true },
  { field: "impedancePct", header: "impedancePct", names: ["impedancepct", "impedance", "uk", "ukpct"], kind: "pct", unitBases: ["impedance", "uk"], required: true },
  { field: "loadLossKW", header: "loadLossKW", names: ["loadlosskw", "loadloss", "copperloss"], kind: "kW", unitBases: ["loadloss", "copperloss"], required: false },
  { field: "noLoadLossKW", header: "noLoadLossKW", names: ["noloadlosskw", "noloadloss", "coreloss", "ironloss"], kind: "kW", unitBases: ["noloadloss", "coreloss", "ironloss"], required: false },
  { field: "xOverR", header: "xOverR", names: ["xoverr", "x/r", "xr"], kind: "ratio", required: false },
  { field: "vectorGroup", header: "vectorGroup", names: ["vectorgroup", "vector", "group"], required: false },
];

export const conductorColumns: ColumnSpec<ConductorField>[] = [
  { field: "name", header: "name", names: ["name", "type", "typename", "conductor"], required: true },
  { field: "kind", header: "kind", names: ["kind", "construction"], required: true },
  { field: "rOhmPerKm", header: "rOhmPerKm", names: ["rohmperkm", "r", "resistance"], kind: "ohmPerKm", unitBases: ["r", "resistance"], required: true },
  { field: "xOhmPerKm", header: "xOhmPerKm", names: ["xohmperkm", "x", "reactance"], kind: "ohmPerKm", unitBases: ["x", "reactance"], required: true },
  { field: "bMicroSiemensPerKm", header: "bMicroSiemensPerKm", names: ["bmicrosiemensperkm", "b", "susceptance"], kind: "microSiemensPerKm", unitBases: ["b", "susceptance"], required: false },
  { field: "ampacityA", header: "ampacityA", names: ["ampacitya", "ampacity", "rating", "ratedcurrent"], kind: "A", unitBases: ["ampacity", "ratedcurrent"], required: true },
  { field: "frequencyHz", header: "frequencyHz", names: ["frequencyhz", "frequency", "hz"], required: false },
  { field: "material", header: "material", names: ["material"], required: false },
  { field: "crossSectionMm2", header: "crossSectionMm2", names: ["crosssectionmm2", "crosssection", "mm2", "area"], required: false },
  { field: "nominalKV", header: "nominalKV", names: ["nominalkv", "systemkv", "voltage"], kind: "kV", unitBases: ["nominal", "system", "voltage"], required: false },
  { field: "source", header: "source", names: ["source", "reference", "datasheet"], required: false },
];

export interface LibraryTypeChange {
  row: number;
  action: "new" | "update";
  kind: LibraryTypeKind;
  name: string;
  data: TransformerTypeData | ConductorTypeData;
  /** The saved type's id, for an update. */
  id?: number;
}

export interface LibraryImportPreview {
  ok: boolean;
  kind?: LibraryTypeKind;
  fileError?: string;
  rowErrors: RowError[];
  totalRowErrors: number;
  changes: LibraryTypeChange[];
  ignoredColumns: string[];
  delimiter?: string;
}

export interface LibraryImportOptions {
  /** Which types the file holds; read from the header when not given. */
  kind?: LibraryTypeKind;
  /** The frequency conductor impedances are given for, unless a frequencyHz column says. */
  frequencyHz: 50 | 60;
  /** Types already in the team's library, to tell updates from new types. */
  existing: Pick<SavedLibraryType, "id" | "kind" | "name">[];
  byteLength?: number;
}

function failedFile(fileError: string, kind?: LibraryTypeKind): LibraryImportPreview {
  return { ok: false, kind, fileError, rowErrors: [], totalRowErrors: 0, changes: [], ignoredColumns: [] };
}

/** Whichever kind's columns the header names more of (the shared "name" aside); null on a tie. */
export function detectLibraryKind(headers: string[]): LibraryTypeKind | null {
  const score = (specs: ColumnSpec<string>[]) =>
    headers.filter((header) => {
      const found = columnFor(header, specs);
      return found !== undefined && found.spec.field !== "name";
    }).length;
  const transformer = score(transformerColumns);
  const conductor = score(conductorColumns);
  if (transformer === conductor) return null;
  return transformer > conductor ? "transformer" : "conductor";
}

const normalName = (text: string) => text.trim().toLowerCase().replace(/\s+/g, " ");

function readKind(cell: string): "overhead" | "cable" | undefined {
  const key = headerKey(cell);
  if (["overhead", "overheadline", "ohl", "line"].includes(key)) return "overhead";
  if (["cable", "undergroundcable", "ug"].includes(key)) return "cable";
  return undefined;
}

/** Reads one row's cells into the raw object the type's schema checks. */
function rowObject<F extends string>(
  row: CsvRow,
  columns: Map<F, MatchedColumn<F>>,
  delimiter: string,
  fail: (column: string, message: string) => void,
): Record<string, unknown> {
  const data: Record<string, unknown> = {};
  for (const [field, column] of columns) {
    if (field === "name") continue;
    const cell = cellOf(row, column);
    if (cell === "") {
      if (column.spec.required) fail(column.header, "is required");
      continue;
    }
    if (field === "kind") {
      const kind = readKind(cell);
      if (kind) data.kind = kind;
      else fail(column.header, `"${cell}" is not overhead or cable`);
    } else if (field === "frequencyHz") {
      const hz = Number(cell.replace(/\s*hz$/i, ""));
      if (hz === 50 || hz === 60) data.frequencyHz = hz;
      else fail(column.header, `"${cell}" is not 50 or 60 Hz`);
    } else if (field === "material") {
      const material = cell.trim().toLowerCase().replace("aluminum", "aluminium");
      if (material === "copper" || material === "aluminium" || material === "acsr") data.material = material;
      else fail(column.header, `"${cell}" is not copper, aluminium or acsr`);
    } else if (field === "crossSectionMm2") {
      const mm2 = Number(cell.replace(/\s*mm(²|2)$/i, ""));
      if (Number.isFinite(mm2)) data.crossSectionMm2 = mm2;
      else fail(column.header, `"${cell}" is not a cross-section in mm²`);
    } else if (column.spec.kind) {
      const read = readQuantityCell(cell, column, delimiter);
      if (read.ok) data[field] = read.value;
      else fail(column.header, read.error);
    } else data[field] = cell;
  }
  return data;
}

/** Reads a library CSV: the types it adds or updates and every row error. */
export function previewLibraryCsv(text: string, options: LibraryImportOptions): LibraryImportPreview {
  const reading = readCsvTable(text, "A library file", options.byteLength);
  if (!reading.ok) return failedFile(reading.error, options.kind);
  const { table } = reading;
  const kind = options.kind ?? detectLibraryKind(table.headers);
  if (!kind)
    return failedFile(
      "Cannot tell whether the file holds transformers (ratedMVA, hvKV, lvKV, impedancePct) or conductors (kind, rOhmPerKm, xOhmPerKm, ampacityA); choose the kind.",
    );
  const specs = (kind === "transformer" ? transformerColumns : conductorColumns) as ColumnSpec<string>[];
  const schema = kind === "transformer" ? transformerTypeDataSchema : conductorTypeDataSchema;
  const matched = matchColumns(table.headers, specs);
  if (!matched.ok) return failedFile(matched.error, kind);
  const { columns } = matched;
  const headerOf = (field: string) => columns.get(field)?.header ?? field;

  const existingByName = new Map(
    options.existing.filter((t) => t.kind === kind).map((t) => [normalName(t.name), t.id]),
  );
  const rowErrors: RowError[] = [...reading.rowErrors];
  const changes: LibraryTypeChange[] = [];
  const rowOfName = new Map<string, number>();

  for (const row of table.rows) {
    const errors: RowError[] = [];
    const fail = (column: string, message: string) => errors.push({ row: row.row, column, message });
    const name = libraryTypeNameSchema.safeParse(cellOf(row, columns.get("name")));
    if (!name.success) fail(headerOf("name"), name.error.issues[0].message);
    const defaults = kind === "conductor" ? { frequencyHz: options.frequencyHz } : {};
    const raw = { ...defaults, ...rowObject(row, columns, table.delimiter, fail) };
    if (errors.length === 0) {
      const data = schema.safeParse(raw);
      if (!data.success)
        for (const issue of data.error.issues) fail(headerOf(formatPath(issue.path)), issue.message);
      else if (name.success) {
        const key = normalName(name.data);
        const earlier = rowOfName.get(key);
        if (earlier !== undefined) fail(headerOf("name"), `row ${earlier} already gives a type named "${name.data}"`);
        else {
          rowOfName.set(key, row.row);
          const id = existingByName.get(key);
          changes.push({ row: row.row, action: id === undefined ? "new" : "update", kind, name: name.data, data: data.data, id });
        }
      }
    }
    rowErrors.push(...errors);
  }

  const base = { kind, changes, ignoredColumns: matched.ignored, delimiter: table.delimiter };
  if (rowErrors.length > 0)
    return { ...base, ok: false, rowErrors: listedRowErrors(rowErrors), totalRowErrors: rowErrors.length };
  return { ...base, ok: true, rowErrors: [], totalRowErrors: 0 };
}
