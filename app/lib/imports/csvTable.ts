// Reading a CSV file a planner exported from a spreadsheet or a utility's records into a header
// and rows, and matching its columns to the fields an import needs. Rows are numbered as a
// spreadsheet shows them (the header is row 1), so an error points at the row the planner sees.
import Papa from "papaparse";
import { parseQuantity, unitLabel, type QuantityKind } from "#app/lib/units.ts";
import { uploadTooLarge, utf8ByteLength, withoutByteOrderMark } from "./uploadLimits.ts";

export interface RowError {
  /** Spreadsheet row number: the header is row 1, the first data row is row 2. */
  row: number;
  /** The column's header as written in the file; empty when the whole row is meant. */
  column: string;
  message: string;
}

/** At most this many row errors are listed; the total is always given. */
export const LISTED_ROW_ERRORS_MAX = 200;
export const CSV_ROW_LIMIT = 20_000;

export interface CsvRow {
  row: number;
  cells: string[];
}

export interface CsvTable {
  delimiter: string;
  headers: string[];
  rows: CsvRow[];
}

export type CsvReading =
  | { ok: true; table: CsvTable; rowErrors: RowError[] }
  | { ok: false; error: string };

const delimiterNames: Record<string, string> = { ",": "comma", ";": "semicolon", "\t": "tab", "|": "vertical bar" };

export function delimiterName(delimiter: string): string {
  return delimiterNames[delimiter] ?? `"${delimiter}"`;
}

/**
 * The separator is whichever of comma, semicolon, tab or bar occurs most often in the header
 * line outside quotes. The header is the one line a planner never leaves ragged, which makes it
 * a surer guide than sampling data rows (spreadsheets in many locales save with semicolons).
 */
export function detectDelimiter(text: string): string {
  const counts = new Map<string, number>();
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const char = text[i];
    if (char === '"') quoted = !quoted;
    else if (!quoted && (char === "\n" || char === "\r")) break;
    else if (!quoted && char in delimiterNames) counts.set(char, (counts.get(char) ?? 0) + 1);
  }
  let best = ",";
  let bestCount = 0;
  for (const [delimiter, count] of counts) {
    if (count > bestCount) {
      best = delimiter;
      bestCount = count;
    }
  }
  return best;
}

const isBlankRow = (cells: string[]) => cells.every((cell) => cell.trim() === "");

/** Reads CSV text into a header and its non-blank rows; structural faults become row errors. */
export function readCsvTable(text: string, what: string, byteLength = utf8ByteLength(text)): CsvReading {
  const tooLarge = uploadTooLarge(byteLength, what);
  if (tooLarge) return { ok: false, error: tooLarge };
  const body = withoutByteOrderMark(text);
  if (body.trim() === "") return { ok: false, error: `The file is empty; ${what.toLowerCase()} needs a header row and at least one row.` };

  const delimiter = detectDelimiter(body);
  const parsed = Papa.parse<string[]>(body, { delimiter, skipEmptyLines: false });
  const records = parsed.data;
  const headerIndex = records.findIndex((cells) => !isBlankRow(cells));
  if (headerIndex < 0) return { ok: false, error: `The file has no header row.` };
  const headers = records[headerIndex].map((h) => h.trim());
  if (records.length - headerIndex - 1 > CSV_ROW_LIMIT)
    return { ok: false, error: `The file has more than ${CSV_ROW_LIMIT.toLocaleString("en")} rows; split it into smaller files.` };

  const rowErrors: RowError[] = [];
  for (const fault of parsed.errors) {
    if (fault.code === "UndetectableDelimiter" || fault.row === undefined) continue;
    const message =
      fault.code === "MissingQuotes"
        ? "a quoted cell is never closed; every opening double quote needs a closing one"
        : fault.code === "InvalidQuotes"
          ? "a cell has a stray double quote; inside a quoted cell write a double quote twice"
          : fault.message;
    rowErrors.push({ row: fault.row + 1, column: "", message });
  }

  // A row whose structure is broken is reported once and not read further: its cells are
  // shifted or swallowed, and errors about them would only mislead.
  const brokenRows = new Set(rowErrors.map((e) => e.row));
  const rows: CsvRow[] = [];
  for (let index = headerIndex + 1; index < records.length; index++) {
    const cells = records[index];
    const row = index + 1;
    if (isBlankRow(cells) || brokenRows.has(row)) continue;
    const extra = cells.slice(headers.length).filter((cell) => cell.trim() !== "");
    if (extra.length > 0)
      rowErrors.push({
        row,
        column: "",
        message: `has ${cells.length} cells but the header has ${headers.length} (separator: ${delimiterName(delimiter)}); is a value missing its quotes?`,
      });
    else rows.push({ row, cells });
  }
  if (rows.length === 0 && rowErrors.length === 0) return { ok: false, error: `The file has a header but no rows.` };
  return { ok: true, table: { delimiter, headers, rows }, rowErrors };
}

/** What an import expects in a column. */
export interface ColumnSpec<F extends string> {
  field: F;
  /** The header we document, e.g. "ratedMVA". */
  header: string;
  /** Header spellings meaning "in the field's own unit", compared by `headerKey`. */
  names: string[];
  /** For a quantity: its kind, and the names that may carry a unit in brackets, e.g. "P (kW)". */
  kind?: QuantityKind;
  unitBases?: string[];
  required: boolean;
}

export interface MatchedColumn<F extends string> {
  spec: ColumnSpec<F>;
  index: number;
  /** The header as written. */
  header: string;
  /** A unit the header gives for plain numbers in this column, e.g. "kW". */
  unit?: string;
}

