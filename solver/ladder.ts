// The voltage ladder: the same link solved at each candidate voltage and compared on losses,
// voltages, fault levels and money. Every alternative goes through solveNetwork, the function
// the command line, the API and the sheet use.
import { z } from "zod";
import { alternativeOverridesSchema, deriveAlternative, inputMessage, zodIssues } from "#solver/alternative.ts";
import {
  capitalCost,
  energyMoney,
  lossMoney,
  moneyInputSchema,
  priceSensitivity,
  type CapitalCost,
  type CapitalOverride,
  type LossMoney,
  type MoneyInput,
  type PriceSensitivity,
} from "#solver/economics.ts";
import { standardVoltage, type StandardVoltage } from "#solver/iec60038.ts";
import { solveNetwork } from "#solver/index.ts";
import type { Check, CheckKind, FaultBusReading, SolveResult } from "#solver/results.ts";
import { validateNetwork, type Network, type ValidationIssue } from "#solver/schema.ts";
import { findSection, type Section } from "#solver/section.ts";
import { recommend } from "#solver/ladderRecommendation.ts";
import { conductorCostPerKm, sizeConductor, type SizingCandidate, type SizingVerdict } from "#solver/conductorSizing.ts";
import { runStudySync, type Energy, type Study, type StudyCheck } from "#solver/study/index.ts";

export { findSection, type Section, type FacingWinding } from "#solver/section.ts";
export { deriveAlternative, alternativeOverridesSchema, conductorSchema, type AlternativeOverrides, type Conductor } from "#solver/alternative.ts";

/** The highest system voltage in IEC 60038 is 1200 kV U_m; anything above is a unit slip. */
export const MAX_CANDIDATE_KV = 1200;
export const MAX_ALTERNATIVES = 12;

export const ladderRequestSchema = z.strictObject({
  sectionBus: z.string().trim().min(1, "must name a bus of the section to re-rate"),
  voltagesKV: z
    .array(
      z
        .number()
        .finite("must be a finite voltage")
        .positive("must be a voltage above 0 kV")
        .max(MAX_CANDIDATE_KV, `is above ${MAX_CANDIDATE_KV} kV; enter kilovolts (33, not 33000)`),
    )
    .min(1, "needs at least one candidate voltage")
    .max(MAX_ALTERNATIVES, `may hold at most ${MAX_ALTERNATIVES} candidate voltages`),
  money: moneyInputSchema.prefault({}),
  /** Per alternative, in the order of voltagesKV: conductor, element overrides, capital entries. */
  overrides: z.array(alternativeOverridesSchema.nullable()).optional(),
  /** Also take each line and transformer out in turn in every case: an alternative must hold N-1 too. */
  outages: z.boolean().optional(),
  /**
   * Size the section's conductor for every alternative: the library type (of the section's own
   * construction) that carries the load, keeps the buses beyond in their band and withstands the
   * fault for the clearing time, at least lifetime cost. An alternative given its own conductor keeps it.
   */
  sizing: z
    .strictObject({
      clearingTimeS: z
        .number()
        .finite("must be a finite time")
        .positive("must be a time above 0 s")
        .max(10, "is above 10 s; enter the protection's clearing time in seconds (0.5, not 500)"),
    })
    .optional(),
});
export type LadderRequest = z.input<typeof ladderRequestSchema>;
type LadderRequestOutput = z.output<typeof ladderRequestSchema>;

/** The conductor the ladder chose for an alternative's section, and why. */
export interface AlternativeSizing {
  clearingTimeS: number;
  /** The library type put on every line of the section; null when none passes or the alternative has its own. */
  chosen: (SizingVerdict & { costPerKm: number }) | null;
  /** Every candidate at this voltage with its verdict, cheapest over its life first. */
  verdicts: SizingVerdict[];
  /** Why this one: a sentence for the planner. */
  note: string;
}

