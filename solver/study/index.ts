// One study run: every operating case, the envelope across them, outages (N-1), years of load
// growth and the energy lost in a year. Each load flow is a plain solve of the network with the
// case applied (applyCase.ts), validated once for the whole study and solved per case by
// solveValidated, the same numerics every caller shares: the study adds bookkeeping, never physics.
//
// The work is a generator of steps, one load flow each, so that the same code runs to the end
// at once (runStudySync, for the ladder and the command line) or a little at a time (runStudy:
// progress, a yield to the event loop now and then, and cancellation by AbortSignal), which is
// what a worker pool or a browser tab needs.
import { z } from "zod";
import { solveNetwork, solveValidated } from "#solver/index.ts";
import { POWER_LIMIT } from "#solver/networkRules.ts";
import { LOAD_FLOW_METHOD } from "#solver/loadFlow/index.ts";
import { moneyInputSchema } from "#solver/economics.ts";
import { inputMessage, zodIssues } from "#solver/alternative.ts";
import type { LoadFlowResult, SolveResult } from "#solver/results.ts";
import { growthSchema, validateNetwork, type Growth, type Network, type OperatingCase, type ValidationIssue } from "#solver/schema.ts";
import { applyCase, operatingCases, type CaseAdjustment } from "#solver/study/applyCase.ts";
import { envelopeOf } from "#solver/study/envelope.ts";
import { energyOf, type LoadFactorInput } from "#solver/study/energy.ts";
import { firmCapacities } from "#solver/study/firmCapacity.ts";
import type { CaseResult, GrowthOutcome, OutageResult, Study, StudyCheck, StudyProgress, YearLimit } from "#solver/study/results.ts";

export type * from "#solver/study/results.ts";
export { applyCase, operatingCases, AS_DRAWN } from "#solver/study/applyCase.ts";
export { transformerCoreLossMW } from "#solver/study/energy.ts";

export const studyRequestSchema = z.strictObject({
  /** true: every line and transformer out in turn in every case; a list: in those cases only. */
  outages: z.union([z.boolean(), z.array(z.string()).min(1, "needs at least one case id").max(100)]).optional(),
  /** true: the network's own growth; or a growth given for this run. */
  years: z.union([z.boolean(), growthSchema]).optional(),
  /** Fault levels in each case (default true); outages and years never compute them. */
  faults: z.boolean().optional(),
});
export type StudyRequest = z.input<typeof studyRequestSchema>;

export type StudyOutcome = { ok: true; network: Network; study: Study } | { ok: false; issues: ValidationIssue[] };

interface PreparedStudy {
  network: Network;
  cases: OperatingCase[];
  outageCases: OperatingCase[];
  growth: Growth | null;
  faults: boolean;
  lossLoadFactor: LoadFactorInput;
}

function prepare(document: unknown, requestInput: unknown): { ok: true; prepared: PreparedStudy } | { ok: false; issues: ValidationIssue[] } {
  const validated = validateNetwork(document);
  if (!validated.ok) return validated;
  const network = validated.network;
  const parsed = studyRequestSchema.safeParse(requestInput ?? {}, { error: inputMessage });
  if (!parsed.success) return { ok: false, issues: zodIssues(parsed.error) };
  const request = parsed.data;
  const cases = operatingCases(network);
  const issues: ValidationIssue[] = [];

  let outageCases: OperatingCase[] = [];
  if (request.outages === true) outageCases = cases;
  else if (Array.isArray(request.outages))
    request.outages.forEach((caseId, i) => {
      const found = cases.find((c) => c.id === caseId);
      if (found) outageCases.push(found);
      else issues.push({ path: `outages[${i}]`, message: `there is no operating case "${caseId}" (the cases are ${cases.map((c) => `"${c.id}"`).join(", ")})` });
    });

  let growth: Growth | null = null;
  if (request.years === true) {
    if (network.growth) growth = network.growth;
    else issues.push({ path: "years", message: "the network gives no load growth; add a growth rate and horizon to the network, or send them here" });
  } else if (request.years) growth = request.years;

  if (issues.length > 0) return { ok: false, issues };
  const money = moneyInputSchema.parse({});
  return {
    ok: true,
    prepared: {
      network,
      cases,
      outageCases,
      growth,
      faults: request.faults ?? true,
      lossLoadFactor: { loadFactor: money.loadFactor, lossLoadFactorK: money.lossLoadFactorK },
    },
  };
}

export interface SolvedCase {
  result: SolveResult;
  /** The network the solver saw in this case (elements out removed), or null when it saw none. */
  network: Network | null;
  lostLoadMW: number;
  deenergisedBuses: string[];
}

