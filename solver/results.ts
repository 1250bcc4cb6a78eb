// The shape of what the solver returns: the same object on the command line, the API and the sheet.

export interface BusReading {
  id: string;
  vPu: number;
  vKV: number;
  angleDeg: number;
}

export interface BranchReading {
  id: string;
  kind: "line" | "transformer";
  fromBus: string;
  toBus: string;
  pFromMW: number;
  qFromMvar: number;
  pToMW: number;
  qToMvar: number;
  /** I²R for lines; copper plus core for transformers. */
  lossKW: number;
  /** The larger of the two ends, in amperes at that end. */
  currentA: number;
  /** Of ampacity (lines) or rated MVA (transformers); null when there is no rating. */
  loadingPct: number | null;
}

export interface SourceReading {
  id: string;
  pMW: number;
  qMvar: number;
}

export interface LoadFlowTotals {
  generationMW: number;
  loadMW: number;
  lossMW: number;
  lossPct: number;
}

export interface LoadFlowResult {
  converged: boolean;
  iterations: number;
  method: string;
  /** Present when the load flow did not converge: a sentence a planner understands. */
  message?: string;
  /** Present when the load flow did not converge: the share of the load (percent) that still solved. */
  loadabilityPct?: number;
  buses: BusReading[];
  branches: BranchReading[];
  sources: SourceReading[];
  totals: LoadFlowTotals;
}

export interface FaultBusReading {
  id: string;
  ik3kA: number;
  ik3MVA: number;
  ip3kA: number;
  ik1kA: number;
  rOverX: number;
  /** Why a value is what it is, e.g. "unearthed system at this bus" when ik1kA is 0. */
  note?: string;
}

export interface FaultResult {
  method: "IEC 60909-0";
  buses: FaultBusReading[];
}

export type CheckKind =
  | "undervoltage"
  | "overvoltage"
  | "line-overload"
  | "transformer-overload"
  | "breaking-current"
  | "not-converged";

export interface Check {
  element: string;
  kind: CheckKind;
  value: number;
  limit: number;
  message: string;
}

export interface SolveResult {
  loadFlow: LoadFlowResult;
  faults?: FaultResult;
  checks: Check[];
}