/** The library's conductors for sizing at a nominal voltage (cables are made for one voltage), at the network's frequency. */
export type ConductorLibrary = (nominalKV: number, frequencyHz: 50 | 60) => SizingCandidate[];

export interface LadderAlternative {
  voltageKV: number;
  /** The section's conductor chosen by sizing (when the request asks for it), with the reasons. */
  sizing: AlternativeSizing | null;
  /** The candidate's IEC 60038 entry; null for a voltage entered freely that is not on the list. */
  standard: StandardVoltage | null;
  converged: boolean;
  /** Converged, and no bus voltage, line current or transformer loading beyond its limit. */
  withinLimits: boolean;
  /** A sentence for the planner: why it does not carry the load, or what it comes to. */
  message: string;
  lossMW: number | null;
  lineLossMW: number | null;
  /** Losses of the re-rated lines alone: what the 1/V² law speaks of. */
  sectionLineLossMW: number | null;
  transformerLossMW: number | null;
  transformerCopperLossMW: number | null;
  transformerCoreLossMW: number | null;
  /**
   * Section line loss predicted from the reference alternative by (V_ref / V)², the law of
   * Joule at the same delivered power and power factor, shown beside the computed one.
   */
  predictedSectionLineLossMW: number | null;
  minVPu: number | null;
  maxVPu: number | null;
  checks: Check[];
  /** IEC 60909-0 fault levels at the section's end buses (computed whether or not the load flow converges). */
  faults: FaultBusReading[];
  money: { capital: CapitalCost; losses: LossMoney | null; totalCost: number | null };
  /** The alternative in each operating case (a network without cases has one, as drawn). */
  cases: AlternativeCase[];
  /** Limits broken in any case (and, when asked, with any line or transformer out), each naming its case. */
  studyChecks: StudyCheck[];
  /** The year's energy lost over the cases (their hours, or the loss-load-factor fallback). */
  energy: Energy;
  network: Network;
  result: SolveResult;
}

export interface AlternativeCase {
  id: string;
  name: string;
  converged: boolean;
  lossMW: number | null;
  minVPu: number | null;
  maxVPu: number | null;
  lostLoadMW: number;
  limitsBroken: number;
}

export interface LadderRecommendation {
  index: number;
  voltageKV: number;
  totalCost: number;
  withinLimits: boolean;
  /**
   * The case that decided: the one in which a cheaper alternative broke a limit ("limits"), or,
   * when the recommendation is the cheapest outright, the case whose losses weigh most ("losses").
   */
  decidingCase: { id: string; name: string; reason: "limits" | "losses" } | null;
  note: string;
}

export interface Ladder {
  sectionBus: string;
  section: Section;
  money: MoneyInput;
  alternatives: LadderAlternative[];
  /** The lowest total cost among alternatives within limits, else among those that converge; null when none does. */
  cheapest: LadderRecommendation | null;
  sensitivity: PriceSensitivity;
  /** The lowest voltage that converged: the 1/V² curve is drawn through it. */
  inverseSquareReference: { index: number; voltageKV: number; sectionLineLossMW: number } | null;
}

export type LadderOutcome = { ok: true; ladder: Ladder } | { ok: false; issues: ValidationIssue[] };

const LIMIT_KINDS: readonly CheckKind[] = ["undervoltage", "overvoltage", "line-overload", "transformer-overload"];
/** What rules an alternative out across the study: a limit broken, or a case it cannot carry. */
const STUDY_KINDS: readonly CheckKind[] = [...LIMIT_KINDS, "not-converged"];

/** The request's own shape (no network needed), with the messages runLadder gives for it. */
export function checkLadderRequest(requestInput: unknown): { ok: true; request: z.output<typeof ladderRequestSchema> } | { ok: false; issues: ValidationIssue[] } {
  const parsed = ladderRequestSchema.safeParse(requestInput, { error: inputMessage });
  if (parsed.success) return { ok: true, request: parsed.data };
  return { ok: false, issues: zodIssues(parsed.error).map((i) => (i.path ? i : { path: i.path, message: `the ladder request ${i.message}` })) };
}

