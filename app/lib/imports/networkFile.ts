// Reading an uploaded network file: size, JSON syntax, then the network file's own validation,
// and a preview of what it holds so the planner can confirm before anything is saved. Pure: the
// upload page runs it in the browser for the preview, the server runs it again before saving.
import { validateNetwork, type Network, type ValidationIssue } from "#solver/schema.ts";
import { findJsonSyntaxError } from "./jsonSyntax.ts";
import { uploadTooLarge, utf8ByteLength, withoutByteOrderMark } from "./uploadLimits.ts";

export interface ElementCounts {
  buses: number;
  gridInfeeds: number;
  generators: number;
  transformers: number;
  overheadLines: number;
  cables: number;
  loads: number;
  shunts: number;
}

export const elementCountLabels: Record<keyof ElementCounts, string> = {
  buses: "Buses",
  gridInfeeds: "Grid infeeds",
  generators: "Generators",
  transformers: "Transformers",
  overheadLines: "Overhead lines",
  cables: "Cables",
  loads: "Loads",
  shunts: "Shunts",
};

export interface NetworkFilePreview {
  /** The document's name when it has a readable one. */
  name: string | null;
  frequencyHz: number | null;
  counts: ElementCounts;
  /** Distinct bus nominal voltages, highest first. */
  voltageLevelsKV: number[];
}

/** At most this many problems are listed; the total is always given. */
export const LISTED_ISSUES_MAX = 200;

export type NetworkFileReading =
  | { ok: true; network: Network; preview: NetworkFilePreview }
  | {
      ok: false;
      /** One sentence saying why the file cannot be used. */
      error: string;
      /** Each problem with its path (the first LISTED_ISSUES_MAX). */
      issues: ValidationIssue[];
      totalIssues: number;
      /** What could be counted, when the file is JSON at all. */
      preview: NetworkFilePreview | null;
    };

function listOf(document: Record<string, unknown>, key: string): unknown[] {
  const value = document[key];
  return Array.isArray(value) ? value : [];
}

function field(element: unknown, key: string): unknown {
  return element !== null && typeof element === "object" ? (element as Record<string, unknown>)[key] : undefined;
}

/** Counts what a document holds, tolerating any shape, so a broken file still gets a preview. */
export function previewDocument(document: unknown): NetworkFilePreview | null {
  if (document === null || typeof document !== "object" || Array.isArray(document)) return null;
  const doc = document as Record<string, unknown>;
  const sources = listOf(doc, "sources");
  const lines = listOf(doc, "lines");
  const buses = listOf(doc, "buses");
  const levels = new Set<number>();
  for (const bus of buses) {
    const kV = field(bus, "nominalKV");
    if (typeof kV === "number" && Number.isFinite(kV) && kV > 0) levels.add(kV);
  }
  const name = typeof doc.name === "string" && doc.name.trim() ? doc.name.trim() : null;
  const frequencyHz = typeof doc.frequencyHz === "number" ? doc.frequencyHz : null;
  return {
    name,
    frequencyHz,
    counts: {
      buses: buses.length,
      gridInfeeds: sources.filter((s) => field(s, "kind") === "grid").length,
      generators: sources.filter((s) => field(s, "kind") === "generator").length,
      transformers: listOf(doc, "transformers").length,
      overheadLines: lines.filter((l) => field(l, "kind") !== "cable").length,
      cables: lines.filter((l) => field(l, "kind") === "cable").length,
      loads: listOf(doc, "loads").length,
      shunts: listOf(doc, "shunts").length,
    },
    voltageLevelsKV: [...levels].sort((a, b) => b - a),
  };
}

function refused(error: string, issues: ValidationIssue[] = [], preview: NetworkFilePreview | null = null): NetworkFileReading {
  return { ok: false, error, issues: issues.slice(0, LISTED_ISSUES_MAX), totalIssues: issues.length, preview };
}

/**
 * Reads an uploaded network file's text. `byteLength` is the file's size when the caller knows
 * it (a File or a request's length); otherwise it is counted from the text.
 */
export function readNetworkFile(text: string, byteLength = utf8ByteLength(text)): NetworkFileReading {
  const tooLarge = uploadTooLarge(byteLength, "A network file");
  if (tooLarge) return refused(tooLarge);
  const body = withoutByteOrderMark(text);
  if (body.trim() === "") return refused("The file is empty; a network file is a JSON document.");

  let document: unknown;
  try {
    document = JSON.parse(body);
  } catch (parseError) {
    const place = findJsonSyntaxError(body);
    const detail = place
      ? `line ${place.line}, column ${place.column}: ${place.message}`
      : (parseError as Error).message;
    return refused(`The file is not valid JSON (${detail}).`, [
      { path: place ? `line ${place.line}, column ${place.column}` : "", message: place?.message ?? detail },
    ]);
  }

  const preview = previewDocument(document);
  const validated = validateNetwork(document);
  if (!validated.ok) {
    const count = validated.issues.length;
    return refused(
      `The file is not a valid network: ${count} problem${count === 1 ? "" : "s"} found.`,
      validated.issues,
      preview,
    );
  }
  return { ok: true, network: validated.network, preview: previewDocument(validated.network)! };
}
