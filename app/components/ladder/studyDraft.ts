// The ladder form's state as the planner types it (text in every number field), and its
// translation into the ladder request the server runs. The request is checked by the same
// schema the server uses, so an error appears next to its field before anything is sent.
import { builtInConductorTypes, conductorAtFrequency } from "#app/lib/equipmentLibrary.ts";
import { parseQuantity } from "#app/lib/units.ts";
import { inputMessage, zodIssues } from "#solver/alternative.ts";
import { moneyInputSchema, type MoneyInput } from "#solver/economics.ts";
import { candidateVoltagesKV } from "#solver/iec60038.ts";
import { findSection, ladderRequestSchema, MAX_ALTERNATIVES, MAX_CANDIDATE_KV, type AlternativeOverrides, type Conductor, type LadderRequest } from "#solver/ladder.ts";
import type { Network } from "#solver/schema.ts";
import { sectionGroups } from "#solver/section.ts";

export interface AlternativeDraft {
  /** "" keeps the conductor as drawn; otherwise a library type's id, or SAVED_CONDUCTOR. */
  conductorId: string;
  /** A conductor from a saved study that is not in the library. */
  savedConductor?: Conductor;
  /** Tap position text by transformer id; "" keeps the drawn tap. */
  taps: Record<string, string>;
  lineCostPerKm: string;
  capitalCost: string;
  /** Overrides this form does not show (from a study saved by a later form), kept as they were. */
  base: AlternativeOverrides;
}

export const MONEY_FIELDS = ["loadFactor", "lossLoadFactorK", "energyPricePerMWh", "discountRatePct", "studyYears", "loadGrowthPct"] as const;
export type MoneyField = (typeof MONEY_FIELDS)[number];

export interface MoneyDraft {
  text: Record<MoneyField, string>;
  currency: string;
  /** Unit-cost tables and the cable factor: not edited here, carried through as they were. */
  rest: Pick<MoneyInput, "lineCostPerKmByKV" | "transformerCostPerMVAByKV" | "cableCostFactor">;
}

export interface StudyDraft {
  sectionBus: string;
  /** Ascending; the alternatives are asked and shown in this order. */
  voltagesKV: number[];
  /** Keyed by voltageKey(kV). */
  alternatives: Record<string, AlternativeDraft>;
  money: MoneyDraft;
  /** An alternative must also keep every limit with any one line or transformer out (N-1), in every case. */
  outages: boolean;
  /** Size the section's conductor from the library for each alternative, for a fault cleared in this time. */
  sizing: SizingDraft;
}

export interface SizingDraft {
  on: boolean;
  clearingTimeS: string;
}

export const DEFAULT_SIZING: SizingDraft = { on: false, clearingTimeS: "0.5" };

export const SAVED_CONDUCTOR = "saved";

export const voltageKey = (voltageKV: number) => String(voltageKV);

export const emptyAlternative = (): AlternativeDraft => ({ conductorId: "", taps: {}, lineCostPerKm: "", capitalCost: "", base: {} });

const text = (value: number | undefined) => (value === undefined ? "" : String(value));

export function moneyDraftOf(money: unknown): MoneyDraft {
  const parsed = moneyInputSchema.safeParse(money ?? {});
  const m = parsed.success ? parsed.data : moneyInputSchema.parse({});
  return {
    text: Object.fromEntries(MONEY_FIELDS.map((f) => [f, text(m[f])])) as Record<MoneyField, string>,
    currency: m.currency,
    rest: { lineCostPerKmByKV: m.lineCostPerKmByKV, transformerCostPerMVAByKV: m.transformerCostPerMVAByKV, cableCostFactor: m.cableCostFactor },
  };
}

export interface ConductorOption {
  id: string;
  label: string;
  conductor: Conductor;
  source: string;
  note?: string;
}