/** How far a ladder run got: load flows solved across its alternatives, and which alternative it is on. */
export interface LadderProgress {
  /** Alternatives finished, and the fraction of the current one's study done (0–1). */
  alternative: number;
  alternatives: number;
  voltageKV: number;
  fraction: number;
}

/**
 * Run the ladder on an untrusted network document and request; every problem comes back named, none thrown.
 * `onProgress`, when given, hears of every load flow of every alternative's study.
 */
export function runLadder(
  document: unknown,
  requestInput: unknown,
  onProgress?: (progress: LadderProgress) => void,
  conductors?: ConductorLibrary,
): LadderOutcome {
  const validated = validateNetwork(document);
  if (!validated.ok)
    return { ok: false, issues: validated.issues.map((i) => ({ path: i.path ? `network.${i.path}` : "network", message: i.message })) };
  const network = validated.network;

  const parsed = checkLadderRequest(requestInput);
  if (!parsed.ok) return parsed;
  const request = parsed.request;
  const issues: ValidationIssue[] = [];
  if ((request.overrides?.length ?? 0) > request.voltagesKV.length)
    issues.push({ path: "overrides", message: `has ${request.overrides!.length} entries for ${request.voltagesKV.length} candidate voltages; give one per voltage (null for none)` });
  const section = findSection(network, request.sectionBus);
  if (!section) issues.push({ path: "sectionBus", message: `there is no bus "${request.sectionBus}" in the network` });
  if (issues.length > 0 || !section) return { ok: false, issues };

  if (request.sizing && !conductors) issues.push({ path: "sizing", message: "sizing the conductor needs the equipment library, which this caller did not give" });
  if (request.sizing && section.lineIds.length === 0)
    issues.push({ path: "sizing", message: "the section has no line or cable to size" });
  if (issues.length > 0) return { ok: false, issues };

  const sizings: (AlternativeSizing | null)[] = request.voltagesKV.map(() => null);
  const derived = request.voltagesKV.map((voltageKV, i) => {
    let overrides = request.overrides?.[i] ?? {};
    if (request.sizing && conductors) {
      const sized = sizeSection(network, section, voltageKV, overrides, request.sizing.clearingTimeS, request.money, conductors);
      sizings[i] = sized.sizing;
      overrides = sized.overrides;
    }
    const result = deriveAlternative(network, section, voltageKV, overrides);
    if (!result.ok)
      issues.push(
        ...result.issues.map((issue) =>
          issue.path.startsWith("overrides")
            ? { path: `overrides[${i}]${issue.path.slice("overrides".length)}`, message: issue.message }
            : { path: `voltagesKV[${i}]`, message: `${voltageKV} kV: ${issue.message}${issue.path ? ` (${issue.path})` : ""}` },
        ),
      );
    return result;
  });
  const solved = derived.map((d, i) => {
    if (!d.ok) return undefined;
    const outcome = solveNetwork(d.network);
    if (!outcome.ok)
      issues.push(...outcome.issues.map((issue) => ({ path: `voltagesKV[${i}]`, message: `${request.voltagesKV[i]} kV: ${issue.message}` })));
    return outcome.ok ? outcome : undefined;
  });
  if (issues.length > 0) return { ok: false, issues };

  const studies = solved.map((outcome, i) => {
    const voltageKV = request.voltagesKV[i];
    const alternatives = request.voltagesKV.length;
    const studied = runStudySync(
      outcome!.network,
      { outages: request.outages ?? false, faults: false },
      onProgress && ((step) => onProgress({ alternative: i, alternatives, voltageKV, fraction: step.done / step.total })),
    );
    if (!studied.ok)
      issues.push(...studied.issues.map((issue) => ({ path: `voltagesKV[${i}]`, message: `${request.voltagesKV[i]} kV: ${issue.message}` })));
    return studied.ok ? studied.study : undefined;
  });
  if (issues.length > 0) return { ok: false, issues };

  const alternatives = solved.map((outcome, i) =>
    describeAlternative(request.voltagesKV[i], section, outcome!.network, outcome!.result, studies[i]!, request.money, request.overrides?.[i]?.capital, sizings[i]),
  );

  const referenceIndex = alternatives.reduce<number | null>(
    (best, a, i) => (a.sectionLineLossMW !== null && (best === null || a.voltageKV < alternatives[best].voltageKV) ? i : best),
    null,
  );
  const inverseSquareReference =
    referenceIndex === null
      ? null
      : {
          index: referenceIndex,
          voltageKV: alternatives[referenceIndex].voltageKV,
          sectionLineLossMW: alternatives[referenceIndex].sectionLineLossMW!,
        };
  if (inverseSquareReference)
    for (const a of alternatives)
      a.predictedSectionLineLossMW = inverseSquareReference.sectionLineLossMW * (inverseSquareReference.voltageKV / a.voltageKV) ** 2;

  const sensitivity = priceSensitivity(
    alternatives.map((a) => ({
      loadDependentPeakLossMW: a.lossMW === null ? null : a.lossMW - a.transformerCoreLossMW!,
      coreLossMW: a.transformerCoreLossMW,
      ...(a.energy.method === "case-hours" ? { energy: annualEnergyOf(a.energy) } : {}),
      capitalCost: a.money.capital.total,
    })),
    request.money,
  );

  return {
    ok: true,
    ladder: {
      sectionBus: request.sectionBus,
      section,
      money: request.money,
      alternatives,
      cheapest: recommend(alternatives, request.money.currency, studies as Study[]),
      sensitivity,
      inverseSquareReference,
    },
  };
}

