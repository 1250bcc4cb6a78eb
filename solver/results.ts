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
  /** Transformers: the tap in use, after regulation where the transformer regulates. */
  tapPct?: number;
  /** Regulating transformers: true when the range ran out before the band was reached. */
  tapLimited?: boolean;
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
  /** IEC 60909-0 minimum case: c_min, weakest infeeds, conductors at end-of-fault temperature, no converters. */
  ik3MinKA: number;
  ik1MinKA: number;
  /** How i_p was found: one radial path, the sum of partial peaks by branch, or method C (equivalent frequency). */
  ipMethod: "radial" | "branch-sum" | "equivalent-frequency";
  /** Why a value is what it is, e.g. "unearthed system at this bus" when ik1kA is 0. */
  note?: string;
}

export interface ConverterFaultReading {
  id: string;
  bus: string;
  /** Short-circuit ratio at the plant's bus: S"k3min / rated MVA. */
  scr: number;
}

export interface FaultResult {
  method: "IEC 60909-0";
  buses: FaultBusReading[];
  converters: ConverterFaultReading[];
}

export type CheckKind =
  | "undervoltage"
  | "overvoltage"
  | "line-overload"
  | "transformer-overload"
  | "breaking-current"
  | "minimum-fault-level"
  | "weak-grid"
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
