// The study object: the same shape from the command line, the API and the pages
// (network-format.md, "Version 2").
import type { Check, CheckKind, FaultResult, LoadFlowResult } from "#solver/results.ts";

/** A check found in one operating case: the case it was broken in rides with it. */
export type StudyCheck = Check & { case: string };

export interface CaseResult {
  id: string;
  name: string;
  hoursPerYear?: number;
  loadFlow: LoadFlowResult;
  faults?: FaultResult;
  checks: StudyCheck[];
  /** Load on buses that no in-service path joins to a slack source (MW, after the case's scales). */
  lostLoadMW: number;
  deenergisedBuses: string[];
}

export interface BusEnvelope {
  id: string;
  vMinPu: number;
  vMinCase: string;
  vMaxPu: number;
  vMaxCase: string;
}

export interface BranchEnvelope {
  id: string;
  maxLoadingPct: number;
  maxLoadingCase: string;
}

/** Each bus's lowest and highest voltage and each rated branch's highest loading across the cases. */
export interface Envelope {
  buses: BusEnvelope[];
  branches: BranchEnvelope[];
}

export interface OutageResult {
  case: string;
  /** The line or transformer taken out. */
  element: string;
  kind: "line" | "transformer";
  /** Load left without supply: reported as lost load, not as a failed solve. */
  lostLoadMW: number;
  deenergisedBuses: string[];
  /** False when the rest of the network cannot carry its load with this element out. */
  converged: boolean;
  checks: StudyCheck[];
  highestLoading: { element: string; loadingPct: number } | null;
  lowestVoltage: { bus: string; vPu: number } | null;
}

/** A substation's parallel transformers between the same two busbars and what they hold with one out. */
export interface FirmCapacity {
  hvBus: string;
  lvBus: string;
  transformers: string[];
  installedMVA: number;
  /** Installed less the largest unit (N-1). */
  firmMVA: number;
  /** The most apparent power the group carries in any case, and that case. */
  peakDemandMVA: number;
  peakCase: string;
  withinFirm: boolean;
}

/** The first year of load growth in which a limit breaks at an element. */
export interface YearLimit {
  element: string;
  kind: CheckKind;
  firstYear: number;
  case: string;
  value: number;
  limit: number;
  message: string;
}

export interface GrowthOutcome {
  ratePctPerYear: number;
  years: number;
  /** The first year in which some case no longer carries its load; null when every year does. */
  loadNotCarriedYear: number | null;
  loadNotCarriedCase: string | null;
}

export interface CaseEnergy {
  case: string;
  lossMW: number;
  /** Transformer core loss within lossMW: it runs whatever the load. */
  coreLossMW: number;
  hoursPerYear: number | null;
  lossMWh: number | null;
}

export interface Energy {
  /** "case-hours": Σ case loss × hours; "loss-load-factor": the peak case's loss by the loss load factor. */
  method: "case-hours" | "loss-load-factor";
  lossMWhPerYear: number;
  /** lossMWhPerYear split into what follows the load (lines, copper) and the transformers' core. */
  loadDependentMWh: number;
  coreMWh: number;
  /** Hours of the year the cases stand for (8760 under the loss-load-factor fallback). */
  hoursCovered: number;
  byCase: CaseEnergy[];
  /** Under the fallback: the case taken as the peak, the load factor and the loss load factor used. */
  peakCase?: string;
  loadFactor?: number;
  lossLoadFactor?: number;
}

export interface Study {
  cases: CaseResult[];
  envelope: Envelope;
  outages?: OutageResult[];
  firmCapacity?: FirmCapacity[];
  years?: YearLimit[];
  growth?: GrowthOutcome;
  energy: Energy;
}

export interface StudyProgress {
  /** Load flows solved so far and the most the study will need. */
  done: number;
  total: number;
  stage: "cases" | "outages" | "years";
}