function annualEnergyOf(energy: Energy) {
  return { loadDependentMWh: energy.loadDependentMWh, coreMWh: energy.coreMWh, totalMWh: energy.lossMWhPerYear };
}

function describeAlternative(
  voltageKV: number,
  section: Section,
  network: Network,
  result: SolveResult,
  study: Study,
  money: MoneyInput,
  capitalOverride: CapitalOverride | undefined,
  sizing: AlternativeSizing | null,
): LadderAlternative {
  const sectionLines = new Set(section.lineIds);
  const facing = new Set(section.facingWindings.map((w) => w.transformerId));
  const capital = capitalCost(
    {
      voltageKV,
      lines: network.lines.filter((l) => sectionLines.has(l.id)).map((l) => (sizing?.chosen ? { ...l, costPerKm: sizing.chosen.costPerKm } : l)),
      transformers: network.transformers.filter((t) => facing.has(t.id)),
    },
    money,
    capitalOverride,
  );
  const ends = new Set(section.endBusIds);
  const studyChecks = [...study.cases.flatMap((c) => c.checks), ...(study.outages ?? []).flatMap((o) => o.checks)].filter((c) =>
    STUDY_KINDS.includes(c.kind),
  );
  const cases: AlternativeCase[] = study.cases.map((c) => {
    const voltages = c.loadFlow.converged ? c.loadFlow.buses.map((b) => b.vPu) : [];
    return {
      id: c.id,
      name: c.name,
      converged: c.loadFlow.converged,
      lossMW: c.loadFlow.converged ? c.loadFlow.totals.lossMW : null,
      minVPu: voltages.length ? Math.min(...voltages) : null,
      maxVPu: voltages.length ? Math.max(...voltages) : null,
      lostLoadMW: c.lostLoadMW,
      limitsBroken: c.checks.filter((k) => STUDY_KINDS.includes(k.kind)).length,
    };
  });
  const common = {
    sizing,
    cases,
    studyChecks,
    energy: study.energy,
    voltageKV,
    standard: standardVoltage(voltageKV) ?? null,
    predictedSectionLineLossMW: null,
    checks: result.checks,
    faults: (result.faults?.buses ?? []).filter((b) => ends.has(b.id)),
    network,
    result,
  };

  const flow = result.loadFlow;
  if (!flow.converged)
    return {
      ...common,
      converged: false,
      withinLimits: false,
      message: flow.message ?? `The load flow at ${voltageKV} kV did not converge.`,
      lossMW: null,
      lineLossMW: null,
      sectionLineLossMW: null,
      transformerLossMW: null,
      transformerCopperLossMW: null,
      transformerCoreLossMW: null,
      minVPu: null,
      maxVPu: null,
      money: { capital, losses: null, totalCost: null },
    };

  const lossMWOf = (kind: "line" | "transformer", keep: (id: string) => boolean = () => true) =>
    flow.branches.filter((b) => b.kind === kind && keep(b.id)).reduce((sum, b) => sum + b.lossKW, 0) / 1000;
  // The core is a shunt conductance at the HV terminal, so its loss follows the square of that voltage.
  const vPu = new Map(flow.buses.map((b) => [b.id, b.vPu]));
  const coreMW = network.transformers.reduce((sum, t) => sum + ((t.noLoadLossKW ?? 0) * (vPu.get(t.hvBus) ?? 1) ** 2) / 1000, 0);
  const transformerLossMW = lossMWOf("transformer");
  const lossMW = flow.totals.lossMW;
  const voltages = flow.buses.map((b) => b.vPu);
  const minVPu = Math.min(...voltages);
  const maxVPu = Math.max(...voltages);
  const limitsBroken = result.checks.filter((c) => LIMIT_KINDS.includes(c.kind)).length;
  const breakingBroken = result.checks.filter((c) => c.kind === "breaking-current").length;
  const losses = study.energy.method === "case-hours" ? energyMoney(annualEnergyOf(study.energy), money) : lossMoney(lossMW - coreMW, coreMW, money);
  const inCases = casesSentence(study, studyChecks);
  return {
    ...common,
    converged: true,
    withinLimits: limitsBroken === 0 && studyChecks.length === 0,
    message:
      `Carries the load at ${voltageKV} kV: losses ${lossMW.toFixed(2)} MW (${flow.totals.lossPct.toFixed(1)} % of generation), ` +
      `bus voltages ${minVPu.toFixed(3)} to ${maxVPu.toFixed(3)} pu, ` +
      (limitsBroken === 0 ? "every voltage and loading within its limit" : `${limitsBroken} voltage or loading limit${limitsBroken > 1 ? "s" : ""} broken`) +
      (breakingBroken === 0 ? "" : `; fault current above the switchgear's breaking current at ${breakingBroken} bus${breakingBroken > 1 ? "es" : ""}`) +
      (inCases ? `; ${inCases}.` : "."),
    lossMW,
    lineLossMW: lossMWOf("line"),
    sectionLineLossMW: lossMWOf("line", (id) => sectionLines.has(id)),
    transformerLossMW,
    transformerCopperLossMW: transformerLossMW - coreMW,
    transformerCoreLossMW: coreMW,
    minVPu,
    maxVPu,
    money: { capital, losses, totalCost: capital.total + losses.presentValueOfLosses },
  };
}

