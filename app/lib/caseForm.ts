// The operating-case editor's form: one case as form fields and back, checked field by field with
// sentences a planner can act on, and the network with that case added, changed or removed. The
// whole document is then saved through the usual save (validated again, a new revision), so the
// form can never store what the network file's rules refuse.
import { HOURS_PER_LEAP_YEAR } from "#solver/networkRules.ts";
import { operatingCaseSchema, type Network, type OperatingCase } from "#solver/schema.ts";

export type SourceMode = "drawn" | "set" | "out";

/** What the form shows: every value as typed. */
export interface CaseFields {
  /** The case's id before this edit; empty for a new case. */
  originalId: string;
  id: string;
  name: string;
  hoursPerYear: string;
  loadScale: string;
  /** Per-load factor by load id; empty means the case's scale. */
  loads: Record<string, string>;
  sources: Record<string, { mode: SourceMode; pMW: string; qMvar: string; voltagePu: string }>;
  outOfService: string[];
}

export type FieldErrors = Record<string, string>;

export interface FormReader {
  get(name: string): FormDataEntryValue | null;
  getAll(name: string): FormDataEntryValue[];
}

const text = (form: FormReader, name: string) => {
  const value = form.get(name);
  return typeof value === "string" ? value.trim() : "";
};

function figure(value: string): number | null {
  const trimmed = value.trim().replace(/\s/g, "").replace(",", ".");
  if (!/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(trimmed)) return null;
  const n = Number(trimmed);
  return Number.isFinite(n) ? n : null;
}

/** An id from a case name: "Winter peak" → "winter-peak". */
export function caseIdFromName(name: string): string {
  return (
    name
      .toLowerCase()
      .normalize("NFKD")
      .replace(/[^\w\s-]/g, "")
      .trim()
      .replace(/[\s_]+/g, "-")
      .replace(/-+/g, "-")
      .slice(0, 60) || "case"
  );
}

/** The lines, transformers, loads and shunts a case can take out (sources have their own control). */
export function switchableElements(network: Network) {
  return [
    ...network.lines.map((e) => ({ id: e.id, name: e.name, kind: "line" as const })),
    ...network.transformers.map((e) => ({ id: e.id, name: e.name, kind: "transformer" as const })),
    ...network.loads.map((e) => ({ id: e.id, name: e.name, kind: "load" as const })),
    ...network.shunts.map((e) => ({ id: e.id, name: e.name, kind: "shunt" as const })),
  ];
}

const shown = (n: number | undefined) => (n === undefined ? "" : String(n));

/** The form's fields for a stored case, or for a new one (every load as drawn, every source as drawn). */
export function caseFields(network: Network, operatingCase: OperatingCase | null): CaseFields {
  const sourceIds = new Set(network.sources.map((s) => s.id));
  const out = new Set(operatingCase?.outOfService ?? []);
  return {
    originalId: operatingCase?.id ?? "",
    id: operatingCase?.id ?? "",
    name: operatingCase?.name ?? "",
    hoursPerYear: shown(operatingCase?.hoursPerYear),
    loadScale: shown(operatingCase?.loadScale ?? 1),
    loads: Object.fromEntries(Object.entries(operatingCase?.loads ?? {}).map(([id, factor]) => [id, String(factor)])),
    sources: Object.fromEntries(
      network.sources.map((s) => {
        const o = operatingCase?.sources?.[s.id];
        const mode: SourceMode = out.has(s.id) || o?.inService === false ? "out" : o && (o.pMW !== undefined || o.qMvar !== undefined || o.voltagePu !== undefined) ? "set" : "drawn";
        return [s.id, { mode, pMW: shown(o?.pMW), qMvar: shown(o?.qMvar), voltagePu: shown(o?.voltagePu) }];
      }),
    ),
    outOfService: [...out].filter((id) => !sourceIds.has(id)),
  };
}

