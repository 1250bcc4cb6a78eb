// The solver's one entry point, shared by the command line, the API and the browser:
// validate the document, run the load flow, then the fault levels, then the checks.
import { validateNetwork, type Network, type ValidationIssue } from "#solver/schema.ts";
import type { Check, SolveResult } from "#solver/results.ts";
import { regulatedLoadFlow } from "#solver/regulatedLoadFlow.ts";
import { loadFlowChecks } from "#solver/checks.ts";
import { computeFaultLevels, faultChecks } from "#solver/faults/index.ts";

export { validateNetwork, networkJsonSchema, networkSchema, formatPath } from "#solver/schema.ts";
export type {
  Bus,
  Line,
  Load,
  Network,
  NetworkInput,
  Shunt,
  Source,
  Transformer,
  ValidationIssue,
  ValidationResult,
} from "#solver/schema.ts";
export type * from "#solver/results.ts";
export { busesCsv, branchesCsv, sourcesCsv, resultsCsv, type CsvTable } from "#solver/csv.ts";
export { LOAD_FLOW_METHOD, MAX_ITERATIONS, MISMATCH_TOLERANCE_PU } from "#solver/loadFlow/index.ts";

export interface SolveOptions {
  /** Compute IEC 60909-0 fault levels too (default true). */
  faults?: boolean;
}

export type SolveOutcome = { ok: true; network: Network; result: SolveResult } | { ok: false; issues: ValidationIssue[] };

/** Validate an untrusted document, then solve it. Every problem with the document comes back with its path. */
export function solveNetwork(document: unknown, options: SolveOptions = {}): SolveOutcome {
  const validated = validateNetwork(document);
  if (!validated.ok) return validated;
  return solveValidated(validated.network, options);
}

/**
 * Solve a network that has already passed `validateNetwork`, such as a stored revision (every
 * revision is stored as the validator's output when it is saved). Skips the validation, so it
 * must never be given untrusted input: anything from a request goes through `solveNetwork`.
 */
export function solveValidated(network: Network, options: SolveOptions = {}): SolveOutcome {
  try {
    const loadFlow = regulatedLoadFlow(network);
    const checks: Check[] = loadFlowChecks(network, loadFlow);
    const result: SolveResult = { loadFlow, checks };
    if (options.faults ?? true) {
      const faults = computeFaultLevels(network);
      result.faults = faults;
      for (const check of faultChecks(network, faults)) checks.push(check);
    }
    return { ok: true, network, result };
  } catch (failure) {
    // The schema bounds every quantity to what equipment can have, so this is a network whose
    // numbers still defeat the arithmetic (say, impedances apart by fifteen orders of magnitude).
    // Its author gets a sentence, never a crash.
    const reason = failure instanceof Error ? failure.message : String(failure);
    return {
      ok: false,
      issues: [{ path: "", message: `The solver could not handle this network's numbers (${reason}); check for impedances or ratings far apart in size.` }],
    };
  }
}