/** Case, spaces, underscores, hyphens and dots do not matter in a header. */
export function headerKey(header: string): string {
  return header.toLowerCase().replace(/[\s_.\-]/g, "");
}

function unitFits(unit: string, kind: QuantityKind): boolean {
  if (kind === "pct") return unit === "%" || /^(pct|percent)$/i.test(unit);
  return parseQuantity(`1 ${unit}`, kind).ok;
}

function matchWithUnit<F extends string>(header: string, spec: ColumnSpec<F>): string | undefined {
  if (!spec.kind || !spec.unitBases) return undefined;
  const bracketed = /^(.*?)\s*[([]\s*([^)\]]+?)\s*[)\]]$/.exec(header);
  if (bracketed) {
    if (!spec.unitBases.includes(headerKey(bracketed[1]))) return undefined;
    return unitFits(bracketed[2], spec.kind) ? bracketed[2] : undefined;
  }
  // Compact spellings such as "P kW", "p_kw" or "QkVAr": a base name followed by a unit.
  const compact = header.replace(/[\s_]/g, "");
  for (const base of spec.unitBases) {
    if (compact.length > base.length && compact.toLowerCase().startsWith(base)) {
      const unit = compact.slice(base.length);
      if (/^[a-z%]/i.test(unit) && unitFits(unit, spec.kind)) return unit;
    }
  }
  return undefined;
}

/** The column a header means: an exact name first, then a name with a unit. */
export function columnFor<F extends string>(header: string, specs: ColumnSpec<F>[]): { spec: ColumnSpec<F>; unit?: string } | undefined {
  const key = headerKey(header);
  const exact = specs.find((spec) => spec.names.includes(key));
  if (exact) return { spec: exact };
  for (const spec of specs) {
    const unit = matchWithUnit(header, spec);
    if (unit) return { spec, unit };
  }
  return undefined;
}

export type ColumnMatch<F extends string> =
  | { ok: true; columns: Map<F, MatchedColumn<F>>; ignored: string[] }
  | { ok: false; error: string };

/** Matches headers to the columns an import expects; a header unit that does not fit is an error. */
export function matchColumns<F extends string>(headers: string[], specs: ColumnSpec<F>[]): ColumnMatch<F> {
  const columns = new Map<F, MatchedColumn<F>>();
  const ignored: string[] = [];
  const claim = (spec: ColumnSpec<F>, index: number, unit?: string): string | null => {
    const already = columns.get(spec.field);
    if (already) return `The columns "${already.header}" and "${headers[index]}" both give ${spec.header}; keep one.`;
    columns.set(spec.field, { spec, index, header: headers[index], unit });
    return null;
  };

  for (let index = 0; index < headers.length; index++) {
    const header = headers[index];
    if (header === "") continue;
    const found = columnFor(header, specs);
    if (found) {
      const clash = claim(found.spec, index, found.unit);
      if (clash) return { ok: false, error: clash };
      continue;
    }
    const bracketUnit = /^(.*?)\s*[([]\s*([^)\]]+?)\s*[)\]]$/.exec(header);
    const sameBase = bracketUnit && specs.find((spec) => spec.unitBases?.includes(headerKey(bracketUnit[1])));
    if (sameBase && sameBase.kind)
      return {
        ok: false,
        error: `The column "${header}" gives the unit "${bracketUnit[2]}", which is not ${expectedUnit(sameBase.kind)}.`,
      };
    ignored.push(header);
  }

  const missing = specs.filter((spec) => spec.required && !columns.has(spec.field));
  if (missing.length > 0)
    return {
      ok: false,
      error: `The header has no ${missing.map((spec) => `"${spec.header}"`).join(", ")} column${missing.length > 1 ? "s" : ""}. Found: ${headers.filter(Boolean).map((h) => `"${h}"`).join(", ") || "nothing"}.`,
    };
  return { ok: true, columns, ignored };
}

function expectedUnit(kind: QuantityKind): string {
  return kind === "pct" ? "a percentage" : `a unit of the same kind as ${unitLabel(kind)}`;
}

/** Reads a cell as a number written with a comma for the decimal point (semicolon-separated files). */
function decimalPoint(cell: string, delimiter: string): string {
  if (delimiter === "," || cell.includes(".")) return cell;
  return cell.replace(/(\d),(\d)/g, "$1.$2");
}

export type CellQuantity = { ok: true; value: number } | { ok: false; error: string };

/**
 * A quantity cell in the column's stored unit. A plain number takes the header's unit when it
 * gives one; a cell with its own unit ("250 kW") keeps it.
 */
export function readQuantityCell<F extends string>(
  cell: string,
  column: MatchedColumn<F>,
  delimiter: string,
): CellQuantity {
  const kind = column.spec.kind!;
  const text = decimalPoint(cell.trim(), delimiter);
  const plain = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(text);
  const withUnit = plain && column.unit ? `${text} ${column.unit === "pct" || column.unit === "percent" ? "%" : column.unit}` : text;
  const parsed = parseQuantity(withUnit, kind);
  return parsed.ok ? { ok: true, value: parsed.value } : { ok: false, error: parsed.error };
}

export function cellOf<F extends string>(row: CsvRow, column: MatchedColumn<F> | undefined): string {
  if (!column) return "";
  return (row.cells[column.index] ?? "").trim();
}

/** Keeps the first LISTED_ROW_ERRORS_MAX errors in row order. */
export function listedRowErrors(errors: RowError[]): RowError[] {
  return [...errors].sort((a, b) => a.row - b.row).slice(0, LISTED_ROW_ERRORS_MAX);
}