/** The form as posted, read against the network (only its own loads, sources and elements). */
export function readCaseFields(form: FormReader, network: Network): CaseFields {
  const switchable = new Set(switchableElements(network).map((e) => e.id));
  const modes = new Set<SourceMode>(["drawn", "set", "out"]);
  return {
    originalId: text(form, "originalId"),
    id: text(form, "id"),
    name: text(form, "name"),
    hoursPerYear: text(form, "hoursPerYear"),
    loadScale: text(form, "loadScale"),
    loads: Object.fromEntries(network.loads.map((l) => [l.id, text(form, `load.${l.id}`)]).filter(([, v]) => v !== "")),
    sources: Object.fromEntries(
      network.sources.map((s) => {
        const mode = text(form, `source.${s.id}.mode`) as SourceMode;
        return [s.id, { mode: modes.has(mode) ? mode : "drawn", pMW: text(form, `source.${s.id}.pMW`), qMvar: text(form, `source.${s.id}.qMvar`), voltagePu: text(form, `source.${s.id}.voltagePu`) }];
      }),
    ),
    outOfService: [...new Set(form.getAll("out").filter((v): v is string => typeof v === "string"))].filter((id) => switchable.has(id)),
  };
}

/** The fields as an operating case, or a sentence for each field that is not right. */
export function caseFromFields(fields: CaseFields, network: Network): { ok: true; operatingCase: OperatingCase } | { ok: false; errors: FieldErrors } {
  const errors: FieldErrors = {};
  const names = new Map<string, string>([...network.loads, ...network.sources].map((e) => [e.id, e.name]));
  if (fields.name === "") errors.name = "Give the case a name, e.g. “Winter peak”.";
  else if (fields.name.length > 200) errors.name = "The name is too long: at most 200 characters.";
  const id = fields.id === "" ? caseIdFromName(fields.name) : fields.id;
  if (!/^[\w.-]{1,100}$/.test(id)) errors.id = "The id is letters, digits, “-”, “_” and “.”, at most 100 of them.";
  const others = (network.cases ?? []).filter((c) => c.id !== fields.originalId);
  if (!errors.id && others.some((c) => c.id === id)) errors.id = `Another case already has the id “${id}”; choose another.`;
  if (!errors.name && others.some((c) => c.name.toLowerCase() === fields.name.toLowerCase())) errors.name = `Another case is already called “${fields.name}”.`;

  let hoursPerYear: number | undefined;
  if (fields.hoursPerYear !== "") {
    const hours = figure(fields.hoursPerYear);
    if (hours === null) errors.hoursPerYear = `“${fields.hoursPerYear}” is not a number of hours.`;
    else if (hours < 0 || hours > HOURS_PER_LEAP_YEAR) errors.hoursPerYear = `Hours a year are between 0 and ${HOURS_PER_LEAP_YEAR}.`;
    else {
      hoursPerYear = hours;
      const othersHours = others.reduce((sum, c) => sum + (c.hoursPerYear ?? 0), 0);
      if (othersHours + hours > HOURS_PER_LEAP_YEAR)
        errors.hoursPerYear = `The other cases already stand for ${othersHours.toLocaleString("en-GB")} h; with this one the cases would stand for more than the ${HOURS_PER_LEAP_YEAR.toLocaleString("en-GB")} h of a year (at most ${(HOURS_PER_LEAP_YEAR - othersHours).toLocaleString("en-GB")} h here).`;
    }
  }

  const factor = (value: string, field: string, what: string): number | undefined => {
    const n = figure(value);
    if (n === null) errors[field] = `“${value}” is not a number (${what}).`;
    else if (n < 0 || n > 100) errors[field] = `${what[0].toUpperCase()}${what.slice(1)} is between 0 and 100 (1 is the load as drawn).`;
    else return n;
    return undefined;
  };
  const loadScale = fields.loadScale === "" ? 1 : factor(fields.loadScale, "loadScale", "the scale of every load");
  const loads: Record<string, number> = {};
  for (const [loadId, value] of Object.entries(fields.loads)) {
    const n = factor(value, `load.${loadId}`, `the factor of ${names.get(loadId) ?? loadId}`);
    if (n !== undefined) loads[loadId] = n;
  }

  const sources: NonNullable<OperatingCase["sources"]> = {};
  for (const source of network.sources) {
    const f = fields.sources[source.id];
    if (!f || f.mode === "drawn") continue;
    if (f.mode === "out") {
      sources[source.id] = { inService: false };
      continue;
    }
    const set: NonNullable<OperatingCase["sources"]>[string] = {};
    const read = (value: string, key: "pMW" | "qMvar" | "voltagePu", unit: string, min: number, max: number) => {
      if (value === "") return;
      const n = figure(value);
      const field = `source.${source.id}.${key}`;
      if (n === null) errors[field] = `“${value}” is not a number (${unit}).`;
      else if (n < min || n > max) errors[field] = `Between ${min} and ${max} ${unit}.`;
      else set[key] = n;
    };
    read(f.pMW, "pMW", "MW", -1e5, 1e5);
    read(f.qMvar, "qMvar", "Mvar", -1e5, 1e5);
    read(f.voltagePu, "voltagePu", "pu", 0.5, 1.5);
    if (Object.keys(set).length === 0 && !errors[`source.${source.id}.pMW`] && !errors[`source.${source.id}.qMvar`] && !errors[`source.${source.id}.voltagePu`])
      errors[`source.${source.id}.mode`] = `${source.name} is set to a new dispatch but no value is given: give P, Q or the voltage, or leave it as drawn.`;
    else sources[source.id] = set;
  }

  if (Object.keys(errors).length > 0) return { ok: false, errors };
  const candidate: OperatingCase = {
    id,
    name: fields.name,
    ...(hoursPerYear === undefined ? {} : { hoursPerYear }),
    loadScale: loadScale ?? 1,
    ...(Object.keys(loads).length > 0 ? { loads } : {}),
    ...(Object.keys(sources).length > 0 ? { sources } : {}),
    ...(fields.outOfService.length > 0 ? { outOfService: fields.outOfService } : {}),
  };
  // The network file's own schema has the last word on the case's shape.
  const parsed = operatingCaseSchema.safeParse(candidate);
  if (!parsed.success) return { ok: false, errors: Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0] ?? "case"), i.message])) };
  return { ok: true, operatingCase: parsed.data };
}

