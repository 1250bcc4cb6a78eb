// What the study page and its downloads were asked to run, read from the address's query:
// ?outages=on (N-1 in every case), ?years=on (load growth), with ?rate= (% a year) and
// ?horizon= (years) replacing the network's own growth for this run. The page's form, the
// progress stream and the CSV downloads read the same query, so a download holds what the page shows.
import { growthSchema } from "#solver/schema.ts";

export interface StudyOptions {
  outages: boolean;
  years: boolean;
  /** As typed, so the form shows it back; empty when the network's own growth is used. */
  rate: string;
  horizon: string;
}

/** The body the study engine takes (network-format.md, "Version 2"). */
export interface StudyRequestBody {
  outages?: boolean;
  years?: boolean | { ratePctPerYear: number; years: number };
}

export type ParsedStudyOptions =
  | { ok: true; options: StudyOptions; request: StudyRequestBody }
  | { ok: false; options: StudyOptions; errors: Partial<Record<keyof StudyOptions, string>> };

const ON = new Set(["on", "1", "true", "yes"]);
const OFF = new Set(["", "off", "0", "false", "no"]);

function flag(search: URLSearchParams, name: string, errors: Partial<Record<keyof StudyOptions, string>>, key: keyof StudyOptions): boolean {
  const value = (search.get(name) ?? "").trim().toLowerCase();
  if (ON.has(value)) return true;
  if (!OFF.has(value)) errors[key] = `"${search.get(name)}" is not a choice here: use ${name}=on, or leave it out.`;
  return false;
}

function figure(text: string): number | null {
  const trimmed = text.trim().replace(",", ".");
  if (!/^[-+]?\d+(\.\d+)?$/.test(trimmed)) return null;
  return Number(trimmed);
}

export function parseStudyOptions(search: URLSearchParams): ParsedStudyOptions {
  const errors: Partial<Record<keyof StudyOptions, string>> = {};
  const options: StudyOptions = {
    outages: flag(search, "outages", errors, "outages"),
    years: flag(search, "years", errors, "years"),
    rate: (search.get("rate") ?? "").trim().slice(0, 40),
    horizon: (search.get("horizon") ?? "").trim().slice(0, 40),
  };
  const request: StudyRequestBody = {};
  if (options.outages) request.outages = true;
  if (options.years) {
    if (options.rate === "" && options.horizon === "") request.years = true;
    else {
      const rate = figure(options.rate);
      const horizon = figure(options.horizon);
      if (rate === null) errors.rate = options.rate === "" ? "Give the growth rate too (% a year), or leave both empty to use the network's own." : `"${options.rate}" is not a number.`;
      if (horizon === null) errors.horizon = options.horizon === "" ? "Give the horizon too (years), or leave both empty to use the network's own." : `"${options.horizon}" is not a number.`;
      const rateIssue = rate === null ? null : growthSchema.shape.ratePctPerYear.safeParse(rate).error?.issues[0];
      const horizonIssue = horizon === null ? null : growthSchema.shape.years.safeParse(horizon).error?.issues[0];
      if (rateIssue) errors.rate = `The growth rate ${rateIssue.message}.`;
      if (horizonIssue) errors.horizon = `The horizon ${horizonIssue.message}.`;
      if (rate !== null && horizon !== null && !rateIssue && !horizonIssue) request.years = { ratePctPerYear: rate, years: horizon };
    }
  } else if (options.rate !== "" || options.horizon !== "") {
    // A rate without asking for years is most likely a forgotten tick: say so rather than ignore it.
    errors.years = "A growth rate or horizon was given without asking for the years study; tick “Years of load growth”.";
  }
  if (Object.keys(errors).length > 0) return { ok: false, options, errors };
  return { ok: true, options, request };
}

/** The query for these options, for links to the downloads and the progress stream. */
export function studyQuery(options: StudyOptions): string {
  const search = new URLSearchParams();
  if (options.outages) search.set("outages", "on");
  if (options.years) search.set("years", "on");
  if (options.years && options.rate !== "") search.set("rate", options.rate);
  if (options.years && options.horizon !== "") search.set("horizon", options.horizon);
  const text = search.toString();
  return text ? `?${text}` : "";
}