/**
 * One case, adjusted or not. The network was validated once when the study began, and a case of
 * it is valid too (elements only leave, loads and dispatch stay within the schema's bounds), so
 * the case is solved without validating again: its cost is the numerics. A case that could fall
 * outside what validation lets through (a load grown past the bound, a regulated bus cut off)
 * goes through solveNetwork, whose validation then says why.
 */
export function solveCase(network: Network, operatingCase: OperatingCase, adjustment: CaseAdjustment = {}, faults = true): SolvedCase {
  const applied = applyCase(network, operatingCase, adjustment);
  const { lostLoadMW, deenergisedBuses } = applied;
  if (!applied.document)
    return { result: { loadFlow: emptyLoadFlow("No bus is connected to a slack source in this case: every load is lost."), checks: [] }, network: null, lostLoadMW, deenergisedBuses };
  const outcome = staysValid(applied.document) ? solveValidated(applied.document, { faults }) : solveNetwork(applied.document, { faults });
  if (outcome.ok) return { result: outcome.result, network: outcome.network, lostLoadMW, deenergisedBuses };
  // A case of a valid network is a valid network; should the solver still refuse it, the case
  // reports why instead of stopping the study.
  const why = outcome.issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)).join("; ");
  return {
    result: { loadFlow: { ...emptyLoadFlow(`This case could not be solved: ${why}`), converged: false }, checks: [] },
    network: null,
    lostLoadMW,
    deenergisedBuses,
  };
}

/**
 * Whether a case of a validated network is itself one without validating it: what applyCase
 * changes beyond removing elements is each load's P and Q (scaled) and a source's dispatch (whose
 * overrides the case's own schema bounds as the source's), and what removal can break is a
 * regulating transformer's reference to a bus left de-energised.
 */
function staysValid(document: Network): boolean {
  for (const load of document.loads) if (!(Math.abs(load.pMW) <= POWER_LIMIT && Math.abs(load.qMvar) <= POWER_LIMIT)) return false;
  const regulated = document.transformers.filter((t) => t.tapControl);
  if (regulated.length === 0) return true;
  const live = new Set(document.buses.map((b) => b.id));
  return regulated.every((t) => live.has(t.tapControl!.bus));
}

function emptyLoadFlow(message: string): LoadFlowResult {
  return {
    converged: true,
    iterations: 0,
    method: LOAD_FLOW_METHOD,
    message,
    buses: [],
    branches: [],
    sources: [],
    totals: { generationMW: 0, loadMW: 0, lossMW: 0, lossPct: 0 },
  };
}

const withCase = (caseId: string, result: SolveResult): StudyCheck[] => result.checks.map((c) => ({ ...c, case: caseId }));

function* studySteps(p: PreparedStudy): Generator<StudyProgress, Study, void> {
  const { network, cases, outageCases, growth } = p;
  const branchIds = [...network.lines.map((l) => ({ id: l.id, kind: "line" as const })), ...network.transformers.map((t) => ({ id: t.id, kind: "transformer" as const }))];
  const total = cases.length + outageCases.length * branchIds.length + (growth ? growth.years * cases.length : 0);
  let done = 0;

  const caseResults: CaseResult[] = [];
  for (const c of cases) {
    const solved = solveCase(network, c, {}, p.faults);
    caseResults.push({
      id: c.id,
      name: c.name,
      ...(c.hoursPerYear === undefined ? {} : { hoursPerYear: c.hoursPerYear }),
      loadFlow: solved.result.loadFlow,
      ...(solved.result.faults ? { faults: solved.result.faults } : {}),
      checks: withCase(c.id, solved.result),
      lostLoadMW: solved.lostLoadMW,
      deenergisedBuses: solved.deenergisedBuses,
    });
    yield { done: ++done, total, stage: "cases" };
  }
  const study: Study = { cases: caseResults, envelope: envelopeOf(caseResults), energy: energyOf(network, caseResults, p.lossLoadFactor) };

  if (outageCases.length > 0) {
    const outages: OutageResult[] = [];
    for (const c of outageCases) {
      const base = caseResults.find((r) => r.id === c.id)!;
      const inService = new Set(base.loadFlow.branches.map((b) => b.id));
      for (const branch of branchIds) {
        if (inService.has(branch.id)) outages.push(outageOf(network, c, branch));
        yield { done: ++done, total, stage: "outages" };
      }
    }
    study.outages = outages;
    study.firmCapacity = firmCapacities(network, caseResults);
  }

  if (growth) {
    const found = new Map<string, YearLimit>();
    const record = (year: number, checks: readonly StudyCheck[]) => {
      for (const check of checks) {
        const key = `${check.element}\u0000${check.kind}`;
        if (check.kind === "not-converged" || found.has(key)) continue;
        found.set(key, { element: check.element, kind: check.kind, firstYear: year, case: check.case, value: check.value, limit: check.limit, message: check.message });
      }
    };
    const outcome: GrowthOutcome = { ...growth, loadNotCarriedYear: null, loadNotCarriedCase: null };
    const carried = new Set<string>();
    for (const c of caseResults) {
      record(0, c.checks);
      if (c.loadFlow.converged) carried.add(c.id);
      else if (outcome.loadNotCarriedYear === null) Object.assign(outcome, { loadNotCarriedYear: 0, loadNotCarriedCase: c.id });
    }
    for (let year = 1; year <= growth.years; year++) {
      const factor = (1 + growth.ratePctPerYear / 100) ** year;
      for (const c of cases) {
        // Once a case no longer carries its load, more load will not bring it back.
        if (carried.has(c.id)) {
          const solved = solveCase(network, c, { loadGrowthFactor: factor }, false);
          record(year, withCase(c.id, solved.result));
          if (!solved.result.loadFlow.converged) {
            carried.delete(c.id);
            if (outcome.loadNotCarriedYear === null) Object.assign(outcome, { loadNotCarriedYear: year, loadNotCarriedCase: c.id });
          }
        }
        yield { done: ++done, total, stage: "years" };
      }
    }
    study.years = [...found.values()];
    study.growth = outcome;
  }
  return study;
}