/** The built-in conductors at the network's frequency, as the ladder offers them. */
export function conductorOptions(frequencyHz: 50 | 60): ConductorOption[] {
  return builtInConductorTypes.map((type) => {
    const at = conductorAtFrequency(type, frequencyHz);
    const conductor: Conductor = { name: type.label, rOhmPerKm: at.rOhmPerKm, xOhmPerKm: at.xOhmPerKm, ampacityA: at.ampacityA };
    if (at.bMicroSiemensPerKm !== undefined) conductor.bMicroSiemensPerKm = at.bMicroSiemensPerKm;
    return { id: type.id, label: type.label, conductor, source: type.source, note: at.note };
  });
}

/** The present voltage and its nearest offered neighbours below and above: the usual first ladder. */
export function defaultVoltagesKV(presentKV: number, frequencyHz: 50 | 60): number[] {
  const offered = candidateVoltagesKV(presentKV, { frequencyHz });
  const at = offered.findIndex((kv) => Math.abs(kv - presentKV) <= 1e-9 * presentKV);
  return offered.slice(Math.max(0, at - 1), at + 2);
}

export function draftForSection(network: Network, sectionBus: string, money: MoneyDraft = moneyDraftOf({}), outages = false, sizing: SizingDraft = DEFAULT_SIZING): StudyDraft {
  const section = findSection(network, sectionBus);
  const voltagesKV = section ? defaultVoltagesKV(section.nominalKV, network.frequencyHz) : [];
  return { sectionBus, voltagesKV, alternatives: Object.fromEntries(voltagesKV.map((kv) => [voltageKey(kv), emptyAlternative()])), money, outages, sizing };
}

/**
 * The first bus of the first section that has lines and a transformer: where a link to re-rate
 * usually is. Every section is found in one pass, so this stays linear in the network's size.
 */
export function defaultSectionBus(network: Network): string {
  const { groupOf } = sectionGroups(network);
  const bounded = new Set<number | undefined>();
  for (const t of network.transformers) bounded.add(groupOf(t.hvBus)).add(groupOf(t.lvBus));
  const line = network.lines.find((l) => groupOf(l.fromBus) !== undefined && bounded.has(groupOf(l.fromBus)));
  return line?.fromBus ?? network.lines[0]?.fromBus ?? network.buses[0].id;
}

/** A saved (or posted) request as the form shows it. */
export function draftFromRequest(network: Network, request: LadderRequest): StudyDraft {
  const options = conductorOptions(network.frequencyHz);
  const order = [...request.voltagesKV.keys()].sort((a, b) => request.voltagesKV[a] - request.voltagesKV[b]);
  const alternatives: Record<string, AlternativeDraft> = {};
  for (const i of order) {
    // Saved and posted requests have passed the request schema, so their overrides have its output shape.
    const o = (request.overrides?.[i] ?? {}) as AlternativeOverrides;
    const { conductor, capital, transformers, ...others } = o;
    const match = conductor ? options.find((opt) => sameConductor(opt.conductor, conductor)) : undefined;
    const taps: Record<string, string> = {};
    const keptTransformers: NonNullable<AlternativeOverrides["transformers"]> = {};
    for (const [id, fields] of Object.entries(transformers ?? {})) {
      const { tapPct, ...restOfTransformer } = fields;
      if (tapPct !== undefined) taps[id] = String(tapPct);
      if (Object.keys(restOfTransformer).length > 0) keptTransformers[id] = restOfTransformer;
    }
    const { lineCostPerKm, capitalCost, ...restOfCapital } = capital ?? {};
    alternatives[voltageKey(request.voltagesKV[i])] = {
      conductorId: conductor ? (match?.id ?? SAVED_CONDUCTOR) : "",
      savedConductor: conductor && !match ? conductor : undefined,
      taps,
      lineCostPerKm: text(lineCostPerKm),
      capitalCost: text(capitalCost),
      base: {
        ...others,
        ...(Object.keys(keptTransformers).length > 0 ? { transformers: keptTransformers } : {}),
        ...(Object.keys(restOfCapital).length > 0 ? { capital: restOfCapital } : {}),
      },
    };
  }
  return {
    sectionBus: request.sectionBus,
    voltagesKV: order.map((i) => request.voltagesKV[i]),
    alternatives,
    money: moneyDraftOf(request.money),
    outages: request.outages === true,
    sizing: request.sizing ? { on: true, clearingTimeS: String(request.sizing.clearingTimeS) } : DEFAULT_SIZING,
  };
}