/** Where the cases broke limits, in a clause; empty when the network is studied as drawn only and holds. */
function casesSentence(study: Study, studyChecks: readonly StudyCheck[]): string {
  if (study.cases.length === 1 && study.cases[0].id === "as-drawn" && !study.outages) return "";
  const scope = `${study.cases.length} operating case${study.cases.length > 1 ? "s" : ""}${study.outages ? " and every single outage" : ""}`;
  if (studyChecks.length === 0) return `every limit kept across ${scope}`;
  const first = studyChecks[0];
  const name = study.cases.find((c) => c.id === first.case)?.name ?? first.case;
  return `${studyChecks.length} limit${studyChecks.length > 1 ? "s" : ""} broken across ${scope}, first in "${name}" (${first.element}, ${first.kind})`;
}

/**
 * The section's conductor at one candidate voltage: the alternative derived as asked, every
 * library type of the section's construction sized on it (conductorSizing.ts, the sheet's own
 * sizing), and the cheapest over its life that passes put on every section line through the
 * alternative's conductor override. A conductor the planner gave for this alternative is kept.
 */
function sizeSection(
  network: Network,
  section: Section,
  voltageKV: number,
  overrides: NonNullable<LadderRequestOutput["overrides"]>[number] & object,
  clearingTimeS: number,
  money: MoneyInput,
  conductors: ConductorLibrary,
): { sizing: AlternativeSizing; overrides: typeof overrides } {
  const none = (note: string, verdicts: SizingVerdict[] = []) => ({ sizing: { clearingTimeS, chosen: null, verdicts, note }, overrides });
  if (overrides.conductor) return none(`The conductor entered for this alternative${overrides.conductor.name ? ` (${overrides.conductor.name})` : ""} is kept; it was not sized.`);
  const derived = deriveAlternative(network, section, voltageKV, overrides);
  if (!derived.ok) return none("Not sized: the alternative itself does not validate (see its problems).");
  const sectionLines = derived.network.lines.filter((l) => section.lineIds.includes(l.id));
  const kinds = new Set(sectionLines.map((l) => l.kind));
  const construction = kinds.size > 1 ? "conductor" : kinds.has("cable") ? "cable" : "overhead conductor";
  const candidates = conductors(voltageKV, network.frequencyHz).filter((c) => kinds.has(c.kind));
  if (candidates.length === 0) return none(`No library ${construction} for ${voltageKV} kV says its material and cross-section; the drawn conductor is kept.`);
  const outcome = sizeConductor(derived.network, section.lineIds, candidates, { clearingTimeS, money });
  if (!outcome.ok) return none(`Not sized: ${outcome.message}`);
  const byLifetime = [...outcome.verdicts].sort((a, b) => (a.lifetimeCost ?? Infinity) - (b.lifetimeCost ?? Infinity));
  const chosenVerdict = byLifetime.find((v) => v.candidateId === outcome.cheapestPassing);
  if (!chosenVerdict) {
    const reasons = byLifetime.slice(0, 3).map((v) => `${v.label} (${failedTests(v)})`).join("; ");
    return none(`None of the ${candidates.length} library ${construction}s passes at ${voltageKV} kV, so the drawn conductor is kept; cheapest over their life: ${reasons}.`, byLifetime);
  }
  const candidate = candidates.find((c) => c.id === chosenVerdict.candidateId)!;
  const cheaperFailing = byLifetime.filter((v) => v !== chosenVerdict && v.lifetimeCost !== null && v.lifetimeCost < chosenVerdict.lifetimeCost!);
  const passesText = chosenVerdict.tests.map((t) => t.reason).join("; ");
  const note =
    `${chosenVerdict.label}: the cheapest over its life of the ${candidates.length} library ${construction}s that pass at ${voltageKV} kV (${passesText})` +
    (cheaperFailing.length === 0 ? "." : `; cheaper over their life but failing: ${cheaperFailing.map((v) => `${v.label} (${failedTests(v)})`).join("; ")}.`);
  return {
    sizing: { clearingTimeS, chosen: { ...chosenVerdict, costPerKm: conductorCostPerKm(candidate, voltageKV, money) }, verdicts: byLifetime, note },
    overrides: {
      ...overrides,
      conductor: {
        name: candidate.label,
        rOhmPerKm: candidate.rOhmPerKm,
        xOhmPerKm: candidate.xOhmPerKm,
        ...(candidate.bMicroSiemensPerKm === undefined ? {} : { bMicroSiemensPerKm: candidate.bMicroSiemensPerKm }),
        ampacityA: candidate.ampacityA,
      },
    },
  };
}

/** The tests a candidate failed, in a few words each. */
function failedTests(verdict: SizingVerdict): string {
  return verdict.tests
    .filter((t) => !t.passes)
    .map((t) => (t.test === "solve" ? "the network cannot carry its load with it" : `${t.test}: ${t.reason}`))
    .join("; ");
}
