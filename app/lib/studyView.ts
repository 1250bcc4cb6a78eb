// A study as the study page and the report show it: the rows of solver/study/tables.ts, each check
// written as a sentence naming its case, and the longer tables cut to what a page can hold (the
// CSV downloads carry every row). Built on the server from the study, so the browser receives
// rows, not every case's whole load flow.
import { checkLine } from "#app/lib/checkText.ts";
import type { Network } from "#solver/schema.ts";
import type { Energy, GrowthOutcome, Study, StudyCheck } from "#solver/study/results.ts";
import {
  branchEnvelopeRows,
  busEnvelopeRows,
  caseElementRows,
  firmCapacityRows,
  outageRows,
  studyCaseColumns,
  yearRows,
  type BranchEnvelopeRow,
  type BusEnvelopeRow,
  type CaseElementRow,
  type FirmCapacityRow,
  type OutageRow,
  type StudyCaseColumn,
  type YearRow,
} from "#solver/study/tables.ts";

/** Rows a table shows on the page; the CSV has the rest. */
export const PAGE_ROWS_MAX = 400;
/** Sentences listed under one outage. */
const OUTAGE_CHECKS_SHOWN = 3;

export interface CheckLine {
  caseId: string;
  caseName: string;
  element: string;
  kind: StudyCheck["kind"];
  text: string;
}

export interface ShownTable<Row> {
  rows: Row[];
  /** How many rows the whole table has (the page shows at most PAGE_ROWS_MAX). */
  total: number;
}

export type ShownOutage = Omit<OutageRow, "checks"> & { checkLines: string[] };

export interface StudyView {
  cases: StudyCaseColumn[];
  caseElements: ShownTable<CaseElementRow>;
  busEnvelope: ShownTable<BusEnvelopeRow>;
  branchEnvelope: ShownTable<BranchEnvelopeRow>;
  checks: ShownTable<CheckLine>;
  /** Null when outages were not asked for. */
  outages: (ShownTable<ShownOutage> & { lostLoadCount: number; brokenCount: number; notCarriedCount: number }) | null;
  firmCapacity: FirmCapacityRow[] | null;
  years: ShownTable<YearRow> | null;
  growth: (GrowthOutcome & { loadNotCarriedCaseName: string | null }) | null;
  energy: Energy;
  loadFlows: number;
}

const shown = <Row,>(rows: Row[]): ShownTable<Row> => ({ rows: rows.slice(0, PAGE_ROWS_MAX), total: rows.length });

/** The outages worth reading first: load not carried, then load lost, then limits broken. */
function bySeverity(a: OutageRow, b: OutageRow): number {
  return Number(a.converged) - Number(b.converged) || b.lostLoadMW - a.lostLoadMW || b.limitsBroken - a.limitsBroken;
}

export function studyView(network: Network, study: Study): StudyView {
  const caseNames = new Map(study.cases.map((c) => [c.id, c.name]));
  const checkLines: CheckLine[] = study.cases.flatMap((c) =>
    c.checks.map((check) => ({ caseId: c.id, caseName: c.name, element: check.element, kind: check.kind, text: checkLine(check, network) })),
  );
  const outages = study.outages ? outageRows(network, study) : null;
  const outagesView = outages
    ? {
        ...shown(
          [...outages].sort(bySeverity).map(({ checks, ...row }) => ({
            ...row,
            checkLines: [
              ...checks.slice(0, OUTAGE_CHECKS_SHOWN).map((c) => checkLine(c, network)),
              ...(checks.length > OUTAGE_CHECKS_SHOWN ? [`and ${checks.length - OUTAGE_CHECKS_SHOWN} more (in the CSV)`] : []),
            ],
          })),
        ),
        lostLoadCount: outages.filter((o) => o.lostLoadMW > 0).length,
        brokenCount: outages.filter((o) => o.limitsBroken > 0).length,
        notCarriedCount: outages.filter((o) => !o.converged).length,
      }
    : null;
  const outageCount = study.outages?.length ?? 0;
  const yearCount = study.growth ? study.growth.years * study.cases.length : 0;
  return {
    cases: studyCaseColumns(study),
    caseElements: shown(caseElementRows(network, study)),
    busEnvelope: shown(busEnvelopeRows(network, study)),
    branchEnvelope: shown(branchEnvelopeRows(network, study)),
    checks: shown(checkLines),
    outages: outagesView,
    firmCapacity: study.outages ? firmCapacityRows(network, study) : null,
    years: study.years ? shown(yearRows(network, study)) : null,
    growth: study.growth ? { ...study.growth, loadNotCarriedCaseName: study.growth.loadNotCarriedCase ? (caseNames.get(study.growth.loadNotCarriedCase) ?? study.growth.loadNotCarriedCase) : null } : null,
    energy: study.energy,
    loadFlows: study.cases.length + outageCount + yearCount,
  };
}
