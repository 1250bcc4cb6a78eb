// How much of a large network the printed report lists. A report of every row of a 10,000-bus
// network is tens of megabytes that no one reads on paper and that outlasts the page's render
// budget; past REPORT_ROWS_MAX buses the report lists the first part of each table, in file
// order, says how many rows there are in all, and points to the CSV downloads for the rest. The
// totals, the convergence line and the counts still cover the whole network. Linear in its size.
import type { SolveResult } from "#solver/results.ts";
import type { Network } from "#solver/schema.ts";

export const REPORT_ROWS_MAX = 300;

/** Rows listed and rows in all, per table; `trimmed` is false when every row is listed. */
export interface ReportExtent {
  trimmed: boolean;
  buses: { listed: number; total: number };
  branches: { listed: number; total: number };
  checks: { listed: number; total: number };
  /** Whole-network counts, for the report's opening sentence. */
  counts: { buses: number; transformers: number; lines: number; loads: number; shunts: number };
}

function counted<T>(items: readonly T[], keep: (item: T) => boolean, max: number): T[] {
  const kept: T[] = [];
  for (const item of items) {
    if (kept.length >= max) break;
    if (keep(item)) kept.push(item);
  }
  return kept;
}

/**
 * The part of the network and its results the report lists: the first `max` buses, and the
 * elements and readings that lie wholly among them (each table at most `max` rows). `alsoBuses`
 * are kept whatever their place (a ladder section's buses), so no sentence falls back to an id.
 */
export function reportPart(
  network: Network,
  result: SolveResult,
  options: { max?: number; alsoBuses?: readonly string[] } = {},
): { network: Network; result: SolveResult; extent: ReportExtent } {
  const max = options.max ?? REPORT_ROWS_MAX;
  const counts = {
    buses: network.buses.length,
    transformers: network.transformers.length,
    lines: network.lines.length,
    loads: network.loads.length,
    shunts: network.shunts.length,
  };
  const branchTotal = result.loadFlow.branches.length;
  if (network.buses.length <= max && result.checks.length <= max) {
    return {
      network,
      result,
      extent: { trimmed: false, buses: { listed: counts.buses, total: counts.buses }, branches: { listed: branchTotal, total: branchTotal }, checks: { listed: result.checks.length, total: result.checks.length }, counts },
    };
  }
  const kept = new Set(network.buses.slice(0, max).map((b) => b.id));
  for (const id of options.alsoBuses ?? []) kept.add(id);
  // Every listed check names its element, so the element (and a branch's ends) is listed too.
  const checks = result.checks.slice(0, max);
  const checked = new Set(checks.map((c) => c.element));
  for (const line of network.lines) if (checked.has(line.id)) kept.add(line.fromBus).add(line.toBus);
  for (const t of network.transformers) if (checked.has(t.id)) kept.add(t.hvBus).add(t.lvBus);
  const atKept = (item: { bus: string }) => kept.has(item.bus);
  const part: Network = {
    ...network,
    buses: network.buses.filter((b) => kept.has(b.id) || checked.has(b.id)),
    sources: counted(network.sources, atKept, max),
    transformers: counted(network.transformers, (t) => checked.has(t.id) || (kept.has(t.hvBus) && kept.has(t.lvBus)), max + checked.size),
    lines: counted(network.lines, (l) => checked.has(l.id) || (kept.has(l.fromBus) && kept.has(l.toBus)), max + checked.size),
    loads: counted(network.loads, atKept, max),
    shunts: counted(network.shunts, atKept, max),
  };
  const elementIds = new Set<string>(part.buses.map((b) => b.id));
  for (const list of [part.sources, part.transformers, part.lines, part.loads, part.shunts]) for (const e of list) elementIds.add(e.id);
  const branches = result.loadFlow.branches.filter((b) => elementIds.has(b.id));
  const partResult: SolveResult = {
    ...result,
    loadFlow: {
      ...result.loadFlow,
      buses: result.loadFlow.buses.filter((b) => elementIds.has(b.id)),
      branches,
      sources: result.loadFlow.sources.filter((s) => elementIds.has(s.id)),
    },
    faults: result.faults
      ? { ...result.faults, buses: result.faults.buses.filter((b) => elementIds.has(b.id)), converters: result.faults.converters.filter((c) => elementIds.has(c.bus)) }
      : undefined,
    checks,
  };
  return {
    network: part,
    result: partResult,
    extent: {
      trimmed: true,
      buses: { listed: part.buses.length, total: counts.buses },
      branches: { listed: branches.length, total: branchTotal },
      checks: { listed: checks.length, total: result.checks.length },
      counts,
    },
  };
}