function outageOf(network: Network, operatingCase: OperatingCase, branch: { id: string; kind: "line" | "transformer" }): OutageResult {
  const solved = solveCase(network, operatingCase, { outOfService: [branch.id] }, false);
  const flow = solved.result.loadFlow;
  let highestLoading: OutageResult["highestLoading"] = null;
  let lowestVoltage: OutageResult["lowestVoltage"] = null;
  if (flow.converged) {
    for (const b of flow.branches)
      if (b.loadingPct !== null && (!highestLoading || b.loadingPct > highestLoading.loadingPct)) highestLoading = { element: b.id, loadingPct: b.loadingPct };
    for (const b of flow.buses) if (!lowestVoltage || b.vPu < lowestVoltage.vPu) lowestVoltage = { bus: b.id, vPu: b.vPu };
  }
  return {
    case: operatingCase.id,
    element: branch.id,
    kind: branch.kind,
    lostLoadMW: solved.lostLoadMW,
    deenergisedBuses: solved.deenergisedBuses,
    converged: flow.converged,
    checks: withCase(operatingCase.id, solved.result),
    highestLoading,
    lowestVoltage,
  };
}

/** The whole study at once; `onStep`, when given, hears of every load flow solved. */
export function runStudySync(document: unknown, request: unknown = {}, onStep?: (progress: StudyProgress) => void): StudyOutcome {
  const prepared = prepare(document, request);
  if (!prepared.ok) return prepared;
  const steps = studySteps(prepared.prepared);
  for (;;) {
    const next = steps.next();
    if (next.done) return { ok: true, network: prepared.prepared.network, study: next.value };
    onStep?.(next.value);
  }
}

export interface StudyControl {
  /** Called now and then while the study runs, and once at the end. */
  onProgress?: (progress: StudyProgress) => void;
  /** Abort to stop the study between two load flows; the promise then rejects with the signal's reason. */
  signal?: AbortSignal;
}

/** Time spent solving before the study lets other work run (and reports progress). */
const SLICE_MS = 50;

/** The study a little at a time: progress, room for other work, and cancellation. */
export async function runStudy(document: unknown, request: unknown = {}, control: StudyControl = {}): Promise<StudyOutcome> {
  control.signal?.throwIfAborted();
  const prepared = prepare(document, request);
  if (!prepared.ok) return prepared;
  const steps = studySteps(prepared.prepared);
  let sliceStart = performance.now();
  for (;;) {
    const next = steps.next();
    if (next.done) return { ok: true, network: prepared.prepared.network, study: next.value };
    if (next.value.done === next.value.total || performance.now() - sliceStart > SLICE_MS) {
      control.onProgress?.(next.value);
      await new Promise((resolve) => setTimeout(resolve, 0));
      control.signal?.throwIfAborted();
      sliceStart = performance.now();
    }
  }
}