function sameConductor(a: Conductor, b: Conductor): boolean {
  return a.name === b.name && a.rOhmPerKm === b.rOhmPerKm && a.xOhmPerKm === b.xOhmPerKm;
}

/** Another bus of the same section keeps the voltages and overrides; another section starts afresh. */
export function moveToSection(draft: StudyDraft, network: Network, sectionBus: string): StudyDraft {
  const now = findSection(network, draft.sectionBus);
  if (now?.busIds.includes(sectionBus)) return { ...draft, sectionBus };
  return draftForSection(network, sectionBus, draft.money, draft.outages, draft.sizing);
}

export function toggleVoltage(draft: StudyDraft, voltageKV: number): StudyDraft {
  const key = voltageKey(voltageKV);
  if (draft.voltagesKV.includes(voltageKV)) {
    const { [key]: _removed, ...alternatives } = draft.alternatives;
    return { ...draft, voltagesKV: draft.voltagesKV.filter((kv) => kv !== voltageKV), alternatives };
  }
  return {
    ...draft,
    voltagesKV: [...draft.voltagesKV, voltageKV].sort((a, b) => a - b),
    alternatives: { ...draft.alternatives, [key]: draft.alternatives[key] ?? emptyAlternative() },
  };
}

/** A voltage typed by the planner ("88", "88 kV", "88000 V"), or why it cannot be a candidate. */
export function readCandidateVoltage(input: string, present: readonly number[]): { ok: true; voltageKV: number } | { ok: false; error: string } {
  const parsed = parseQuantity(input, "kV");
  if (!parsed.ok) return { ok: false, error: `The voltage ${parsed.error}.` };
  const voltageKV = Number(parsed.value.toPrecision(10));
  if (!(voltageKV > 0)) return { ok: false, error: "The voltage must be above 0 kV." };
  if (voltageKV > MAX_CANDIDATE_KV) return { ok: false, error: `${voltageKV} kV is above ${MAX_CANDIDATE_KV} kV; enter kilovolts (33, not 33000).` };
  if (present.includes(voltageKV)) return { ok: false, error: `${voltageKV} kV is already in the ladder.` };
  if (present.length >= MAX_ALTERNATIVES) return { ok: false, error: `The ladder holds at most ${MAX_ALTERNATIVES} voltages; remove one first.` };
  return { ok: true, voltageKV };
}

/**
 * A number as planners type it: "0.6", "8 %", "7,540,000" or "7 540 000"; a trailing % is
 * accepted in the fields that are percentages already.
 */
export function readNumber(input: string, percentField = false): { ok: true; value: number } | { ok: false; error: string } {
  let t = input.trim().replace(/[\u00a0\u2009\u202f ]/g, "");
  if (percentField) t = t.replace(/%$/, "");
  if (/^[+-]?\d{1,3}(,\d{3})+(\.\d+)?$/.test(t)) t = t.replace(/,/g, "");
  else if (/\d,\d/.test(t)) return { ok: false, error: "use a point for decimals, e.g. 0.6" };
  t = t.replace(/^\u2212/, "-");
  if (!/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(t)) return { ok: false, error: `"${input.trim()}" is not a number` };
  return { ok: true, value: Number(t) };
}

const PERCENT_FIELDS = new Set<MoneyField>(["discountRatePct", "loadGrowthPct"]);

export type FieldErrors = Record<string, string>;

