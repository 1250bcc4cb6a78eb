// A study's tables as RFC 4180 CSV with units in the header: the case × element table (bus
// voltages and branch loadings in each case), the N-1 table and the years table.
import { toCsv } from "#solver/csv.ts";
import type { Study } from "#solver/study/results.ts";

/** One row per bus or rated branch, one column per case: voltage (pu) or loading (%). */
export function caseElementCsv(study: Study): string {
  const header = ["element_id", "quantity", ...study.cases.map((c) => `${c.id}`)];
  const busIds = study.envelope.buses.map((b) => b.id);
  const branchIds = study.envelope.branches.map((b) => b.id);
  const busV = study.cases.map((c) => new Map(c.loadFlow.buses.map((b) => [b.id, b.vPu])));
  const loading = study.cases.map((c) => new Map(c.loadFlow.branches.map((b) => [b.id, b.loadingPct])));
  return toCsv(header, [
    ...busIds.map((id) => [id, "voltage_pu", ...busV.map((m) => m.get(id))]),
    ...branchIds.map((id) => [id, "loading_pct", ...loading.map((m) => m.get(id))]),
  ]);
}

export function outagesCsv(study: Study): string {
  return toCsv(
    ["case_id", "element_out", "kind", "lost_load_MW", "converged", "limits_broken", "highest_loading_element", "highest_loading_pct", "lowest_voltage_bus", "lowest_voltage_pu"],
    (study.outages ?? []).map((o) => [
      o.case,
      o.element,
      o.kind,
      o.lostLoadMW,
      o.converged ? "yes" : "no",
      o.checks.length,
      o.highestLoading?.element,
      o.highestLoading?.loadingPct,
      o.lowestVoltage?.bus,
      o.lowestVoltage?.vPu,
    ]),
  );
}

export function yearsCsv(study: Study): string {
  return toCsv(
    ["element_id", "limit", "first_year", "case_id", "value", "limit_value"],
    (study.years ?? []).map((y) => [y.element, y.kind, y.firstYear, y.case, y.value, y.limit]),
  );
}