/** The network with this case in place of `originalId` (or added at the end), as a version 2 file. */
export function withCase(network: Network, operatingCase: OperatingCase, originalId: string): Network {
  const cases = network.cases ?? [];
  const at = originalId === "" ? -1 : cases.findIndex((c) => c.id === originalId);
  const next = at < 0 ? [...cases, operatingCase] : cases.map((c, i) => (i === at ? operatingCase : c));
  return { ...network, version: 2, cases: next };
}

/** The network without the case; with no case left, it is studied as drawn again. */
export function withoutCase(network: Network, caseId: string): Network {
  const cases = (network.cases ?? []).filter((c) => c.id !== caseId);
  const { cases: _gone, ...rest } = network;
  return cases.length > 0 ? { ...rest, cases } : rest;
}

/** Load growth from the form: both figures, or neither to remove it. */
export function growthFromForm(form: FormReader): { ok: true; growth: Network["growth"] } | { ok: false; errors: FieldErrors } {
  const rateText = text(form, "ratePctPerYear");
  const yearsText = text(form, "years");
  if (rateText === "" && yearsText === "") return { ok: true, growth: undefined };
  const errors: FieldErrors = {};
  const rate = figure(rateText);
  const years = figure(yearsText);
  if (rate === null) errors.ratePctPerYear = rateText === "" ? "Give the growth rate (% a year), or empty both fields to remove growth." : `“${rateText}” is not a number.`;
  else if (rate < -50 || rate > 100) errors.ratePctPerYear = "The growth rate is between −50 and 100 % a year.";
  if (years === null) errors.years = yearsText === "" ? "Give the horizon in years, or empty both fields to remove growth." : `“${yearsText}” is not a number.`;
  else if (!Number.isInteger(years) || years < 1 || years > 100) errors.years = "The horizon is a whole number of years from 1 to 100.";
  if (Object.keys(errors).length > 0) return { ok: false, errors };
  return { ok: true, growth: { ratePctPerYear: rate!, years: years! } };
}