/** The request this draft asks for, and every field error by the request's own paths. */
export function requestFromDraft(draft: StudyDraft, network: Network): { request: LadderRequest; errors: FieldErrors } {
  const section = findSection(network, draft.sectionBus);
  const errors: FieldErrors = {};
  const number = (path: string, input: string, percent = false): number | undefined => {
    if (input.trim() === "") return undefined;
    const read = readNumber(input, percent);
    if (read.ok) return read.value;
    errors[path] = read.error;
    return undefined;
  };

  const money: Record<string, unknown> = { ...draft.money.rest, currency: draft.money.currency };
  for (const field of MONEY_FIELDS) {
    const value = number(`money.${field}`, draft.money.text[field], PERCENT_FIELDS.has(field));
    if (value !== undefined) money[field] = value;
    else if (draft.money.text[field].trim() === "") errors[`money.${field}`] = "is required";
  }

  const offered = new Map(conductorOptions(network.frequencyHz).map((o) => [o.id, o.conductor]));
  const facing = new Set(section?.facingWindings.map((w) => w.transformerId) ?? []);
  const overrides = draft.voltagesKV.map((kv, i) => {
    const alt = draft.alternatives[voltageKey(kv)] ?? emptyAlternative();
    const o: AlternativeOverrides = structuredClone(alt.base);
    const conductor =
      alt.conductorId === SAVED_CONDUCTOR ? alt.savedConductor : alt.conductorId ? offered.get(alt.conductorId) : undefined;
    if (conductor) o.conductor = conductor;
    for (const [id, tapText] of Object.entries(alt.taps)) {
      if (!facing.has(id)) continue;
      const tapPct = number(`overrides[${i}].transformers.${id}.tapPct`, tapText, true);
      if (tapPct !== undefined) o.transformers = { ...o.transformers, [id]: { ...o.transformers?.[id], tapPct } };
    }
    const lineCostPerKm = number(`overrides[${i}].capital.lineCostPerKm`, alt.lineCostPerKm);
    const capitalCost = number(`overrides[${i}].capital.capitalCost`, alt.capitalCost);
    if (lineCostPerKm !== undefined || capitalCost !== undefined)
      o.capital = { ...o.capital, ...(lineCostPerKm !== undefined ? { lineCostPerKm } : {}), ...(capitalCost !== undefined ? { capitalCost } : {}) };
    return Object.keys(o).length > 0 ? o : null;
  });

  const clearingTimeS = draft.sizing.on ? number("sizing.clearingTimeS", draft.sizing.clearingTimeS) : undefined;
  if (draft.sizing.on && draft.sizing.clearingTimeS.trim() === "") errors["sizing.clearingTimeS"] = "is required";
  const request: LadderRequest = {
    sectionBus: draft.sectionBus,
    voltagesKV: draft.voltagesKV,
    money: money as LadderRequest["money"],
    ...(overrides.some((o) => o !== null) ? { overrides } : {}),
    ...(draft.outages ? { outages: true } : {}),
    ...(draft.sizing.on ? { sizing: { clearingTimeS: clearingTimeS ?? Number.NaN } } : {}),
  };
  const checked = ladderRequestSchema.safeParse(request, { error: inputMessage });
  if (!checked.success) for (const issue of zodIssues(checked.error)) errors[issue.path] ??= issue.message;
  return { request, errors };
}

/** Issues from the server (or the schema) as errors by path; the first message for a path wins. */
export function errorsByPath(issues: readonly { path: string; message: string }[]): FieldErrors {
  const errors: FieldErrors = {};
  for (const issue of issues) errors[issue.path] ??= issue.message;
  return errors;
}

/** A request as comparable text (defaults filled in, keys sorted), or undefined when it does not read. */
export function canonicalRequest(request: unknown): string | undefined {
  const parsed = ladderRequestSchema.safeParse(request);
  if (!parsed.success) return undefined;
  return JSON.stringify(parsed.data, (_key, value: unknown) =>
    value && typeof value === "object" && !Array.isArray(value)
      ? Object.fromEntries(Object.entries(value as Record<string, unknown>).sort(([a], [b]) => a.localeCompare(b)))
      : value,
  );
}

/** The money inputs of a draft as the schema reads them, or undefined while one is wrong. */
export function moneyOfDraft(draft: StudyDraft, network: Network): MoneyInput | undefined {
  const { request } = requestFromDraft(draft, network);
  const parsed = moneyInputSchema.safeParse(request.money);
  return parsed.success ? parsed.data : undefined;
}
